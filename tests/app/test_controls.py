"""The driver-angle control and the status line."""

import pytest
from PySide6.QtCore import Qt
from PySide6.QtTest import QTest

from app.document import Analysis
from app.status import status_text
from kinematics.groups.steps import agreement
from tests.designs import CLAW_FEED, TRIPLE_ROCKER


def test_a_typed_angle_and_the_slider_turn_the_driver(make_window):
    window = make_window(CLAW_FEED)
    window.angle.spin.setValue(123.0)
    assert window.document.solution.driver_angle_deg == pytest.approx(123.0)
    window.angle.slider.setValue(2705)
    assert window.document.solution.driver_angle_deg == pytest.approx(270.5)
    assert window.angle.spin.value() == pytest.approx(270.5)
    assert "driver at 270.50°" in window.status.text()  # as the sheet says it: one rounding rule


def test_play_turns_the_driver_until_paused(make_window, qtbot):
    window = make_window(CLAW_FEED)
    start = window.document.solution.driver_angle_deg
    QTest.mouseClick(window.angle.play, Qt.LeftButton)
    assert window.angle.timer.isActive()
    qtbot.waitUntil(lambda: abs(window.document.solution.driver_angle_deg - start) > 3.0, timeout=3000)
    QTest.mouseClick(window.angle.play, Qt.LeftButton)
    assert not window.angle.timer.isActive()
    paused = window.document.solution.driver_angle_deg
    qtbot.wait(100)
    assert window.document.solution.driver_angle_deg == paused
    assert window.angle.spin.value() == pytest.approx(paused % 360.0, abs=0.05), "shown when play stops"


def test_each_frame_of_play_turns_on_from_the_last_pose_even_while_the_number_lags(make_window):
    from app.angle_control import ANIMATION_STEP_DEG

    window = make_window(CLAW_FEED)
    start = window.document.solution.driver_angle_deg
    QTest.mouseClick(window.angle.play, Qt.LeftButton)
    window.angle.timer.stop()  # frames by hand, faster than the shown number follows
    for _ in range(5):
        window.angle.advance()
    assert window.document.solution.driver_angle_deg == pytest.approx((start + 5 * ANIMATION_STEP_DEG) % 360.0)
    QTest.mouseClick(window.angle.play, Qt.LeftButton)


def test_an_angle_that_cannot_be_assembled_keeps_the_pose_and_says_so(make_window):
    window = make_window(TRIPLE_ROCKER)
    window.turn_driver(40.0)
    kept = window.document.solution
    window.angle.spin.setValue(180.0)  # the input link of this triple rocker cannot reach 180°
    assert window.document.solution is kept
    assert "cannot turn to 180.00°" in window.status.text()
    assert window.angle.spin.value() == pytest.approx(40.0)


def test_the_status_line_lists_every_warning_and_the_cross_check(make_window):
    window = make_window(CLAW_FEED)
    construction = window.document.construction
    text = status_text(Analysis(solution=construction.solution, construction=construction), "note first")
    assert text.startswith("note first")
    # Below the rounding floor the figure is said as rounding (no place: nothing differs).
    assert agreement(construction.max_relative_difference) in text
    shown = type(construction)(**{**construction.__dict__, "max_relative_difference": 3.2e-12})
    text = status_text(Analysis(solution=construction.solution, construction=shown))
    assert "3.2e-12" in text and construction.where in text
    warned = Analysis(solution=construction.solution, construction=type(construction)(
        **{**construction.__dict__, "warnings": ("near a dead point", "group G is not a dyad")}))
    text = status_text(warned)
    assert "warning: near a dead point" in text and "warning: group G is not a dyad" in text
    assert status_text(Analysis(problem="cannot assemble at driver angle 9.0°")) == \
        "cannot analyse: cannot assemble at driver angle 9.0°"


def test_play_rocks_a_driver_that_cannot_turn_fully_between_its_dead_points(make_window):
    window = make_window(TRIPLE_ROCKER)
    low, high = window.document.sweep.range_deg
    assert not window.document.sweep.full_turn
    seen = []
    for _ in range(int(2.5 * (high - low) / 2.0) + 5):
        window.angle.advance()
        angle = window.document.solution.driver_angle_deg
        seen.append(low + (angle - low) % 360.0)
    assert "cannot turn" not in window.status.text()
    assert min(seen) == pytest.approx(low, abs=2.1) and max(seen) == pytest.approx(high, abs=2.1)


def test_the_cycle_tab_plots_the_document_sweep_and_turns_the_driver(make_window):
    window = make_window(CLAW_FEED)
    assert window.cycle is None, "made on first use only"
    window.turn_driver(120.0)
    tabs = window.side_tabs
    tabs.setCurrentIndex(next(i for i in range(tabs.count()) if tabs.tabText(i) == "Cycle"))
    doc, cycle = window.document, window.cycle
    assert tabs.currentWidget() is window.cycle_pages and window.cycle_pages.currentWidget() is cycle
    assert cycle.coarse is doc.sweep and doc.sweep is not None
    assert cycle.angle_deg == pytest.approx(120.0)
    window.turn_driver(150.0)
    assert cycle.angle_deg == pytest.approx(150.0)
    cycle.angle_picked.emit(222.0)  # a click on the plot
    assert doc.solution.driver_angle_deg == pytest.approx(222.0)
    window.length_units.setCurrentText("m")
    window.speed_units.setCurrentText("rpm")
    assert (cycle.units.length, cycle.units.speed) == ("m", "rpm")
    window.new_design()
    assert cycle.coarse is None and "not ready to plot" in cycle.reason


def test_one_driver_angle_reads_the_same_in_the_window_and_on_the_sheet(make_window):
    from kinematics.drawing import Ref, Text
    from kinematics.drawing.layout import draw_sheet

    window = make_window(CLAW_FEED)
    window.turn_driver(60.0249)
    assert window.angle.spin.text() == "60.02 °"
    assert "driver at 60.02°" in window.status.text()
    sheet = draw_sheet(window.document.construction)
    block = " ".join(p.text for p in sheet.primitives if isinstance(p, Text) and p.ref == Ref("title block"))
    assert "at 60.02°," in block
