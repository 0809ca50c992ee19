"""Real mouse drags on the space diagram: design edits, driver turns, refusals, random drags."""

import math
import random

import pytest
from PySide6.QtCore import QPointF, Qt
from PySide6.QtTest import QTest

from tests import CASE_FACTOR
from tests.designs import CARTON_PUSHER, CLAW_FEED, SWING_LEVER, load


def joint_scene_pos(window, name) -> QPointF:
    return window.drawings.space_scene.joint_pos(name)


def mm_per_pixel(view) -> float:
    return 1.0 / view.transform().m11()


def drag(window, name, offsets_mm):
    """Press on joint ``name``, move through ``offsets_mm`` (machine mm, x right, y up, from the
    press), release at the last one."""
    return drag_from(window, joint_scene_pos(window, name), offsets_mm)


def drag_from(window, start: QPointF, offsets_mm):
    """Press on the space diagram at scene position ``start``, move through ``offsets_mm``
    (machine mm from the press), release at the last one; returns the view."""
    view = window.drawings.space_view
    QTest.mousePress(view.viewport(), Qt.LeftButton, Qt.NoModifier, view.mapFromScene(start))
    for dx, dy in offsets_mm:
        QTest.mouseMove(view.viewport(), view.mapFromScene(start + QPointF(dx, -dy)))
    dx, dy = offsets_mm[-1]
    QTest.mouseRelease(view.viewport(), Qt.LeftButton, Qt.NoModifier, view.mapFromScene(start + QPointF(dx, -dy)))
    return view


def test_dragging_a_joint_moves_it_and_undo_returns(make_window):
    window = make_window(CLAW_FEED)
    doc = window.document
    before = dict(doc.mechanism.points)
    view = drag(window, "B", [(3.0, 1.0), (6.0, 3.0), (10.0, 5.0)])
    tolerance = 1.5 * mm_per_pixel(view)  # the mouse moves in whole pixels
    x, y = doc.mechanism.points["B"]
    assert x == pytest.approx(before["B"][0] + 10.0, abs=tolerance)
    assert y == pytest.approx(before["B"][1] + 5.0, abs=tolerance)
    assert doc.mechanism.points["A"] == before["A"]
    assert doc.undo_stack.count() == 1, "one drag is one undo step"
    assert doc.solution is not None
    doc.undo_stack.undo()
    assert dict(doc.mechanism.points) == before
    doc.undo_stack.redo()
    assert doc.mechanism.points["B"][0] == pytest.approx(before["B"][0] + 10.0, abs=tolerance)


def test_two_drags_are_two_undo_steps(make_window):
    window = make_window(CLAW_FEED)
    drag(window, "B", [(5.0, 0.0)])
    drag(window, "P", [(0.0, 5.0)])
    assert window.document.undo_stack.count() == 2


def test_dragging_the_crank_turns_the_driver_without_an_edit(make_window):
    window = make_window(CLAW_FEED)
    doc = window.document
    points = dict(doc.mechanism.points)
    # A sits at 50 mm from O2 at 53.13°; take it round to 90° in a few moves.
    a = doc.solution.position("A") * 1e3
    target = (0.0, 50.0)
    view = drag(window, "A", [(t * (target[0] - a[0]), t * (target[1] - a[1])) for t in (0.3, 0.6, 1.0)])
    pixel_deg = math.degrees(1.5 * mm_per_pixel(view) / 50.0)
    assert doc.angle_deg == pytest.approx(90.0, abs=pixel_deg)
    assert doc.solution.driver_angle_deg == pytest.approx(90.0, abs=pixel_deg)
    assert dict(doc.mechanism.points) == points
    assert doc.undo_stack.count() == 0
    assert window.angle.spin.value() == pytest.approx(doc.angle_deg, abs=0.06)


