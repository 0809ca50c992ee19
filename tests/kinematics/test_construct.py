"""The graphical construction against the independent numeric solver."""

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import kinematics
from kinematics import Component, Role
from kinematics.groups import rpr as group_rpr
from kinematics.groups import rrp as group_rrp
from tests import CASE_FACTOR
from tests.designs import (
    SAMPLE_FILES,
    TRIAD_PRESS,
    block_on_rotating_guide,
    four_bar,
    slider_crank,
    slotted_lever,
    solve_at,
)


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.name)
def test_every_sample_constructs_within_1e9_at_its_angles(path):
    mech = kinematics.load_mechanism(path)
    for angle in [None, *mech.analysis_angles_deg, 0.0, 97.0, 181.0, 277.0]:
        construction = kinematics.construct(solve_at(mech, angle))
        steps = construction.velocity.steps + construction.acceleration.steps
        if all((s.condition or 0) < 1e3 for s in steps):
            assert construction.max_relative_difference <= 1e-9, (angle, construction.where)


def test_step_records_read_like_the_trade():
    mech = kinematics.load_mechanism(four_bar(40, 120, 100, 140, 30, rpm=120, alpha=4.0))
    construction = kinematics.construct(kinematics.solve(mech))
    velocity, acceleration = construction.velocity, construction.acceleration
    assert velocity.pole_label == "o" and acceleration.pole_label == "o′"
    assert set(velocity.images) == set(mech.points)
    labels = [s.label for s in acceleration.steps if s.role is Role.INTERSECTION]
    assert labels == ["b′"]
    radial = [s for s in acceleration.steps if s.component is Component.RADIAL]
    # Radial component of B about A: v_BA²/|AB|, directed from B to A.
    vba = np.subtract(velocity.images["B"], velocity.images["A"])
    ab = np.subtract(mech.position_m("B"), mech.position_m("A"))
    expected = np.dot(vba, vba) / np.linalg.norm(ab)
    step = next(s for s in radial if "B relative to A" in s.text)
    (x0, y0), (x1, y1) = step.geometry.coords
    assert math.hypot(x1 - x0, y1 - y0) == pytest.approx(expected, rel=1e-12)
    assert np.dot([x1 - x0, y1 - y0], ab) < 0  # from B towards A
    assert step.text.startswith("radial component of B relative to A: v²/r = ")
    assert any(s.component is Component.TANGENTIAL and s.role is Role.KNOWN for s in acceleration.steps)


def test_coriolis_component_is_laid_and_cannot_be_left_out(monkeypatch):
    mech = kinematics.load_mechanism(slotted_lever(60, 150, 30, rpm=60))
    solution = kinematics.solve(mech)
    construction = kinematics.construct(solution)
    assert construction.max_relative_difference < 1e-9
    (step,) = [s for s in construction.acceleration.steps if s.component is Component.CORIOLIS]
    (x0, y0), (x1, y1) = step.geometry.coords
    omega = solution.angular_velocity["lever"]
    # 2·ω·v_rel (KINEMATICS.md relation; e.g. Norton, Design of Machinery, 5th ed., eq. 7.3  # from memory)
    assert math.hypot(x1 - x0, y1 - y0) == pytest.approx(2 * abs(omega * solution.sliding_velocity["slot"]),
                                                         rel=1e-12)
    monkeypatch.setattr(group_rpr, "coriolis", lambda omega_guide, relative: 0.0 * relative)
    without = kinematics.construct(solution)
    assert without.max_relative_difference > 1e-2


def test_coriolis_on_a_moving_guide_cannot_be_left_out(monkeypatch):
    solution = kinematics.solve(kinematics.load_mechanism(block_on_rotating_guide(50.0, alpha=3.0)))
    assert kinematics.construct(solution).max_relative_difference < 1e-9
    monkeypatch.setattr(group_rrp, "coriolis", lambda omega_guide, relative: 0.0 * relative)
    assert kinematics.construct(solution).max_relative_difference > 1e-3


