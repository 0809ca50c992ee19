"""Zoom, pan, fit, hover and step selection, through real events."""

from PySide6.QtCore import QPoint, QPointF, Qt
from PySide6.QtGui import QWheelEvent
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication, QGraphicsLineItem

from app.scene_backend import ITEM_REF, Z_LINE
from kinematics.drawing import Ref
from kinematics.drawing.style import pen_for
from kinematics.reports.shown_units import in_units
from tests.designs import CLAW_FEED


def lines_of(scene, ref) -> list:
    """The line items drawing ``ref`` (a bar's broad body first drawn under its centre line left out)."""
    return [item for item in scene.items() if isinstance(item, QGraphicsLineItem) and item.data(ITEM_REF) == ref
            and item.zValue() >= Z_LINE]


def pin(scene, name):
    return next(item for item in scene.items() if item.data(1) and item.data(ITEM_REF) == Ref("point", name))


def wheel(view, steps: int):
    centre = QPointF(view.viewport().rect().center())
    event = QWheelEvent(centre, view.viewport().mapToGlobal(centre), QPoint(0, 0), QPoint(0, 120 * steps),
                        Qt.NoButton, Qt.NoModifier, Qt.NoScrollPhase, False)
    QApplication.sendEvent(view.viewport(), event)


def test_the_wheel_zooms_and_fit_restores(make_window):
    window = make_window(CLAW_FEED)
    view = window.drawings.velocity_view
    fitted = view.transform().m11()
    wheel(view, 2)
    assert view.transform().m11() > fitted * 1.3
    assert not view.auto_fit
    wheel(view, -4)
    assert view.transform().m11() < fitted
    window.drawings.fit_all()
    assert view.auto_fit and abs(view.transform().m11() - fitted) < 1e-6 * fitted


def test_a_resized_view_refits_its_drawing(make_window):
    window = make_window(CLAW_FEED)
    view = window.drawings.acceleration_view
    before = view.transform().m11()
    window.resize(1000, 700)
    QApplication.processEvents()
    assert view.transform().m11() < before
    visible = view.mapToScene(view.viewport().rect()).boundingRect()
    assert visible.contains(view.fit_rect.adjusted(1, 1, -1, -1))


def test_dragging_empty_space_pans(make_window):
    window = make_window(CLAW_FEED)
    view = window.drawings.space_view
    empty = QPoint(8, view.viewport().height() - 8)
    assert view.joint_at(empty) is None
    centre = view.mapToScene(view.viewport().rect().center())
    QTest.mousePress(view.viewport(), Qt.LeftButton, Qt.NoModifier, empty)
    QTest.mouseMove(view.viewport(), empty + QPoint(60, -40))
    QTest.mouseRelease(view.viewport(), Qt.LeftButton, Qt.NoModifier, empty + QPoint(60, -40))
    moved = view.mapToScene(view.viewport().rect().center())
    assert (moved - centre).manhattanLength() > 1.0
    assert window.document.undo_stack.count() == 0 and not view.auto_fit


def test_hovering_a_joint_marks_its_images_and_its_table_row(make_window):
    window = make_window(CLAW_FEED)
    view = window.drawings.space_view
    at = view.mapFromScene(window.drawings.space_scene.joint_pos("B"))
    QTest.mouseMove(view.viewport(), at + QPoint(30, 30))
    QTest.mouseMove(view.viewport(), at)
    drawings = window.drawings
    assert drawings.velocity_scene.ring_visible() and drawings.acceleration_scene.ring_visible()
    image = window.document.construction.velocity.images["B"]
    scale = window.document.construction.velocity.scale_per_mm
    ring = drawings.velocity_scene._ring.pos()
    assert abs(ring.x() - image[0] / scale) < 1e-9 and abs(ring.y() + image[1] / scale) < 1e-9
    selected = window.table.selectionModel().selectedRows()
    assert [i.row() for i in selected] == [window.table.results.rows["B"]]
    assert pin(drawings.space_scene, "B").brush().color().name() != "#ffffff"
    far = QPoint(6, 6)
    assert view.joint_at(far) is None
    QTest.mouseMove(view.viewport(), far)
    assert not drawings.velocity_scene.ring_visible()


def test_selecting_a_step_emphasises_its_geometry_and_links(make_window):
    window = make_window(CLAW_FEED)
    construction = window.document.construction
    step = next(s for s in construction.velocity.steps if s.links == ("rocker",) and s.role.value == "result")
    row = [*construction.velocity.steps, *construction.acceleration.steps].index(step)
    window.steps.setCurrentRow(row)
    scene = window.drawings.velocity_scene
    assert scene.selected_step == step.id
    line = lines_of(scene, Ref("step", step.id))[0]
    plain = next(other for s in construction.velocity.steps if s.id != step.id and pen_for(s) == pen_for(step)
                 for other in lines_of(scene, Ref("step", s.id)))
    assert line.pen().widthF() > plain.pen().widthF()
    space = window.drawings.space_scene
    rocker, crank = (lines_of(space, Ref("link", name))[0] for name in ("rocker", "crank"))
    assert rocker.pen().widthF() > crank.pen().widthF()
    assert in_units(step.text, *window.steps.units) in window.steps.item(row).text()
    window.steps.setCurrentRow(-1)
    assert scene.selected_step is None


def test_clicking_a_polygon_line_shows_its_step(make_window):
    window = make_window(CLAW_FEED)
    construction = window.document.construction
    step = next(s for s in construction.acceleration.steps if s.role.value == "result")
    view, scene = window.drawings.acceleration_view, window.drawings.acceleration_scene
    line = lines_of(scene, Ref("step", step.id))[0].line()
    middle = view.mapFromScene(line.pointAt(0.5))
    QTest.mouseClick(view.viewport(), Qt.LeftButton, Qt.NoModifier, middle + QPoint(2, 1))  # a near miss is fine
    assert window.side_tabs.currentWidget() is window.steps
    assert window.steps.currentItem().data(Qt.UserRole) == step.id
    assert scene.selected_step == step.id


def test_choosing_a_table_row_rings_the_point_images(make_window):
    window = make_window(CLAW_FEED)
    row = window.table.results.rows["P"]
    index = window.table.model().index(row, 1)
    QTest.mouseClick(window.table.viewport(), Qt.LeftButton, Qt.NoModifier, window.table.visualRect(index).center())
    drawings = window.drawings
    assert drawings.velocity_scene.ring_visible() and drawings.acceleration_scene.ring_visible()
    image = window.document.construction.acceleration.images["P"]
    scale = window.document.construction.acceleration.scale_per_mm
    ring = drawings.acceleration_scene._ring.pos()
    assert abs(ring.x() - image[0] / scale) < 1e-9 and abs(ring.y() + image[1] / scale) < 1e-9
