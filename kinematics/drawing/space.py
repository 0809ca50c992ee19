"""The space diagram as the trade draws it: link centre lines from joint
centre to joint centre (a plate as its outline through its joints), so any
length on paper measures true at the drawing scale; pins, fixed pivots,
slider blocks and guides as symbols of constant paper size."""

from __future__ import annotations

import math

import numpy as np

from ..model import GROUND
from ..style import ANNOTATION, SPACE_GROUND, SPACE_LINK
from . import symbols
from .sheet import Line, Polyline, Recorder, View
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
    sliding = {slide.point for slide in mech.slides.values()}
    for name, where in at.items():
        bodies = mech.bodies_of(name)
        if GROUND in bodies:
            symbols.fixed_pivot(rec, where, SPACE_GROUND, size, part=name, **ids)
        symbols.pin(rec, where, SPACE_LINK, size, joint=len(bodies) > 1, part=name, **ids)
        # A label clears the fixed-pivot mark under its pin, or the slider block round it.
        gap = 5.0 * size.pin if GROUND in bodies else 4.0 * size.pin if name in sliding else size.pin
        symbols.label(rec, where, name, centre, SPACE_LINK, size, gap=gap, part=name, **ids)
    if mech.driver is not None:
        _draw_driver_sense(rec, mech.driver, mech.links[mech.driver.link], at, size, ids)


def _draw_slide(rec: Recorder, slide, at, size: Symbols, ids) -> None:
    e, f, d = (np.array(at[n]) for n in (*slide.line, slide.point))
    length = float(np.hypot(*(f - e)))
    if length == 0.0:
        return
    u = (f - e) / length
    if slide.guide == GROUND:
        along = [0.0, length, float((d - e) @ u)]
        reach = 4.0 * size.pin  # the guide runs a little past the block's travel shown
        start, end = e + (min(along) - reach) * u, e + (max(along) + reach) * u
        rec.add(Line(start=tuple(start), end=tuple(end), pen=SPACE_GROUND, part=slide.name, **ids))
    symbols.slider_block(rec, tuple(d), tuple(u), SPACE_LINK, size, part=slide.name, **ids)


def _draw_driver_sense(rec: Recorder, driver, link_points, at, size: Symbols, ids) -> None:
    """A curved arrow round the driver's pivot in the sense it turns."""
    others = [n for n in link_points if n != driver.pivot]
    if not others or driver.speed_rad_s == 0.0:
        return
    cx, cy = at[driver.pivot]
    tx, ty = at[others[0]]
    start = math.atan2(ty - cy, tx - cx)
    sense = 1.0 if driver.speed_rad_s > 0 else -1.0
    radius = 7.0 * size.pin
    angles = [start + sense * math.radians(20 + 5 * k) for k in range(21)]  # 20° to 120° past the crank
    points = tuple((cx + radius * math.cos(a), cy + radius * math.sin(a)) for a in angles)
    rec.add(Polyline(points=points[:-8], pen=ANNOTATION, part=driver.link, **ids))
    symbols.arrow(rec, points[-9], points[-1], ANNOTATION, size, part=driver.link, **ids)