def test_nearly_parallel_lines_are_flagged():
    # The toggle sample near (not at) toggle: a driven dyad close to straight gives flagged steps at some angle.
    mech = kinematics.load_mechanism(four_bar(40, 100, 100, 140, 30))
    # Find the driver angle where coupler and rocker are nearly in line: scan, then check the flag.
    worst = max((kinematics.construct(kinematics.solve(mech, a)) for a in np.arange(0.0, 360.0, 1.0)),
                key=lambda c: max((s.condition or 0) for s in c.velocity.steps))
    intersections = [s for s in worst.velocity.steps if s.role is Role.INTERSECTION]
    assert all(s.condition >= 1.0 and s.angle_between_deg is not None for s in intersections)


# Random assemblable mechanisms of every group form: derandomised profile "ci" (see tests/conftest.py).
angles = st.floats(0.0, 359.0)
speeds = st.floats(-600.0, 600.0).filter(lambda v: abs(v) > 1.0)
accelerations = st.floats(-50.0, 50.0)


def _assemblable(make):
    try:
        doc = make()
    except (ValueError, ZeroDivisionError):  # the test's builder cannot place this geometry
        return None
    try:
        return kinematics.solve(kinematics.load_mechanism(doc))
    except kinematics.KinematicsError:  # the product's own refusal: fine, it is not assemblable
        return None


def _crosscheck_ok(solution):
    if solution is None:
        return
    construction = kinematics.construct(solution)
    steps = construction.velocity.steps + construction.acceleration.steps
    if all((s.condition or 0) < 1e3 for s in steps):
        assert construction.max_relative_difference <= 1e-9
    else:
        assert any(s.flagged for s in steps)


@settings(max_examples=150 * CASE_FACTOR)
@given(a=st.floats(10, 80), b=st.floats(60, 200), c=st.floats(40, 180), d=st.floats(60, 200), theta=angles,
       rpm=speeds, alpha=accelerations, p=st.floats(5, 100), delta=st.floats(-170, 170))
def test_random_four_bars(a, b, c, d, theta, rpm, alpha, p, delta):
    _crosscheck_ok(_assemblable(lambda: four_bar(a, b, c, d, theta, rpm=rpm, alpha=alpha, coupler_point=(p, delta))))


@settings(max_examples=120 * CASE_FACTOR)
@given(r=st.floats(10, 80), extra=st.floats(20, 300), e=st.floats(-60, 60), theta=angles, rpm=speeds,
       alpha=accelerations)
def test_random_slider_cranks(r, extra, e, theta, rpm, alpha):
    _crosscheck_ok(_assemblable(lambda: slider_crank(r, r + abs(e) + extra, e, theta, rpm=rpm, alpha=alpha)))


@settings(max_examples=120 * CASE_FACTOR)
@given(r=st.floats(10, 100), gap=st.floats(10, 200), offset=st.floats(-0.9, 0.9), theta=angles, rpm=speeds,
       alpha=accelerations)
def test_random_slotted_levers(r, gap, offset, theta, rpm, alpha):
    _crosscheck_ok(_assemblable(lambda: slotted_lever(r, r + gap, theta, rpm=rpm, alpha=alpha,
                                                      offset=offset * gap)))


@settings(max_examples=120 * CASE_FACTOR)
@given(theta=angles, rpm=speeds, alpha=accelerations, share=st.floats(0.2, 2.0))
def test_random_blocks_on_rotating_guides(theta, rpm, alpha, share):
    _crosscheck_ok(_assemblable(lambda: block_on_rotating_guide(theta, rpm=rpm, alpha=alpha, share=share)))


def test_a_group_that_is_no_dyad_is_marked_and_taken_from_the_solver():
    mech = kinematics.load_mechanism(TRIAD_PRESS)
    assert kinematics.diagnose(mech) == []
    solution = kinematics.solve(mech, 40.0)
    construction = kinematics.construct(solution)
    (group,) = construction.decomposition.groups
    assert not group.is_dyad and set(group.links) == {"rod", "plate", "upper", "lower"}
    assert any("is not a dyad" in w for w in construction.warnings)
    numeric = [s for s in construction.velocity.steps if s.numeric]
    assert {s.label for s in numeric} == {"b", "c", "d"}
    assert all("taken from the numeric solver" in s.text for s in numeric)
    with pytest.raises(kinematics.KinematicsError, match="no dyad"):
        kinematics.sweep(mech, 36)
