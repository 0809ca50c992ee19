"""Velocities and accelerations against sympy's symbolic differentiation of the position
equations (sympy, https://www.sympy.org: an independent reference library)."""

import math

import numpy as np
import pytest
import sympy as sp

import kinematics
from tests.designs import four_bar, slotted_lever


def _check_against_sympy(mech, angle_deg, point_expressions, theta, t, omega, alpha):
    solution = kinematics.solve(mech, angle_deg)
    construction = kinematics.construct(solution)
    subs_rules = {sp.Derivative(theta, t, 2): alpha, sp.Derivative(theta, t): omega}
    for name, (ex, ey) in point_expressions.items():
        values = []
        for order in (0, 1, 2):
            dx, dy = sp.diff(ex, t, order), sp.diff(ey, t, order)
            dx, dy = (expr.subs(subs_rules).subs(theta, math.radians(angle_deg)) for expr in (dx, dy))
            values.append(np.array([float(dx), float(dy)]) / 1000.0)
        # Exact formulations on both sides: 1e-9 of the value's size.
        assert np.allclose(solution.position(name), values[0], atol=1e-12)
        assert np.allclose(solution.velocity(name), values[1], rtol=1e-9, atol=1e-9 * np.abs(values[1]).max())
        assert np.allclose(solution.acceleration(name), values[2], rtol=1e-9, atol=1e-9 * np.abs(values[2]).max())
        assert np.allclose(construction.velocity.images[name], values[1], rtol=1e-9,
                           atol=1e-9 * np.abs(values[1]).max())
        assert np.allclose(construction.acceleration.images[name], values[2], rtol=1e-9,
                           atol=1e-9 * np.abs(values[2]).max())


@pytest.mark.parametrize("angle", [35.0, 140.0, 260.0])
def test_four_bar_coupler_point_against_sympy(angle):
    a, b, c, d = 40, 120, 100, 140
    p, delta = 60, 30
    rpm, alpha = 200.0, 7.5
    mech = kinematics.load_mechanism(four_bar(a, b, c, d, 30.0, rpm=rpm, alpha=alpha, coupler_point=(p, delta)))
    t = sp.symbols("t")
    theta = sp.Function("theta")(t)
    ax, ay = a * sp.cos(theta), a * sp.sin(theta)
    ex, ey = d - ax, -ay
    dist = sp.sqrt(ex ** 2 + ey ** 2)
    phi = sp.atan2(ey, ex) + sp.acos((b ** 2 + dist ** 2 - c ** 2) / (2 * b * dist))
    bx, by = ax + b * sp.cos(phi), ay + b * sp.sin(phi)
    px = ax + p * sp.cos(phi + sp.rad(delta))
    py = ay + p * sp.sin(phi + sp.rad(delta))
    _check_against_sympy(mech, angle, {"A": (ax, ay), "B": (bx, by), "P": (px, py)}, theta, t,
                         rpm * 2 * math.pi / 60, alpha)


@pytest.mark.parametrize("angle", [20.0, 130.0, 300.0])
def test_slotted_lever_tip_against_sympy(angle):
    """The lever tip T of a crank and slotted lever: its motion includes the Coriolis term."""
    r, d, rpm, alpha = 60, 150, 60.0, 3.0
    doc = slotted_lever(r, d, 90.0, rpm=rpm, alpha=alpha)
    mech = kinematics.load_mechanism(doc)
    reach = math.hypot(*doc["points"]["T"])
    t = sp.symbols("t")
    theta = sp.Function("theta")(t)
    ax, ay = r * sp.cos(theta), d + r * sp.sin(theta)
    lever = sp.atan2(ay, ax)
    _check_against_sympy(mech, angle, {"T": (reach * sp.cos(lever), reach * sp.sin(lever))}, theta, t,
                         rpm * 2 * math.pi / 60, alpha)
