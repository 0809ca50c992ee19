"""The cycle plot panel: curves equal to the core's sweep, real clicks, cursor, axes, units,
peaks, the fine sweep worker, coupler paths, and a look at the screen."""

import doctest
import json
import math
import subprocess
import sys

import numpy as np
import pytest
from PySide6.QtCore import QPointF, Qt
from PySide6.QtGui import QImage
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication

import app.cycle_series
import app.cycle_series as series
import kinematics
from app.cycle_panel import NO_CYCLE, PALETTE, CyclePanel
from app.cycle_series import Quantity, coupler_paths_mm, readable
from kinematics.cycle.peaks import peaks
from tests.designs import CARTON_PUSHER, CLAW_FEED, SAMPLES, SWING_LEVER, TRIPLE_ROCKER, load

SIX_BAR = SAMPLES / "stacker-transfer-stephenson.json"
SPEED_P = Quantity("velocity", "magnitude", "P")
ACCELERATION_P = Quantity("acceleration", "magnitude", "P")


@pytest.fixture
def panel(qtbot):
    widget = CyclePanel()
    qtbot.addWidget(widget)
    widget.resize(1100, 420)
    widget.show()
    qtbot.waitExposed(widget)
    return widget


def wrapped_order(result):
    """The samples sorted by driver angle in [0°, 360°), worked out here, not by the panel."""
    return np.argsort(result.driver_angle_deg % 360.0, kind="stable")


def curve_data(panel, quantity):
    x, y = panel.curves[quantity].getData()
    return np.asarray(x), np.asarray(y)


def test_the_plotted_speed_is_the_sweeps_own_array(panel):
    result = kinematics.sweep(load(CLAW_FEED), 360)
    panel.set_units("m", "rad/s")
    panel.set_sweep(result)
    panel.choose([SPEED_P])
    x, y = curve_data(panel, SPEED_P)
    order = wrapped_order(result)
    expected = np.linalg.norm(result.velocities[:, result.point_names.index("P")], axis=1)
    assert np.array_equal(y, expected[order])
    assert np.array_equal(x, (result.driver_angle_deg % 360.0)[order])
    assert np.all(np.diff(x) > 0) and 0.0 <= x[0] and x[-1] < 360.0


def test_units_convert_the_same_arrays(panel):
    result = kinematics.sweep(load(CLAW_FEED), 360)
    omega = Quantity("angular velocity", "rate", "rocker")
    panel.set_sweep(result)
    panel.choose([SPEED_P, omega])
    panel.set_units("in", "rpm")
    order = wrapped_order(result)
    speed = np.linalg.norm(result.velocities[:, result.point_names.index("P")], axis=1)
    # 1 in = 25.4 mm exactly (international inch, 1959); 1 rev/min = 2π rad / 60 s  # common practice
    assert np.allclose(curve_data(panel, SPEED_P)[1], speed[order] / 0.0254, rtol=1e-15)
    assert np.allclose(curve_data(panel, omega)[1], result.angular_velocity["rocker"][order] * 60 / (2 * math.pi),
                       rtol=1e-15)
    assert panel.plots["velocity"].getAxis("left").labelText == "v (in/s)"
    assert panel.plots["angular velocity"].getAxis("left").labelText == "ω (rpm)"


def test_a_real_click_on_the_plot_picks_that_angle(panel, qtbot):
    panel.set_sweep(kinematics.sweep(load(CLAW_FEED), 360))
    box = panel.plots["velocity"].getViewBox()
    (low, high), (bottom, top) = box.viewRange()
    scene_point = box.mapViewToScene(QPointF(123.0, 0.5 * (bottom + top)))
    at = panel.graphics.mapFromScene(scene_point)
    with qtbot.waitSignal(panel.angle_picked, timeout=2000) as picked:
        QTest.mouseClick(panel.graphics.viewport(), Qt.LeftButton, Qt.NoModifier, at)
    degrees_per_pixel = (high - low) / box.width()
    assert picked.args[0] == pytest.approx(123.0, abs=degrees_per_pixel)


