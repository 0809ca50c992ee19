"""Ground hatching: a region filled with parallel strokes, recorded once as the
strokes a painter draws and the pattern they come from, so a CAD file gets one
HATCH entity where a painter draws lines.

The strokes are the pattern's lines clipped to the outline, the lines taken
through the drawing's origin and ``spacing_mm`` apart, as a CAD program lays
a hatch pattern whose base point is the origin: the strokes a painter draws
and those a CAD program makes from the HATCH coincide.

>>> from kinematics.drawing.style import SPACE_GROUND
>>> band = ground_hatch(((0.0, -1.0), (4.0, -1.0), (4.0, 0.0), (0.0, 0.0)), 45.0, 1.0, SPACE_GROUND)
>>> len(band.points) // 2   # 3.54 mm across 45° lines 1 mm apart: lines 1 to 3 mm off the origin (0 only touches)
3
"""

from __future__ import annotations

import math
from typing import NamedTuple

from .sheet import Ref, Strokes
from .style import Pen


class Pattern(NamedTuple):
    """What a :class:`~kinematics.drawing.sheet.Strokes` hatches: the convex ``boundary``
    (its corners) filled with lines at ``angle_deg`` (counter-clockwise from +x, in
    [0°, 180°)) ``spacing_mm`` apart, through the origin."""

    boundary: tuple
    angle_deg: float
    spacing_mm: float


def _clip(boundary, ox: float, oy: float, ux: float, uy: float):
    """The part inside the convex ``boundary`` of the line through (ox, oy) along (ux, uy), or None.

    Cyrus-Beck: each edge's outward normal bounds the line's parameter from one side.
    """
    count = len(boundary)
    area = sum(boundary[i][0] * boundary[(i + 1) % count][1] - boundary[(i + 1) % count][0] * boundary[i][1]
               for i in range(count))
    turn = 1.0 if area > 0.0 else -1.0  # outward normals of a counter-clockwise outline point right of each edge
    enter, leave = -math.inf, math.inf
    for i in range(count):
        (ax, ay), (bx, by) = boundary[i], boundary[(i + 1) % count]
        nx, ny = turn * (by - ay), -turn * (bx - ax)
        along, room = nx * ux + ny * uy, nx * (ax - ox) + ny * (ay - oy)
        if along == 0.0:
            if room < 0.0:
                return None  # parallel to this edge and outside it
        elif along > 0.0:
            leave = min(leave, room / along)
        else:
            enter = max(enter, room / along)
    if leave - enter <= 1e-12:
        return None
    return (ox + enter * ux, oy + enter * uy), (ox + leave * ux, oy + leave * uy)


def ground_hatch(boundary, angle_deg: float, spacing_mm: float, pen: Pen, view: str = "",
                 ref: Ref | None = None) -> Strokes:
    """The convex ``boundary`` (corners, sheet mm) hatched at ``angle_deg``, ``spacing_mm`` apart.

    Parameters
    ----------
    boundary : the outline's corners in order (either sense), sheet mm.
    angle_deg : direction of the strokes, counter-clockwise from +x (a line has no sense:
        kept in [0°, 180°)).
    spacing_mm : distance between neighbouring strokes, square to them.
    pen, view, ref : as every primitive has them.

    Returns
    -------
    Strokes
        The strokes inside the outline, with the :class:`Pattern` they come from.
    """
    angle_deg = float(angle_deg) % 180.0
    corners = tuple((float(x), float(y)) for x, y in boundary)
    theta = math.radians(angle_deg)
    ux, uy = math.cos(theta), math.sin(theta)
    across = [y * ux - x * uy for x, y in corners]  # each corner's distance from the line through the origin
    strokes = []
    for k in range(math.ceil(min(across) / spacing_mm), math.floor(max(across) / spacing_mm) + 1):
        piece = _clip(corners, -k * spacing_mm * uy, k * spacing_mm * ux, ux, uy)  # the line k spacings off
        if piece is not None:
            strokes += piece
    return Strokes(points=tuple(strokes), pen=pen, view=view, ref=ref,
                   pattern=Pattern(corners, angle_deg, float(spacing_mm)))
