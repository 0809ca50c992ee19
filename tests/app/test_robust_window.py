"""The window never fails a save without a word, never makes a design its own loader refuses,
and its fields never change a coordinate the user did not touch."""

import copy
import json
import os
import time
from dataclasses import replace

import pytest
from PySide6.QtCore import Qt
from PySide6.QtWidgets import QMessageBox

import kinematics
from tests.designs import CLAW_FEED, UNFINISHED, load


@pytest.fixture
def warnings_shown(monkeypatch):
    shown = []
    monkeypatch.setattr(QMessageBox, "warning", lambda parent, title, text, *a: shown.append((title, text)))
    return shown


def test_a_save_that_cannot_encode_the_design_says_so(make_window, tmp_path, warnings_shown):
    """A lone surrogate in the title: the save is refused with a message, the old file kept."""
    window = make_window(CLAW_FEED)
    target = tmp_path / "claw.json"
    target.write_text("the old contents", encoding="utf-8")
    window.document.edit(replace(window.document.mechanism, title="claw \ud800"), "rename", check=False)
    assert not window.save_to(target)
    assert target.read_text(encoding="utf-8") == "the old contents"
    (title, text), = warnings_shown
    assert title == "Cannot save" and "cannot be stored as UTF-8" in text
    # The refusal is in the message box, which stays until dismissed; the status line keeps the state.
    assert "cannot be stored as UTF-8" not in window.status.text()
    assert not window.document.undo_stack.isClean()
    assert not window.autosave.write_if_unsaved(), "the recovery copy is refused too, quietly"


@pytest.mark.parametrize(("answer", "replaced"), [(QMessageBox.StandardButton.No, False),
                                                  (QMessageBox.StandardButton.Yes, True)])
def test_saving_over_a_read_only_file_asks_first(make_window, tmp_path, monkeypatch, warnings_shown, answer,
                                                 replaced):
    window = make_window(CLAW_FEED)
    target = tmp_path / "claw.json"
    target.write_text("kept", encoding="utf-8")
    os.chmod(target, 0o444)
    asked = []
    monkeypatch.setattr(QMessageBox, "question", lambda parent, title, text, *a: asked.append(text) or answer)
    assert window.save_to(target) is replaced
    (question,) = asked
    assert "read-only (mode 0444)" in question and "Replace it anyway?" in question
    if replaced:
        assert kinematics.load_mechanism(target) == window.document.mechanism
        assert window.document.undo_stack.isClean()
    else:
        assert target.read_text(encoding="utf-8") == "kept"
        assert "not saved" in window.status.text()


def test_opening_a_design_clears_the_leftovers_of_cut_short_saves(make_window, tmp_path):
    path = tmp_path / "claw.json"
    path.write_text(kinematics.dumps(load(CLAW_FEED)), encoding="utf-8")
    leftover = tmp_path / ".claw.json.k9x_e2rq.part"
    leftover.write_text("torn", encoding="utf-8")
    os.utime(leftover, (time.time() - 3600, time.time() - 3600))
    window = make_window(CLAW_FEED)
    assert window.open_path(path)
    assert not leftover.exists()


def test_a_far_drag_stops_at_the_format_limit_says_so_and_the_design_reopens(make_window, tmp_path):
    """Dragged 2e9 mm away (a zoomed-out view makes that a few pixels), the coupler point stops at
    ±1e9 mm; the design saves and reopens unchanged. (Unfinished, so that no analysis refuses the far
    pose first.)"""
    window = make_window(UNFINISHED)
    start = window.document.mechanism.points["P"]
    window.begin_drag("P", tuple(start))
    window.continue_drag((start[0] + 2e9, start[1] - 3e9))
    assert window.document.mechanism.points["P"] == (1e9, -1e9)
    window.end_drag()  # the status line follows a drag at most ten times a second; the last frame's now
    assert "P stops at (1e+09, -1e+09) mm: coordinates are limited to ±1e+09 mm" in window.status.text()
    target = tmp_path / "far.json"
    assert window.save_to(target)
    assert kinematics.load_mechanism(target) == window.document.mechanism


def type_number(qtbot, spin, text):
    """Select the field's text, type ``text`` and press Enter, as a user would."""
    qtbot.keyClick(spin, Qt.Key_A, Qt.ControlModifier)
    qtbot.keyClicks(spin, text)
    qtbot.keyClick(spin, Qt.Key_Return)


def design_tab(window, joint):
    window.side_tabs.setCurrentWidget(window.properties)
    window.properties.show_point(joint)
    return window.properties


def test_typing_y_never_moves_x_and_far_coordinates_are_kept(make_window, qtbot):
    far = copy.deepcopy(UNFINISHED)
    far["points"]["P"] = [2500000.0, 80.0]
    window = make_window(far)
    panel = design_tab(window, "P")
    type_number(qtbot, panel.y, "81")
    assert window.document.mechanism.points["P"] == (2500000.0, 81.0)
    type_number(qtbot, panel.x, "200000000")  # 2e8 mm: beyond the old ±1e6 field limit, within the format's
    assert window.document.mechanism.points["P"] == (2e8, 81.0)


def test_a_design_in_metres_keeps_its_digits(make_window, qtbot):
    metres = copy.deepcopy(UNFINISHED)
    metres["length_unit"] = "m"
    metres["points"] = {k: [x / 1000, y / 1000] for k, (x, y) in metres["points"].items()}
    metres["points"]["B"] = [0.12345, 0.105]
    window = make_window(metres)
    window.length_units.setCurrentText("m")  # the window shows lengths in the file's own unit
    panel = design_tab(window, "B")
    assert panel.x.text() == "0.123450 m"
    type_number(qtbot, panel.y, "0.10625")
    assert window.document.mechanism.points["B"] == (0.12345, 0.10625)
    window.length_units.setCurrentText("mm")  # and in mm, the same digits
    assert panel.x.text() == "123.450 mm"
    type_number(qtbot, panel.y, "106.5")
    assert window.document.mechanism.points["B"] == (0.12345, pytest.approx(0.1065, rel=1e-15))


def test_the_window_opens_a_design_with_a_repeated_slide_and_names_it(qtbot, tmp_path, monkeypatch):
    """``kinepoly FILE`` used to exit 1 before the window appeared (numpy's LinAlgError)."""
    from app.window import MainWindow, open_window
    from tests.designs import CARTON_PUSHER

    monkeypatch.setattr(MainWindow, "ask_to_save", lambda self: True)
    doc = copy.deepcopy(CARTON_PUSHER)
    doc["slides"]["again"] = dict(doc["slides"]["guide"])
    path = tmp_path / "twice.json"
    path.write_text(json.dumps(doc), encoding="utf-8")
    window = open_window([str(path)])
    qtbot.addWidget(window)
    assert window.isVisible() and window.document.path == str(path)
    assert "slides.again: slide again is redundant" in window.status.text()
