"""Every new refusal of the mass data and the forces, with its wording and its place; and the
results' shape: read-only, SI, the signs of the conventions."""

import math
from dataclasses import FrozenInstanceError, replace

import numpy as np
import pytest

import kinematics
from kinematics.dynamics import drive_summary, forces, sweep_forces
from kinematics.dynamics.blocks import plan
from kinematics.dynamics.layout import layout
from kinematics.errors import FileFormatError, ForcesUndetermined, KinematicsError, NoMassData
from kinematics.model.mass import LinkMass, Load, MassData, PointMass
from tests.designs import CARTON_PUSHER, TRIPLE_ROCKER, four_bar, load, slider_crank
from tests.masses import steel


def _refused(error, location, message, make):
    with pytest.raises(error) as caught:
        make()
    assert caught.value.location == location
    assert caught.value.detail == message


@pytest.mark.parametrize("location, message, make", [
    ("masses.coupler.mass", 'unknown mass unit "lb" (use kg, g)',
     lambda: LinkMass("coupler", 1.0, (0, 0), 0.0, mass_unit="lb")),
    ("masses.coupler.inertia", 'unknown inertia unit "kg*cm^2" (use kg*m^2, kg*mm^2, g*mm^2)',
     lambda: LinkMass("coupler", 1.0, (0, 0), 0.0, inertia_unit="kg*cm^2")),
    ("masses.coupler.mass", "a mass cannot be negative (-2)", lambda: LinkMass("coupler", -2.0, (0, 0))),
    ("masses.coupler.inertia", "a moment of inertia cannot be negative (-0.5)",
     lambda: LinkMass("coupler", 1.0, (0, 0), -0.5)),
    ("masses.coupler.centre", "the centre of mass must be a finite number, not nan",
     lambda: LinkMass("coupler", 1.0, (math.nan, 0))),
    ("masses.coupler.centre", "the centre of mass must be two finite numbers [x, y], not (1.0,)",
     lambda: LinkMass("coupler", 1.0, (1.0,))),
    ("masses.coupler.mass", "a mass must be a finite number, not True", lambda: LinkMass("coupler", True, (0, 0))),
    ("point_masses.D", "a mass cannot be negative (-1)", lambda: PointMass("D", -1.0)),
    ("point_masses.D", 'unknown mass unit "oz" (use kg, g)', lambda: PointMass("D", 1.0, "oz")),
    ("loads.cut", "a load is either a force at a point or a torque on a link: give one of force and torque",
     lambda: Load("cut", point="D")),
    ("loads.cut", "a load is either a force at a point or a torque on a link: give one of force and torque",
     lambda: Load("cut", point="D", force_value=(1, 0), link="rod", torque_value=1.0)),
    ("loads.cut.point", "a force needs the point it acts at", lambda: Load("cut", force_value=(1, 0))),
    ("loads.cut.link", "a torque needs the link it acts on", lambda: Load("cut", torque_value=1.0)),
    ("loads.cut.point", "a torque acts on a link, not at a point: leave the point out",
     lambda: Load("cut", point="D", link="rod", torque_value=1.0)),
    ("loads.cut.force", 'unknown force unit "kN" (use N)', lambda: Load("cut", point="D", force_value=(1, 0),
                                                                          force_unit="kN")),
    ("loads.cut.torque", 'unknown torque unit "Nm" (use N*m)', lambda: Load("cut", link="rod", torque_value=1.0,
                                                                             torque_unit="Nm")),
    ("loads.cut.force", "a force must be a finite number, not inf", lambda: Load("cut", point="D",
                                                                                 force_value=(math.inf, 0))),
    ("loads.cut.torque", "a torque must be a finite number, not 'x'", lambda: Load("cut", link="rod",
                                                                                   torque_value="x")),
    ("loads.cut.over_deg", "over_deg must be two finite angles [start, end] in degrees, not (10.0,)",
     lambda: Load("cut", link="rod", torque_value=1.0, over_deg=(10.0,))),
    ("loads.cut.over_deg", "over_deg must be a finite number, not nan",
     lambda: Load("cut", link="rod", torque_value=1.0, over_deg=(10.0, math.nan))),
    ("loads.cut.over_deg", "over_deg [10, 370] starts and ends at the same angle; leave over_deg out for a load "
                           "that acts at every angle", lambda: Load("cut", link="rod", torque_value=1.0,
                                                                    over_deg=(10.0, 370.0))),
    ("gravity", 'unknown acceleration unit "g" (use m/s^2)', lambda: MassData(gravity_value=(0, -1), gravity_unit="g")),
    ("gravity", "gravity must be two finite numbers [x, y], not (0, 0, -9.8)",
     lambda: MassData(gravity_value=(0, 0, -9.8))),
    ("masses.rod", 'the entry is filed as "rod" but names link "crank"',
     lambda: MassData(masses={"rod": LinkMass("crank", 1.0, (0, 0))})),
    ("loads.a", 'the entry is filed as "a" but names name "b"',
     lambda: MassData(loads={"a": Load("b", link="rod", torque_value=1.0)})),
])
def test_mass_data_refusals(location, message, make):
    _refused(FileFormatError, location, message, make)


