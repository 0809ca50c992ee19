"""A velocity or acceleration polygon drawn from its construction steps.

Every line comes from a step's shapely geometry, placed by the view; image
figures join the images already computed. Nothing here solves anything.
"""

from __future__ import annotations

import numpy as np

from ..construct import Role
from ..style import IMAGE, pen_for
from . import symbols
from .sheet import Circle, Line, Polyline, Recorder, View
from .space import outline, positions
from .symbols import Symbols

_LAYER_ORDER = {Role.DIRECTION: 0, Role.KNOWN: 1, Role.RESULT: 1, Role.INTERSECTION: 2, Role.IMAGE: 2}


def polygon_bounds(polygon) -> tuple:
    """(x0, y0, x1, y1) of everything a polygon draws, in its units, pole included."""
    coords = [(0.0, 0.0)]
    for step in polygon.steps:
        coords.extend(step.geometry.coords)
    xs, ys = zip(*coords, strict=True)
    return (min(xs), min(ys), max(xs), max(ys))


def draw_polygon(rec: Recorder, polygon, solution, view: View, size: Symbols) -> None:
    """Record ``polygon`` (a :class:`kinematics.Polygon` of ``solution``) into ``view``."""
    ids = {"view": view.name}
    _draw_image_figures(rec, polygon, solution, view, ids)
    # Construction lines first, vectors over them, points and labels on top: the order a reader needs.
    for step in sorted(polygon.steps, key=lambda s: _LAYER_ORDER[s.role]):
        pen = pen_for(step)
        coords = [view.place(c) for c in step.geometry.coords]
        if step.role is Role.DIRECTION:
            rec.add(Line(start=coords[0], end=coords[-1], pen=pen, step=step.id, **ids))
        elif step.is_vector:
            symbols.arrow(rec, coords[0], coords[-1], pen, size, step=step.id, **ids)
        else:
            rec.add(Circle(centre=coords[0], radius=size.dot, pen=pen, filled=True, step=step.id, **ids))
    labels = {}
    for step in polygon.steps:
        if step.label:
            where = step.geometry.coords[-1]  # a point, or the end of a vector, carries the label
            labels.setdefault(step.label, (view.place(where), step.id))
    centre = tuple(np.mean([where for where, _ in labels.values()], axis=0)) if labels else view.origin
    for text, (where, step_id) in labels.items():
        symbols.label(rec, where, text, centre, IMAGE, size, gap=size.dot, step=step_id, **ids)


def _draw_image_figures(rec: Recorder, polygon, solution, view: View, ids) -> None:
    """The image of each plate (three or more joints), directly similar to it."""
    image_steps = {name: step.id for step in polygon.steps if step.role is Role.IMAGE for name in step.points}
    xy = positions(solution)
    for link, names in solution.mechanism.links.items():
        if len(names) < 3 or not all(n in polygon.images for n in names):
            continue
        order, closed = outline(names, xy)
        points = tuple(view.place(polygon.images[n]) for n in order)
        step_id = next((image_steps[n] for n in order if n in image_steps), "")
        rec.add(Polyline(points=points, pen=IMAGE, closed=closed, step=step_id, part=link, **ids))
