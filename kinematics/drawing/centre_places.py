"""Where the instantaneous centres of a pose go on the space diagram, in model metres.

A centre near the linkage is drawn where it is, and the view grows to take it in. One far away
would shrink the linkage to a dot, so past ``REACH`` linkage sizes from the linkage's middle it is
left off the view and shown as an arrow at the view's edge pointing at it, with its distance and
direction in words; a centre at infinity is an arrow at the edge along its direction (the bodies
translate relative to each other, perpendicular to it). An undetermined centre has no place and is
only named. No primitive is made here: :mod:`kinematics.drawing.centres_overlay` draws these.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..instantaneous.kennedy import Centres

# A finite centre farther than this many linkage sizes from the linkage's middle is off the view:
# a designer reads the linkage at a useful size and the far centre's place in words.
REACH = 3.0


@dataclass(frozen=True)
class CentrePlace:
    """One centre as drawn: ``kind`` "on view" (``at_m``), "off view" (``at_m``, beyond the
    reach; ``direction`` from the linkage's middle towards it), "infinity" (``direction``, a
    unit vector) or "undetermined" (``reason``). ``name`` is the pair, ``"a|b"``."""

    name: str
    kind: str
    at_m: tuple | None = None
    direction: tuple | None = None
    distance_m: float = 0.0
    reason: str = ""


def linkage_box(solution) -> tuple:
    """(x0, y0, x1, y1) in metres of the pose's points."""
    xs, ys = solution.positions[:, 0], solution.positions[:, 1]
    return (float(xs.min()), float(ys.min()), float(xs.max()), float(ys.max()))


def centre_places(centres: Centres, reach: float = REACH) -> tuple:
    """Every centre of ``centres`` placed (see the module docstring), in the order found."""
    x0, y0, x1, y1 = linkage_box(centres.solution)
    middle = complex(0.5 * (x0 + x1), 0.5 * (y0 + y1))
    size = max(x1 - x0, y1 - y0, centres.solution.mechanism.size * centres.solution.mechanism.metres_per_unit)
    placed = []
    for name, centre in centres.centres.items():
        if centre.kind == "undetermined":
            placed.append(CentrePlace(name, "undetermined", reason=centre.reason))
        elif centre.kind == "direction":
            placed.append(CentrePlace(name, "infinity", direction=centre.direction))
        else:
            z = complex(*centre.at_m)
            away = z - middle
            if abs(away) <= reach * size:
                placed.append(CentrePlace(name, "on view", at_m=centre.at_m))
            else:
                unit = away / abs(away)
                placed.append(CentrePlace(name, "off view", at_m=centre.at_m, direction=(unit.real, unit.imag),
                                          distance_m=abs(away)))
    return tuple(placed)


def bounds_with_centres(solution, places) -> tuple:
    """The linkage's box grown to take in the centres drawn on the view."""
    x0, y0, x1, y1 = linkage_box(solution)
    for place in places:
        if place.kind == "on view":
            x, y = place.at_m
            x0, y0, x1, y1 = min(x0, x), min(y0, y), max(x1, x), max(y1, y)
    return (x0, y0, x1, y1)


def where_words(place: CentrePlace) -> str:
    """The label of a centre not drawn where it is: off the view with its place, or at infinity.

    >>> where_words(CentrePlace("crank|rocker", "off view", at_m=(2.5, -0.75), direction=(0.96, -0.29),
    ...                         distance_m=2.6))
    'crank|rocker off the view at (2500, −750) mm'
    >>> where_words(CentrePlace("ground|piston", "infinity", direction=(0.0, 1.0)))
    'ground|piston at infinity, 90.0°'
    """
    if place.kind == "off view":
        x, y = (f"{1000.0 * v:.0f}".replace("-", "−") for v in place.at_m)
        return f"{place.name} off the view at ({x}, {y}) mm"
    if place.kind == "infinity":
        angle = math.degrees(math.atan2(place.direction[1], place.direction[0])) % 180.0
        return f"{place.name} at infinity, {angle:.1f}°"
    return place.name
