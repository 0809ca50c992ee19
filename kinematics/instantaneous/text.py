"""The centres of a pose for people (a table in mm) and for programs (JSON in SI)."""

from __future__ import annotations

import math

from ..errors import KinematicsError
from ..model.units import angle_text
from .advantage import advantage
from .kennedy import Centres


def where_text(centre) -> str:
    """A centre's x, y in mm, its direction at infinity, or 'undetermined'."""
    if centre.kind == "point":
        x, y = centre.at_m
        return f"{x * 1000:>11.3f}{y * 1000:>11.3f}"
    if centre.kind == "direction":
        ux, uy = centre.direction
        angle = round(math.degrees(math.atan2(uy, ux)), 2) + 0.0  # + 0.0: no "-0.00°"
        return f"{f'at infinity, direction {angle:.2f}°':>22}"
    return f"{'undetermined':>22}"


def centres_table(centres: Centres) -> str:
    """The table of centres for people (pair, x and y in mm or the direction at infinity, how found), the
    velocity cross-check, the mechanical advantage where the file names an output, and the warnings."""
    solution = centres.solution
    mech = solution.mechanism
    pairs = list(centres.centres.values())
    width = max(len("pair"), *(len(c.name) for c in pairs)) + 2
    at = angle_text(solution.driver_angle_deg)
    lines = [f"{mech.title or 'Mechanism'} — instantaneous centres at driver angle {at} "
             f"({len(centres.bodies)} bodies, {len(pairs)} centres)", "",
             f"{'pair':<{width}}{'x [mm]':>11}{'y [mm]':>11}  how found"]
    for centre in pairs:
        how = centre.reason if centre.kind == "undetermined" else centre.how
        lines.append(f"{centre.name:<{width}}{where_text(centre)}  {'primary: ' if centre.primary else ''}{how}")
    lines += ["", f"velocities from the centres against the polygon and the solver: largest relative difference "
              f"{centres.max_relative_difference:.3g} at {centres.where or '-'}"]
    if mech.output is not None:
        try:
            lines.append(advantage(centres).sentence())
        except KinematicsError as err:
            lines.append(f"no mechanical advantage: {err}")
    lines += [f"warning: {w}" for w in centres.warnings]
    return "\n".join(lines)


def centre_json(centre) -> dict:
    """One centre for JSON, in SI: ``{"at": [x, y]}``, ``{"direction": [ux, uy]}`` or ``{"undetermined": reason}``."""
    if centre.kind == "point":
        return {"at": list(centre.at_m)}
    if centre.kind == "direction":
        return {"direction": list(centre.direction)}
    return {"undetermined": centre.reason}


def centres_json(centres: Centres) -> dict:
    """``centres``: pair -> {"at": [x, y]} (m) | {"direction": [ux, uy]} | {"undetermined": reason}, pairs
    named "<body>|<body>" with the bodies in the file's order (the frame as ``ground``), in the order
    found; ``crosscheck``: the velocities from the centres against the polygon and the solver."""
    return {"kinepoly_centres": 1, "driver_angle_deg": centres.solution.driver_angle_deg,
            "centres": {c.name: centre_json(c) for c in centres.centres.values()},
            "crosscheck": {"max_relative_difference": centres.max_relative_difference, "where": centres.where},
            "warnings": list(centres.warnings)}
