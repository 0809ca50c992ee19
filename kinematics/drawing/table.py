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


def _short(value: float, reference: float) -> str:
    # Round-off of a quantity that is zero (a crank's α at constant speed) prints as 0, not 9e-14.
    return "0" if abs(value) <= 1e-9 * reference else f"{value:.4g}"


def _reference(values) -> float:
    return max((abs(v) for v in values), default=0.0)


def point_rows(solution) -> list:
    """Rows (point, |v| m/s, |a| m/s²) for the printed table, 4 significant figures."""
    speeds = [math.hypot(*v) for v in solution.velocities]
    accelerations = [math.hypot(*a) for a in solution.accelerations]
    v_ref, a_ref = _reference(speeds), _reference(accelerations)
    return [(name, _short(speeds[i], v_ref), _short(accelerations[i], a_ref))
            for i, name in enumerate(solution.point_names) if name not in solution.mechanism.ground]


def link_rows(solution) -> list:
    """Rows (link, ω rad/s, α rad/s²) for the printed table; CCW positive."""
    w_ref, a_ref = _reference(solution.angular_velocity.values()), _reference(solution.angular_acceleration.values())
    return [(link, _short(omega, w_ref), _short(solution.angular_acceleration[link], a_ref))
            for link, omega in solution.angular_velocity.items()]


def slide_rows(solution) -> list:
    """Rows (slide, sliding velocity m/s, sliding acceleration m/s²) for the printed table."""
    v_ref, a_ref = _reference(solution.sliding_velocity.values()), _reference(solution.sliding_acceleration.values())
    return [(slide, _short(speed, v_ref), _short(solution.sliding_acceleration[slide], a_ref))
            for slide, speed in solution.sliding_velocity.items()]
