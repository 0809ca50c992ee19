"""The radial, tangential and Coriolis components of the relative accelerations, as read off
the acceleration polygon (:func:`kinematics.acceleration_components`).

References: sympy's symbolic differentiation (https://www.sympy.org, an independent library) for
ω, α and the sliding rate, put into the component formulas a^r = −ω²·r, a^t = α × r and
a^c = 2·ω × v_rel (J. J. Uicker, G. R. Pennock, J. E. Shigley, *Theory of Machines and
Mechanisms*, 4th ed., Oxford University Press, 2011, ch. 4  # from memory (chapter)).
"""

import math

import numpy as np
import pytest
import sympy as sp

import kinematics
from kinematics import Component
from tests.designs import SAMPLE_FILES, block_on_rotating_guide, four_bar, slotted_lever, solve_at

EXACT = 1e-9  # both sides exact formulations: agreement to rounding


def _rates(expression, theta, angle_rad, omega, alpha):
    """(value, first, second time derivative) of ``expression`` in θ(t) at θ = angle, θ' = ω, θ'' = α."""
    first = sp.diff(expression, theta)
    second = sp.diff(first, theta)
    at = {theta: angle_rad}
    value, d1, d2 = (float(e.subs(at)) for e in (expression, first, second))
    return value, d1 * omega, d2 * omega ** 2 + d1 * alpha


def _by_key(components):
    return {(c.point, c.about, c.component): c for c in components}


def _close(vector, expected, scale):
    return np.allclose(vector, expected, rtol=EXACT, atol=EXACT * scale)


@pytest.mark.parametrize("angle", [35.0, 140.0, 260.0])
def test_four_bar_components_against_sympy(angle):
    a, b, c, d, rpm, alpha = 40, 120, 100, 140, 200.0, 7.5
    omega = rpm * 2 * math.pi / 60  # common practice: 1 rpm = 2π/60 rad/s
    solution = kinematics.solve(kinematics.load_mechanism(four_bar(a, b, c, d, 30.0, rpm=rpm, alpha=alpha)), angle)
    found = _by_key(kinematics.acceleration_components(kinematics.construct(solution)))
    theta = sp.Symbol("theta")
    ax, ay = a * sp.cos(theta), a * sp.sin(theta)
    ex, ey = d - ax, -ay
    dist = sp.sqrt(ex ** 2 + ey ** 2)
    phi = sp.atan2(ey, ex) + sp.acos((b ** 2 + dist ** 2 - c ** 2) / (2 * b * dist))  # coupler angle
    bx, by = ax + b * sp.cos(phi), ay + b * sp.sin(phi)
    psi = sp.atan2(by, bx - d)  # rocker angle
    t = math.radians(angle)
    at = {theta: t}
    pin_a = np.array([float(ax.subs(at)), float(ay.subs(at))]) / 1000.0  # mm to m
    pin_b = np.array([float(bx.subs(at)), float(by.subs(at))]) / 1000.0
    for point, about, link_angle, r in (("A", "O2", theta, pin_a), ("B", "A", phi, pin_b - pin_a),
                                        ("B", "O4", psi, pin_b - np.array([d / 1000.0, 0.0]))):
        _, w, al = _rates(link_angle, theta, t, omega, alpha)
        scale = max(w * w, abs(al)) * np.hypot(*r)
        assert _close(found[(point, about, Component.RADIAL)].vector, -w * w * r, scale)
        assert _close(found[(point, about, Component.TANGENTIAL)].vector, al * np.array([-r[1], r[0]]), scale)