def test_set_angle_moves_the_cursor_on_every_row(panel):
    panel.set_sweep(kinematics.sweep(load(CLAW_FEED), 360))
    panel.choose([SPEED_P, ACCELERATION_P])
    assert len(panel.cursors) == 2
    panel.set_angle(200.0)
    assert [c.value() for c in panel.cursors] == [200.0, 200.0]
    panel.set_angle(-30.0)
    assert all(c.value() == pytest.approx(330.0) and c.isVisible() for c in panel.cursors)
    panel.set_angle(None)
    assert not any(c.isVisible() for c in panel.cursors)


def test_ticking_another_quantity_in_the_list_changes_the_curves(panel):
    result = kinematics.sweep(load(CLAW_FEED), 360)
    panel.set_sweep(result)
    assert set(panel.curves) == {SPEED_P, ACCELERATION_P}  # the coupler point first
    alpha = Quantity("angular acceleration", "rate", "coupler")
    rows = {panel.choices.item(i).data(Qt.UserRole): panel.choices.item(i) for i in range(panel.choices.count())}
    rows[SPEED_P].setCheckState(Qt.Unchecked)
    rows[ACCELERATION_P].setCheckState(Qt.Unchecked)
    rows[alpha].setCheckState(Qt.Checked)
    assert list(panel.curves) == [alpha] and list(panel.plots) == ["angular acceleration"]
    assert np.array_equal(curve_data(panel, alpha)[1], result.angular_acceleration["coupler"][wrapped_order(result)])
    assert "O2" not in {q.subject for q in rows}  # a fixed pivot never moves: not offered


def test_components_and_sliding_rates_are_offered_and_plotted(panel):
    result = kinematics.sweep(load(SWING_LEVER), 360)
    panel.set_units("m", "rad/s")
    panel.set_sweep(result)
    vy = Quantity("velocity", "y", "A")
    slip = Quantity("acceleration", "sliding", "slot")
    panel.choose([vy, slip])
    order = wrapped_order(result)
    assert np.array_equal(curve_data(panel, vy)[1], result.velocities[:, result.point_names.index("A"), 1][order])
    assert np.array_equal(curve_data(panel, slip)[1], result.sliding_acceleration["slot"][order])
    assert slip.label == "aₛ slot" and vy.label == "vᵧ A"


def test_none_clears_the_plot_with_a_plain_message(panel):
    panel.set_sweep(kinematics.sweep(load(CLAW_FEED), 360))
    panel.set_sweep(None)
    assert panel.curves == {} and panel.plots == {} and panel.choices.count() == 0
    assert panel.message.text == NO_CYCLE
    assert panel.peaks.text() == "" and not panel.compute.isEnabled()
    panel.set_sweep(None, "no cycle: the design is unfinished")
    assert panel.message.text == "no cycle: the design is unfinished"


def test_time_axis_only_at_constant_speed(panel):
    accelerating = kinematics.sweep(load(CLAW_FEED), 360)
    assert accelerating.time_s is None
    panel.set_sweep(accelerating)
    assert not panel.x_choice.model().item(1).isEnabled()
    steady = kinematics.sweep(load(CARTON_PUSHER), 360)
    panel.set_sweep(steady)
    assert panel.x_choice.model().item(1).isEnabled()
    panel.x_choice.setCurrentIndex(1)
    quantity = panel.chosen[0]
    x, _ = curve_data(panel, quantity)
    assert np.array_equal(x, steady.time_s)
    bottom_row = list(panel.plots.values())[-1]
    assert bottom_row.getAxis("bottom").labelText == "time from the reference pose (s)"
    omega = 300 * 2 * math.pi / 60  # the design's 300 rpm  # common practice
    # A quarter turn past the reference pose takes (π/2)/ω.
    panel.set_angle(steady.driver_angle_deg[0] + 90.0)
    assert panel.cursors[0].value() == pytest.approx(0.5 * math.pi / omega, rel=1e-12)
    assert panel.axis.angle_of_x(0.5 * math.pi / omega) == pytest.approx((steady.driver_angle_deg[0] + 90) % 360)
    panel.set_sweep(accelerating)  # the time axis falls back to the driver angle
    assert panel.x_choice.currentIndex() == 0 and panel.axis.kind == "angle"


