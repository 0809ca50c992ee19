"""File names and file messages: Save As and the exports add the extension their filter implies
and suggest the design's name; Open asks about unsaved changes before the file dialog; a file
message names the path once; a cut-off file says it ends early and where; recent files are
numbered with a "Clear list"."""

import json

import pytest
from PySide6.QtWidgets import QFileDialog, QMessageBox

import kinematics
from app.file_actions import FILE_FILTER
from app.file_names import suggested_name, with_extension
from app.print_preview import PaperDialog
from app.window import MainWindow
from tests.app.dialogs import when_shown
from tests.designs import CARTON_PUSHER, CLAW_FEED, load

REAL_ASK_TO_SAVE = MainWindow.ask_to_save


@pytest.fixture
def save_dialog(monkeypatch):
    """A save dialog answering with a typed name and the first filter; records what it was offered."""
    offered = []

    def answer(typed):
        def dialog(parent, caption, suggestion, filters, *rest):
            offered.append((suggestion, filters))
            return typed, filters.split(";;")[0]
        monkeypatch.setattr(QFileDialog, "getSaveFileName", dialog)
    answer.offered = offered
    return answer


def test_save_as_adds_the_json_extension_and_suggests_the_title(make_window, tmp_path, save_dialog):
    window = make_window(CLAW_FEED)
    save_dialog(str(tmp_path / "slider"))
    assert window.save_as()
    assert (tmp_path / "slider.json").is_file() and not (tmp_path / "slider").exists()
    assert window.document.path == str(tmp_path / "slider.json")
    assert save_dialog.offered[0][0] == "claw_feed_four-bar.json"
    save_dialog(str(tmp_path / "again"))
    window.save_as()
    assert save_dialog.offered[1][0] == str(tmp_path / "slider.json"), "then the design's own file name"


@pytest.mark.parametrize("menu_text, extension", [("Export sheet as P&DF…", ".pdf"),
                                                  ("Export drawing as D&XF…", ".dxf")])
def test_the_exports_add_their_extension_and_suggest_the_design_name(make_window, tmp_path, save_dialog,
                                                                     menu_text, extension):
    window = make_window(CLAW_FEED, path=str(tmp_path / "claw.json"))
    save_dialog(str(tmp_path / "sheet"))
    when_shown(PaperDialog, lambda dialog: dialog.accept())  # the PDF export asks the paper first
    file_menu = next(a.menu() for a in window.menuBar().actions() if a.text() == "&File")
    next(a for a in file_menu.actions() if a.text() == menu_text).trigger()
    assert (tmp_path / f"sheet{extension}").is_file()
    assert save_dialog.offered[0][0] == str(tmp_path / f"claw{extension}")


def test_a_name_with_the_right_extension_or_all_files_is_kept():
    assert with_extension("/d/a.JSON", "Kinepoly mechanism (*.json)", FILE_FILTER) == "/d/a.JSON"
    assert with_extension("/d/a.v2", "Kinepoly mechanism (*.json)", FILE_FILTER) == "/d/a.v2.json"
    assert with_extension("/d/a", "All files (*)", FILE_FILTER) == "/d/a"
    assert with_extension("/d/a", "", FILE_FILTER) == "/d/a.json", "no filter said: the first one counts"
    assert suggested_name(None, "  ", ".json") == "untitled.json"


def test_an_added_extension_never_replaces_another_file_unasked(make_window, tmp_path, save_dialog, monkeypatch):
    window = make_window(CLAW_FEED)
    (tmp_path / "slider.json").write_text("keep me", encoding="utf-8")
    save_dialog(str(tmp_path / "slider"))
    monkeypatch.setattr(QMessageBox, "question", lambda *a: QMessageBox.No)
    assert not window.save_as()
    assert (tmp_path / "slider.json").read_text(encoding="utf-8") == "keep me"


def test_open_asks_about_unsaved_changes_before_the_file_dialog(make_window, monkeypatch):
    window = make_window(CLAW_FEED)
    monkeypatch.setattr(MainWindow, "ask_to_save", REAL_ASK_TO_SAVE)
    window.document.edit(kinematics.move_point(window.document.mechanism, "P", (71.0, 140.0)), "move P")
    order = []
    monkeypatch.setattr(QMessageBox, "question", lambda *a: order.append("asked") or QMessageBox.Cancel)
    monkeypatch.setattr(QFileDialog, "getOpenFileName", lambda *a: order.append("dialog") or ("", ""))
    window.open_dialog()
    assert order == ["asked"], "Cancel at the question: no file dialog at all"
    window.document.undo_stack.setClean()  # closing the window at the end asks nothing


def test_a_cut_off_file_says_it_ends_early_where_and_names_the_path_once(make_window, tmp_path, monkeypatch):
    window = make_window(CLAW_FEED)
    shown = []
    monkeypatch.setattr(QMessageBox, "warning", lambda parent, title, text, *a: shown.append(text))
    whole = json.dumps(CARTON_PUSHER)
    cut = tmp_path / "cut.json"
    cut.write_text(whole[:60], encoding="utf-8")
    assert not window.open_path(cut)
    text = shown[0]
    assert text.count(str(cut)) == 1
    assert "ends early" in text and "line 1 column 61" in text
    assert window.document.mechanism == load(CLAW_FEED)


def test_a_wrong_character_is_not_called_an_early_end(tmp_path):
    bad = tmp_path / "bad.json"
    bad.write_text('{"kinepoly": 1, "points": {"A": [0 0]}}', encoding="utf-8")
    with pytest.raises(kinematics.KinematicsError) as caught:
        kinematics.load_mechanism(bad)
    assert "not valid JSON" in str(caught.value) and "ends early" not in str(caught.value)


def test_recent_files_are_numbered_and_the_list_can_be_cleared(make_window, tmp_path):
    window = make_window(CLAW_FEED)
    for name in ("one", "two"):
        path = tmp_path / f"{name}.json"
        path.write_text(json.dumps(CLAW_FEED), encoding="utf-8")
        window.open_path(path)
    texts = [a.text() for a in window.recent_menu.actions()]
    assert texts == [f"&1  {tmp_path / 'two.json'}", f"&2  {tmp_path / 'one.json'}", "", "&Clear list"]
    window.recent_menu.actions()[-1].trigger()
    assert not window.recent_menu.actions() and not window.recent_menu.isEnabled()
