"""Jerk (m/s³) and angular jerk (rad/s³): the solver's third linear solve and the sweep's closed forms,
against sympy's threefold differentiation of the loop equations (sympy, https://www.sympy.org: an
independent reference library), finite differences of the swept accelerations, and the exact piston
motion of the in-line slider-crank at dead centre."""

import math
from dataclasses import replace
from functools import cache

import mpmath
import numpy as np
import pytest
import sympy as sp

import kinematics
from kinematics.cycle.peaks import peaks
from kinematics.cycle.sweep import sweep, sweep_csv, verify_sweep
from tests.designs import block_on_rotating_guide, four_bar, slider_crank, slotted_lever

T = sp.symbols("t")
THETA = sp.Function("theta")(T)


def _with_angular_jerk(mech, angular_jerk_rad_s3):
    return replace(mech, driver=replace(mech.driver, angular_jerk_rad_s3=angular_jerk_rad_s3))


@cache
def _third_derivative(expr):
    """d³expr/dt³ as a function of (θ, θ̇, θ̈, θ⃛), differentiated once per expression."""
    th, w, al, ad = sp.symbols("th w al ad")
    rules = {sp.Derivative(THETA, T, 3): ad, sp.Derivative(THETA, T, 2): al, sp.Derivative(THETA, T): w}
    return sp.lambdify((th, w, al, ad), sp.diff(expr, T, 3).subs(rules).subs(THETA, th), "mpmath")


def _third(expr, angle_deg, omega, alpha, alpha_dot):
    """d³expr/dt³ with θ̇ = ω, θ̈ = α, θ⃛ = α̇ at θ = angle (evaluated by mpmath at 30 digits)."""
    with mpmath.workdps(30):
        return float(_third_derivative(expr)(mpmath.radians(angle_deg), omega, alpha, alpha_dot))


def _swept_at(mech, angle_deg):
    """The sweep's row at ``angle_deg`` (a 720-step sweep from the reference pose lands on whole half degrees)."""
    result = sweep(mech, steps=720)
    row = int(np.argmin(np.abs((result.driver_angle_deg - angle_deg + 180.0) % 360.0 - 180.0)))
    assert abs((result.driver_angle_deg[row] - angle_deg + 180.0) % 360.0 - 180.0) < 1e-9
    return result, row


def _check(mech, angle_deg, expressions, link_angles, omega, alpha, alpha_dot):
    solution = kinematics.solve(mech, angle_deg)
    result, row = _swept_at(mech, angle_deg)
    for name, (ex, ey) in expressions.items():
        expected = np.array([_third(ex, angle_deg, omega, alpha, alpha_dot),
                             _third(ey, angle_deg, omega, alpha, alpha_dot)]) / 1000.0  # mm -> m
        # Exact formulations on both sides: 1e-9 of the jerk's size (rounding of a few solves).
        tolerance = 1e-9 * np.abs(expected).max()
        assert np.allclose(solution.jerk(name), expected, rtol=1e-9, atol=tolerance), name
        i = result.point_names.index(name)
        assert np.allclose(result.jerks[row, i], expected, rtol=1e-9, atol=tolerance), name
    for link, angle in link_angles.items():
        expected = _third(angle, angle_deg, omega, alpha, alpha_dot)
        assert solution.angular_jerk[link] == pytest.approx(expected, rel=1e-9, abs=1e-9 * abs(expected))
        assert result.angular_jerk[link][row] == pytest.approx(expected, rel=1e-9, abs=1e-9 * abs(expected))


@pytest.mark.parametrize("angle", [35.0, 140.0, 260.0])
@pytest.mark.parametrize("alpha_dot", [0.0, 40.0])
def test_four_bar_jerk_against_sympy(angle, alpha_dot):
    a, b, c, d, p, delta = 40, 120, 100, 140, 60, 30
    rpm, alpha = 200.0, 7.5
    mech = kinematics.load_mechanism(four_bar(a, b, c, d, 30.0, rpm=rpm, alpha=alpha, coupler_point=(p, delta)))
    mech = _with_angular_jerk(mech, alpha_dot)
    ax, ay = a * sp.cos(THETA), a * sp.sin(THETA)
    ex, ey = d - ax, -ay
    dist = sp.sqrt(ex ** 2 + ey ** 2)
    phi = sp.atan2(ey, ex) + sp.acos((b ** 2 + dist ** 2 - c ** 2) / (2 * b * dist))
    bx, by = ax + b * sp.cos(phi), ay + b * sp.sin(phi)
    px, py = ax + p * sp.cos(phi + sp.rad(delta)), ay + p * sp.sin(phi + sp.rad(delta))
    _check(mech, angle, {"A": (ax, ay), "B": (bx, by), "P": (px, py)},
           {"coupler": phi, "rocker": sp.atan2(by, bx - d), "crank": THETA},
           rpm * 2 * math.pi / 60, alpha, alpha_dot)


