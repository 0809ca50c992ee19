"""The one rule for a vector's direction and a zero vector, and the tables that use it."""

import math

import kinematics
from kinematics.groups.vectors import NEGLIGIBLE, direction_deg
from kinematics.reports.text import solution_table
from tests.designs import CLAW_FEED, load


def test_directions_are_counter_clockwise_from_x_in_one_turn():
    # atan2(y, x) conventions (C99 7.12.4.4, Python's math.atan2), folded into [0°, 360°).
    assert [direction_deg(*v) for v in ((1, 0), (0, 1), (-1, 0), (0, -2), (1, -1))] == [0.0, 90.0, 180.0, 270.0,
                                                                                        315.0]
    assert direction_deg(-1.0, -0.0) == 180.0  # atan2(-0.0, -1) is -180°, the same direction


def test_a_zero_vector_has_no_direction():
    assert direction_deg(0.0, 0.0) is None
    assert direction_deg(0.5 * NEGLIGIBLE, 0.0, scale=1.0) is None  # the solver's rounding
    assert direction_deg(2.0 * NEGLIGIBLE, 0.0, scale=1.0) == 0.0


def test_the_printed_table_gives_a_fixed_point_no_direction():
    solution = kinematics.solve(load(CLAW_FEED))
    row = next(line for line in solution_table(solution).splitlines() if line.startswith("O2 "))
    # A fixed pivot neither moves nor accelerates: both direction columns say so.
    assert row.split()[-1] == "—" and row.split()[-3] == "—"
    moving = next(line for line in solution_table(solution).splitlines() if line.startswith("A "))
    vx, vy = solution.velocity("A")
    assert float(moving.split()[4]) == round(math.degrees(math.atan2(vy, vx)) % 360.0, 1)
