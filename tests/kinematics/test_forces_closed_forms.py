"""Forces against closed forms and energy: the reciprocating-part inertia force of a slider-crank,
a balanced crank, the turning-moment diagram's energy over a cycle, and the drive summary."""

import math
from dataclasses import replace

import numpy as np
import pytest

import kinematics
from kinematics.dynamics import drive_summary, forces, sweep_forces
from kinematics.dynamics.summary import energy_fluctuation
from kinematics.model.mass import LinkMass, Load, MassData, PointMass
from tests.designs import four_bar, load, slider_crank
from tests.masses import steel

R_MM, ROD_MM, RPM, BLOCK_KG = 50.0, 200.0, 600.0, 3.0


def _reciprocating(theta_deg):
    """An in-line slider-crank whose only mass is the block (piston) at D."""
    mech = load(slider_crank(R_MM, ROD_MM, 0.0, 20.0, rpm=RPM))
    return forces(kinematics.solve(replace(mech, mass_data=MassData(point_masses={"D": PointMass("D", BLOCK_KG)})),
                                   theta_deg))


@pytest.mark.parametrize("theta", [0.0, 25.0, 60.0, 90.0, 133.0, 180.0, 250.0, 311.0])
def test_reciprocating_inertia_force_exact_and_approximate(theta):
    # Piston acceleration of an in-line slider-crank, exact (common practice, engine design texts):
    # a = −r·ω²·[cos θ + (λ·cos 2θ + λ³·sin⁴θ)/(1 − λ²·sin²θ)^(3/2)], λ = r/l = 1/n;
    # its usual approximation a ≈ −r·ω²·(cos θ + cos 2θ / n).
    r, lam, omega = R_MM / 1000.0, R_MM / ROD_MM, RPM * 2 * math.pi / 60.0
    t = math.radians(theta)
    s2 = math.sin(t) ** 2
    exact = BLOCK_KG * r * omega ** 2 * (math.cos(t) + (lam * math.cos(2 * t) + lam ** 3 * s2 ** 2)
                                         / (1 - lam ** 2 * s2) ** 1.5)
    approximate = BLOCK_KG * r * omega ** 2 * (math.cos(t) + lam * math.cos(2 * t))
    result = _reciprocating(theta)
    scale = BLOCK_KG * r * omega ** 2
    # The frame feels the reciprocating inertia force through the crank's pivot (the guide's
    # normal force is vertical): x of what the frame receives at O2, from the joint-force solve.
    assert result.frame.pivots_n["O2"][0] == pytest.approx(exact, abs=1e-9 * scale)
    assert result.shaking_force_n[0] == pytest.approx(exact, abs=1e-9 * scale)
    # Error bound of the approximation (derived from the exact form with the mean-value theorem:
    # |(1 − u)^(−3/2) − 1| ≤ 1.5·u/(1 − u)^(5/2), u = λ²·sin²θ): |error| ≤ m·r·ω²·2.5·λ³/(1 − λ²)^(5/2).
    bound = scale * 2.5 * lam ** 3 / (1 - lam ** 2) ** 2.5
    assert abs(result.frame.pivots_n["O2"][0] - approximate) <= bound


def test_approximation_bound_is_not_loose():
    # The bound above is within a factor ten of the largest error over a turn (so the check means something).
    lam, r, omega = R_MM / ROD_MM, R_MM / 1000.0, RPM * 2 * math.pi / 60.0
    t = np.radians(np.arange(0.0, 360.0, 15.0))
    approximate = BLOCK_KG * r * omega ** 2 * (np.cos(t) + lam * np.cos(2 * t))
    errors = [abs(_reciprocating(math.degrees(a)).frame.pivots_n["O2"][0] - f) for a, f in zip(t, approximate,
                                                                                             strict=True)]
    bound = BLOCK_KG * r * omega ** 2 * 2.5 * lam ** 3 / (1 - lam ** 2) ** 2.5
    assert bound / 10 < max(errors) <= bound


