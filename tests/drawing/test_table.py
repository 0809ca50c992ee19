"""The results CSV read back with the standard csv module."""

import csv
import io
import math

import pytest

from kinematics.drawing.table import link_rows, point_rows, results_csv
from tests.designs import BOTTLE_PUSHER, GATE_LIFTER, construction


def _rows(solution):
    return list(csv.DictReader(io.StringIO(results_csv(solution))))


def test_one_row_per_point_link_and_slide_with_units_in_the_header():
    solution = construction(BOTTLE_PUSHER, 70.0).solution
    text = results_csv(solution)
    header = text.splitlines()[0]
    for unit in ("[m]", "[m/s]", "[m/s^2]", "[rad/s]", "[rad/s^2]", "[deg]"):
        assert unit in header
    rows = _rows(solution)
    assert [(r["kind"], r["name"]) for r in rows] == (
        [("point", n) for n in solution.point_names] + [("link", n) for n in solution.angular_velocity]
        + [("slide", n) for n in solution.sliding_velocity])


def test_numbers_are_the_solvers_doubles_exactly():
    solution = construction(GATE_LIFTER, 212.5).solution
    rows = {r["name"]: r for r in _rows(solution)}
    for i, name in enumerate(solution.point_names):
        assert float(rows[name]["v_x [m/s]"]) == solution.velocities[i][0]  # repr round-trips a double
        assert float(rows[name]["a_y [m/s^2]"]) == solution.accelerations[i][1]
        assert float(rows[name]["x [m]"]) == solution.positions[i][0]
    assert float(rows["coupler"]["alpha [rad/s^2]"]) == solution.angular_acceleration["coupler"]


def test_crank_pin_speed_is_omega_r():
    # A point at radius r on a body turning at ω about a fixed pivot moves at ω·r (rigid-body kinematics);
    # 90 rpm = 3π rad/s and the design's crank is 40 mm.
    rows = {r["name"]: r for r in _rows(construction(GATE_LIFTER, 10.0).solution)}
    assert float(rows["A"]["|v| [m/s]"]) == pytest.approx(3 * math.pi * 0.040, rel=1e-12)
    assert float(rows["crank"]["omega [rad/s]"]) == pytest.approx(3 * math.pi, rel=1e-12)


def test_printed_rows_round_to_four_figures_and_show_zero_as_zero():
    solution = construction(BOTTLE_PUSHER, 30.0).solution
    rows = {name: (v, a) for name, v, a in point_rows(solution)}
    assert rows["A"][0] == f"{math.hypot(*solution.velocity('A')):.4g}"
    assert "E" not in rows  # fixed points are left out
    # The crank turns at constant speed; the solver's round-off (about 1e-13 rad/s²) must not print.
    crank = next(row for row in link_rows(solution) if row[0] == "crank")
    assert abs(solution.angular_acceleration["crank"]) < 1e-9 and crank[2] == "0"
