"""A velocity or acceleration polygon drawn from its construction steps.

Every line comes from a step's shapely geometry, placed by the view; image
figures join the images already computed. Nothing here solves anything.
"""

from __future__ import annotations

import math

from ..groups.steps import Role
from . import symbols
from .declutter import declutter
from .sheet import Circle, Line, Polyline, Recorder, View, ref_of
from .space import outline, positions
from .style import IMAGE, pen_for
from .symbols import Symbols


def _layer(step) -> int:
    """Where a step is drawn in the stack: construction lines, then vectors, then points (by
    identity: an Enum's hash is a Python call, and this runs for every step of every frame)."""
    role = step.role
    return 0 if role is Role.DIRECTION else 1 if role is Role.KNOWN or role is Role.RESULT else 2


def polygon_bounds(polygon) -> tuple:
    """(x0, y0, x1, y1) of everything a polygon draws, in its units, pole included."""
    coords = [(0.0, 0.0)]
    for step in polygon.steps:
        coords.extend(step.coords)
    xs, ys = zip(*coords, strict=True)
    return (min(xs), min(ys), max(xs), max(ys))


def draw_polygon(rec: Recorder, polygon, solution, view: View, size: Symbols, xy: dict | None = None,
                 pen_of=pen_for, stack_labels: bool = False, labelled=None) -> None:
    """Record ``polygon`` (a :class:`kinematics.Polygon` of ``solution``) into ``view``; ``xy``
    is the pose's point positions (:func:`~kinematics.drawing.space.positions`) if already at hand;
    ``pen_of`` gives a step its pen (the force polygon draws on layers of its own). The labels of
    coinciding points join on one line ("a, d"), or with ``stack_labels`` stand one a line (a
    force's label is long: "F(crank→rod)", and a vertex of the force polygon ends several);
    ``labelled(step)``, if given, says which steps are labelled (all that have a label otherwise)."""
    name, place = view.name, view.place
    # The lines a label must not sit along: the image segments, construction lines and vectors.
    segments = _draw_image_figures(rec, polygon, solution, view, positions(solution) if xy is None else xy)
    # Construction lines first, vectors over them, points and labels on top: the order a reader needs.
    for step in sorted(polygon.steps, key=_layer):
        pen, ref = pen_of(step), ref_of("step", step.id)
        if step.role is Role.DIRECTION:
            ends = place(step.coords[0]), place(step.coords[-1])
            rec.add(Line(*ends, pen, name, ref))
            segments.append(ends)
            if not stack_labels:  # a construction line's free ends: no image label sits over them
                for end in ends:  # (the force polygon's stacked labels keep their own fitted places)
                    symbols.dot_mark(rec, end, size.dot, name)
        elif step.is_vector:
            ends = place(step.coords[0]), place(step.coords[-1])
            if symbols.arrow(rec, *ends, pen, size, view=name, ref=ref):
                segments.append(ends)
        else:
            at = place(step.coords[0])
            rec.add(Circle(at, size.dot, pen, True, name, ref))
            symbols.dot_mark(rec, at, size.dot, name)
    labels = _labels(polygon, view, size, labelled)
    centre = (sum(where[0] for where, _ in labels) / len(labels),
              sum(where[1] for where, _ in labels) / len(labels)) if labels else view.origin
    lines = [] if rec.draft else symbols.lines_near(segments, size.dot)
    for where, names in labels:
        texts = [(text, ref_of("step", step_id)) for text, step_id in names]
        if not stack_labels:
            texts = [(", ".join(text for text, _ in names), texts[0][1])]
        symbols.stacked_label(rec, where, texts, centre, IMAGE, size, gap=size.dot,
                              avoid=symbols.directions_at(where, lines), view=name)
    declutter(rec, view.name)


def _labels(polygon, view: View, size: Symbols, labelled=None) -> list:
    """(where, [(text, step id), ...]) per labelled place: the labels of the steps ending there,
    each once, in the steps' order."""
    merged = []
    for step in polygon.steps:
        if not step.label or (labelled is not None and not labelled(step)):
            continue
        where = view.place(step.coords[-1])  # a point, or the end of a vector, carries the label
        same = next((i for i, (at, _) in enumerate(merged) if math.dist(at, where) < 0.5 * size.text), None)
        if same is None:
            merged.append((where, [(step.label, step.id)]))
        elif step.label not in (text for text, _ in merged[same][1]):
            merged[same][1].append((step.label, step.id))
    return merged


def _draw_image_figures(rec: Recorder, polygon, solution, view: View, xy: dict) -> list:
    """The image of each link, directly similar to it: a segment for a bar, a figure for a plate;
    returns the segments' ends."""
    segments = []
    images, place, name = polygon.images, view.place, view.name
    for link, names in solution.mechanism.links.items():
        if len(names) < 2 or not images.keys() >= set(names):
            continue
        if len(names) == 2:
            points = (place(images[names[0]]), place(images[names[1]]))
            rec.add(Line(points[0], points[1], IMAGE, name, ref_of("image", link)))
            segments.append(points)
            continue
        order, closed = outline(names, xy)
        rec.add(Polyline(tuple(place(images[n]) for n in order), IMAGE, closed, name, ref_of("image", link)))
    return segments
