"""Renaming a joint or a link in the Design tab, typed with the keyboard: the drawing, the table and
the undo history follow, and a name the core refuses is said and not kept."""

import json

from PySide6.QtCore import Qt
from PySide6.QtGui import QAction, QKeySequence

import kinematics
from tests.app.drawn import joint_label, joints
from tests.designs import SAMPLES

# A four-bar with a coupler point: joints O2 A B O4 P, links crank coupler rocker.
FOUR_BAR = json.loads((SAMPLES / "label-swing-arm.json").read_text())


def type_name(qtbot, field, text):
    """Select the field's text, rub it out, type ``text`` and press Enter, as a user would."""
    qtbot.keyClick(field, Qt.Key_A, Qt.ControlModifier)
    qtbot.keyClick(field, Qt.Key_Backspace)
    qtbot.keyClicks(field, text)
    qtbot.keyClick(field, Qt.Key_Return)


def design_tab(window):
    window.side_tabs.setCurrentWidget(window.properties)
    return window.properties


def table_names(window):
    results = window.table.results
    return [results.item(row, 0).text() for row in range(results.rowCount())]


def menu_action(window, shortcut):
    return next(a for a in window.findChildren(QAction) if a.shortcut() == QKeySequence(shortcut))


def test_a_joint_renamed_in_the_design_tab_is_renamed_everywhere_and_undone(make_window, qtbot):
    window = make_window(FOUR_BAR)
    doc, panel = window.document, design_tab(window)
    panel.point.setCurrentText("A")
    assert panel.point_name.text() == "A"
    count = doc.undo_stack.count()
    type_name(qtbot, panel.point_name, "crank_pin")
    mech = doc.mechanism
    assert list(mech.points) == ["O2", "crank_pin", "B", "O4", "P"]
    assert mech.links["crank"] == ("O2", "crank_pin") and mech.links["coupler"] == ("crank_pin", "B", "P")
    assert doc.undo_stack.count() == count + 1 and doc.undo_stack.undoText() == "rename joint A to crank_pin"
    scene = window.drawings.space_scene
    assert "A" not in joints(scene) and joint_label(scene, "crank_pin") == "crank_pin"
    assert "point crank_pin" in table_names(window) and "point A" not in table_names(window)
    assert panel.point.currentText() == "crank_pin" and panel.point_name.text() == "crank_pin"
    assert doc.solution is not None and "cannot" not in window.status.text()

    menu_action(window, QKeySequence.Undo).trigger()
    assert list(doc.mechanism.points) == ["O2", "A", "B", "O4", "P"]
    assert joint_label(window.drawings.space_scene, "A") == "A"
    assert "point A" in table_names(window) and "point crank_pin" not in table_names(window)
    assert panel.point.currentText() == "A" and panel.point_name.text() == "A"
    menu_action(window, QKeySequence.Redo).trigger()
    assert "crank_pin" in doc.mechanism.points and panel.point_name.text() == "crank_pin"


def test_a_link_renamed_in_the_design_tab_carries_the_driver(make_window, qtbot):
    window = make_window(FOUR_BAR)
    doc, panel = window.document, design_tab(window)
    panel.link.setCurrentText("crank")
    assert panel.link_name.text() == "crank" and panel.link_points.text() == "joins O2, A"
    type_name(qtbot, panel.link_name, "input_crank")
    assert list(doc.mechanism.links) == ["input_crank", "coupler", "rocker"]
    assert doc.mechanism.driver.link == "input_crank" and panel.driver.text() == "input_crank about O2"
    assert "link input_crank" in table_names(window) and "link crank" not in table_names(window)
    assert doc.undo_stack.undoText() == "rename link crank to input_crank"
    doc.undo_stack.undo()
    assert doc.mechanism.driver.link == "crank" and panel.link_name.text() == "crank"
    assert "link crank" in table_names(window)


def test_a_refused_name_is_said_and_the_design_stays(make_window, qtbot):
    window = make_window(FOUR_BAR)
    doc, panel = window.document, design_tab(window)
    panel.point.setCurrentText("A")
    before, count = kinematics.dumps(doc.mechanism), doc.undo_stack.count()
    for typed, message in [
        ("crank pin", 'points.A: point A cannot be called "crank pin": a name is a letter, then letters, digits or _'),
        ("b", 'points.A: point A cannot be called "b": it clashes with point "B" (names of points, links and slides '
              "must differ ignoring case)"),
        ("", "points.A: point A needs a name: the new name is empty"),
    ]:
        type_name(qtbot, panel.point_name, typed)
        assert window.status.text().startswith(message + " · ")
        assert kinematics.dumps(doc.mechanism) == before and doc.undo_stack.count() == count
        assert panel.point_name.text() == "A" and "A" in joints(window.drawings.space_scene)
    panel.link.setCurrentText("rocker")
    type_name(qtbot, panel.link_name, "O4")
    assert window.status.text().startswith(
        'links.rocker: link rocker cannot be called "O4": it clashes with point "O4"')
    assert kinematics.dumps(doc.mechanism) == before and panel.link_name.text() == "rocker"
    type_name(qtbot, panel.link_name, " output_arm ")  # spaces around a name are a slip of the keyboard
    assert "output_arm" in doc.mechanism.links and not window.status.text().startswith("links.")


def test_a_name_being_typed_survives_the_driver_turning(make_window, qtbot):
    window = make_window(FOUR_BAR)
    doc, panel = window.document, design_tab(window)
    panel.point.setCurrentText("P")
    qtbot.keyClick(panel.point_name, Qt.Key_A, Qt.ControlModifier)
    qtbot.keyClicks(panel.point_name, "claw_ti")
    assert doc.set_angle(120.0) == ""  # the window refreshes the tab at each pose
    assert panel.point_name.text() == "claw_ti"
    qtbot.keyClicks(panel.point_name, "p")
    qtbot.keyClick(panel.point_name, Qt.Key_Return)
    assert "claw_tip" in doc.mechanism.points and "claw_tip" in joints(window.drawings.space_scene)
