"""The cylinder's drive force: the axial force along its line (push positive) in place of a drive
torque, checked against the statics and dynamics of a table hinged on the ground, and by the
power balance."""

import math
from dataclasses import replace

import numpy as np
import pytest

import kinematics
from kinematics import solve, sweep
from kinematics.dynamics import drive_summary, forces, sweep_forces
from kinematics.model.mass import LinkMass, MassData
from tests.cylinders import tipping_table

G = 9.81
PLANK_KG = 80.0


def _hinged_plank(length_mm, **driver):
    """The tipping table as a uniform plank O–T of 80 kg (massless barrel and rod): G at the
    plank's middle, I_G = m·l²/12 (a slender bar, common practice)."""
    mech = tipping_table(length_mm, **driver)
    (ox, oy), (tx, ty) = mech.points["O"], mech.points["T"]
    plank_m = math.hypot(tx - ox, ty - oy) / 1000
    data = MassData(masses={"table": LinkMass("table", PLANK_KG, ((ox + tx) / 2, (oy + ty) / 2),
                                              PLANK_KG * plank_m ** 2 / 12)}, gravity_value=(0.0, -G))
    return replace(mech, mass_data=data), plank_m


def _cross(a, b):
    return a[0] * b[1] - a[1] * b[0]


@pytest.mark.parametrize("length_mm", [520.0, 600.0, 700.0, 800.0])
def test_static_lift_by_moments_about_the_hinge(length_mm):
    """At rest (speed 0) the table is in static balance. Moments about the hinge O on the table
    (common practice, statics of a hinged body; the massless cylinder is a two-force member, so it
    pushes on B along CB): F·(OB × u) + (OG × m·g) = 0, u the unit vector from C to B. Tolerance
    1e-9 relative: the pose converges to 1e-12 of the design's size, and the rest is arithmetic."""
    mech, _ = _hinged_plank(length_mm, speed_m_s=0.0)
    sol = solve(mech, length=length_mm / 1000)
    got = forces(sol)
    p = {n: np.array(sol.position(n)) for n in ("C", "O", "B", "T")}
    u = (p["B"] - p["C"]) / np.linalg.norm(p["B"] - p["C"])
    centre = (p["O"] + p["T"]) / 2
    expected = -_cross(centre - p["O"], (0.0, -PLANK_KG * G)) / _cross(p["B"] - p["O"], u)
    assert got.drive_force_n == pytest.approx(expected, rel=1e-9)
    assert got.drive_torque_n_m == 0.0
    # The barrel, massless and pinned at both ends, carries F along its axis to the frame at C.
    assert got.joints_n["C"]["barrel"] == pytest.approx(expected * u, rel=1e-9, abs=1e-9 * abs(expected))
    assert got.power_balance.drive_force_n == pytest.approx(expected, rel=1e-9)
    assert got.driver_length_m == length_mm / 1000


def test_moving_table_by_the_hinge_moment_equation():
    """Extending at 0.2 m/s and 0.5 m/s²: the table turns about its fixed hinge O, so
    ΣM_O = I_O·α with I_O = I_G + m·|OG|² (rigid rotation about a fixed axis, parallel-axis
    theorem, common practice): F·(OB × u) + OG × m·g = I_O·α, α from the solver. Tolerance 1e-9
    relative, as above."""
    mech, plank_m = _hinged_plank(650.0, speed_m_s=0.2, accel_m_s2=0.5)
    sol = solve(mech, length=0.65)
    got = forces(sol)
    p = {n: np.array(sol.position(n)) for n in ("C", "O", "B", "T")}
    u = (p["B"] - p["C"]) / np.linalg.norm(p["B"] - p["C"])
    centre = (p["O"] + p["T"]) / 2
    inertia_o = PLANK_KG * plank_m ** 2 / 12 + PLANK_KG * np.sum((centre - p["O"]) ** 2)
    alpha = sol.angular_acceleration["table"]
    expected = (inertia_o * alpha - _cross(centre - p["O"], (0.0, -PLANK_KG * G))) / _cross(p["B"] - p["O"], u)
    assert got.drive_force_n == pytest.approx(expected, rel=1e-9)
    assert got.power_balance.drive_power_w == pytest.approx(expected * 0.2, rel=1e-9)


def test_power_balance_over_the_stroke():
    """Newton-Euler's F and the power balance's (virtual power, computed on its own) agree at every
    pose of the stroke to 1e-9 relative: both are exact, only rounding separates them."""
    mech, _ = _hinged_plank(600.0, speed_m_s=0.3, accel_m_s2=0.0, stroke=(480.0, 900.0))
    result = sweep_forces(sweep(mech, steps=61))
    assert result.max_relative_difference < 1e-9
    assert np.all(result.drive_torque_n_m == 0.0)
    assert np.allclose(result.power_balance.drive_power_w, result.drive_force_n * 0.3, rtol=1e-12)


def test_summary_of_a_stroke_gives_push_pull_and_mean_power():
    """The summary's peaks are the swept force's extremes; the mean power over a stroke at constant
    speed is the work ∫F dL (trapezoids, numpy) over the stroke's time, to 1e-3 relative (61
    poses: the trapezoid rule against the poses' mean)."""
    mech, _ = _hinged_plank(600.0, speed_m_s=0.3, stroke=(480.0, 900.0))
    result = sweep_forces(sweep(mech, steps=61))
    summary = drive_summary(result)
    force, length = result.drive_force_n, result.driver_length_m
    assert summary.peak_push_n == pytest.approx(max(force.max(), 0.0))
    assert summary.peak_pull_n == pytest.approx(min(force.min(), 0.0))
    work = np.trapezoid(force, length) if hasattr(np, "trapezoid") else np.trapz(force, length)
    duration = (length[-1] - length[0]) / 0.3
    assert summary.mean_power_w == pytest.approx(work / duration, rel=1e-3)


def test_the_work_over_the_stroke_is_the_rise_in_energy():
    """Work-energy theorem for frictionless rigid bodies (common practice): the cylinder's work
    ∫F dL over the sample's stroke equals the rise of potential and kinetic energy of the table,
    the barrel and the crate, both turning about fixed pivots (KE = ½·m·v_G² + ½·I·ω²). The
    summary's trapezoids over 241 poses err by O(h²): 1e-4 relative (measured 7e-6)."""
    from tests.designs import SAMPLES

    mech = kinematics.load_mechanism(SAMPLES / "crate-tipping-table.json")
    summary = drive_summary(sweep_forces(sweep(mech, 241)))
    reference = solve(mech)

    def energy(sol):
        total = 400.0 * G * sol.position("K")[1] + 0.5 * 400.0 * float(np.sum(np.square(sol.velocity("K"))))
        for link, pivot in (("table", "O"), ("barrel", "C")):
            entry = mech.mass_data.masses[link]
            turn = math.radians(sol.link_angle_deg[link] - reference.link_angle_deg[link])
            arm = (np.array(entry.centre) - np.array(mech.points[pivot])) / 1000
            arm = np.array([[math.cos(turn), -math.sin(turn)], [math.sin(turn), math.cos(turn)]]) @ arm
            omega = sol.angular_velocity[link]
            total += entry.mass_kg * G * (mech.points[pivot][1] / 1000 + arm[1])
            total += 0.5 * entry.mass_kg * (omega * np.linalg.norm(arm)) ** 2 + 0.5 * entry.inertia_kg_m2 * omega ** 2
        return total

    rise = energy(solve(mech, length=1.060)) - energy(solve(mech, length=0.580))
    assert summary.work_j == pytest.approx(rise, rel=1e-4)
