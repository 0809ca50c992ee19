"""The force polygon (kinematics.forcepolygon) against the numeric forces of kinematics.dynamics,
the exact reference: two formulations that each compute their own result (graphical, dyad by
dyad from the acceleration polygon, and one Newton-Euler system from the solver's motion).

Tolerance 1e-9 relative: both are exact in double precision; what separates them is the
rounding of two different routes (closed-form polygon images against the solver's accelerations,
intersections against a linear solve), some 1e-12 at the worst pose seen.

No published worked example of a graphical force analysis with inertia whose answer could be
cited by book, edition and example was found within the search's time box; the reference here
is the numeric one, and the D'Alembert facts (the single equivalent inertia force moved off G
by I·α/(m·a_G)) are common practice, stated in shared KINEMATICS.md, Forces.
"""

import math
from dataclasses import replace
from types import MappingProxyType

import numpy as np
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

import kinematics
from kinematics.dynamics import forces
from kinematics.errors import CannotAssemble, ParallelLines
from kinematics.forcepolygon import force_polygon, inertia
from kinematics.groups.force_steps import intersect_lines
from kinematics.groups.scales import MANTISSAS
from kinematics.groups.steps import Component, PolygonBuilder, Role
from kinematics.model.mass import LinkMass, Load, MassData, PointMass
from tests import CASE_FACTOR
from tests.cylinders import tipping_table
from tests.designs import (
    SAMPLE_FILES,
    SWING_LEVER,
    TRIAD_PRESS,
    block_on_rotating_guide,
    four_bar,
    load,
    slider_crank,
    slotted_lever,
    solve_at,
)
from tests.masses import steel

TOLERANCE = 1e-9
CASES = 20 * CASE_FACTOR
GRAVITY = (0.0, -9.80665)  # standard gravity, m/s² (common practice)


def _massive(mech):
    """Steel links, gravity, a point mass at every sliding point."""
    return steel(mech, point_masses={s.point: 0.8 for s in mech.slides.values()}, gravity=GRAVITY)


def _made(mech, angle):
    solution = solve_at(mech, angle)
    return force_polygon(kinematics.construct(solution)), solution


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_every_sample_agrees_with_the_numeric_forces(path):
    mech = _massive(kinematics.load_mechanism(path))
    if mech.driver.is_actuator:  # over its stroke: a third of the way each time
        low, high = mech.driver.stroke_min, mech.driver.stroke_max
        poses = [kinematics.solve(mech, length=(low + k * (high - low) / 3) * mech.metres_per_unit) for k in range(4)]
    else:
        poses = []
        for angle in (None, 17.0, 133.0, 251.0):
            try:
                poses.append(solve_at(mech, angle))
            except CannotAssemble:
                continue
    for solution in poses:
        made = force_polygon(kinematics.construct(solution))
        angle = solution.driver_angle_deg
        assert made.max_relative_difference <= TOLERANCE, (path.stem, angle, made.where)
        assert made.polygon.kind == "force" and made.polygon.unit == "N"


def test_a_group_that_is_no_dyad_takes_the_numeric_forces_and_says_so():
    made, _ = _made(_massive(load(TRIAD_PRESS)), 40.0)
    assert made.max_relative_difference <= TOLERANCE
    numeric = [s for s in made.polygon.steps if s.numeric]
    assert numeric and all(set(s.links) <= {"rod", "plate", "upper", "lower"} for s in numeric)
    assert any("not a dyad" in w for w in made.warnings)
    # The driver is still constructed: its frame force closes its own polygon.
    assert any(s.label == "F(frame→crank)" and not s.numeric for s in made.polygon.steps)


def test_scale_is_from_the_series_and_fits_the_box():
    made, _ = _made(_massive(load(SWING_LEVER)), 30.0)
    scale = made.polygon.scale_per_mm
    mantissa = scale / 10 ** math.floor(math.log10(scale))
    assert any(math.isclose(mantissa, m) for m in MANTISSAS)
    extent = max(math.hypot(*xy) for s in made.polygon.steps for xy in s.coords)
    assert extent / scale <= 120.0


def test_steps_name_their_forces_in_one_notation():
    made, _ = _made(_massive(load(four_bar(40, 150, 110, 160, 50, alpha=8.0))), 20.0)
    components = {s.component for s in made.polygon.steps}
    assert {Component.INERTIA, Component.GRAVITY, Component.PERPENDICULAR, Component.ALONG_LINK,
            Component.TORQUE} <= components
    results = [s for s in made.polygon.steps if s.role is Role.RESULT and s.component is not Component.TORQUE]
    assert results and all(s.label.startswith("F(") and "→" in s.label for s in results)
    assert all(" N" in s.text for s in results)
    assert len(made.centre_images) == 3 and all(s.label.startswith("g′(") for s in made.centre_images)


