"""Plain-words warnings about a pose: a dead point of the driver (a driven dyad in
line, so the construction lines on the polygon are nearly parallel) versus a toggle
(a group's link in line with the link that carries its pin, so the output stops
while everything stays well-conditioned)."""

from __future__ import annotations

import math

from ..model.mechanism import GROUND, Mechanism
from .decompose import Decomposition

# Within this angle of being in line, a pose is called near a dead point or a toggle.
IN_LINE_DEG = 3.0


def _angle_between_lines(u, v) -> float:
    """Acute angle between two lines (degrees, 0 for lines in line)."""
    cross = u[0] * v[1] - u[1] * v[0]
    dot = u[0] * v[0] + u[1] * v[1]
    return math.degrees(math.atan2(abs(cross), abs(dot)))


def _vector(xy, p, q):
    return (xy[q][0] - xy[p][0], xy[q][1] - xy[p][1])


def pose_warnings(mech: Mechanism, decomposition: Decomposition, xy: dict) -> list:
    """Warnings for the pose with point coordinates ``xy`` (name -> (x, y))."""
    warnings = []
    for group in decomposition.groups:
        r = group.roles
        if group.form == "RRR":
            off_line = _angle_between_lines(_vector(xy, r["B"], r["A"]), _vector(xy, r["B"], r["C"]))
            if off_line < IN_LINE_DEG:
                first, second = group.links
                warnings.append(f"near a dead point of the driver: links {first} and {second} are {off_line:.2f}° "
                                f"from being in line at {r['B']}; the polygon's construction lines are nearly "
                                "parallel")
        elif group.form == "RRP":
            slide = mech.slides[group.slide]
            square = 90.0 - _angle_between_lines(_vector(xy, r["A"], r["D"]), _vector(xy, *slide.line))
            if square < IN_LINE_DEG:
                warnings.append(f"near a dead point of the driver: link {group.links[0]} is {square:.2f}° from "
                                f"square to the line of slide {slide.name}")
        if group.form in ("RPR", "numeric"):
            continue
        for pin, other in ((r["A"], r.get("B", r.get("D"))), (r.get("C"), r.get("B"))):
            if pin is None or other is None:
                continue
            link = next(k for k in group.links if pin in mech.links[k])
            for carrier in mech.bodies_of(pin):
                if carrier in (GROUND, *group.links):
                    continue
                # The carrier's line runs from its pivot (a ground point if it has one) to the pin.
                others = [p for p in mech.links[carrier] if p != pin]
                base = next((p for p in others if p in mech.ground), others[0] if others else None)
                in_line = _angle_between_lines(_vector(xy, base, pin), _vector(xy, pin, other))
                if in_line < IN_LINE_DEG:
                    warnings.append(f"toggle: links {carrier} and {link} are {in_line:.2f}° from being in line at "
                                    f"{pin}; the links it drives are momentarily at rest")
    return warnings
