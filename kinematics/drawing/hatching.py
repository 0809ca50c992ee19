"""Ground hatching: a region filled with parallel strokes, recorded once as its
outline and its pattern so a CAD file gets one HATCH entity where a painter
draws the strokes.

The strokes are the pattern's lines clipped to the outline, the lines taken
through the drawing's origin and ``spacing_mm`` apart, as a CAD program lays
a hatch pattern whose base point is the origin: the strokes a painter draws
and those a CAD program regenerates from the HATCH coincide.

>>> from kinematics.drawing.style import SPACE_GROUND
>>> band = ground_hatch(((0.0, -1.0), (4.0, -1.0), (4.0, 0.0), (0.0, 0.0)), 45.0, 1.0, SPACE_GROUND)
>>> len(band.strokes) // 2   # the band is 3.54 mm across 45° lines 1 mm apart: lines 0 to 3 mm off the origin
4
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import shapely

from .style import Pen


@dataclass(frozen=True)
class GroundHatch:
    """A closed ``boundary`` hatched with strokes at ``angle_deg`` (counter-clockwise
    from +x), ``spacing_mm`` apart; ``strokes`` are those strokes taken in pairs
    of ends, for a backend that draws lines."""

    boundary: tuple
    strokes: tuple
    angle_deg: float
    spacing_mm: float
    pen: Pen
    view: str = ""
    step: str = ""
    part: str = ""


def ground_hatch(boundary, angle_deg: float, spacing_mm: float, pen: Pen, **ids) -> GroundHatch:
    """``boundary`` (corners, sheet mm) hatched at ``angle_deg``, ``spacing_mm`` apart (the
    angle kept in [0°, 180°): a line has no sense)."""
    angle_deg = float(angle_deg) % 180.0
    corners = tuple((float(x), float(y)) for x, y in boundary)
    outline = shapely.Polygon(corners)
    theta = math.radians(angle_deg)
    ux, uy = math.cos(theta), math.sin(theta)
    across = [y * ux - x * uy for x, y in corners]  # each corner's distance from the line through the origin
    along = [x * ux + y * uy for x, y in corners]
    start, end = min(along) - 1.0, max(along) + 1.0  # every line long enough to cross the whole outline
    strokes = []
    for k in range(math.ceil(min(across) / spacing_mm), math.floor(max(across) / spacing_mm) + 1):
        ox, oy = -k * spacing_mm * uy, k * spacing_mm * ux  # the line's foot, k spacings off the origin
        line = shapely.LineString([(ox + start * ux, oy + start * uy), (ox + end * ux, oy + end * uy)])
        piece = outline.intersection(line)
        for segment in getattr(piece, "geoms", [piece]):
            if isinstance(segment, shapely.LineString) and segment.length > 0.0:
                (x0, y0), *_, (x1, y1) = segment.coords
                strokes += [(x0, y0), (x1, y1)]
    return GroundHatch(boundary=corners, strokes=tuple(strokes), angle_deg=float(angle_deg),
                       spacing_mm=float(spacing_mm), pen=pen, **ids)