def test_parallel_closing_lines_are_refused_not_guessed():
    group = kinematics.groups.decompose.decompose(load(four_bar(40, 150, 110, 160, 50))).groups[0]
    builder = PolygonBuilder("force", "N")
    with pytest.raises(ParallelLines):
        intersect_lines(builder, group, (1 + 0j, 1 + 1j, Component.ALONG_LINK, "first"),
                        (0j, 2 + 2j, Component.ALONG_LINK, "second"), "a close")


def test_nearly_parallel_closing_lines_are_flagged():
    # Coupler and rocker (60 mm each) across a 120 mm gap from A to O4: B a hair off the line A-O4,
    # so the lines along AB and O4B meet at a few hundredths of a degree.
    made, _ = _made(_massive(load(four_bar(40.0, 60.0, 60.000002, 160.0, 0.0))), 0.0)
    flagged = [s for s in made.polygon.steps if s.flagged]
    assert flagged and all(s.role is Role.INTERSECTION for s in flagged)
    assert any(w.startswith("force polygon") and "condition figure" in w for w in made.warnings)


def _perturbed(numeric, factor):
    joints = MappingProxyType({p: MappingProxyType({k: np.asarray(f) * factor for k, f in by.items()})
                               for p, by in numeric.joints_n.items()})
    return replace(numeric, joints_n=joints, drive_torque_n_m=numeric.drive_torque_n_m * factor)


def test_the_polygon_never_reads_the_numeric_forces_or_the_solver_accelerations():
    for design in (four_bar(40, 150, 110, 160, 50, alpha=8.0), slider_crank(40, 160, 10, 30),
                   slotted_lever(40, 100, 30, offset=8.0), block_on_rotating_guide(30.0)):
        mech = _massive(load(design))
        solution = kinematics.solve(mech)
        construction = kinematics.construct(solution)
        honest = force_polygon(construction)
        wrong_solution = replace(solution, accelerations=solution.accelerations * 1.5)
        fooled = force_polygon(replace(construction, solution=wrong_solution),
                               numeric=_perturbed(forces(wrong_solution), 1.01))
        assert [s.coords for s in fooled.polygon.steps] == [s.coords for s in honest.polygon.steps]
        assert fooled.drive_torque_n_m == honest.drive_torque_n_m
        assert honest.max_relative_difference <= TOLERANCE
        assert fooled.max_relative_difference > 1e-3


def test_leaving_out_the_inertia_couple_fails_the_crosscheck(monkeypatch):
    mech = _massive(load(four_bar(40, 150, 110, 160, 50, alpha=8.0)))
    made, _ = _made(mech, 20.0)
    assert abs(made.angular_accelerations["coupler"]) > 1.0
    assert made.max_relative_difference <= TOLERANCE
    monkeypatch.setattr(inertia, "inertia_offset", lambda force, couple: 0j)
    careless, _ = _made(mech, 20.0)
    assert careless.max_relative_difference > 1e-4


def test_no_mass_data_is_refused_by_name():
    with pytest.raises(kinematics.NoMassData):
        force_polygon(kinematics.construct(kinematics.solve(load(SWING_LEVER), 10.0)))


unit = st.floats(0.0, 1.0)
signed = st.floats(-1.0, 1.0)
masses = st.lists(st.tuples(unit, signed, signed, unit), min_size=4, max_size=4)


def _random_mass(mech, draw, gravity, loads, point_masses):
    data = {}
    for name, (m, du, dv, i) in zip(mech.links, draw, strict=False):
        pts = [np.array(mech.points[p], float) for p in mech.links[name]]
        centre = np.mean(pts, axis=0) + 30.0 * np.array([du, dv])
        data[name] = LinkMass(name, 0.05 + 5.0 * m, tuple(centre), 1e-4 + 0.05 * i)
    return replace(mech, mass_data=MassData(masses=data, gravity_value=gravity,
                                            point_masses={p: PointMass(p, m) for p, m in point_masses.items()},
                                            loads={ld.name: ld for ld in loads}))


def _agrees(mech, angle):
    try:
        solution = kinematics.solve(mech, angle)
    except CannotAssemble:
        assume(False)
    assume(solution.condition < 1e6)
    made = force_polygon(kinematics.construct(solution))
    assert made.max_relative_difference <= TOLERANCE, made.where


