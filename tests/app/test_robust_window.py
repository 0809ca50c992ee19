"""The window never fails a save without a word, never makes a design its own loader refuses,
and its fields never change a coordinate the user did not touch."""

from dataclasses import replace

import pytest
from PySide6.QtWidgets import QMessageBox

from tests.designs import CLAW_FEED


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
