"""What a drag holds back to keep each frame short, and that all of it catches up when the drag ends:
the cycle sweep (paths, plot), the step list, the status line, a hidden Design tab, antialiasing."""

import math

import numpy as np
import pytest
from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QPainter
from PySide6.QtTest import QTest

import kinematics
from app.document import SWEEP_STEPS
from app.steps_panel import step_text
from app.throttle import Throttle
from kinematics.drawing import Ref
from kinematics.groups.steps import agreement
from tests.app.drawn import outline
from tests.designs import CLAW_FEED


def test_a_throttle_runs_the_first_live_call_holds_the_rest_and_never_loses_the_last(qtbot):
    runs, late = [], []
    throttle = Throttle(lambda: runs.append(len(runs)), interval_ms=60)
    throttle.ran_late.connect(lambda: late.append(True))
    throttle(live=True)
    assert runs == [0] and not throttle.held
    throttle(live=True)
    throttle(live=True)
    assert runs == [0] and throttle.held, "calls within the interval are held"
    qtbot.waitUntil(lambda: len(runs) == 2, timeout=1000)
    assert late == [True] and not throttle.held, "the held call ran when the interval was over"
    throttle(live=True)
    assert throttle.held
    throttle.flush()
    assert len(runs) == 3 and late == [True, True] and not throttle.held
    throttle(live=True)  # the interval is over: at once, and holding the next
    throttle(live=True)
    assert len(runs) == 4 and throttle.held
    throttle(live=False)  # not live: at once, whatever was held
    assert len(runs) == 5 and not throttle.held


def _drag_fast(window, name, offsets_mm, release=True):
    """A press on ``name`` and one mouse move per offset (machine mm), with no pause between."""
    view = window.drawings.space_view
    start = window.drawings.space_scene.joint_pos(name)
    QTest.mousePress(view.viewport(), Qt.LeftButton, Qt.NoModifier, view.mapFromScene(start))
    for dx, dy in offsets_mm:
        QTest.mouseMove(view.viewport(), view.mapFromScene(start + QPointF(dx, -dy)))
    if release:
        dx, dy = offsets_mm[-1]
        QTest.mouseRelease(view.viewport(), Qt.LeftButton, Qt.NoModifier,
                           view.mapFromScene(start + QPointF(dx, -dy)))


def _antialiased(window) -> list:
    drawings = window.drawings
    return [bool(v.renderHints() & QPainter.Antialiasing)
            for v in (drawings.space_view, drawings.velocity_view, drawings.acceleration_view)]


def test_everything_held_back_during_a_drag_is_of_the_final_design_when_it_ends(make_window):
    window = make_window(CLAW_FEED)
    doc = window.document
    window.snapping.setChecked(False)
    moves = [(0.4 * i, 0.2 * i) for i in range(1, 25)]
    _drag_fast(window, "B", moves, release=False)
    assert doc.sweep_behind, "moves faster than ten a second leave the sweep behind for a moment"
    assert _antialiased(window) == [False] * 3, "drawn without antialiasing while the mouse drags"
    _drag_fast(window, "B", [moves[-1]])  # the last move and the release
    mech = doc.mechanism
    assert not doc.sweep_behind
    fresh = kinematics.sweep(mech, steps=SWEEP_STEPS)
    np.testing.assert_array_equal(doc.sweep.positions, fresh.positions)
    # The coupler point's path on the space diagram is the final design's.
    (path,) = (outline(item) for item in window.drawings.space_scene.paths.items_of(Ref("path", "P")))
    track = fresh.positions[:, fresh.point_names.index("P")] * 1e3
    assert len(path) >= len(track)
    for k in (0, len(track) // 3, len(track) - 1):
        x, y = path[k]
        assert (x, -y) == pytest.approx(tuple(track[k]), abs=1e-9)
    steps = [*doc.construction.velocity.steps, *doc.construction.acceleration.steps]
    listed = [window.steps.item(i).text() for i in range(window.steps.count())]
    assert listed == [step_text(s, *window.steps.units) for s in steps]
    assert agreement(doc.construction.max_relative_difference) in window.status.text()
    assert _antialiased(window) == [True] * 3


def test_a_hidden_design_tab_shows_the_dragged_joint_where_the_drag_left_it(make_window):
    window = make_window(CLAW_FEED)
    window.snapping.setChecked(False)
    window.properties.show_point("B")
    assert not window.properties.isVisible()
    _drag_fast(window, "B", [(2.0, 1.0), (4.0, 2.0), (6.0, 3.0)])
    x, y = window.document.mechanism.points["B"]
    assert (window.properties.x.value(), window.properties.y.value()) == pytest.approx((x, y), abs=1e-3)


def test_a_drag_within_one_grid_node_edits_nothing(make_window):
    window = make_window(CLAW_FEED)
    window.snapping.setChecked(True)
    grid = window.grid_mm()
    before = window.document.mechanism
    _drag_fast(window, "B", [(0.1 * grid, 0.1 * grid), (0.2 * grid, -0.1 * grid)])
    assert window.document.mechanism.points == before.points
    assert window.document.undo_stack.count() == 0


def test_a_polygon_keeps_its_scale_while_its_drawing_still_fits_and_refits_when_it_does_not(make_window):
    window = make_window(CLAW_FEED)
    view = window.drawings.velocity_view
    drawing = QRectF(window.drawings.velocity_scene.content_rect)
    scale = view.transform().m11()
    view.show_rect(drawing.adjusted(0.0, 0.0, -0.05 * drawing.width(), 0.0))  # a little smaller: still fits well
    assert view.transform().m11() == scale
    view.show_rect(drawing.adjusted(0.0, 0.0, 2.0 * drawing.width(), 0.0))  # out of the view: refitted
    assert view.transform().m11() < 0.5 * scale
    visible = view.mapToScene(view.viewport().rect()).boundingRect()
    assert visible.contains(view.fit_rect)
    view.show_rect(QRectF(drawing.topLeft(), drawing.size() * 0.2))  # far smaller than the view: refitted
    assert view.transform().m11() > 2.0 * scale


def test_the_table_after_a_drag_shows_the_final_pose(make_window):
    window = make_window(CLAW_FEED)
    window.snapping.setChecked(False)
    _drag_fast(window, "B", [(1.5 * i, -1.0 * i) for i in range(1, 12)])
    solution = window.document.solution
    model = window.table.results
    for name, row in model.rows.items():
        speed_mm_s = 1e3 * math.hypot(*solution.velocity(name))
        shown = model.item(row, 1).data(Qt.UserRole)
        assert shown == pytest.approx(speed_mm_s, rel=1e-12, abs=1e-9 * max(1.0, speed_mm_s)), name
