"""File menu behaviour: atomic save, open (good, bad, dropped), recent files, the
unsaved-changes prompt, and the About box's caution."""

import json
import os

import pytest
from PySide6.QtCore import QMimeData, QPoint, QPointF, Qt, QUrl
from PySide6.QtGui import QDragEnterEvent, QDropEvent
from PySide6.QtWidgets import QApplication, QMessageBox

import kinematics
from app import files
from app.window import MainWindow, open_window
from tests.designs import CARTON_PUSHER, CLAW_FEED, load

REAL_ASK_TO_SAVE = MainWindow.ask_to_save  # the fixture replaces it; these tests want the real prompt


def write(path, design):
    path.write_text(json.dumps(design), encoding="utf-8")
    return path


@pytest.fixture
def warnings_shown(monkeypatch):
    shown = []
    monkeypatch.setattr(QMessageBox, "warning", lambda parent, title, text, *a: shown.append((title, text)))
    return shown


def test_save_writes_the_core_text_atomically(make_window, tmp_path):
    window = make_window(CLAW_FEED)
    target = tmp_path / "claw.json"
    target.write_text("old", encoding="utf-8")
    mode = 0o640
    os.chmod(target, mode)
    assert window.save_to(target)
    assert target.read_text(encoding="utf-8") == kinematics.dumps(window.document.mechanism)
    assert kinematics.load_mechanism(target).points == window.document.mechanism.points
    assert os.stat(target).st_mode & 0o777 == mode, "an overwritten file keeps its permissions"
    # The previous version stays beside it, one generation (kinematics.files.storage.save_mechanism).
    assert sorted(p.name for p in tmp_path.iterdir()) == ["claw.json", "claw.json.bak", "settings.ini"]
    assert (tmp_path / "claw.json.bak").read_text(encoding="utf-8") == "old"
    assert window.document.undo_stack.isClean() and window.document.path == str(target)


def test_a_failed_save_leaves_the_old_file_whole_and_no_temporary(make_window, tmp_path, monkeypatch,
                                                                  warnings_shown):
    window = make_window(CLAW_FEED)
    target = tmp_path / "claw.json"
    target.write_text("the old contents", encoding="utf-8")

    def refuse(*_):
        raise OSError("disk full")

    monkeypatch.setattr(kinematics.files.storage.os, "replace", refuse)
    assert not window.save_to(target)
    assert target.read_text(encoding="utf-8") == "the old contents"
    assert [p.name for p in tmp_path.iterdir() if p.name.endswith((".tmp", ".part"))] == []
    assert warnings_shown and "disk full" in warnings_shown[0][1]


def test_a_bad_file_shows_its_message_and_keeps_the_design(make_window, tmp_path, warnings_shown):
    window = make_window(CLAW_FEED)
    before = window.document.mechanism
    bad = tmp_path / "bad.json"
    bad.write_text('{"kinepoly": 1, "points": {"A": [0, 0]', encoding="utf-8")
    assert not window.open_path(bad)
    assert window.document.mechanism is before
    title, text = warnings_shown[0]
    assert str(bad) in text and "line" in text
    assert not window.open_path(tmp_path / "missing.json")
    assert window.document.mechanism is before


def test_open_replaces_the_design_and_remembers_the_file(make_window, tmp_path):
    window = make_window(CLAW_FEED)
    path = write(tmp_path / "pusher.json", CARTON_PUSHER)
    window.document.edit(kinematics.move_point(window.document.mechanism, "P", (71.0, 140.0)), "move P")
    assert window.open_path(path)
    assert set(window.document.mechanism.slides) == {"guide"}
    assert window.document.undo_stack.count() == 0 and window.document.undo_stack.isClean()
    assert files.recent_files()[0] == str(path.resolve())
    assert [a.text() for a in window.recent_menu.actions()] == [f"&1  {path.resolve()}", "", "&Clear list"]
    assert "pusher.json" in window.windowTitle()


def test_a_dropped_file_is_opened(make_window, tmp_path):
    window = make_window(CLAW_FEED)
    path = write(tmp_path / "dropped.json", CARTON_PUSHER)
    data = QMimeData()
    data.setUrls([QUrl.fromLocalFile(str(path))])
    enter = QDragEnterEvent(QPoint(50, 50), Qt.CopyAction, data, Qt.LeftButton, Qt.NoModifier)
    QApplication.sendEvent(window, enter)
    assert enter.isAccepted()
    drop = QDropEvent(QPointF(50, 50), Qt.CopyAction, data, Qt.LeftButton, Qt.NoModifier)
    QApplication.sendEvent(window, drop)
    assert window.document.path == str(path)


def test_unsaved_changes_are_asked_about(make_window, monkeypatch):
    window = make_window(CLAW_FEED)
    monkeypatch.setattr(MainWindow, "ask_to_save", REAL_ASK_TO_SAVE)
    window.document.edit(kinematics.move_point(window.document.mechanism, "P", (71.0, 140.0)), "move P")
    assert "*" in window.windowTitle()
    answers = [QMessageBox.Cancel]
    monkeypatch.setattr(QMessageBox, "question", lambda *a: answers[0])
    window.new_design()
    assert window.document.mechanism.points["P"] == (71.0, 140.0), "Cancel keeps the design"
    window.close()
    assert window.isVisible(), "Cancel keeps the window open"
    answers[0] = QMessageBox.Discard
    window.new_design()
    assert not window.document.mechanism.points
    assert "no driver" in window.status.text()
    window.document.edit(load(CLAW_FEED), "paste")
    window.close()
    assert not window.isVisible()


def test_the_about_box_carries_the_safety_caution(make_window, monkeypatch):
    window = make_window(CLAW_FEED)
    shown = []
    monkeypatch.setattr(QMessageBox, "about", lambda parent, title, text: shown.append(text))
    window.about()
    assert kinematics.CAUTION in shown[0]


def test_kinepoly_file_opens_it(qtbot, tmp_path, monkeypatch):
    monkeypatch.setattr(MainWindow, "ask_to_save", lambda self: True)
    path = write(tmp_path / "claw.json", CLAW_FEED)
    window = open_window([str(path)])
    qtbot.addWidget(window)
    assert window.isVisible() and window.document.path == str(path)
    assert window.document.solution is not None


def test_the_kinepoly_command_runs_the_window_on_a_file(qapp, tmp_path, monkeypatch):
    from app.main import main as kinepoly

    path = write(tmp_path / "claw.json", CLAW_FEED)
    opened = []

    def event_loop(_app):
        # Stands in for Qt's own loop, which once quit leaves no timer firing for the tests after.
        QApplication.processEvents()
        opened.extend(w for w in QApplication.topLevelWidgets() if isinstance(w, MainWindow) and w.isVisible())
        for window in opened:
            window.close()
        return 0

    monkeypatch.setattr(QApplication, "exec", event_loop)
    assert kinepoly([str(path)]) == 0
    assert any(w.document.path == str(path) and w.document.solution is not None for w in opened)
