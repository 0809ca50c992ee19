"""Cylinder drivers: the solver (length as the input), the sweep over the stroke and the
construction, against sympy's differentiation of the loop equations with the length as the input
(sympy, https://www.sympy.org: an independent reference library; no published worked example of a
cylinder-driven linkage's velocities was at hand), each other, and finite differences."""

import math

import numpy as np
import pytest
import sympy as sp
from hypothesis import given, settings
from hypothesis import strategies as st

import kinematics
from kinematics.cycle.sweep import sweep, sweep_csv
from kinematics.errors import CannotAssemble, KinematicsError
from tests.cylinders import tipping_table

T = sp.symbols("t")
L = sp.Function("L")(T)


def _rates(expr, length_m, speed, accel):
    """expr and its first three time derivatives with L̇ = speed, L̈ = accel, L⃛ = 0 at L = length."""
    rules = {sp.Derivative(L, T, 3): 0, sp.Derivative(L, T, 2): accel, sp.Derivative(L, T): speed}
    return [float(sp.diff(expr, T, k).subs(rules).subs(L, length_m)) for k in range(4)]


@pytest.mark.parametrize("length_mm", [450.0, 530.0, 600.0])
def test_tipping_table_against_sympy(length_mm):
    speed, accel = -0.08, 0.3
    ox, oy, arm, tip, turn = 0.6, 0.3, 0.35, 0.5, math.radians(30.0)
    mech = tipping_table(500.0, accel_m_s2=accel, speed_m_s=speed)
    d = math.hypot(ox, oy)
    phi = sp.atan2(oy, ox) + sp.acos((L ** 2 + d ** 2 - arm ** 2) / (2 * L * d))
    bx, by = L * sp.cos(phi), L * sp.sin(phi)
    table = sp.atan2(by - oy, bx - ox)
    tx, ty = ox + tip * sp.cos(table + turn), oy + tip * sp.sin(table + turn)
    solution = kinematics.solve(mech, length=length_mm / 1000.0)
    construction = kinematics.construct(solution)
    result = sweep(mech, steps=2)  # a second, independent evaluation: the closed forms at the ends
    assert result.driver_length_m is not None
    for name, (ex, ey) in {"B": (bx, by), "T": (tx, ty)}.items():
        xs, ys = _rates(ex, length_mm / 1000.0, speed, accel), _rates(ey, length_mm / 1000.0, speed, accel)
        for order, table_values in enumerate((solution.positions, solution.velocities, solution.accelerations,
                                               solution.jerks)):
            expected = np.array([xs[order], ys[order]])
            # Exact formulations on both sides: 1e-9 of the quantity's size.
            assert np.allclose(table_values[solution.point_names.index(name)], expected, rtol=1e-9,
                               atol=1e-9 * np.abs(expected).max()), (name, order)
        for images, order in ((construction.velocity.images, 1), (construction.acceleration.images, 2)):
            expected = np.array([xs[order], ys[order]])
            assert np.allclose(images[name], expected, rtol=1e-9, atol=1e-9 * np.abs(expected).max())
    for link, angle in (("table", table), ("barrel", phi)):
        values = _rates(angle, length_mm / 1000.0, speed, accel)
        assert solution.angular_velocity[link] == pytest.approx(values[1], rel=1e-9)
        assert solution.angular_acceleration[link] == pytest.approx(values[2], rel=1e-9)
        assert solution.angular_jerk[link] == pytest.approx(values[3], rel=1e-9)
    assert solution.sliding_velocity["cylinder"] == pytest.approx(speed, rel=1e-12)
    assert solution.sliding_acceleration["cylinder"] == pytest.approx(accel, rel=1e-9)


@settings(max_examples=25)
@given(ox=st.floats(300, 900), oy=st.floats(-200, 500), arm=st.floats(150, 500), share=st.floats(0.2, 0.8),
       above=st.booleans(), speed=st.floats(-0.3, 0.3).filter(lambda v: abs(v) > 1e-3),
       accel=st.floats(-1.0, 1.0), tip_deg=st.floats(-90, 90))
