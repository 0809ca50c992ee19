"""The closed-form cycle sweep against pointwise solves, derivatives and closed-form checks."""

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import kinematics
from kinematics.cycle.measures import output_motion
from kinematics.cycle.sweep import sweep, sweep_csv, verify_sweep
from kinematics.groups.loops import grashof_class
from tests import CASE_FACTOR
from tests.designs import SAMPLE_FILES, SAMPLES, four_bar, slider_crank, solve_swept


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.name)
def test_sweep_equals_pointwise_solve_and_the_numeric_check(path):
    mech = kinematics.load_mechanism(path)
    result = sweep(mech, 72)
    for k in range(0, 72, 7):
        solution = solve_swept(mech, result, k)
        index = [result.point_names.index(n) for n in solution.point_names]
        size = mech.size * mech.metres_per_unit
        assert np.abs(solution.positions - result.positions[k][index]).max() <= 1e-9 * size
        assert np.allclose(solution.velocities, result.velocities[k][index], rtol=1e-9,
                           atol=1e-9 * np.abs(result.velocities).max())
        assert np.allclose(solution.accelerations, result.accelerations[k][index], rtol=1e-9,
                           atol=1e-9 * np.abs(result.accelerations).max())
    check = verify_sweep(sweep(mech, 720))
    assert max(check.values()) < 1e-9, check


def _derivative_check(mech, steps=20000):
    """Central differences over the swept angle: error O(h²); with h = 2π/20000 and the samples'
    sizes, 1e-5 of each quantity's largest value bounds it (measured about 1e-7)."""
    result = sweep(mech, steps)
    if result.driver_length_m is not None:
        # A stroke at constant speed: the poses are equal steps in time; its ends have no neighbour beyond.
        h = (result.driver_length_m[1] - result.driver_length_m[0]) / mech.driver.linear_speed_m_s
        inner = slice(1, -1)
    else:
        h = math.radians(result.driver_angle_deg[1] - result.driver_angle_deg[0]) / mech.driver.speed_rad_s
        inner = slice(None)
    for values, rates in ((result.positions, result.velocities), (result.velocities, result.accelerations)):
        central = (np.roll(values, -1, axis=0) - np.roll(values, 1, axis=0)) / (2 * h)
        assert np.abs(central - rates)[inner].max() <= 1e-5 * np.abs(rates).max()


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.name)
def test_swept_rates_are_derivatives_of_the_swept_motion(path):
    mech = kinematics.load_mechanism(path)
    if mech.driver.angular_acceleration_rad_s2 == 0 and mech.driver.linear_acceleration_m_s2 == 0:
        _derivative_check(mech)


@settings(max_examples=40 * CASE_FACTOR)
@given(a=st.floats(10, 60), b=st.floats(80, 200), c=st.floats(60, 180), d=st.floats(80, 200),
       theta=st.floats(0, 359))
def test_random_crank_rockers_close_the_loop_and_differentiate(a, b, c, d, theta):
    verdict, turns = grashof_class(d, a, b, c)
    s_, p, q, l_ = sorted((a, b, c, d))
    # Close to a change point (s + l → p + q) the transmission angle nears 0° and the
    # accelerations spike within a fraction of a degree, beyond what central differences
    # at 0.018° can follow: keep a margin of 5 % of l  # common practice (conditioning).
    if verdict != "crank-rocker" or turns != "input" or (p + q) - (s_ + l_) < 0.05 * l_:
        return
    try:
        doc = four_bar(a, b, c, d, theta)
    except (ValueError, ZeroDivisionError):  # the test's builder cannot place this geometry
        return
    mech = kinematics.load_mechanism(doc)
    result = sweep(mech, 720)
    i = result.point_names.index
    # Loop closure: every link keeps its length to 1e-9 of the mechanism's size.
    for p, q, length in (("A", "B", b), ("O4", "B", c), ("O2", "A", a)):
        drawn = np.linalg.norm(result.positions[:, i(q)] - result.positions[:, i(p)], axis=1) * 1000
        assert np.abs(drawn - length).max() <= 1e-9 * (a + b + c + d)
    _derivative_check(mech, 20000)


@settings(max_examples=40 * CASE_FACTOR)
@given(r=st.floats(10, 60), extra=st.floats(30, 200), e=st.floats(-40, 40), theta=st.floats(0, 359))
def test_random_slider_cranks_differentiate(r, extra, e, theta):
    mech = kinematics.load_mechanism(slider_crank(r, r + abs(e) + extra, e, theta))
    result = sweep(mech, 720)
    assert result.full_turn
    _derivative_check(mech, 20000)


