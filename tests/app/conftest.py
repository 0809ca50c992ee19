"""Fixtures for the window tests: a window on a known design, settings kept in a temporary folder."""

import pytest
from PySide6.QtCore import QSettings
from PySide6.QtWidgets import QApplication

from app import files, recovery
from app.window import MainWindow
from tests.designs import CLAW_FEED, load


@pytest.fixture(autouse=True)
def private_settings(tmp_path, monkeypatch):
    """Recent files and recovery copies go to a temporary folder, never the user's own."""
    path = str(tmp_path / "settings.ini")
    monkeypatch.setattr(files, "settings", lambda: QSettings(path, QSettings.IniFormat))
    monkeypatch.setattr(recovery, "recovery_folder", lambda: tmp_path / "recovery")


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
