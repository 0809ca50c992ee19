"""The space diagram as the trade draws it: link centre lines from joint
centre to joint centre (a plate as its outline through its joints), so any
length on paper measures true at the drawing scale; pins, fixed pivots,
slider blocks and guides as symbols of constant paper size."""

from __future__ import annotations

import math

import numpy as np

from ..model.mechanism import GROUND
from . import symbols
from .hatching import ground_hatch
from .sheet import Line, Polyline, Recorder, Text, View
from .style import ANNOTATION, SPACE_GROUND, SPACE_LINK
from .symbols import Symbols

# Points this close to one line (relative to the link's size) make a straight bar, not a plate.
COLLINEAR = 1e-9


def outline(names, xy: dict) -> tuple:
    """The joints of one link in drawing order: round the plate's centre for a
    plate, along the bar for points in one line; the second value says closed."""
    names = list(names)
    if len(names) <= 2:
        return tuple(names), False
    pts = np.array([xy[n] for n in names], dtype=float)
    centre = pts.mean(axis=0)
    spread = pts - centre
    size = float(np.max(np.hypot(*spread.T)))
    _, singular, axes = np.linalg.svd(spread)
    if size == 0.0 or singular[-1] <= COLLINEAR * size * math.sqrt(len(names)):
        along = spread @ axes[0]
        return tuple(names[i] for i in np.argsort(along, kind="stable")), False
    angles = np.arctan2(spread[:, 1], spread[:, 0])
    return tuple(names[i] for i in np.argsort(angles, kind="stable")), True


def positions(solution) -> dict:
    """Point name -> (x, y) in metres, straight from the solved pose."""
    return {name: (float(solution.positions[i][0]), float(solution.positions[i][1]))
            for i, name in enumerate(solution.point_names)}


def draw_space(rec: Recorder, solution, view: View, size: Symbols) -> None:
    """Record the space diagram of ``solution`` into ``view``."""
    mech = solution.mechanism
    xy = positions(solution)
    at = {name: view.place(p) for name, p in xy.items()}
    ids = {"view": view.name}
    for link, names in mech.links.items():
        order, closed = outline(names, xy)
        if len(order) == 2:
            rec.add(Line(start=at[order[0]], end=at[order[1]], pen=SPACE_LINK, part=link, **ids))
        elif len(order) > 2:
            rec.add(Polyline(points=tuple(at[n] for n in order), pen=SPACE_LINK, closed=closed, part=link, **ids))
    for slide in mech.slides.values():
        _draw_slide(rec, slide, at, size, ids)
    centre = tuple(np.mean(list(at.values()), axis=0))
    _draw_joints(rec, mech, at, centre, size, ids)
    _draw_link_names(rec, mech, xy, at, centre, size, ids)
    if mech.driver is not None:
        _draw_driver_sense(rec, mech, at, centre, size, ids)


def _segments(primitives, view: str) -> list:
    """The straight pieces of the link and guide lines already drawn in ``view``."""
    out = []
    for p in primitives:
        if p.view != view or p.pen not in (SPACE_LINK, SPACE_GROUND):
            continue
        if isinstance(p, Line):
            out.append((p.start, p.end))
        elif isinstance(p, Polyline):
            ring = list(p.points) + ([p.points[0]] if p.closed else [])
            out.extend(zip(ring, ring[1:], strict=False))
    return out


def _draw_link_names(rec: Recorder, mech, xy, at, centre, size: Symbols, ids) -> None:
    """Each link's name in small text, so the results table reads against the
    drawing: beside a bar's middle (on the side away from the mechanism's
    middle), at a plate's centre."""
    for link, names in mech.links.items():
        order, closed = outline(names, xy)
        if closed:
            where = tuple(np.mean([at[n] for n in order], axis=0))
            rec.add(Text(position=where, text=link, height=size.small_text, pen=ANNOTATION, align="centre",
                         anchor="middle", part=link, **ids))
            continue
        (x0, y0), (x1, y1) = at[order[0]], at[order[-1]]
        length = math.hypot(x1 - x0, y1 - y0)
        if length < 4 * size.text:
            continue  # too short on paper to carry its name
        middle = (0.5 * (x0 + x1), 0.5 * (y0 + y1))
        nx, ny = -(y1 - y0) / length, (x1 - x0) / length
        if (middle[0] - centre[0]) * nx + (middle[1] - centre[1]) * ny < 0:
            nx, ny = -nx, -ny
        symbols.label(rec, middle, link, (middle[0] - nx, middle[1] - ny), ANNOTATION,
                      Symbols(text=size.small_text), gap=0.5 * size.small_text, part=link, **ids)