@settings(max_examples=CASES)
@given(crank=st.floats(20.0, 45.0), coupler=st.floats(120.0, 180.0), rocker=st.floats(100.0, 150.0),
       rpm=st.floats(-400.0, 400.0), alpha=st.floats(-20.0, 20.0), angle=st.floats(0.0, 360.0), draw=masses,
       push=st.tuples(signed, signed), pin=unit)
def test_random_four_bars(crank, coupler, rocker, rpm, alpha, angle, draw, push, pin):
    frame = 140.0
    assume(crank + max(coupler, rocker, frame) < coupler + rocker + frame - max(coupler, rocker, frame))
    mech = load(four_bar(crank, coupler, rocker, frame, 30.0, rpm=rpm, alpha=alpha, coupler_point=(60.0, 20.0)))
    loads = [Load("push", point="P", force_value=(500 * push[0], 500 * push[1])),
             Load("brake", link="rocker", torque_value=10 * push[1]),
             Load("pin", point="B", force_value=(100 * push[1], -50.0))]
    _agrees(_random_mass(mech, draw, GRAVITY, loads, {"B": 0.1 + pin}), angle)


@settings(max_examples=CASES)
@given(crank=st.floats(20.0, 50.0), rod=st.floats(130.0, 220.0), offset=st.floats(-30.0, 30.0),
       rpm=st.floats(-600.0, 600.0), alpha=st.floats(-20.0, 20.0), angle=st.floats(0.0, 360.0), draw=masses,
       block=unit, push=st.tuples(signed, signed))
def test_random_slider_cranks(crank, rod, offset, rpm, alpha, angle, draw, block, push):
    mech = load(slider_crank(crank, rod, offset, 30.0, rpm=rpm, alpha=alpha))
    loads = [Load("stroke", point="D", force_value=(-800 * abs(push[0]), 100 * push[1]), over_deg=(300.0, 120.0))]
    _agrees(_random_mass(mech, draw, (0.3, -9.80665), loads, {"D": 0.1 + 4 * block}), angle)


@settings(max_examples=CASES)
@given(crank=st.floats(25.0, 60.0), distance=st.floats(80.0, 140.0), offset=st.floats(-15.0, 15.0),
       rpm=st.floats(-200.0, 200.0), alpha=st.floats(-10.0, 10.0), angle=st.floats(0.0, 360.0), draw=masses,
       pin=unit)
def test_random_slotted_levers(crank, distance, offset, rpm, alpha, angle, draw, pin):
    mech = load(slotted_lever(crank, distance, 30.0, rpm=rpm, alpha=alpha, offset=offset))
    loads = [Load("tool", point="T", force_value=(-60.0, 10.0))]
    _agrees(_random_mass(mech, draw, GRAVITY, loads, {"A": 0.05 + pin}), angle)


@settings(max_examples=CASES)
@given(rpm=st.floats(-300.0, 300.0), alpha=st.floats(-10.0, 10.0), share=st.floats(0.3, 0.9),
       angle=st.floats(0.0, 360.0), draw=masses, block=unit)
def test_random_blocks_on_a_turning_guide(rpm, alpha, share, angle, draw, block):
    mech = load(block_on_rotating_guide(30.0, rpm=rpm, alpha=alpha, share=share))
    _agrees(_random_mass(mech, draw, GRAVITY, [], {"D": 0.05 + block}), angle)


