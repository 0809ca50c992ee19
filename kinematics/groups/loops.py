"""Rotatability of the loop a group closes: the :class:`LoopCheck` record,
Grashof's class of a four-bar, and the lengths each group's check reads
(in the file's unit, straight from the reference pose)."""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..model.mechanism import GROUND


@dataclass(frozen=True)
class LoopCheck:
    """One loop's rotatability verdict, in words, with the lengths it used (mm of the file unit)."""

    loop: str
    verdict: str
    turns_fully: str | None
    lengths: dict


def grashof_class(frame: float, input_: float, coupler: float, output: float) -> tuple[str, str | None]:
    """(class, which link turns fully) of a four-bar with the given link lengths.

    >>> grashof_class(140, 40, 122, 107)
    ('crank-rocker', 'input')
    """
    lengths = {"frame": frame, "input": input_, "coupler": coupler, "output": output}
    ordered = sorted(lengths.values())
    s, p, q, l_ = ordered
    margin = (s + l_) - (p + q)
    if abs(margin) <= 1e-9 * l_:
        return "change point (s + l = p + q)", None
    if margin > 0:
        return "non-Grashof triple rocker", None
    shortest = min(lengths, key=lengths.get)
    return {"frame": ("double-crank", "input and output"), "input": ("crank-rocker", "input"),
            "output": ("crank-rocker", "output"), "coupler": ("double-rocker", "coupler")}[shortest]


def ground_pivot(mech, link):
    """The ground pivot of ``link``, or None if it has none."""
    return next((p for p in mech.links[link] if p in mech.ground), None)


def length(mech, p, q):
    """The distance between points p and q of the file, in the file's length unit."""
    (x1, y1), (x2, y2) = mech.points[p], mech.points[q]
    return math.hypot(float(x2) - float(x1), float(y2) - float(y1))


def distance_from_line(mech, point, line) -> float:
    """Distance (file units) of ``point`` from the line through the two points of ``line``."""
    (ex, ey), (fx, fy) = (mech.points[p] for p in line)
    px, py = mech.points[point]
    return abs((px - ex) * (fy - ey) - (py - ey) * (fx - ex)) / math.hypot(fx - ex, fy - ey)


def driving_crank(mech, group, pin):
    """(carrier, its ground pivot, crank length) of the link that carries ``pin`` into ``group``
    from a ground pivot, or None where no such crank drives the loop."""
    carrier = next((b for b in mech.bodies_of(pin) if b not in group.links and b != GROUND), None)
    pivot = ground_pivot(mech, carrier) if carrier else None
    if pivot is None or pivot == pin:
        return None
    return carrier, pivot, length(mech, pivot, pin)