def _guide_sides(mech, at) -> dict:
    """Point name -> unit normal to the left of its fixed guide (the side without hatching)."""
    sides = {}
    for slide in mech.slides.values():
        if slide.guide == GROUND:
            (ex, ey), (fx, fy) = at[slide.line[0]], at[slide.line[1]]
            length = math.hypot(fx - ex, fy - ey) or 1.0
            for name in (*slide.line, slide.point):
                sides[name] = (-(fy - ey) / length, (fx - ex) / length)
    return sides


def _draw_joints(rec: Recorder, mech, at, centre, size: Symbols, ids) -> None:
    """Pins, fixed-pivot marks and point labels."""
    sliding = {slide.point for slide in mech.slides.values()}
    sides = _guide_sides(mech, at)
    segments = _segments(rec.primitives, ids["view"])
    for name, where in at.items():
        bodies = mech.bodies_of(name)
        # A fixed point on no link only marks where a guide runs: no pivot symbol for it.
        pivot = GROUND in bodies and len(bodies) > 1
        if pivot:
            symbols.fixed_pivot(rec, where, SPACE_GROUND, size, part=name, **ids)
        symbols.pin(rec, where, SPACE_LINK, size, joint=len(bodies) > 1, part=name, **ids)
        # A label clears the fixed-pivot mark under its pin, or the slider block round it;
        # on a fixed guide it goes to the side without hatching, elsewhere away from the middle.
        gap = 5.0 * size.pin if pivot else 4.0 * size.pin if name in sliding else size.pin
        side = sides.get(name)
        away_from = (where[0] - side[0], where[1] - side[1]) if side is not None and not pivot else centre
        avoid = symbols.directions_at(where, segments, tolerance=size.dot)
        if pivot:
            avoid.append(-0.5 * math.pi)  # the fixed-pivot mark hangs below the pin
        symbols.label(rec, where, name, away_from, SPACE_LINK, size, gap=gap, avoid=avoid, part=name, **ids)


def _draw_slide(rec: Recorder, slide, at, size: Symbols, ids) -> None:
    """The slider block on its line; a fixed guide also as a hatched line past the block's reach."""
    e, f, d = (np.array(at[n]) for n in (*slide.line, slide.point))
    length = float(np.hypot(*(f - e)))
    if length == 0.0:
        return
    u = (f - e) / length
    if slide.guide == GROUND:
        along = [0.0, length, float((d - e) @ u)]
        reach = 4.0 * size.pin  # the guide runs a little past the block's travel shown
        lo, hi = min(along) - reach, max(along) + reach
        rec.add(Line(start=_point(e + lo * u), end=_point(e + hi * u), pen=SPACE_GROUND, part=slide.name, **ids))
        # Hatching on the guide's right-hand side marks it as fixed: strokes at 45° back along it.
        below = np.array([u[1], -u[0]])
        depth = 2.0 * size.pin * math.sqrt(0.5)
        band = [_point(e + lo * u), _point(e + hi * u), _point(e + hi * u + depth * below),
                _point(e + lo * u + depth * below)]
        angle = math.degrees(math.atan2(below[1] - u[1], below[0] - u[0]))
        rec.add(ground_hatch(band, angle, 3.0 * size.pin * math.sqrt(0.5), SPACE_GROUND, part=slide.name, **ids))
    symbols.slider_block(rec, _point(d), _point(u), SPACE_LINK, size, part=slide.name, **ids)


def _point(array) -> tuple:
    return (float(array[0]), float(array[1]))


def _angle_gap(a: float, b: float) -> float:
    return abs((a - b + math.pi) % (2.0 * math.pi) - math.pi)


def _draw_driver_sense(rec: Recorder, mech, at, centre, size: Symbols, ids) -> None:
    """A curved arrow round the driver's pivot in the sense it turns, set where
    it is clearest of the lines meeting at the pivot and of the pivot's label."""
    driver = mech.driver
    if driver.speed_rad_s == 0.0:
        return
    cx, cy = at[driver.pivot]
    busy = [math.atan2(at[n][1] - cy, at[n][0] - cx) for names in mech.links.values() if driver.pivot in names
            for n in names if n != driver.pivot]
    busy.append(math.atan2(cy - centre[1], cx - centre[0]))  # the label sits away from the middle
    busy.append(-0.5 * math.pi)  # the fixed-pivot mark hangs below
    middle = max((math.radians(d) for d in range(0, 360, 10)), key=lambda c: min(_angle_gap(c, b) for b in busy))
    sense = 1.0 if driver.speed_rad_s > 0 else -1.0
    radius = 5.5 * size.pin
    angles = [middle + sense * math.radians(-45 + 5 * k) for k in range(19)]  # 90° of arc
    points = tuple((cx + radius * math.cos(a), cy + radius * math.sin(a)) for a in angles)
    rec.add(Polyline(points=points[:-8], pen=ANNOTATION, part=driver.link, **ids))
    symbols.arrow(rec, points[-9], points[-1], ANNOTATION, size, part=driver.link, **ids)