def test_random_cylinder_driven_tables(ox, oy, arm, share, above, speed, accel, tip_deg):
    """Solver = sweep = construction to 1e-9, the loop closes, and the rates are the finite differences
    of the swept positions over the stroke (central differences over 400 steps of the stroke: the error
    h²/6·|x‴| reaches 5e-5 of the largest speed where a stroke end comes near the reach's limit, so 2e-4)."""
    d = math.hypot(ox, oy)
    low, high = abs(d - arm), d + arm
    length = low + share * (high - low)
    mech = tipping_table(length, pivot=(ox, oy), arm_mm=arm, tip=(400.0, tip_deg), above=above,
                         speed_m_s=speed, accel_m_s2=accel,
                         stroke=(low + 0.1 * (high - low), high - 0.1 * (high - low)))
    result = sweep(mech, steps=401)
    for row in (3, 200, 397):
        solution = kinematics.solve(mech, length=float(result.driver_length_m[row]))
        index = [solution.point_names.index(n) for n in result.point_names]
        for swept, solved in ((result.positions, solution.positions), (result.velocities, solution.velocities),
                              (result.accelerations, solution.accelerations), (result.jerks, solution.jerks)):
            assert np.abs(swept[row] - solved[index]).max() <= 1e-9 * (np.abs(solved).max() + 1e-12)
        construction = kinematics.construct(solution)
        assert construction.max_relative_difference < 1e-9
        b, c, o = (solution.position(n) for n in ("B", "C", "O"))
        assert np.linalg.norm(b - c) == pytest.approx(result.driver_length_m[row], rel=1e-12)
        assert np.linalg.norm(b - o) == pytest.approx(arm / 1000.0, rel=1e-9)
    if accel == 0.0:
        step_s = abs(result.driver_length_m[1] - result.driver_length_m[0]) / abs(speed)
        rate = (result.positions[2:] - result.positions[:-2]) / (2 * step_s)
        assert np.abs(rate - result.velocities[1:-1]).max() <= 2e-4 * np.abs(result.velocities).max()


def test_independence_perturbing_solver_rates_moves_no_image():
    """The construction takes the solver's pose only: changing the solver's rates changes no image."""
    from dataclasses import replace

    mech = tipping_table(500.0, accel_m_s2=0.2)
    solution = kinematics.solve(mech, length=0.53)
    disturbed = replace(solution, velocities=solution.velocities * 1.5 + 0.01,
                        accelerations=solution.accelerations * 0.5 - 0.02,
                        angular_velocity={k: v + 1.0 for k, v in solution.angular_velocity.items()},
                        angular_acceleration={k: v - 1.0 for k, v in solution.angular_acceleration.items()})
    first, second = kinematics.construct(solution), kinematics.construct(disturbed)
    for polygon in ("velocity", "acceleration"):
        for name, image in getattr(first, polygon).images.items():
            assert getattr(second, polygon).images[name] == image


def test_sweep_csv_starts_with_the_length():
    mech = tipping_table(500.0, stroke=(420.0, 610.0))
    result = sweep(mech, steps=5)
    header, first = sweep_csv(result).splitlines()[:2]
    assert header.startswith("driver.length [m],")
    assert float(first.split(",")[0]) == pytest.approx(0.42)


def test_a_stroke_outside_the_reach_is_cut_to_the_assemblable_part_with_a_warning():
    mech = tipping_table(500.0, stroke=(200.0, 610.0))  # reach from |670.8 − 350| = 320.8 mm
    result = sweep(mech, steps=11)
    assert result.driver_length_m.min() > 0.3208
    assert result.warnings[0].startswith("the stroke 200 to 610 mm is outside the linkage's reach in part")


def test_a_length_where_it_cannot_assemble():
    mech = tipping_table(500.0)
    with pytest.raises(CannotAssemble) as caught:
        kinematics.solve(mech, length=1.2)
    assert "cannot assemble at cylinder length 1200.000 mm" in str(caught.value)
    assert caught.value.location == "cylinder length 1200.000 mm"


def test_a_cylinder_whose_slide_is_not_link_on_link():
    from dataclasses import replace

    from kinematics import Slide

    mech = tipping_table(500.0)
    grounded = replace(mech, slides={"cylinder": Slide("cylinder", "B", "ground", ("C", "F"))},
                       ground=("C", "O", "F"), links={"barrel": ("C", "F"), "table": ("O", "B", "T")})
    with pytest.raises(KinematicsError) as caught:
        kinematics.solve(grounded, length=0.5)
    assert "this slide is not link-on-link" in str(caught.value)
