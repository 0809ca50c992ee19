"""A velocity or acceleration polygon drawn from its construction steps.

Every line comes from a step's shapely geometry, placed by the view; image
figures join the images already computed. Nothing here solves anything.
"""

from __future__ import annotations

import math

from ..steps import Role
from ..style import IMAGE, pen_for
from . import symbols
from .declutter import declutter
from .sheet import Arrow, Circle, Line, Polyline, Recorder, Ref, View
from .space import outline, positions
from .symbols import Symbols

_LAYER_ORDER = {Role.DIRECTION: 0, Role.KNOWN: 1, Role.RESULT: 1, Role.INTERSECTION: 2, Role.IMAGE: 2}


def polygon_bounds(polygon) -> tuple:
    """(x0, y0, x1, y1) of everything a polygon draws, in its units, pole included."""
    coords = [(0.0, 0.0)]
    for step in polygon.steps:
        coords.extend(step.coords)
    xs, ys = zip(*coords, strict=True)
    return (min(xs), min(ys), max(xs), max(ys))


def draw_polygon(rec: Recorder, polygon, solution, view: View, size: Symbols, xy: dict | None = None) -> None:
    """Record ``polygon`` (a :class:`kinematics.Polygon` of ``solution``) into ``view``; ``xy``
    is the pose's point positions (:func:`~kinematics.drawing.space.positions`) if already at hand."""
    _draw_image_figures(rec, polygon, solution, view, positions(solution) if xy is None else xy)
    # Construction lines first, vectors over them, points and labels on top: the order a reader needs.
    for step in sorted(polygon.steps, key=lambda s: _LAYER_ORDER[s.role]):
        pen = pen_for(step)
        ids = {"view": view.name, "ref": Ref("step", step.id)}
        coords = [view.place(c) for c in step.coords]
        if step.role is Role.DIRECTION:
            rec.add(Line(start=coords[0], end=coords[-1], pen=pen, **ids))
        elif step.is_vector:
            symbols.arrow(rec, coords[0], coords[-1], pen, size, **ids)
        else:
            rec.add(Circle(centre=coords[0], radius=size.dot, pen=pen, filled=True, **ids))
            symbols.dot_mark(rec, coords[0], size.dot, view.name)
    labels = _labels(polygon, view, size)
    centre = (sum(where[0] for where, _, _ in labels) / len(labels),
              sum(where[1] for where, _, _ in labels) / len(labels)) if labels else view.origin
    segments = [(p.start, p.end) for p in rec.primitives if p.view == view.name and isinstance(p, (Line, Arrow))]
    for where, text, step_id in labels:
        avoid = symbols.directions_at(where, segments, tolerance=size.dot)
        symbols.label(rec, where, text, centre, IMAGE, size, gap=size.dot, avoid=avoid, view=view.name,
                      ref=Ref("step", step_id))
    declutter(rec, view.name)


def _labels(polygon, view: View, size: Symbols) -> list:
    """(where, text, step id) per labelled place; labels of coinciding points join ("a, d")."""
    merged = []
    for step in polygon.steps:
        if not step.label:
            continue
        where = view.place(step.coords[-1])  # a point, or the end of a vector, carries the label
        same = next((i for i, (at, _, _) in enumerate(merged) if math.dist(at, where) < 0.5 * size.text), None)
        if same is None:
            merged.append((where, step.label, step.id))
        elif step.label not in merged[same][1].split(", "):
            at, text, step_id = merged[same]
            merged[same] = (at, f"{text}, {step.label}", step_id)
    return merged


def _draw_image_figures(rec: Recorder, polygon, solution, view: View, xy: dict) -> None:
    """The image of each link, directly similar to it: a segment for a bar, a figure for a plate."""
    for link, names in solution.mechanism.links.items():
        if len(names) < 2 or not all(n in polygon.images for n in names):
            continue
        order, closed = outline(names, xy)
        points = tuple(view.place(polygon.images[n]) for n in order)
        ids = {"view": view.name, "ref": Ref("image", link)}
        if len(points) == 2:
            rec.add(Line(start=points[0], end=points[1], pen=IMAGE, **ids))
        else:
            rec.add(Polyline(points=points, pen=IMAGE, closed=closed, **ids))
