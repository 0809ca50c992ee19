"""The force polygon pane in the window, with real mouse events: its tab, its words when there is
no force polygon, hover and click on a step laying its line of action over the space diagram,
and the polygon following a drag and a turn of the driver."""

from pathlib import Path

from PySide6.QtCore import QPoint, QPointF, Qt
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication

import kinematics
from kinematics.drawing import Arrow, Ref
from tests.designs import CLAW_FEED

SAMPLES = Path(__file__).resolve().parents[2] / "samples"
FEEDER = kinematics.load_mechanism(SAMPLES / "cap-press-feeder.json")


def open_force_tab(window):
    """Click the third pane's "Force polygon" tab."""
    bar = window.drawings.third.tabBar()
    QTest.mouseClick(bar, Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier, bar.tabRect(1).center())
    QApplication.processEvents()
    assert window.drawings.showing_forces()


def window_on(make_window, mechanism):
    window = make_window(CLAW_FEED)
    window.document.replace(mechanism)
    window.drawings.fit_all()
    QApplication.processEvents()
    return window


def step_id(window, label: str) -> str:
    return next(s.id for s in window.drawings.force_polygon().polygon.steps if s.label == label)


def arrow_middle(window, sid: str) -> QPoint:
    """Where the mouse goes to point at step ``sid``'s vector: a place along its shaft, in the
    view, where no other step is drawn over it (vectors of a force polygon often lie along each other)."""
    view = window.drawings.force_view
    (arrow,) = [p for p in window.drawings.force_scene.drawing.primitives_of(Ref("step", sid))
                if isinstance(p, Arrow)]
    (x0, y0), (x1, y1) = arrow.start, arrow.end
    for share in (0.5, 0.4, 0.6, 0.3, 0.7, 0.2, 0.8):
        at = view.mapFromScene(QPointF(x0 + share * (x1 - x0), -(y0 + share * (y1 - y0))))
        if view.step_at(at) == sid:
            return at
    raise AssertionError(f"step {sid} is covered along its whole length")


def overlay_refs(window) -> set:
    return set(window.drawings.space_scene.overlay.by_ref)


def test_the_force_tab_shows_the_polygon_its_scale_and_the_drive_torque(make_window):
    window = window_on(make_window, FEEDER)
    open_force_tab(window)
    made = window.drawings.force_polygon()
    scene = window.drawings.force_scene
    assert {s.id for s in made.polygon.steps} == scene._steps
    assert scene.sheet.views["force"].scale_text == f"{made.polygon.scale_per_mm:g} N per mm"
    assert f"T = {made.drive_torque_n_m:.4g} N·m" in window.drawings.force_view.message


def test_hovering_a_force_step_lays_its_line_of_action_over_the_space_diagram(make_window, qtbot):
    window = window_on(make_window, FEEDER)
    open_force_tab(window)
    view = window.drawings.force_view
    sid = step_id(window, "Fᵢ(rod)")
    QTest.mouseMove(view.viewport(), arrow_middle(window, sid))
    qtbot.waitUntil(lambda: Ref("force line", sid) in overlay_refs(window), timeout=2000)
    QTest.mouseMove(view.viewport(), QPoint(5, view.viewport().height() - 5))  # off every step
    qtbot.waitUntil(lambda: not overlay_refs(window), timeout=2000)


def test_a_clicked_step_stays_emphasised_with_its_line_until_clicked_again(make_window, qtbot):
    window = window_on(make_window, FEEDER)
    open_force_tab(window)
    view = window.drawings.force_view
    sid = step_id(window, "W(rod)")
    at = arrow_middle(window, sid)
    QTest.mouseClick(view.viewport(), Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier, at)
    assert window.drawings.force_scene.selected_step == sid
    QTest.mouseMove(view.viewport(), QPoint(5, view.viewport().height() - 5))
    QApplication.processEvents()
    assert Ref("force line", sid) in overlay_refs(window)
    QTest.mouseClick(view.viewport(), Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier,
                     arrow_middle(window, sid))
    assert window.drawings.force_scene.selected_step is None


def test_the_polygon_follows_a_drag_and_a_turn_of_the_driver(make_window):
    window = window_on(make_window, FEEDER)
    open_force_tab(window)
    sid = step_id(window, "Fᵢ(rod)")
    window.drawings.select_force_step(sid)
    before = window.drawings.force_scene.sheet
    line_before = window.drawings.space_scene.overlay.primitives_of(Ref("force line", sid))
    view = window.drawings.space_view
    start = window.drawings.space_scene.joint_pos("A")
    QTest.mousePress(view.viewport(), Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier,
                     view.mapFromScene(start))
    QTest.mouseMove(view.viewport(), view.mapFromScene(start + QPointF(6.0, 4.0)))
    mid_drag = window.drawings.force_scene.sheet
    QTest.mouseRelease(view.viewport(), Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier,
                       view.mapFromScene(start + QPointF(6.0, 4.0)))
    assert mid_drag is not before and mid_drag.primitives != before.primitives  # drawn during the drag
    assert window.drawings.force_polygon().construction is window.document.construction
    assert window.drawings.space_scene.overlay.primitives_of(Ref("force line", sid)) != line_before
    angle = window.document.shown_angle_deg
    window.turn_driver(angle + 40.0)
    assert window.drawings.force_polygon().construction.solution.driver_angle_deg == window.document.shown_angle_deg
    assert window.drawings.force_scene.sheet is not mid_drag


def test_a_design_without_mass_data_says_so_in_the_pane(make_window):
    window = make_window(CLAW_FEED)
    open_force_tab(window)
    assert window.drawings.force_polygon() is None
    assert "No force polygon: the design has no masses" in window.drawings.force_view.message
    assert window.drawings.force_scene.sheet is None