def test_quick_return_time_ratio_equals_the_closed_form():
    """Crank and slotted lever, slot through the lever pivot: the crank turns β = 2·arccos(r/d)
    during the quick stroke, ratio (360° − β)/β (Uicker, Pennock, Shigley, Theory of Machines and
    Mechanisms, 4th ed., §1.11 quick-return mechanisms  # from memory (section number))."""
    mech = kinematics.load_mechanism(SAMPLES / "tile-trimmer-quick-return.json")
    motion = output_motion(mech, sweep(mech, 3600))
    r, d = 60.0, 150.0
    beta = 2 * math.degrees(math.acos(r / d))
    # The limit angles are interpolated zero crossings of ω: 1e-4 relative is ample at 0.1° steps.
    assert motion["time_ratio"] == pytest.approx((360 - beta) / beta, rel=1e-4)
    assert motion["fast_stroke_driver_deg"] == pytest.approx(beta, abs=1e-3)
    # Swing of the lever 2·arcsin(r/d) (same source  # from memory).
    assert motion["travel"] == pytest.approx(2 * math.degrees(math.asin(r / d)), abs=1e-4)


def test_csv_has_the_documented_columns_at_full_precision():
    mech = kinematics.load_mechanism(SAMPLES / "cap-press-feeder.json")
    result = sweep(mech, 8)
    lines = sweep_csv(result).splitlines()
    header = lines[0].split(",")
    assert header[:7] == ["driver_angle_deg", "O2.x [m]", "O2.y [m]", "O2.vx [m/s]", "O2.vy [m/s]",
                          "O2.ax [m/s^2]", "O2.ay [m/s^2]"]
    assert "crank.omega [rad/s]" in header and "ram.sliding_acceleration [m/s^2]" in header
    assert len(lines) == 9
    column = header.index("D.ax [m/s^2]")
    assert float(lines[3].split(",")[column]) == result.accelerations[2, result.point_names.index("D"), 0]


def test_a_driver_that_cannot_turn_fully_sweeps_between_its_dead_points():
    mech = kinematics.load_mechanism(four_bar(100, 60, 90, 120, 60))
    result = sweep(mech, 200)
    assert not result.full_turn
    low, high = result.range_deg
    assert low < 60 < high
    # The ends lie 1e-6° short of a dead point, where the Jacobian is nearly singular: the numeric
    # check agrees to 1e-6 there (measured 1e-8), and the branch to 1e-12.
    check = verify_sweep(result)
    assert check["branch"] < 1e-12 and max(check.values()) < 1e-6
    # At each dead point coupler and rocker are in line (the dyad's determinant vanishes  # common practice).
    for angle in (low, high):
        t = math.radians(angle)
        a = np.array([100 * math.cos(t), 100 * math.sin(t)])
        assert np.linalg.norm(a - [120, 0]) == pytest.approx(60 + 90, abs=1e-6) or \
            np.linalg.norm(a - [120, 0]) == pytest.approx(90 - 60, abs=1e-6)


def test_solve_does_not_depend_on_what_was_solved_before():
    """Poses reached earlier are kept as starting points; the answer must not depend on them."""
    path = SAMPLES / "stacker-transfer-stephenson.json"
    fresh = kinematics.solve(kinematics.load_mechanism(path), 301.0)
    mech = kinematics.load_mechanism(path)
    for angle in (10.0, 250.0, 120.0, 299.0, 302.0):
        kinematics.solve(mech, angle)
    again = kinematics.solve(mech, 301.0)
    assert np.allclose(again.positions, fresh.positions, rtol=0, atol=1e-12)
    assert np.allclose(again.accelerations, fresh.accelerations, rtol=1e-10, atol=1e-10)


def test_a_sweep_by_chunks_reports_progress_equals_the_whole_and_can_be_cancelled():
    from kinematics.cycle.sweep import PROGRESS_CHUNK
    from kinematics.errors import SweepCancelled

    mech = kinematics.load_mechanism(SAMPLES / "stacker-transfer-stephenson.json")
    steps = 2 * PROGRESS_CHUNK + 500
    seen = []
    chunked = sweep(mech, steps, progress=seen.append)
    whole = sweep(mech, steps)
    assert seen == [PROGRESS_CHUNK / steps, 2 * PROGRESS_CHUNK / steps, 1.0]
    # numpy's vector kernels may round the last bit differently for other array lengths.
    assert np.allclose(chunked.accelerations, whole.accelerations, rtol=1e-13, atol=1e-13)
    assert np.allclose(chunked.angular_velocity["arm"], whole.angular_velocity["arm"], rtol=1e-13, atol=1e-13)
    with pytest.raises(SweepCancelled):
        sweep(mech, steps, progress=lambda done: done < 0.4)
