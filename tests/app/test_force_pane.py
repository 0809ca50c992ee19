"""The force polygon pane in the window, with real mouse events: its tab, its words when there is
no force polygon, hover and click on a step laying its line of action over the space diagram,
and the polygon following a drag and a turn of the driver."""

from pathlib import Path

from PySide6.QtCore import QPoint, QPointF, Qt
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication

import kinematics
from kinematics.drawing import Arrow, Ref
from tests.designs import CLAW_FEED, load

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


def steps_listed(window) -> list:
    listed = window.steps
    return [listed.item(row).data(Qt.ItemDataRole.UserRole) for row in range(listed.count())]


def test_the_steps_list_gains_the_force_steps_linked_both_ways_with_the_drawing(make_window, qtbot):
    window = window_on(make_window, FEEDER)
    assert not any(s.startswith("f") for s in steps_listed(window))  # the acceleration polygon is shown
    open_force_tab(window)
    made = window.drawings.force_polygon().polygon
    listed = steps_listed(window)
    assert listed[-len(made.steps):] == [s.id for s in made.steps]
    # A click on a force step's row: emphasised in the force polygon, its line of action laid out.
    sid = step_id(window, "Fᵢ(rod)")
    steps = window.steps
    window.side_tabs.setCurrentWidget(steps)
    steps.scrollToItem(steps.item(listed.index(sid)))
    row = steps.visualItemRect(steps.item(listed.index(sid)))
    QTest.mouseClick(steps.viewport(), Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier, row.center())
    assert window.drawings.force_scene.selected_step == sid
    assert Ref("force line", sid) in overlay_refs(window)
    # A click on a vector of the polygon: its row becomes the list's current one.
    other = step_id(window, "W(rod)")
    view = window.drawings.force_view
    QTest.mouseClick(view.viewport(), Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier,
                     arrow_middle(window, other))
    assert steps.currentItem().data(Qt.ItemDataRole.UserRole) == other
    assert window.drawings.force_scene.selected_step == other
    # Back to the acceleration polygon: the force steps leave the list.
    bar = window.drawings.third.tabBar()
    QTest.mouseClick(bar, Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier, bar.tabRect(0).center())
    assert not any(s.startswith("f") for s in steps_listed(window))


def test_hovering_a_joint_emphasises_the_forces_at_it_in_the_force_polygon(make_window, qtbot):
    window = window_on(make_window, FEEDER)
    open_force_tab(window)
    space = window.drawings.space_view
    at = space.mapFromScene(window.drawings.space_scene.joint_pos("A"))
    QTest.mouseMove(space.viewport(), at)
    scene = window.drawings.force_scene
    qtbot.waitUntil(lambda: scene.marked == "A", timeout=2000)
    emphasised = {ref.name for ref in scene.drawing.emphasised}
    made = window.drawings.force_polygon().polygon
    at_a = {s.id for s in made.steps if s.is_vector and "A" in s.points}
    assert emphasised == at_a
    # The forces of the crank on the rod and of the rod on the crank at A are equal and opposite
    # (Newton's third law, common practice): both are lit.
    vectors = {s.label: s.coords for s in made.steps if s.id in emphasised}
    (a0, a1), (b0, b1) = vectors["F(crank→rod)"], vectors["F(rod→crank)"]
    assert abs((a1[0] - a0[0]) + (b1[0] - b0[0])) < 1e-12 and abs((a1[1] - a0[1]) + (b1[1] - b0[1])) < 1e-12
    QTest.mouseMove(space.viewport(), QPoint(3, 3))
    qtbot.waitUntil(lambda: not scene.drawing.emphasised, timeout=2000)


BALER = kinematics.load_mechanism(SAMPLES / "baler-tamper-watt.json")  # the busiest force polygon of the samples


def label_boxes(window) -> list:
    """The viewport pixel boxes of the force polygon's step labels, as drawn."""
    from kinematics.drawing import Text
    from kinematics.drawing.declutter import text_box

    view, scene = window.drawings.force_view, window.drawings.force_scene
    boxes = []
    for p in scene.sheet.primitives:
        if isinstance(p, Text) and p.ref is not None and p.ref.kind == "step":
            x0, y0, x1, y1 = text_box(p)
            a, b = view.mapFromScene(QPointF(x0, -y1)), view.mapFromScene(QPointF(x1, -y0))
            boxes.append((p.text, a.x(), a.y(), b.x(), b.y()))
    return boxes


def test_the_labels_stand_in_the_pane_clear_of_the_legend_and_of_each_other(make_window):
    window = window_on(make_window, BALER)
    window.resize(1600, 1000)
    QApplication.processEvents()
    open_force_tab(window)
    window.drawings.force_view.fit_to_window()
    QApplication.processEvents()
    view = window.drawings.force_view
    boxes = label_boxes(window)
    found = {s.label for s in window.drawings.force_polygon().polygon.steps if s.role.name == "RESULT"}
    assert found <= {text for text, *_ in boxes}  # every force the polygon found is named
    width, height = view.viewport().width(), view.viewport().height()
    for text, x0, y0, x1, y1 in boxes:
        assert 0 <= x0 and x1 <= width and view.legend_height() <= y0 and y1 <= height, text
    for i, (a, *one) in enumerate(boxes):
        for b, *other in boxes[i + 1:]:
            assert not (one[0] < other[2] and other[0] < one[2] and one[1] < other[3] and other[1] < one[3]), (a, b)


def test_a_known_force_is_named_on_the_pane_when_chosen(make_window):
    window = window_on(make_window, FEEDER)
    open_force_tab(window)
    sid = step_id(window, "W(rod)")
    assert "W(rod)" not in {text for text, *_ in label_boxes(window)}
    window.steps.select_step(sid)  # as a click on its row in the steps list
    assert "W(rod)" in {text for text, *_ in label_boxes(window)}


def test_ctrl_shift_f_draws_the_forces_where_they_act_and_says_why_when_there_are_none(make_window, qtbot):
    window = window_on(make_window, FEEDER)
    scene = window.drawings.space_scene
    keys = Qt.KeyboardModifier.ControlModifier | Qt.KeyboardModifier.ShiftModifier
    QTest.keyClick(window, Qt.Key.Key_F, keys)
    assert window.space_forces_action.isChecked()
    drawn = [p for ref in scene.forces.by_ref for p in scene.forces.primitives_of(ref) if isinstance(p, Arrow)]
    steps = {s.id for s in window.drawings.force_polygon().polygon.steps}
    assert len(drawn) >= 5 and all(p.ref.kind == "force arrow" and p.ref.name in steps for p in drawn)
    # The view takes the arrows in.
    view = window.drawings.space_view
    rect = view.mapToScene(view.viewport().rect()).boundingRect()
    assert all(rect.contains(QPointF(p.start[0], -p.start[1])) for p in drawn)
    QTest.keyClick(window, Qt.Key.Key_F, keys)
    assert not scene.forces.by_ref
    window.document.replace(load(CLAW_FEED))  # no mass data
    QTest.keyClick(window, Qt.Key.Key_F, keys)
    assert "no masses and no loads" in window.status.text()
