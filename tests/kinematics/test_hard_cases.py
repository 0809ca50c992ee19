"""Hard cases a reviewer found: change points, designs drawn at a dead point, linkages far from
the origin, file order, and arguments that must be refused in words."""

import math

import numpy as np
import pytest

import kinematics
from kinematics.cycle.checks import loop_checks
from kinematics.cycle.sweep import sweep, verify_sweep
from tests.designs import SAMPLES, driver

PARALLELOGRAM = {"kinepoly": 1, "points": {"O2": [0, 0], "A": [0, 40], "B": [100, 40], "O4": [100, 0]},
                 "ground": ["O2", "O4"], "links": {"crank": ["O2", "A"], "coupler": ["A", "B"], "rocker": ["O4", "B"]},
                 "driver": driver(rpm=60)}
AT_DEAD_POINT = {"kinepoly": 1, "points": {"O2": [60, 0], "A": [60, 80], "B": [30, 40], "O4": [0, 0]},
                 "ground": ["O2", "O4"], "links": {"crank": ["O2", "A"], "coupler": ["A", "B"], "rocker": ["O4", "B"]},
                 "driver": driver(rpm=30)}


@pytest.mark.parametrize("steps", [4, 7, 360])
def test_a_sweep_through_a_change_point_is_refused_plainly(steps):
    """A parallelogram passes its change point where all pins are in line (s + l = p + q  # common practice)."""
    mech = kinematics.load_mechanism(PARALLELOGRAM)
    with pytest.raises(kinematics.ParallelLines, match="passes straight \\(a change point\\)"):
        sweep(mech, steps)
    # Pose by pose the solver keeps the branch whose velocity is continuous: the parallelogram's,
    # where the rocker turns with the crank.
    assert kinematics.solve(mech, 270.0).angular_velocity["rocker"] == pytest.approx(2 * math.pi, rel=1e-9)


def test_a_design_drawn_at_its_dead_point_is_analysed():
    mech = kinematics.load_mechanism(AT_DEAD_POINT)
    result = sweep(mech, 90)
    assert not result.full_turn and result.range_deg == pytest.approx((90.0, 270.0), abs=1e-6)
    solution = kinematics.solve(mech, 180.0)
    index = [result.point_names.index(n) for n in solution.point_names]
    k = int(np.argmin(np.abs(result.driver_angle_deg - 180.0)))
    assert result.driver_angle_deg[k] == pytest.approx(180.0, abs=1.1)
    # |A − O4|² = 10000 + 9600·cos θ ≤ 100² holds exactly for 90° ≤ θ ≤ 270° (law of cosines  # common practice)
    a = solution.position("A")
    assert np.hypot(*a) == pytest.approx(0.02, abs=1e-12)
    assert np.isfinite(solution.velocities).all() and result.positions[k][index].shape == solution.positions.shape


def test_a_linkage_far_from_the_origin_solves():
    doc = {"kinepoly": 1, "points": {"O2": [300000, 300000], "A": [300020, 300034.641], "B": [300120, 300105],
                                     "O4": [300140, 300000]},
           "ground": ["O2", "O4"], "links": {"crank": ["O2", "A"], "coupler": ["A", "B"], "rocker": ["O4", "B"]},
           "driver": driver(rpm=150)}
    far = kinematics.solve(kinematics.load_mechanism(doc), 90.0)
    near = kinematics.solve(kinematics.load_mechanism(SAMPLES / "label-swing-arm.json"), 90.0)
    assert far.angular_acceleration["rocker"] == pytest.approx(near.angular_acceleration["rocker"], rel=1e-6)
    assert max(verify_sweep(sweep(kinematics.load_mechanism(doc), 60)).values()) < 1e-6


def test_the_loop_check_does_not_depend_on_the_order_of_links():
    doc = {"kinepoly": 1, "points": {"O2": [0, 0], "A": [20, 34.641], "B": [120, 105], "O4": [140, 0]},
           "ground": ["O2", "O4"], "links": {"crank": ["O2", "A"], "rocker": ["O4", "B"], "coupler": ["A", "B"]},
           "driver": driver(rpm=150)}
    (loop,) = loop_checks(kinematics.load_mechanism(doc))
    assert loop.verdict == "crank-rocker" and loop.turns_fully == "crank"


def test_a_whitworth_lever_turns_fully():
    """Crank and slotted lever with the crank longer than the centre distance: the lever turns too
    (a Whitworth quick return  # common practice)."""
    doc = {"kinepoly": 1, "points": {"C": [0, 0], "O2": [0, 40], "A": [100, 40], "T": [200, 80]},
           "ground": ["C", "O2"], "links": {"crank": ["O2", "A"], "lever": ["C", "T"]},
           "slides": {"slot": {"point": "A", "guide": "lever", "line": ["C", "T"]}}, "driver": driver(rpm=60)}
    (loop,) = loop_checks(kinematics.load_mechanism(doc))
    assert "the lever turns fully too" in loop.verdict and loop.turns_fully == "crank"


def test_toggle_is_found_when_the_driver_lists_another_point_first():
    doc = {"kinepoly": 1, "points": {"X": [-30, 10], "O2": [0, 0], "A": [20, 34.641], "B": [120, 105],
                                     "O4": [140, 0]},
           "ground": ["O2", "O4"], "links": {"crank": ["X", "O2", "A"], "coupler": ["A", "B"], "rocker": ["O4", "B"]},
           "driver": driver(rpm=150)}
    mech = kinematics.load_mechanism(doc)
    # The driver angle is taken from O2 to X here; the toggle is where A, the pin, lines up with the coupler.
    angles = np.arange(0.0, 360.0, 0.5)
    found = [a for a in angles if any(w.startswith("near toggle: links crank and coupler")
                                      for w in kinematics.solve(mech, float(a)).warnings)]
    assert found


@pytest.mark.parametrize("call, where", [
    (lambda m, s: kinematics.solve(m, float("nan")), "angle"),
    (lambda m, s: kinematics.solve(m, 1e300), "angle"),
    (lambda m, s: kinematics.construct(s, box_mm=0), "box_mm"),
    (lambda m, s: kinematics.construct(s, velocity_scale=-1.0), "velocity_scale"),
    (lambda m, s: sweep(m, 2.5), "steps"),
    (lambda m, s: sweep(m, 10 ** 9), "steps"),
    (lambda m, s: kinematics.move_point(m, "Q", (0, 0)), "points"),
    (lambda m, s: kinematics.move_point(m, "B", (float("nan"), 0)), "points.B"),
    (lambda m, s: kinematics.load_mechanism(None), ""),
])
def test_bad_arguments_are_refused_in_words(call, where):
    mech = kinematics.load_mechanism(SAMPLES / "label-swing-arm.json")
    with pytest.raises(kinematics.KinematicsError) as caught:
        call(mech, kinematics.solve(mech))
    assert caught.value.location == where


def test_a_link_of_no_length_is_named():
    mech = kinematics.load_mechanism(SAMPLES / "label-swing-arm.json")
    squashed = kinematics.move_point(mech, "B", mech.points["O4"])
    (finding,) = kinematics.diagnose(squashed)
    assert finding.location == "links.rocker" and "coincide" in finding.message