def test_a_rocking_driver_keeps_its_range_in_one_piece(panel):
    result = kinematics.sweep(load(TRIPLE_ROCKER), 360)
    assert not result.full_turn
    panel.set_sweep(result)
    low, high = result.range_deg
    span = panel.axis.span
    assert span[1] - span[0] == pytest.approx(high - low, abs=1e-5)
    assert 0.0 <= 0.5 * (span[0] + span[1]) < 360.0
    assert np.all(np.diff(curve_data(panel, panel.chosen[0])[0]) > 0)
    assert panel.note.isVisible() and "cannot turn fully" in panel.note.text()


def test_dead_point_ends_set_neither_the_scale_nor_the_peaks(panel):
    result = kinematics.sweep(load(TRIPLE_ROCKER), 360)
    omega = Quantity("angular velocity", "rate", "output")
    panel.set_sweep(result)
    panel.choose([omega])
    values = result.angular_velocity["output"]
    end = round(0.03 * len(values))
    inner = values[end:-end]
    low, high = panel.plots["angular velocity"].getViewBox().viewRange()[1]
    assert low <= inner.min() and inner.max() <= high
    assert high - low < np.ptp(values)  # the unbounded ends run off the plot
    at = end + int(np.argmax(np.abs(inner)))
    assert f"peak {readable(values[at])} rad/s at {panel.axis.along[at]:.1f}°" in panel.peaks.text()
    assert "left out of the scale and the peaks" in panel.peaks.text()


def test_a_two_step_rocking_sweep_still_has_peaks(panel):
    result = kinematics.sweep(load(TRIPLE_ROCKER), 2)
    panel.set_sweep(result)
    assert len(curve_data(panel, panel.chosen[0])[0]) == 2 and "peak" in panel.peaks.text()


def test_a_clockwise_driver_counts_time_the_way_it_turns(panel):
    design = {**CARTON_PUSHER, "driver": {**CARTON_PUSHER["driver"], "speed": {"value": -300, "unit": "rpm"}}}
    result = kinematics.sweep(load(design), 360)
    assert result.driver_angle_deg[1] < result.driver_angle_deg[0]
    panel.set_sweep(result)
    panel.x_choice.setCurrentIndex(1)
    panel.set_angle(result.driver_angle_deg[0] - 90.0)  # a quarter turn clockwise: (π/2)/ω
    assert panel.cursors[0].value() == pytest.approx(0.5 * math.pi / (300 * 2 * math.pi / 60), rel=1e-12)
    assert np.array_equal(curve_data(panel, panel.chosen[0])[0], result.time_s)


def test_the_peaks_readout_agrees_with_the_cores_peaks_table(panel):
    result = kinematics.sweep(kinematics.load_mechanism(SIX_BAR), 360)
    panel.set_units("m", "rad/s")
    panel.set_sweep(result)
    panel.choose([SPEED_P])
    table = peaks(result)["points"]["P"]
    assert f"peak {readable(table['max_speed'])} m/s at {table['at_deg'] % 360:.1f}°" in panel.peaks.text()
    assert readable(10737.4) == "10737" and readable(-53.3412) == "-53.34" and readable(2.5e-5) == "2.5e-05"


def test_the_window_and_the_command_leave_out_the_same_dead_point_ends(panel, tmp_path):
    """For a driver that rocks, the window's peaks and those of ``kinepoly sweep --json`` are the
    same samples' (both leave out the same share of the range at each dead point)."""
    design = tmp_path / "rocker.json"
    design.write_text(json.dumps(TRIPLE_ROCKER), encoding="utf-8")
    out = subprocess.run([sys.executable, "-m", "app.main", "sweep", str(design), "--steps", "360", "--json"],
                         capture_output=True, text=True)
    assert out.returncode == 0, out.stderr
    table = json.loads(out.stdout)["peaks"]
    result = kinematics.sweep(load(TRIPLE_ROCKER), 360)
    assert not result.full_turn and table["dead_point_share_left_out"] > 0
    panel.set_units("m", "rad/s")
    panel.set_sweep(result)
    point, link = table["points"]["B"], table["links"]["output"]
    # The accelerations peak at the first sample kept (they grow fastest towards a dead point).
    expected = {Quantity("velocity", "magnitude", "B"): (point["max_speed"], point["at_deg"]),
                Quantity("acceleration", "magnitude", "B"): (point["max_acceleration"], point["acceleration_at_deg"]),
                Quantity("angular velocity", "rate", "output"): (link["max_angular_velocity"], link["at_deg"]),
                Quantity("angular acceleration", "rate", "output"): (link["max_angular_acceleration"],
                                                                     link["acceleration_at_deg"])}
    panel.choose(list(expected))
    text = panel.peaks.text()
    for quantity, (value, at_deg) in expected.items():
        at = int(np.flatnonzero(result.driver_angle_deg == at_deg)[0])
        signed = float(series.si_values(result, quantity)[at])
        assert abs(signed) == pytest.approx(value, rel=1e-12)  # the same sample, maybe another rounding
        assert f"<b>{quantity.label}</b> peak {readable(signed)}" in text
        assert f"at {panel.axis.along[at]:.1f}°" in text