@pytest.mark.parametrize("angle", [20.0, 100.0, 230.0])
def test_offset_slider_crank_jerk_against_sympy(angle):
    r, rod, e, rpm, alpha = 50, 180, 15, 300.0, -4.0
    mech = kinematics.load_mechanism(slider_crank(r, rod, e, 30.0, rpm=rpm, alpha=alpha))
    ax, ay = r * sp.cos(THETA), r * sp.sin(THETA)
    dx = ax + sp.sqrt(rod ** 2 - (ay + e) ** 2)
    solution = kinematics.solve(mech, angle)
    _check(mech, angle, {"A": (ax, ay), "D": (dx, sp.Integer(-e))}, {"rod": sp.atan2(-e - ay, dx - ax)},
           rpm * 2 * math.pi / 60, alpha, 0.0)
    expected = _third(dx, angle, rpm * 2 * math.pi / 60, alpha, 0.0) / 1000.0
    assert solution.sliding_jerk["piston"] == pytest.approx(expected, rel=1e-9)


@pytest.mark.parametrize("rpm, alpha", [(240.0, 0.0), (240.0, 12.0)])
def test_in_line_slider_crank_jerk_at_dead_centre(rpm, alpha):
    """x = r·cos θ + √(l² − r²·sin²θ) is even in θ, so x‴(0) = 0 and, at θ = 0,
    j = x‴·ω³ + 3·x″·ω·α + x′·α̇ = −3·r·(1 + r/l)·ω·α (x″(0) = −r(1 + r/l)).  # common practice"""
    r, rod = 0.06, 0.24
    omega = rpm * 2 * math.pi / 60
    mech = kinematics.load_mechanism(slider_crank(r * 1000, rod * 1000, 0.0, 0.0, rpm=rpm, alpha=alpha))
    solution = kinematics.solve(mech, 0.0)
    expected = -3.0 * r * (1.0 + r / rod) * omega * alpha
    # Exact relation; 1e-9 of the crank pin's jerk ω³r sets the scale of the rounding.
    assert solution.sliding_jerk["piston"] == pytest.approx(expected, abs=1e-9 * omega ** 3 * r)
    assert solution.jerk("D")[0] == pytest.approx(expected, abs=1e-9 * omega ** 3 * r)
    # The crank pin at constant speed: −ω³·perp(r_OA), plus the tangential part's −3ωα·r_OA.  # common practice
    assert np.allclose(solution.jerk("A"), [-3 * omega * alpha * r, -omega ** 3 * r], atol=1e-9 * omega ** 3 * r)


def _rate(values, step_s):
    """Central differences along the first axis, the end rows left out."""
    return (values[2:] - values[:-2]) / (2.0 * step_s)


@pytest.mark.parametrize("design", [four_bar(40, 120, 100, 140, 30.0, coupler_point=(60, 30)),
                                    slider_crank(50, 180, 15, 30.0), slotted_lever(60, 150, 90.0, offset=20.0),
                                    block_on_rotating_guide(30.0)],
                         ids=["four-bar", "slider-crank", "offset slotted lever", "block on a turning guide"])
def test_swept_jerk_is_the_rate_of_the_swept_acceleration(design):
    """Central differences of the accelerations over 20,000 steps at constant speed: the error is
    h²/6·|a⁗|, h at most 0.018° of crank turn, below 1e-5 of the largest jerk for these proportions.
    A rocking driver (the block on a turning guide) is compared on the middle 80 % of its range, away
    from its dead points where every rate grows without bound."""
    mech = kinematics.load_mechanism(design)
    result = sweep(mech, steps=20_000)
    step_s = math.radians(abs(result.driver_angle_deg[1] - result.driver_angle_deg[0])) / abs(mech.driver.speed_rad_s)
    keep = slice(None) if result.full_turn else slice(2_000, -2_000)
    middle = slice(1, -1)

    def agree(accelerations, jerks):
        jerks = jerks[middle][keep]
        return np.abs(_rate(accelerations, step_s)[keep] - jerks).max() <= 1e-5 * (np.abs(jerks).max() or 1.0)

    assert agree(result.accelerations, result.jerks)
    for link in mech.links:
        assert agree(result.angular_acceleration[link], result.angular_jerk[link]), link
    for slide in mech.slides:
        assert agree(result.sliding_acceleration[slide], result.sliding_jerk[slide]), slide


def test_verify_sweep_compares_the_jerk():
    mech = kinematics.load_mechanism(slotted_lever(60, 150, 90.0, alpha=2.0, offset=20.0))
    # Two exact formulations of the same quantity: rounding only.
    assert verify_sweep(sweep(mech, steps=360))["jerk"] < 1e-12


def test_csv_has_the_jerk_columns():
    mech = kinematics.load_mechanism(four_bar(40, 120, 100, 140, 30.0))
    result = sweep(mech, steps=8)
    header, first = sweep_csv(result).splitlines()[:2]
    columns = header.split(",")
    assert "B.jx [m/s^3]" in columns and "B.jy [m/s^3]" in columns and "rocker.jerk [rad/s^3]" in columns
    values = dict(zip(columns, first.split(","), strict=True))
    assert float(values["B.jy [m/s^3]"]) == result.jerks[0, result.point_names.index("B"), 1]
    assert float(values["rocker.jerk [rad/s^3]"]) == result.angular_jerk["rocker"][0]


def test_peaks_have_the_jerk():
    mech = kinematics.load_mechanism(four_bar(40, 120, 100, 140, 30.0))
    result = sweep(mech, steps=360)
    table = peaks(result)
    i = result.point_names.index("B")
    assert table["points"]["B"]["max_jerk"] == pytest.approx(np.linalg.norm(result.jerks[:, i], axis=1).max())
    assert table["links"]["rocker"]["max_angular_jerk"] == pytest.approx(np.abs(result.angular_jerk["rocker"]).max())
