"""``kinepoly solve/construct --length MM`` on the crate tipping table sample: millimetres for people,
SI in JSON, and the refusals' exit codes."""

import json
import math
from pathlib import Path

import pytest
import sympy

from app.cli import main

SAMPLE = str(Path(__file__).resolve().parents[2] / "samples" / "crate-tipping-table.json")


def _run(capsys, *argv):
    code = main(list(argv))
    out, err = capsys.readouterr()
    return code, out, err


def test_solve_at_a_length_matches_the_triangle_by_sympy(capsys):
    """Triangle C-O-B: L² = d² + r² − 2·d·r·cos γ (law of cosines, any handbook), γ the angle at O
    between OC and OB; sympy differentiates it in time for the table's angular velocity. Tolerance
    1e-9 relative: the solver converges to 1e-12 of the design's size."""
    code, out, _ = _run(capsys, "solve", SAMPLE, "--length", "800", "--json")
    assert code == 0
    result = json.loads(out)
    assert result["driver_length_m"] == 0.8
    points = json.loads(Path(SAMPLE).read_text())["points"]
    c, o, b = (tuple(v / 1000 for v in points[n]) for n in "COB")
    d, r = math.dist(c, o), math.dist(o, b)
    t = sympy.symbols("t")
    length = 0.8 + 0.040 * t  # extending at 40 mm/s, the file's speed
    gamma = sympy.acos((d ** 2 + r ** 2 - length ** 2) / (2 * d * r))
    gamma_dot = float(sympy.diff(gamma, t).subs(t, 0))
    # γ opens as the cylinder extends; the table turns clockwise (B is left of O and rises).
    assert result["links"]["table"]["angular_velocity"] == pytest.approx(-gamma_dot, rel=1e-9)
    bx, by = result["points"]["B"]["position"]
    assert math.hypot(bx, by) == pytest.approx(0.8, rel=1e-12)
    assert math.dist((bx, by), o) == pytest.approx(r, rel=1e-12)


def test_construct_at_a_length_agrees_with_the_solver(capsys):
    code, out, _ = _run(capsys, "construct", SAMPLE, "--length", "900", "--json")
    assert code == 0
    # The construction's own cross-check against the solver: 1e-9 relative, as for every polygon.
    assert json.loads(out)["crosscheck"]["max_relative_difference"] < 1e-9


@pytest.mark.parametrize("argv, code, words", [
    (("solve", SAMPLE, "--length", "1900"), 3, "cannot assemble at cylinder length 1900.000 mm"),
    (("solve", SAMPLE, "--length", "-3"), 2, 'argument --length: "-3" is not a positive finite cylinder length'),
    (("solve", SAMPLE, "--angle", "30"), 2, "a cylinder-driven design is solved at a cylinder length"),
    (("forces", SAMPLE, "--cycle", "--length", "800"), 2, "--length is for one pose"),
])
def test_refusals(capsys, argv, code, words):
    got, _, err = _run(capsys, *argv)
    assert got == code and words in err


def test_forces_at_a_length_give_the_cylinder_force(capsys):
    """The table names the cylinder's force, not a torque on the barrel; the JSON gives it in N with the
    length in m; the power F·L̇ is the force times the file's 40 mm/s (exact arithmetic, 1e-12)."""
    code, out, _ = _run(capsys, "forces", SAMPLE, "--length", "800")
    assert code == 0
    assert "drive force of cylinder:" in out and " N push" in out and "drive torque" not in out
    code, out, _ = _run(capsys, "forces", SAMPLE, "--length", "800", "--json")
    document = json.loads(out)
    assert "driver_torque" not in document and document["driver_length_m"] == 0.8
    force = document["drive_force_n"]
    assert document["power_balance"]["drive_power"] == pytest.approx(force * 0.040, rel=1e-12)
    # The virtual-work force, computed on its own: agreement to 1e-9 (both exact up to rounding).
    assert document["power_balance"]["drive_force_n"] == pytest.approx(force, rel=1e-9)


def test_forces_over_the_stroke_give_push_pull_and_power(capsys):
    code, out, _ = _run(capsys, "forces", SAMPLE, "--cycle", "--steps", "25")
    assert code == 0
    assert "peak push" in out and "peak pull" in out and "at length 580.0 mm" in out and "flywheel" not in out
    code, out, _ = _run(capsys, "forces", SAMPLE, "--cycle", "--steps", "25", "--json")
    document = json.loads(out)
    assert document["peak_push_n"] > 0 and document["peak_pull_n"] <= 0
    assert document["power_balance"]["max_relative_difference"] < 1e-9