def _on_pusher(**data):
    return replace(load(CARTON_PUSHER), mass_data=MassData(**data))


@pytest.mark.parametrize("location, message, data", [
    ("masses.lever", 'unknown link "lever"', dict(masses={"lever": LinkMass("lever", 1.0, (0, 0))})),
    ("masses.ground", "the frame does not move: masses and loads go on moving links",
     dict(masses={"ground": LinkMass("ground", 1.0, (0, 0))})),
    ("point_masses.Q", 'unknown point "Q"', dict(point_masses={"Q": PointMass("Q", 1.0)})),
    ("point_masses.O2", "point O2 is fixed: a mass there is part of the frame and takes no part in the motion",
     dict(point_masses={"O2": PointMass("O2", 1.0)})),
    ("loads.cut.point", 'unknown point "Q"', dict(loads={"cut": Load("cut", point="Q", force_value=(1, 0))})),
    ("loads.cut.link", 'unknown link "arm"', dict(loads={"cut": Load("cut", link="arm", torque_value=1.0)})),
    ("loads.cut.link", "the frame does not move: masses and loads go on moving links",
     dict(loads={"cut": Load("cut", link="ground", torque_value=1.0)})),
    ("loads.cut.link", "link crank does not hold point D",
     dict(loads={"cut": Load("cut", point="D", link="crank", force_value=(1, 0))})),
    ("loads.cut.point", "point E is fixed: a force there acts on the frame; name the link it acts on",
     dict(loads={"cut": Load("cut", point="E", force_value=(1, 0))})),
])
def test_mass_data_that_does_not_fit_the_design(location, message, data):
    _refused(FileFormatError, location, message, lambda: _on_pusher(**data))


def test_no_mass_data_is_refused_not_zeros():
    message = "the design has no mass data: give link masses, point masses or loads to compute forces from"
    bare = load(CARTON_PUSHER)
    _refused(NoMassData, "masses", message, lambda: forces(kinematics.solve(bare, 30.0)))
    _refused(NoMassData, "masses", message,
             lambda: sweep_forces(kinematics.sweep(replace(bare, mass_data=MassData(gravity_value=(0, -9.8))), 36)))


def test_a_redundant_link_is_refused():
    # A parallelogram with a second rocker alongside (a redundant link): more unknown joint forces than
    # balance equations. The kinematics refuses it too; the forces' own count says why.
    design = four_bar(40.0, 120.0, 40.0, 120.0, 60.0)
    p = design["points"]
    p["O6"], p["C"] = [60.0, 0.0], [p["A"][0] + 60.0, p["A"][1]]
    design["ground"].append("O6")
    design["links"]["coupler"] = ["A", "B", "C"]
    design["links"]["second"] = ["O6", "C"]
    mech = steel(load(design))
    _refused(ForcesUndetermined, "joints", "the joint forces are not determined by statics: 13 unknown force and "
                                           "torque components against 12 balance equations", lambda: layout(mech))