# Few poses near the reference: the numeric solver's continuation to a far angle is slow on each new design.
@settings(max_examples=max(10, CASES // 2))
@given(angle=st.sampled_from((None, 20.0, 45.0)), draw=masses, rpm=st.floats(30.0, 300.0))
def test_random_groups_that_are_no_dyad(angle, draw, rpm):
    design = {**TRIAD_PRESS, "driver": {**TRIAD_PRESS["driver"], "speed": {"value": rpm, "unit": "rpm"}}}
    _agrees(_random_mass(load(design), draw + draw[:1], GRAVITY, [], {}), angle)


def test_the_command_line_gives_the_force_steps_in_words_and_as_json(monkeypatch, capsys):
    import json

    import app.cli as cli

    mech = _massive(load(slider_crank(40, 160, 10, 30)))
    monkeypatch.setattr(cli, "load_mechanism", lambda path: mech)
    assert cli.main(["construct", "press.json", "--forces", "--angle", "40"]) == 0
    words = capsys.readouterr().out
    assert "force polygon (scale" in words and "drive torque" in words and "F(frame→block D)" in words
    assert cli.main(["construct", "press.json", "--forces", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["force"]["unit"] == "N" and data["force"]["scale_per_mm"] > 0
    assert set(data["force"]) == {"unit", "scale_per_mm", "images", "marks", "steps"}
    assert data["crosscheck"]["max_relative_difference"] <= TOLERANCE
    assert data["joints_n"]["A"]["rod"] and data["drive_torque_n_m"] == pytest.approx(
        forces(kinematics.solve(mech)).drive_torque_n_m, rel=1e-9)


def test_the_command_line_names_missing_mass_data(tmp_path, capsys):
    import app.cli as cli

    path = tmp_path / "lever.json"
    path.write_text(kinematics.dumps(load(SWING_LEVER)))
    assert cli.main(["construct", str(path), "--forces"]) == 2
    assert "masses" in capsys.readouterr().err


@settings(max_examples=CASES)
@given(length=st.floats(480.0, 820.0), speed=st.floats(-0.3, 0.3), accel=st.floats(-0.5, 0.5),
       above=st.booleans(), draw=masses, rod_end=unit, push=st.tuples(signed, signed))
def test_random_tipping_tables_driven_by_a_cylinder(length, speed, accel, above, draw, rod_end, push):
    """The cylinder's force along its axis and the guide's normal force, as well as every pin force,
    from the construction (two links meeting at the rod's end) against the numeric forces."""
    mech = tipping_table(length, above=above, speed_m_s=speed, accel_m_s2=accel)
    loads = [Load("tool", point="T", force_value=(800 * push[0], 800 * push[1]))]
    mech = _random_mass(mech, draw, GRAVITY, loads, {"B": 0.2 + 3.0 * rod_end})
    try:
        solution = kinematics.solve(mech, length=length / 1000)
    except CannotAssemble:
        assume(False)
    made = force_polygon(kinematics.construct(solution))
    assert made.max_relative_difference <= TOLERANCE, made.where
    numeric = forces(solution)
    assert made.drive_force_n == pytest.approx(numeric.drive_force_n, rel=1e-9, abs=1e-9)
    assert made.normals_n["cylinder"] == pytest.approx(numeric.slides["cylinder"].normal_n, rel=1e-9, abs=1e-9)


def test_a_cylinder_holding_a_plank_still_pushes_by_the_moments_about_the_hinge():
    """At rest (speed 0), a uniform 80 kg plank O–T hinged at O and held by a massless cylinder:
    F·(OB × u) + OG × m·g = 0 about the hinge (statics of a hinged body, common practice), u the
    unit vector from C to B; the polygon's cylinder force is that F, laid along CB."""
    mech = tipping_table(600.0, speed_m_s=0.0)
    (ox, oy), (tx, ty) = mech.points["O"], mech.points["T"]
    plank_kg = 80.0
    plank_m = math.hypot(tx - ox, ty - oy) / 1000
    data = MassData(masses={"table": LinkMass("table", plank_kg, ((ox + tx) / 2, (oy + ty) / 2),
                                              plank_kg * plank_m ** 2 / 12)}, gravity_value=(0.0, -9.81))
    solution = kinematics.solve(replace(mech, mass_data=data), length=0.6)
    made = force_polygon(kinematics.construct(solution))
    p = {n: np.array(solution.position(n)) for n in ("C", "O", "B", "T")}
    u = (p["B"] - p["C"]) / np.linalg.norm(p["B"] - p["C"])
    centre = (p["O"] + p["T"]) / 2

    def cross(a, b):
        return a[0] * b[1] - a[1] * b[0]

    expected = -cross(centre - p["O"], (0.0, -plank_kg * 9.81)) / cross(p["B"] - p["O"], u)
    assert made.drive_force_n == pytest.approx(expected, rel=1e-9)
    (drive,) = [s for s in made.polygon.steps if s.component is Component.DRIVE]
    (x0, y0), (x1, y1) = drive.coords
    assert np.allclose((x1 - x0, y1 - y0), expected * u, rtol=1e-9, atol=1e-9 * abs(expected))
    assert "a push" in drive.text and drive.label == "F(cylinder)"


def test_the_cylinders_polygon_never_reads_the_numeric_forces():
    mech = _massive(tipping_table(650.0, speed_m_s=0.1, accel_m_s2=0.2))
    solution = kinematics.solve(mech, length=0.65)
    construction = kinematics.construct(solution)
    honest = force_polygon(construction)
    wrong_solution = replace(solution, accelerations=solution.accelerations * 1.5)
    numeric = forces(wrong_solution)
    fooled = force_polygon(replace(construction, solution=wrong_solution),
                           numeric=replace(_perturbed(numeric, 1.01), drive_force_n=numeric.drive_force_n * 1.01))
    assert [s.coords for s in fooled.polygon.steps] == [s.coords for s in honest.polygon.steps]
    assert fooled.drive_force_n == honest.drive_force_n
    assert honest.max_relative_difference <= TOLERANCE < 1e-3 < fooled.max_relative_difference
