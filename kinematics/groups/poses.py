"""Plain-words warnings about a pose: a dead point of the driver (a driven dyad in
line, so the construction lines on the polygon are nearly parallel) versus a toggle
(a group's link in line with the link that carries its pin, so the output stops
while everything stays well-conditioned). Each group form says which of its own
configurations to warn of (``Group.pose_warnings``); the helpers they share are here."""

from __future__ import annotations

import math

from ..model.mechanism import GROUND, Mechanism

# Within this angle of being in line, a pose is called near a dead point or a toggle.
IN_LINE_DEG = 3.0


def angle_between_lines(u, v) -> float:
    """Acute angle between two lines (degrees, 0 for lines in line)."""
    cross = u[0] * v[1] - u[1] * v[0]
    dot = u[0] * v[0] + u[1] * v[1]
    return math.degrees(math.atan2(abs(cross), abs(dot)))


def vector(xy, p, q):
    """The vector from p to q in the pose ``xy`` (name -> (x, y))."""
    return (xy[q][0] - xy[p][0], xy[q][1] - xy[p][1])


def toggle_warnings(mech: Mechanism, links: tuple, xy: dict, pins: tuple) -> list:
    """Toggles of a group of ``links`` at the pose ``xy``: for each (pin, other) of ``pins``, the
    link of the group from ``pin`` to ``other`` in line with a link that carries ``pin`` in."""
    warnings = []
    for pin, other in pins:
        link = next(k for k in links if pin in mech.links[k])
        for carrier in mech.bodies_of(pin):
            if carrier in (GROUND, *links):
                continue
            # The carrier's line runs from its pivot (a ground point if it has one) to the pin.
            others = [p for p in mech.links[carrier] if p != pin]
            base = next((p for p in others if p in mech.ground), others[0] if others else None)
            in_line = angle_between_lines(vector(xy, base, pin), vector(xy, pin, other))
            if in_line < IN_LINE_DEG:
                warnings.append(f"toggle: links {carrier} and {link} are {in_line:.2f}° from being in line at "
                                f"{pin}; the links it drives are momentarily at rest")
    return warnings


def pose_warnings(mech: Mechanism, decomposition, xy: dict) -> list:
    """Warnings for the pose with point coordinates ``xy`` (name -> (x, y)), group by group."""
    return [warning for group in decomposition.groups for warning in group.pose_warnings(mech, xy)]
