"""The keys and clicks a drafting program is expected to answer (common practice): click selects,
click on empty space clears, Delete deletes, Escape returns to Select, arrows nudge the selected
joint one undo step at a time, each tool has a key listed in its menu and on the shortcuts page,
a right click opens the joint's, link's or empty space's menu, the middle button pans."""

import pytest
from PySide6.QtCore import QPoint, QPointF, Qt
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication

from app.design_actions import FINE_STEPS_PER_GRID, grid_step_mm
from app.menus import TOOL_KEYS, shortcut_rows
from app.pane_events import item_under
from tests.designs import CLAW_FEED


def pixel(window, x_mm, y_mm) -> QPoint:
    return window.drawings.space_view.mapFromScene(QPointF(x_mm, -y_mm))


def joint_pixel(window, name) -> QPoint:
    return window.drawings.space_view.mapFromScene(window.drawings.space_scene.joint_pos(name))


def click(window, at: QPoint, button=Qt.LeftButton):
    QTest.mouseClick(window.drawings.space_view.viewport(), button, Qt.NoModifier, at)


def key(window, key, modifier=Qt.NoModifier):
    QTest.keyClick(window.drawings.space_view, key, modifier)


@pytest.fixture
def window(make_window, qtbot):
    window = make_window(CLAW_FEED)
    window.activateWindow()
    qtbot.waitActive(window)  # shortcuts answer in the active window only
    return window


def empty_pixel(window) -> QPoint:
    at = pixel(window, 100.0, 20.0)  # between the crank, the coupler and the rocker of the claw feed
    assert item_under(window.drawings.space_view, at) == (None, None)
    return at


def test_a_clicked_joint_is_deleted_by_the_delete_key_and_undo_brings_it_back(window):
    click(window, joint_pixel(window, "P"))
    assert window.design_actions.selected == ("point", "P")
    assert "P selected" in window.status.text()
    key(window, Qt.Key_Delete)
    assert "P" not in window.document.mechanism.points
    assert "P deleted" in window.status.text()
    window.document.undo_stack.undo()
    assert "P" in window.document.mechanism.points


def test_a_clicked_link_is_selected_and_deleted(window):
    click(window, pixel(window, 155.0, 55.0))  # the middle of the rocker O4–B
    assert window.design_actions.selected == ("link", "rocker")
    assert window.properties.link.currentText() == "rocker"
    key(window, Qt.Key_Delete)
    assert "rocker" not in window.document.mechanism.links
    assert set(window.document.mechanism.points) == {"O2", "A", "B", "O4", "P"}, "its joints stay"


def test_a_click_on_empty_space_clears_the_selection(window):
    click(window, joint_pixel(window, "P"))
    click(window, empty_pixel(window))
    assert window.design_actions.selected is None
    key(window, Qt.Key_Delete)
    assert set(window.document.mechanism.points) == {"O2", "A", "B", "O4", "P"}
    assert "nothing is selected" in window.status.text()


def test_escape_returns_to_select_from_any_tool(window):
    window.use_tool("link")
    QTest.mouseClick(window.drawings.space_view.viewport(), Qt.LeftButton, Qt.NoModifier, joint_pixel(window, "O2"))
    assert window.builder.picks == ["O2"]
    key(window, Qt.Key_Escape)
    assert window.builder.tool == "select" and window.tool_actions["select"].isChecked()
    assert not window.drawings.space_view.building and not window.builder.picks


def test_arrow_keys_nudge_the_selected_joint_a_grid_step_shift_a_fine_one(window):
    doc = window.document
    click(window, joint_pixel(window, "P"))
    x0, y0 = doc.mechanism.points["P"]
    count = doc.undo_stack.count()
    step = grid_step_mm(doc.mechanism)  # the file is in mm
    key(window, Qt.Key_Right)
    key(window, Qt.Key_Right)
    key(window, Qt.Key_Up, Qt.ShiftModifier)
    x, y = doc.mechanism.points["P"]
    # Tolerance: three additions of doubles near 100 mm.
    assert x == pytest.approx(x0 + 2 * step, abs=1e-9)
    assert y == pytest.approx(y0 + step / FINE_STEPS_PER_GRID, abs=1e-9)
    assert doc.undo_stack.count() == count + 3, "one undo step per press"
    doc.undo_stack.undo()
    assert doc.mechanism.points["P"][1] == y0