def test_a_new_sweep_updates_the_existing_curves_in_place(panel):
    mech = kinematics.load_mechanism(SIX_BAR)
    panel.set_sweep(kinematics.sweep(mech, 360))
    curve, plot = panel.curves[SPEED_P], panel.plots["velocity"]
    moved = kinematics.move_point(mech, "C", (112.0, 203.0))
    second = kinematics.sweep(moved, 360)
    panel.set_sweep(second)
    assert panel.curves[SPEED_P] is curve and panel.plots["velocity"] is plot
    speed = np.linalg.norm(second.velocities[:, second.point_names.index("P")], axis=1)
    assert np.array_equal(curve_data(panel, SPEED_P)[1], (speed / 1e-3)[wrapped_order(second)])  # mm/s shown


def test_the_fine_sweep_reaches_100_percent_and_equals_the_cores_sweep(panel, qtbot):
    mech = load(CLAW_FEED)
    coarse = kinematics.sweep(mech, 360)
    panel.set_sweep(coarse)
    job = panel.start_fine_sweep(36_000)
    seen = []
    job.progressed.connect(seen.append)
    assert panel.progress.isVisible() and panel.cancel.isVisible() and not panel.compute.isEnabled()
    with qtbot.waitSignal(job.finished, timeout=20_000):
        pass
    qtbot.waitUntil(lambda: panel.sweep is not coarse, timeout=5000)
    assert panel.progress.value() == 100 and not panel.progress.isVisible()
    assert [p for p in seen if 0 < p < 100] == [28, 56, 83]  # one report per 10 000-pose chunk
    reference = kinematics.sweep(mech, 36_000)
    assert np.array_equal(panel.sweep.driver_angle_deg, reference.driver_angle_deg)
    for field in ("positions", "velocities", "accelerations"):
        # By chunks, numpy's vector kernels may round the last bit differently.
        assert np.allclose(getattr(panel.sweep, field), getattr(reference, field), rtol=1e-13, atol=1e-13)
    assert len(curve_data(panel, SPEED_P)[0]) == 36_000
    panel.set_sweep(coarse)  # the same coarse sweep again (the window refreshes on every turn)
    assert len(panel.sweep.driver_angle_deg) == 36_000
    assert "36 000" in panel.shown_steps.text()


def test_cancel_stops_waiting_and_keeps_the_plot(panel, qtbot):
    coarse = kinematics.sweep(load(CLAW_FEED), 360)
    panel.set_sweep(coarse)
    job = panel.start_fine_sweep(100_000)
    QTest.mouseClick(panel.cancel, Qt.LeftButton)
    assert panel.job is None and not panel.progress.isVisible() and panel.compute.isEnabled()
    assert job.wait(30_000)
    QApplication.processEvents()
    assert panel.sweep is coarse and panel.progress.value() != 100
    assert len(curve_data(panel, SPEED_P)[0]) == 360


def test_a_fine_sweep_the_core_refuses_says_why(panel, qtbot):
    panel.set_sweep(kinematics.sweep(load(CLAW_FEED), 360))
    assert panel.start_fine_sweep(1) is not None
    # The refusal is at once: the thread may end before a wait for its finished signal could be set up,
    # so wait for the panel's own slot, connected before the thread started.
    qtbot.waitUntil(lambda: panel.job is None, timeout=10_000)
    assert panel.note.isVisible() and "fine sweep of 1 steps" in panel.note.text()
    assert "from 2 to 1,000,000" in panel.note.text()
    assert len(panel.sweep.driver_angle_deg) == 360 and panel.compute.isEnabled()