@pytest.mark.parametrize("angle", [20.0, 130.0, 300.0])
def test_slotted_lever_components_against_sympy(angle):
    """Crank pin A in the slot of a lever about C: the point of the lever under A has radial and
    tangential components about C, and A has a Coriolis component 2·ω·ṡ across the slot."""
    r, d, rpm, alpha = 60, 150, 60.0, 3.0
    omega = rpm * 2 * math.pi / 60  # common practice
    solution = kinematics.solve(kinematics.load_mechanism(slotted_lever(r, d, 90.0, rpm=rpm, alpha=alpha)), angle)
    components = kinematics.acceleration_components(kinematics.construct(solution))
    found = _by_key(components)
    theta = sp.Symbol("theta")
    ax, ay = r * sp.cos(theta), d + r * sp.sin(theta)
    t = math.radians(angle)
    lever, w, al = _rates(sp.atan2(ay, ax), theta, t, omega, alpha)
    s, s_dot, _ = _rates(sp.sqrt(ax ** 2 + ay ** 2) / 1000, theta, t, omega, alpha)  # A's distance from C, m
    u = np.array([math.cos(lever), math.sin(lever)])  # along the slot, C towards A
    radial = found[("A", "C", Component.RADIAL)]
    assert radial.carried and radial.title == "radial lever's point at A rel. C"
    assert _close(radial.vector, -w * w * s * u, w * w * s)
    assert _close(found[("A", "C", Component.TANGENTIAL)].vector, al * s * np.array([-u[1], u[0]]), abs(al) * s)
    coriolis = found[("A", "lever", Component.CORIOLIS)]
    assert coriolis.title == "Coriolis A sliding on lever" and not coriolis.carried
    assert _close(coriolis.vector, 2 * w * s_dot * np.array([-u[1], u[0]]), abs(2 * w * s_dot))
    assert len(components) == 5  # and the crank pin's radial and tangential components about O2


def test_block_on_rotating_guide_coriolis_uses_the_guides_rate():
    """A block on a turning arm: Coriolis 2·ω_guide × v_slide, with ω and the sliding velocity of the
    numeric solver (the relation: Uicker, Pennock & Shigley, 4th ed., ch. 4  # from memory (chapter))."""
    solution = kinematics.solve(kinematics.load_mechanism(block_on_rotating_guide(50.0, alpha=4.0)))
    found = _by_key(kinematics.acceleration_components(kinematics.construct(solution)))
    coriolis = found[("D", "rocker", Component.CORIOLIS)]
    g, o = solution.position("G"), solution.position("O4")
    u = (g - o) / np.hypot(*(g - o))
    expected = 2 * solution.angular_velocity["rocker"] * solution.sliding_velocity["block"] * np.array([-u[1], u[0]])
    assert _close(coriolis.vector, expected, np.hypot(*expected))


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_components_of_every_sample_follow_the_solver(path):
    """Every radial and tangential component against −ω²·r and α × r with the numeric solver's ω and
    α (an independent formulation), and where the point is a joint of the link, the relative-acceleration
    equation a_P = a_Q + a^r + a^t  # common practice."""
    mech = kinematics.load_mechanism(path)
    for angle in (None, 47.0):
        try:
            solution = solve_at(mech, angle)
        except kinematics.CannotAssemble:
            continue
        components = kinematics.acceleration_components(kinematics.construct(solution))
        assert components, "every linkage here has a driver crank, so at least its radial component"
        scale = max(np.hypot(*solution.accelerations.T))
        pairs = {}
        for c in components:
            if c.component is Component.CORIOLIS:
                continue
            w, al = solution.angular_velocity[c.link], solution.angular_acceleration[c.link]
            r = solution.position(c.point) - solution.position(c.about)
            expected = -w * w * r if c.component is Component.RADIAL else al * np.array([-r[1], r[0]])
            assert _close(c.vector, expected, scale), (path.stem, angle, c)
            if not c.carried:
                pairs.setdefault((c.point, c.about), []).append(np.array(c.vector))
        for (point, about), vectors in pairs.items():
            driver_steady = len(vectors) == 1  # a crank at constant speed has no tangential component
            assert len(vectors) == 2 or driver_steady
            assert _close(solution.acceleration(about) + sum(vectors), solution.acceleration(point), scale)