def test_a_locked_pose_is_refused():
    # Forces asked at a pose where the coupler and rocker lie in line: the dyad cannot carry a load
    # across its middle pin (the polygon's lines are parallel), statics does not determine its forces.
    mech = steel(load(four_bar(40.0, 150.0, 110.0, 160.0, 30.0)))
    solution = kinematics.solve(mech, 30.0)
    positions = np.array(solution.positions)
    index = solution.point_names.index
    a, o4 = positions[index("A")], positions[index("O4")]
    positions[index("B")] = o4 + (a - o4) * 110.0 / np.linalg.norm(a - o4)
    _refused(ForcesUndetermined, "driver angle 30.000°",
             "the joint forces are not determined by statics here: a redundant constraint or a locked pose; "
             "no least-squares guess is made", lambda: forces(replace(solution, positions=positions)))


def test_structurally_singular_systems_are_refused():
    message = ("the joint forces are not determined by statics: the balance equations cannot all be met by the "
               "joint forces (a redundant constraint)")
    constant = np.array([[1.0, 1.0], [0.0, 0.0]])
    _refused(ForcesUndetermined, "joints", message,
             lambda: plan(constant, np.array([], int), np.array([], int), np.ones(2, bool), np.ones(2, bool)))
    repeated = ("the joint forces are not determined by statics: some balance equations repeat others "
                "(a redundant constraint)")
    _refused(ForcesUndetermined, "joints", repeated,
             lambda: plan(np.ones((2, 2)), np.array([], int), np.array([], int), np.ones(2, bool), np.ones(2, bool)))


def test_drive_summary_refusals():
    cycle = sweep_forces(kinematics.sweep(steel(load(four_bar(40.0, 150.0, 110.0, 160.0, 30.0))), 36))
    for bad in (0.0, -0.1, math.nan, True, "0.02"):
        _refused(KinematicsError, "fluctuation",
                 f"the coefficient of speed fluctuation must be a positive number, not {bad!r}",
                 lambda bad=bad: drive_summary(cycle, bad))
    accelerating = steel(load(four_bar(40.0, 150.0, 110.0, 160.0, 30.0, alpha=3.0)))
    _refused(KinematicsError, "driver", "the drive summary is for a driver turning at constant speed: set its "
                                        "angular acceleration to 0 and its speed to a value other than 0",
             lambda: drive_summary(sweep_forces(kinematics.sweep(accelerating, 36))))
    rocking = steel(load(TRIPLE_ROCKER))
    _refused(KinematicsError, "driver", "the drive summary needs a driver that turns fully; this one rocks between "
                                        "its dead points", lambda: drive_summary(sweep_forces(kinematics.sweep(rocking,
                                                                                                               36))))


def test_results_are_read_only_and_signed_by_the_conventions():
    mech = steel(load(slider_crank(40.0, 150.0, 10.0, 30.0)), point_masses={"D": 2.0}, gravity=(0.0, -9.80665))
    result = forces(kinematics.solve(mech, 70.0))
    with pytest.raises(FrozenInstanceError):
        result.drive_torque_n_m = 0.0
    with pytest.raises(TypeError):
        result.joints_n["A"] = {}
    with pytest.raises(ValueError):
        result.joints_n["A"]["rod"][0] = 1.0
    # Action and reaction at a pin between two links; the frame receives minus its force on the crank.
    assert np.array_equal(result.joints_n["A"]["crank"], -result.joints_n["A"]["rod"])
    assert np.array_equal(result.frame.pivots_n["O2"], -result.joints_n["O2"]["crank"])
    assert result.frame.drive_reaction_n_m == -result.drive_torque_n_m
    # The guide line E→F runs along +x: its left normal is +y, and the normal force is that vector's size.
    slide = result.slides["piston"]
    assert slide.force_n[0] == 0.0 and slide.force_n[1] == slide.normal_n
    assert set(result.joints_n) == {"O2", "A", "D"} and set(result.joints_n["D"]) == {"rod"}


def test_a_driver_at_rest_still_balances_power():
    # At zero speed (accelerating from rest) the power balance uses velocities per unit driver speed.
    mech = steel(load(four_bar(40.0, 150.0, 110.0, 160.0, 30.0, rpm=0.0, alpha=12.0)), gravity=(0.0, -9.80665))
    result = forces(kinematics.solve(mech, 75.0))
    assert result.power_balance.relative_difference <= 1e-9
    assert result.drive_torque_n_m == pytest.approx(result.power_balance.drive_torque_n_m, rel=1e-9)