def test_arrow_keys_without_a_selection_leave_the_design_alone(window):
    before = window.document.mechanism
    key(window, Qt.Key_Left)
    assert window.document.mechanism is before


def test_each_tool_has_a_key_listed_in_the_tools_menu_and_the_shortcuts_page(window):
    QTest.keyClick(window.drawings.space_view, Qt.Key_L)
    assert window.builder.tool == "link"
    key(window, Qt.Key_Escape)
    tools_menu = next(a.menu() for a in window.menuBar().actions() if a.text() == "&Tools")
    listed = {a.text(): a.shortcut().toString() for a in tools_menu.actions() if not a.isSeparator()}
    for tool, letter in TOOL_KEYS.items():
        assert listed[window.tool_actions[tool].text()] == letter
    rows = dict((what, keys) for keys, what in shortcut_rows(window))
    assert rows["Tools › Link"] == "L"
    assert rows["Edit › Delete the selected joint or link"] == "Del"
    assert any("nudge" in what for what in rows)


def test_a_right_click_on_a_joint_offers_its_edits(window):
    view = window.drawings.space_view
    at = joint_pixel(window, "P")
    QApplication.sendEvent(view.viewport(), _context_event(view, at))
    menu = window.pane_events.menu
    texts = [a.text() for a in menu.actions() if not a.isSeparator()]
    assert texts[:3] == ["Delete P", "Rename P…", "Fix P to the frame"]
    next(a for a in menu.actions() if a.text() == "Fix P to the frame").trigger()
    menu.close()
    assert "P" in window.document.mechanism.ground


def test_a_right_click_on_a_link_can_make_it_the_driver(window):
    view = window.drawings.space_view
    QApplication.sendEvent(view.viewport(), _context_event(view, pixel(window, 155.0, 55.0)))
    menu = window.pane_events.menu
    choice = next(a for a in menu.actions() if a.text().startswith("Make rocker the driver"))
    choice.trigger()
    menu.close()
    driver = window.document.mechanism.driver
    assert (driver.link, driver.pivot) == ("rocker", "O4")


def test_a_right_click_on_empty_space_adds_a_pivot_there(window):
    view = window.drawings.space_view
    QApplication.sendEvent(view.viewport(), _context_event(view, empty_pixel(window)))
    menu = window.pane_events.menu
    next(a for a in menu.actions() if a.text() == "Add a fixed pivot here").trigger()
    menu.close()
    new = set(window.document.mechanism.ground) - {"O2", "O4"}
    assert len(new) == 1
    assert window.design_actions.selected == ("point", new.pop()), "the new pivot is the current one"


def test_the_middle_button_pans_without_moving_a_joint(window):
    view = window.drawings.space_view
    before_points = window.document.mechanism.points
    start = joint_pixel(window, "P")  # even starting on a joint: the middle button never drags it
    centre = view.mapToScene(view.viewport().rect().center())
    QTest.mousePress(view.viewport(), Qt.MiddleButton, Qt.NoModifier, start)
    QTest.mouseMove(view.viewport(), start + QPoint(40, 25))
    QTest.mouseRelease(view.viewport(), Qt.MiddleButton, Qt.NoModifier, start + QPoint(40, 25))
    moved = view.mapToScene(view.viewport().rect().center())
    assert (moved - centre).manhattanLength() > 1.0
    assert window.document.mechanism.points == before_points
    assert not view.auto_fit


def _context_event(view, at: QPoint):
    from PySide6.QtGui import QContextMenuEvent

    return QContextMenuEvent(QContextMenuEvent.Reason.Mouse, at, view.viewport().mapToGlobal(at))
