"""The results of one pose as a table: rows for the printed sheet (rounded,
with units) and CSV for other programs (SI, full double precision)."""

from __future__ import annotations

import csv
import io
import math

CSV_HEADER = (
    "kind", "name",
    "x [m]", "y [m]", "v_x [m/s]", "v_y [m/s]", "|v| [m/s]", "a_x [m/s^2]", "a_y [m/s^2]", "|a| [m/s^2]",
    "angle [deg]", "omega [rad/s]", "alpha [rad/s^2]",
    "sliding velocity [m/s]", "sliding acceleration [m/s^2]",
)


def _number(value: float) -> str:
    # repr round-trips a double exactly; a CSV reader gets the solver's number, not a rounded one.
    return repr(float(value))


def results_csv(solution) -> str:
    """The results of ``solution`` as CSV text: one row per point, link and slide.

    Columns that do not apply to a row are empty. Units are in the header;
    all values are SI at full double precision.

    >>> import kinematics
    >>> mech = kinematics.load_mechanism({"kinepoly": 1, "points": {"O": [0, 0], "A": [0, 1]},
    ...     "ground": ["O"], "links": {"crank": ["O", "A"]}, "length_unit": "m",
    ...     "driver": {"link": "crank", "pivot": "O", "speed": {"value": 2, "unit": "rad/s"}}})
    >>> print(results_csv(kinematics.solve(mech)).splitlines()[2])
    point,A,0.0,1.0,-2.0,0.0,2.0,-0.0,-4.0,4.0,,,,,
    """
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow(CSV_HEADER)
    blank = [""] * 5
    for i, name in enumerate(solution.point_names):
        (x, y), (vx, vy), (ax, ay) = solution.positions[i], solution.velocities[i], solution.accelerations[i]
        values = (x, y, vx, vy, math.hypot(vx, vy), ax, ay, math.hypot(ax, ay))
        writer.writerow(["point", name, *map(_number, values), *blank])
    for link, omega in solution.angular_velocity.items():
        angle = solution.link_angle_deg.get(link, math.nan)
        writer.writerow(["link", link, *[""] * 8, _number(angle), _number(omega),
                         _number(solution.angular_acceleration[link]), "", ""])
    for slide, speed in solution.sliding_velocity.items():
        writer.writerow(["slide", slide, *[""] * 11, _number(speed), _number(solution.sliding_acceleration[slide])])
    return out.getvalue()


def _short(value: float) -> str:
    return f"{value:.4g}"


def point_rows(solution) -> list:
    """Rows (point, |v| m/s, |a| m/s²) for the printed table, 4 significant figures."""
    rows = []
    for i, name in enumerate(solution.point_names):
        if name in solution.mechanism.ground:
            continue
        rows.append((name, _short(math.hypot(*solution.velocities[i])), _short(math.hypot(*solution.accelerations[i]))))
    return rows


def link_rows(solution) -> list:
    """Rows (link, ω rad/s, α rad/s²) for the printed table; CCW positive."""
    return [(link, _short(omega), _short(solution.angular_acceleration[link]))
            for link, omega in solution.angular_velocity.items()]


def slide_rows(solution) -> list:
    """Rows (slide, sliding velocity m/s, sliding acceleration m/s²) for the printed table."""
    return [(slide, _short(speed), _short(solution.sliding_acceleration[slide]))
            for slide, speed in solution.sliding_velocity.items()]