def test_an_edited_design_drops_the_fine_sweep_still_running(panel, qtbot):
    mech = load(CLAW_FEED)
    panel.set_sweep(kinematics.sweep(mech, 360))
    job = panel.start_fine_sweep(36_000)
    edited = kinematics.sweep(kinematics.move_point(mech, "P", (72.0, 141.0)), 360)
    panel.set_sweep(edited)
    assert panel.job is None
    job.wait(30_000)
    QApplication.processEvents()
    assert panel.sweep is edited


def test_coupler_paths_are_the_points_on_one_moving_link_in_mm():
    mech = load(CLAW_FEED)
    result = kinematics.sweep(mech, 36)
    paths = coupler_paths_mm(result, mech)
    assert list(paths) == ["P"] and paths["P"].shape == (36, 2)
    # Checked against the numeric pose solver, pose by pose.
    for k in (0, 7, 23):
        solved = kinematics.solve(mech, float(result.driver_angle_deg[k])).position("P")
        assert paths["P"][k] == pytest.approx(np.multiply(solved, 1e3), abs=1e-9)
    six_bar = kinematics.load_mechanism(SIX_BAR)
    assert list(coupler_paths_mm(kinematics.sweep(six_bar, 36), six_bar)) == ["P"]


def test_the_series_examples_run():
    assert doctest.testmod(app.cycle_series).failed == 0


def test_screenshots_show_labelled_curves(panel):
    panel.set_sweep(kinematics.sweep(kinematics.load_mechanism(SIX_BAR), 360))
    panel.set_angle(100.0)
    QApplication.processEvents()
    single = panel.grab()
    single.save("/tmp/cycle_panel.png")
    panel.choose([SPEED_P, ACCELERATION_P, Quantity("angular velocity", "rate", "follower")])
    panel.set_units("mm", "rpm")
    QApplication.processEvents()
    double = panel.grab()
    double.save("/tmp/cycle_panel_two.png")
    image = double.toImage().convertToFormat(QImage.Format_RGB32)
    argb = np.unique(np.frombuffer(image.constBits(), np.uint32)) & 0xFFFFFF
    colours = {f"#{value:06x}" for value in argb}
    assert {PALETTE[0].lower(), PALETTE[1].lower(), PALETTE[2].lower()} <= colours  # one curve per row drawn
    assert len(panel.plots) == 3


def test_jerk_is_offered_ticked_and_plotted_from_the_sweeps_own_arrays(panel):
    result = kinematics.sweep(kinematics.load_mechanism(SIX_BAR), 360)
    panel.set_units("mm", "rad/s")
    panel.set_sweep(result)
    jerk = Quantity("jerk", "magnitude", "P")
    spin = Quantity("angular jerk", "rate", list(result.angular_jerk)[-1])
    rows = {panel.choices.item(i).data(Qt.UserRole): panel.choices.item(i) for i in range(panel.choices.count())}
    assert {Quantity("jerk", "x", "P"), Quantity("jerk", "y", "P")} <= set(rows)
    for quantity in list(panel.curves):
        rows[quantity].setCheckState(Qt.Unchecked)
    rows[jerk].setCheckState(Qt.Checked)
    rows[spin].setCheckState(Qt.Checked)
    assert list(panel.plots) == ["jerk", "angular jerk"]
    order = wrapped_order(result)
    magnitude = np.linalg.norm(result.jerks[:, result.point_names.index("P")], axis=1)
    assert np.allclose(curve_data(panel, jerk)[1], magnitude[order] * 1000.0, rtol=1e-15)  # m/s³ -> mm/s³
    assert np.array_equal(curve_data(panel, spin)[1], result.angular_jerk[spin.subject][order])
    assert panel.plots["jerk"].getAxis("left").labelText == "j (mm/s³)"
    assert panel.plots["angular jerk"].getAxis("left").labelText == "dα/dt (rad/s³)"
    # The readout's peak is the core's peaks table's (kinematics.cycle.peaks), in the unit shown.
    table = peaks(result)["points"]["P"]
    assert (f"peak {readable(table['max_jerk'] * 1000.0)} mm/s³ at {table['jerk_at_deg'] % 360:.1f}°"
            in panel.peaks.text())