@pytest.mark.parametrize("alpha", [0.0, 8.0])
def test_balanced_crank_gives_no_shaking_force(alpha):
    # A crank whose centre of mass is on its pivot has a_G = 0 (common practice): no shaking force,
    # whatever its speed or acceleration; the frame's pivot carries nothing but the drive.
    mech = load(four_bar(40.0, 150.0, 110.0, 160.0, 30.0, rpm=400.0, alpha=alpha))
    mech = replace(mech, mass_data=MassData(masses={"crank": LinkMass("crank", 4.0, (0.0, 0.0), 0.01)}))
    for angle in (10.0, 100.0, 200.0, 290.0):
        result = forces(kinematics.solve(mech, angle))
        assert np.abs(result.shaking_force_n).max() <= 1e-12
        assert np.abs(result.frame.pivots_n["O2"]).max() <= 1e-12
        # The drive only accelerates the crank's inertia: T = I·α.
        assert result.drive_torque_n_m == pytest.approx(0.01 * alpha, abs=1e-12)


def test_counterweight_balances_the_crank_pin_mass():
    # A pin mass at the crank pin A (where crank and coupler meet) balanced by an equal mass at the
    # same radius opposite (W, on the crank only: lumped on it): centre of the pair on the pivot.
    design = four_bar(40.0, 150.0, 110.0, 160.0, 30.0, rpm=400.0)
    ax, ay = design["points"]["A"]
    design["points"]["W"] = [-ax, -ay]
    design["links"]["crank"] = ["O2", "A", "W"]
    mech = load(design)
    mech = replace(mech, mass_data=MassData(point_masses={"A": PointMass("A", 1.5), "W": PointMass("W", 1.5)}))
    for angle in (0.0, 70.0, 160.0, 255.0):
        result = forces(kinematics.solve(mech, angle))
        assert np.abs(result.shaking_force_n).max() <= 1e-9


def _cycle_work(result):
    """∮T dθ over the swept turn (J): equal steps, end excluded; exact to rounding for a smooth periodic T."""
    step = 2 * math.pi / len(result.drive_torque_n_m)
    return float(np.sum(result.drive_torque_n_m) * step), float(np.sum(np.abs(result.drive_torque_n_m)) * step)


@pytest.mark.parametrize("gravity", [None, (0.0, -9.80665)])
def test_drive_torque_does_no_net_work_over_a_cycle(gravity):
    # At constant speed with no loads, the kinetic energy is periodic and gravity is conservative:
    # ∮T dθ = 0 (common practice).
    for design in (four_bar(40.0, 150.0, 110.0, 160.0, 30.0, rpm=300.0), slider_crank(45.0, 170.0, 12.0, 30.0)):
        mech = steel(load(design), point_masses={"D": 2.0} if "D" in design["points"] else None, gravity=gravity)
        work, size = _cycle_work(sweep_forces(kinematics.sweep(mech, 720)))
        assert abs(work) <= 1e-10 * size


def _gauss(function, low, high, nodes=40):
    x, w = np.polynomial.legendre.leggauss(nodes)
    middle, half = (low + high) / 2, (high - low) / 2
    return half * sum(wi * function(middle + half * xi) for xi, wi in zip(x, w, strict=True))


def test_drive_work_over_a_cycle_is_minus_the_loads_work():
    # A constant force at the coupler point over a working stroke [a, b] (and a constant torque on the
    # rocker all the time): over a turn ∮T dθ = −F·(r_P(b) − r_P(a)), the work of the force while it
    # acts; the torque's work over the closed turn is zero. Gauss-Legendre on each smooth piece.
    design = four_bar(40.0, 150.0, 110.0, 160.0, 30.0, rpm=300.0, coupler_point=(70.0, 25.0))
    start, end, push = 40.0, 160.0, np.array([-120.0, 35.0])
    loads = [Load("stroke", point="P", force_value=tuple(push), over_deg=(start, end)),
             Load("spring", link="rocker", torque_value=-1.5)]
    mech = steel(load(design), loads=loads, gravity=(0.0, -9.80665))

    def torque(angle_deg):
        return forces(kinematics.solve(mech, angle_deg)).drive_torque_n_m

    work = math.radians(1.0) * (_gauss(torque, start, end) + _gauss(torque, end, start + 360.0))
    travel = kinematics.solve(mech, end).position("P") - kinematics.solve(mech, start).position("P")
    assert work == pytest.approx(-float(push @ travel), rel=1e-9)


