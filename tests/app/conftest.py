"""Fixtures for the window tests: a window on a known design, settings kept in a temporary folder."""

import time

import pytest
from PySide6.QtCore import QSettings, QTimer
from PySide6.QtWidgets import QApplication, QDialog

from app import files, recovery
from app.window import MainWindow
from tests.designs import CLAW_FEED, load


@pytest.fixture(autouse=True)
def private_settings(tmp_path, monkeypatch):
    """Recent files and recovery copies go to a temporary folder, never the user's own."""
    path = str(tmp_path / "settings.ini")
    monkeypatch.setattr(files, "settings", lambda: QSettings(path, QSettings.IniFormat))
    monkeypatch.setattr(recovery, "recovery_folder", lambda: tmp_path / "recovery")


STRAY_DIALOG_S = 20.0  # far longer than any answered dialog stays up; far shorter than a CI run


@pytest.fixture(autouse=True)
def no_stray_dialog(qapp):
    """A modal dialog that no test answers is closed after STRAY_DIALOG_S and fails the test, instead of
    waiting for a click that never comes and hanging the whole run."""
    strays, first_seen = [], {}

    def look():
        modal = QApplication.activeModalWidget()
        if modal is None:
            first_seen.clear()
            return
        since = first_seen.setdefault(id(modal), time.monotonic())
        if time.monotonic() - since > STRAY_DIALOG_S:
            strays.append(f"{type(modal).__name__} {modal.windowTitle()!r}")
            first_seen.pop(id(modal))
            modal.done(0) if isinstance(modal, QDialog) else modal.close()  # done(): a message box ignores close

    timer = QTimer()
    timer.timeout.connect(look)
    timer.start(250)
    yield
    timer.stop()
    assert not strays, f"a modal dialog no test answered was left open: {strays}"


@pytest.fixture
def make_window(qtbot, monkeypatch):
    """A factory of shown windows; closing them never asks about unsaved changes unless a test says so."""
    def make(design=CLAW_FEED, path=None):
        window = MainWindow(load(design), path)
        qtbot.addWidget(window)
        window.show()
        qtbot.waitExposed(window)
        QApplication.processEvents()  # let the first layout settle before positions are read
        window.drawings.fit_all()
        return window

    monkeypatch.setattr(MainWindow, "ask_to_save", lambda self: True)
    return make
