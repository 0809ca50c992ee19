"""Property tests (hypothesis, derandomised "ci" profile, tests/conftest.py): on random massive
four-bars, offset slider-cranks and slotted levers with random gravity and loads, the Newton-Euler
drive torque equals the power balance's (two formulations, each computing its own), and with no
gravity and no loads the frame receives exactly the shaking force and moment (D'Alembert:
common practice). 60 cases per family in "ci" (600 with KINEPOLY_FULL=1)."""

import math
from dataclasses import replace

import numpy as np
from hypothesis import assume, given, settings
from hypothesis import strategies as st

import kinematics
from kinematics.dynamics import forces, sweep_forces
from kinematics.errors import CannotAssemble
from kinematics.model.mass import LinkMass, Load, MassData, PointMass
from tests import CASE_FACTOR
from tests.designs import four_bar, load, slider_crank, slotted_lever

CASES = 60 * CASE_FACTOR
# Exact formulations on both sides, in double precision: 1e-9 of the torque's scale.
TOLERANCE = 1e-9

unit = st.floats(0.0, 1.0)
signed = st.floats(-1.0, 1.0)


def _mass_data(mech, draw_masses, gravity, loads):
    masses = {}
    for name, (m, du, dv, i) in zip(mech.links, draw_masses, strict=False):
        pts = [np.array(mech.points[p], float) for p in mech.links[name]]
        centre = np.mean(pts, axis=0) + 30.0 * np.array([du, dv])
        masses[name] = LinkMass(name, 0.05 + 5.0 * m, tuple(centre), 1e-4 + 0.05 * i)
    return MassData(masses=masses, gravity_value=gravity, loads={ld.name: ld for ld in loads})


masses_strategy = st.lists(st.tuples(unit, signed, signed, unit), min_size=3, max_size=3)


def _check(mech, angle, with_loads):
    try:
        solution = kinematics.solve(mech, angle)
    except CannotAssemble:
        assume(False)
    assume(solution.condition < 1e6)
    result = forces(solution)
    newton_euler, power_balance = result.drive_torque_n_m, result.power_balance.drive_torque_n_m
    assert abs(newton_euler - power_balance) <= TOLERANCE * max(abs(newton_euler), 1e-3)
    assert result.power_balance.relative_difference <= TOLERANCE
    if not with_loads:
        size = max(np.abs(result.shaking_force_n).max(), 1e-9)
        assert np.allclose(result.frame.force_n, result.shaking_force_n, rtol=0, atol=1e-9 * size)
        moment = max(abs(result.shaking_moment_n_m), 1e-9)
        assert abs(result.frame.moment_n_m - result.shaking_moment_n_m) <= 1e-9 * moment


loads_flag = st.booleans()
angle_strategy = st.floats(0.0, 360.0)


@settings(max_examples=CASES)
@given(crank=st.floats(20.0, 45.0), coupler=st.floats(120.0, 180.0), rocker=st.floats(100.0, 150.0),
       rpm=st.floats(-400.0, 400.0), alpha=st.floats(-20.0, 20.0), angle=angle_strategy, draw=masses_strategy,
       loaded=loads_flag, push=st.tuples(signed, signed), torque=signed)
def test_four_bar_newton_euler_equals_power_balance(crank, coupler, rocker, rpm, alpha, angle, draw, loaded, push,
                                                    torque):
    frame = 140.0
    assume(crank + max(coupler, rocker, frame) < coupler + rocker + frame - max(coupler, rocker, frame))
    mech = load(four_bar(crank, coupler, rocker, frame, 30.0, rpm=rpm, alpha=alpha, coupler_point=(60.0, 20.0)))
    loads = [Load("push", point="P", force_value=(500 * push[0], 500 * push[1]), over_deg=(20.0, 200.0)),
             Load("brake", link="rocker", torque_value=10 * torque),
             Load("pin", point="B", force_value=(100 * push[1], -50.0))] if loaded else []
    mech = replace(mech, mass_data=_mass_data(mech, draw, (0.0, -9.80665) if loaded else None, loads))
    _check(mech, angle, loaded)


@settings(max_examples=CASES)
@given(crank=st.floats(20.0, 50.0), rod=st.floats(130.0, 220.0), offset=st.floats(-30.0, 30.0),
       rpm=st.floats(-600.0, 600.0), alpha=st.floats(-20.0, 20.0), angle=angle_strategy, draw=masses_strategy,
       block=unit, loaded=loads_flag, push=st.tuples(signed, signed))
def test_slider_crank_newton_euler_equals_power_balance(crank, rod, offset, rpm, alpha, angle, draw, block, loaded,
                                                        push):
    mech = load(slider_crank(crank, rod, offset, 30.0, rpm=rpm, alpha=alpha))
    data = _mass_data(mech, draw, (0.3, -9.80665) if loaded else None,
                      [Load("stroke", point="D", force_value=(-800 * abs(push[0]), 100 * push[1]),
                            over_deg=(300.0, 120.0))] if loaded else [])
    mech = replace(mech, mass_data=replace(data, point_masses={"D": PointMass("D", 0.1 + 4 * block)}))
    _check(mech, angle, loaded)


@settings(max_examples=CASES)
@given(crank=st.floats(25.0, 60.0), distance=st.floats(80.0, 140.0), offset=st.floats(-15.0, 15.0),
       rpm=st.floats(-200.0, 200.0), alpha=st.floats(-10.0, 10.0), angle=angle_strategy, draw=masses_strategy,
       pin=unit, loaded=loads_flag)
def test_slotted_lever_newton_euler_equals_power_balance(crank, distance, offset, rpm, alpha, angle, draw, pin,
                                                         loaded):
    # The slot is a moving guide: its normal force acts on the lever too.
    mech = load(slotted_lever(crank, distance, 30.0, rpm=rpm, alpha=alpha, offset=offset))
    data = _mass_data(mech, draw, (0.0, -9.80665) if loaded else None,
                      [Load("tool", point="T", force_value=(-60.0, 10.0))] if loaded else [])
    mech = replace(mech, mass_data=replace(data, point_masses={"A": PointMass("A", 0.05 + pin)}))
    _check(mech, angle, loaded)


@settings(max_examples=max(10, CASES // 6))
@given(rpm=st.floats(60.0, 600.0), draw=masses_strategy, block=unit)
def test_cycle_equals_the_poses(rpm, draw, block):
    # The cycle (closed-form kinematics, batched) against single poses (numeric solver): same forces.
    mech = load(slider_crank(40.0, 160.0, 10.0, 30.0, rpm=rpm))
    mech = replace(mech, mass_data=replace(_mass_data(mech, draw, (0.0, -9.80665), []),
                                           point_masses={"D": PointMass("D", 0.1 + block)}))
    cycle = sweep_forces(kinematics.sweep(mech, 36))
    for k in (0, 7, 19, 30):
        pose = forces(kinematics.solve(mech, float(cycle.driver_angle_deg[k])))
        size = max(abs(pose.drive_torque_n_m), 1e-6)
        assert math.isclose(cycle.drive_torque_n_m[k], pose.drive_torque_n_m, rel_tol=1e-8, abs_tol=1e-8 * size)
        scale = np.abs(pose.joints_n["A"]["rod"]).max()
        assert np.allclose(cycle.joints_n["A"]["rod"][k], pose.joints_n["A"]["rod"], rtol=0, atol=1e-8 * scale)
        assert math.isclose(cycle.slides["piston"].normal_n[k], pose.slides["piston"].normal_n, rel_tol=1e-8,
                            abs_tol=1e-8 * scale)
    assert cycle.max_relative_difference <= TOLERANCE