def test_energy_fluctuation_of_a_sine():
    # T = T0 + A·sin(kθ): ∫(T − T0) dθ = −(A/k)·cos kθ, so ΔE = 2A/k (closed form).
    theta = np.linspace(0.0, 2 * math.pi, 3600, endpoint=False)
    assert energy_fluctuation(5.0 + 3.0 * np.sin(2 * theta), 2 * math.pi / 3600) == pytest.approx(3.0, rel=1e-5)


def test_drive_summary_of_a_cycle():
    mech = steel(load(four_bar(40.0, 150.0, 110.0, 160.0, 30.0, rpm=300.0)),
                 loads=[Load("spring", link="rocker", torque_value=-1.5, over_deg=(90.0, 270.0))])
    result = sweep_forces(kinematics.sweep(mech, 1440))
    summary = drive_summary(result, fluctuation=0.05)
    torque, omega = result.drive_torque_n_m, mech.driver.speed_rad_s
    k = int(np.argmax(np.abs(torque)))
    assert summary.peak_torque_n_m == torque[k] and summary.peak_torque_angle_deg == result.driver_angle_deg[k]
    assert summary.mean_torque_n_m == pytest.approx(torque.mean(), rel=1e-12)
    assert summary.rms_torque_n_m == pytest.approx(math.sqrt(np.mean(torque ** 2)), rel=1e-12)
    assert summary.mean_power_w == pytest.approx(torque.mean() * omega, rel=1e-12)
    assert summary.flywheel_inertia_kg_m2 == pytest.approx(summary.energy_fluctuation_j / (0.05 * omega ** 2))
    joint = summary.joints["B"]["rocker"]
    size = np.hypot(*result.joints_n["B"]["rocker"].T)
    assert joint.peak_n == size.max() and joint.mean_n == pytest.approx(size.mean())
    assert drive_summary(result).fluctuation == 0.02


def test_equivalent_single_inertia_force():
    # The inertia force −m·a_G and couple −I·α as one force along a line offset from G by r with
    # cross(r, F) = C, |r| = I·|α|/(m·|a_G|) (common practice).
    mech = steel(load(four_bar(40.0, 150.0, 110.0, 160.0, 30.0, rpm=300.0, alpha=25.0)))
    result = forces(kinematics.solve(mech, 120.0))
    solution = kinematics.solve(mech, 120.0)
    for link, inertia in result.inertia.items():
        entry = mech.mass_data.masses[link]
        r = inertia.offset_point_m - inertia.centre_m
        f = inertia.force_n
        assert r[0] * f[1] - r[1] * f[0] == pytest.approx(inertia.couple_n_m, rel=1e-12, abs=1e-15)
        assert inertia.couple_n_m == pytest.approx(-entry.inertia_kg_m2 * solution.angular_acceleration[link],
                                                   rel=1e-12)
        expected = entry.inertia_kg_m2 * abs(solution.angular_acceleration[link]) / np.hypot(*f)
        assert inertia.offset_m == pytest.approx(expected, rel=1e-12)
        assert np.hypot(*r) == pytest.approx(expected, rel=1e-12)


def test_pure_inertia_couple_has_an_infinite_offset():
    # A balanced crank accelerating: no inertia force, a couple only; its line is at infinity.
    mech = load(four_bar(40.0, 150.0, 110.0, 160.0, 30.0, rpm=100.0, alpha=8.0))
    mech = replace(mech, mass_data=MassData(masses={"crank": LinkMass("crank", 2.0, (0.0, 0.0), 0.004)}))
    inertia = forces(kinematics.solve(mech, 50.0)).inertia["crank"]
    assert inertia.offset_m == math.inf and inertia.couple_n_m == pytest.approx(-0.032)
    assert np.array_equal(inertia.offset_point_m, inertia.centre_m)
