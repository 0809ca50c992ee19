"""The window never fails a save without a word, never makes a design its own loader refuses,
and its fields never change a coordinate the user did not touch."""

import os
import time
from dataclasses import replace

import pytest
from PySide6.QtWidgets import QMessageBox

import kinematics
from tests.designs import CLAW_FEED, load


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
    assert "cannot be stored as UTF-8" in window.status.text()
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