def test_a_drag_out_of_reach_keeps_the_last_valid_design_and_says_so(make_window):
    window = make_window(CLAW_FEED)
    doc = window.document
    window.turn_driver(200.0)
    assert doc.solution.driver_angle_deg == 200.0
    # At 200° the crank pin is about 50 mm left of O2; coupler + rocker reach about 242 mm:
    # O4 dragged 300 mm to the right cannot be reached.
    drag(window, "O4", [(10.0, 0.0), (100.0, 0.0), (300.0, 0.0)])
    assert doc.solution is not None and doc.construction is not None
    assert doc.mechanism.points["O4"][0] < 170.0 + 300.0 - 1.0
    assert "cannot go" in window.status.text() and "last valid design is kept" in window.status.text()
    assert doc.undo_stack.count() == 1  # the reachable part of the drag
    doc.undo_stack.undo()
    assert doc.mechanism.points["O4"] == (170.0, 0.0)


def test_a_moving_joint_is_edited_in_the_reference_pose(make_window):
    window = make_window(CLAW_FEED)
    window.turn_driver(120.0)
    drag(window, "B", [(4.0, 0.0)])
    assert window.document.angle_deg is None
    assert "reference pose" in window.status.text()


def test_a_sliding_joint_stays_on_its_guide(make_window):
    window = make_window(CARTON_PUSHER)
    doc = window.document
    drag(window, "D", [(10.0, 7.0)])
    x, y = doc.mechanism.points["D"]
    assert y == pytest.approx(-15.0, abs=1e-9), "the block stays on the line E-F"
    assert x > 150.0
    assert doc.solution is not None


def test_moving_a_guide_end_carries_the_block_onto_the_new_line(make_window):
    window = make_window(CARTON_PUSHER)
    doc = window.document
    drag(window, "F", [(0.0, 10.0)])
    e, f, d = (doc.mechanism.points[p] for p in ("E", "F", "D"))
    cross = (f[0] - e[0]) * (d[1] - e[1]) - (f[1] - e[1]) * (d[0] - e[0])
    assert abs(cross) < 1e-6 * math.dist(e, f) ** 2
    assert doc.solution is not None


RANDOM_DRAGS = 200 * CASE_FACTOR  # 2,000 with KINEPOLY_FULL=1


@pytest.mark.parametrize("design", [CLAW_FEED, CARTON_PUSHER, SWING_LEVER], ids=["four-bar", "slider", "slot"])
def test_random_drags_never_fail(make_window, design):
    window = make_window(design)
    doc = window.document
    start = dict(doc.mechanism.points)
    chance = random.Random(20261201)
    names = list(doc.mechanism.points)
    size = doc.mechanism.size
    for _ in range(RANDOM_DRAGS // 3 + 1):
        name = chance.choice(names)
        moves = [(chance.uniform(-0.4, 0.4) * size, chance.uniform(-0.4, 0.4) * size) for _ in range(3)]
        drag(window, name, moves)
        assert doc.solution is not None, window.status.text()
        if chance.random() < 0.1:
            window.turn_driver(chance.uniform(0.0, 360.0))
    while doc.undo_stack.canUndo():
        doc.undo_stack.undo()
    assert dict(doc.mechanism.points) == start


def test_a_joint_clicked_in_the_space_diagram_is_the_one_the_design_tab_shows(make_window):
    window = make_window(CLAW_FEED)
    view = window.drawings.space_view
    at = view.mapFromScene(joint_scene_pos(window, "P"))
    QTest.mouseClick(view.viewport(), Qt.LeftButton, Qt.NoModifier, at)
    panel = window.properties
    assert panel.point.currentText() == "P"
    x, y = window.document.mechanism.points["P"]
    assert (panel.x.value(), panel.y.value()) == (pytest.approx(x), pytest.approx(y))
    assert window.document.mechanism.points == load(CLAW_FEED).points  # a click edits nothing
    drag(window, "B", [(4.0, 2.0)])
    assert panel.point.currentText() == "B"
    assert panel.x.value() == pytest.approx(window.document.mechanism.points["B"][0], abs=1e-3)
