"""The force polygon drawn from its construction steps, and a force's line of action on the
space diagram.

The force polygon (:class:`kinematics.forcepolygon.ForcePolygon`) is drawn by the kinematic
polygons' own machinery (:func:`~kinematics.drawing.polygons.draw_polygon`: vectors, lines of
known direction, intersections, labels) with pens of its own, so the DXF puts it on layers of
its own (FORCE-…). Its scale is the construction's, from the 1, 2, 5 series, stated in N per mm.
Nothing here computes a force: every vector is a step's, every place a step's ``space``.

>>> import kinematics
>>> from kinematics.forcepolygon import force_polygon
>>> from kinematics.drawing.symbols import Symbols
>>> mech = kinematics.load_mechanism({"kinepoly": 2, "length_unit": "mm",
...     "points": {"O": [0, 0], "A": [30, 40]}, "ground": ["O"], "links": {"crank": ["O", "A"]},
...     "driver": {"link": "crank", "pivot": "O", "speed": {"value": 60, "unit": "rpm"}},
...     "masses": {"crank": {"mass": {"value": 1.0, "unit": "kg"}, "centre": [15, 20],
...                          "inertia": {"value": 1000, "unit": "kg*mm^2"}}}})
>>> made = force_polygon(kinematics.construct(kinematics.solve(mech)))
>>> sheet = force_pane(made, Symbols())
>>> sheet.views["force"].scale_text
'0.02 N per mm'
"""

from __future__ import annotations

import math
from dataclasses import replace

from ..groups.steps import Component, Role
from .panes import polygon_pane
from .scaling import plain
from .sheet import TRUE_SIZE_SPACE, Arrow, Line, Recorder, Ref, Sheet, Text, View
from .style import CORIOLIS, DIRECTION, FLAGGED, IMAGE, KNOWN, NUMERIC, RESULT, Pen
from .symbols import Symbols, arrow

# The kinematic polygons' colours and weights (one visual language), on layers of their own.
FORCE_KNOWN = replace(KNOWN, layer="FORCE-KNOWN", legend="known force (inertia, weight, load, reaction)")
FORCE_PERPENDICULAR = replace(CORIOLIS, layer="FORCE-PERPENDICULAR",
                              legend="perpendicular component, from the moments")
FORCE_LINE = replace(DIRECTION, layer="FORCE-CONSTRUCTION", legend="line of known direction (along link, normal)")
FORCE_RESULT = replace(RESULT, layer="FORCE-RESULT", legend="force found by the polygon")
FORCE_POINT = replace(IMAGE, layer="FORCE-POINTS", legend="pole, intersection and label")
FORCE_NUMERIC = replace(NUMERIC, layer="FORCE-NUMERIC", legend="force from the numeric solution (no dyad)")
FORCE_FLAGGED = replace(FLAGGED, layer="FORCE-FLAGGED", legend="ill-conditioned intersection")
# A force's line of action shown on the space diagram (hover in the window).
FORCE_ACTION = Pen(RESULT.colour, 0.35, "dashdot", "FORCE-ACTION", "line of action of a force")
FORCE_LEGEND = (FORCE_KNOWN, FORCE_PERPENDICULAR, FORCE_RESULT, FORCE_LINE, FORCE_POINT, FORCE_NUMERIC,
                FORCE_FLAGGED)
# A line of action is drawn this many times the design's size long, centred on its point.
ACTION_LENGTH = 1.2


def force_pen(step) -> Pen:
    """The pen a force polygon step is drawn with."""
    if step.numeric:
        return FORCE_NUMERIC
    if step.flagged:
        return FORCE_FLAGGED
    if step.role is Role.DIRECTION:
        return FORCE_LINE
    if step.role is Role.RESULT and len(step.coords) == 2:
        return FORCE_RESULT
    if step.component is Component.PERPENDICULAR:
        return FORCE_PERPENDICULAR
    if step.role is Role.KNOWN:
        return FORCE_KNOWN
    return FORCE_POINT


def screen_labelled(step, chosen: str = "") -> bool:
    """Whether a screen's force polygon labels ``step``: the pole, the forces it found and the step
    ``chosen`` (the known inertia, weight and component vectors are named in the steps list; on a
    pane a few hundred pixels wide all their labels could not stand clear of each other)."""
    return step.role in (Role.IMAGE, Role.RESULT) or step.id == chosen


def scale_words(polygon) -> str:
    """The force polygon's scale as stated beside its bar: "2 N per mm"."""
    return f"{plain(polygon.scale_per_mm)} N per mm"


def force_pane(made, size: Symbols, draft: bool = False) -> Sheet:
    """The force polygon of ``made`` alone, at its construction's scale, its scale bar under it
    stating N per mm (view "force"), for a pane that zooms (see :mod:`kinematics.drawing.panes`)."""
    polygon = made.polygon
    return polygon_pane(polygon, made.construction.solution, size, draft, pen_of=force_pen,
                        scale_text=scale_words(polygon), stack_labels=True)


def has_line_of_action(step) -> bool:
    """Whether ``step`` locates itself on the space diagram: a force with a point on its line of
    action, or the drive torque with its arm."""
    return bool(step.space) and (len(step.space) == 2 or len(step.coords) == 2)


def draw_line_of_action(rec: Recorder, step, view: View, design_mm: float, size: Symbols) -> None:
    """Record where ``step`` acts on the space diagram ``view``: a force's line of action through
    its point (``step.space``, m), with the force's sense as an arrow ending at the point; the
    drive torque's arm from the pivot. Nothing for a step with no place there."""
    if not has_line_of_action(step):
        return
    ids = {"view": view.name, "ref": Ref("force line", step.id)}
    if len(step.space) == 2:  # the torque's arm: from the pivot to the foot of the perpendicular
        start, end = view.place(step.space[0]), view.place(step.space[1])
        arrow(rec, start, end, FORCE_ACTION, size, **ids)
        at = end
    else:
        (x0, y0), (x1, y1) = step.coords
        length = math.hypot(x1 - x0, y1 - y0)
        if length == 0.0:
            return
        ux, uy = (x1 - x0) / length, (y1 - y0) / length
        at = view.place(step.space[0])
        half = 0.5 * ACTION_LENGTH * design_mm
        rec.add(Line((at[0] - half * ux, at[1] - half * uy), (at[0] + half * ux, at[1] + half * uy), FORCE_ACTION,
                     **ids))
        tail = 0.25 * design_mm
        rec.add(Arrow((at[0] - tail * ux, at[1] - tail * uy), at, _head(at, ux, uy, size), FORCE_RESULT, **ids))
    rec.add(Text((at[0] + size.text, at[1] + size.text), step.label, size.text, FORCE_RESULT, **ids))


def _head(tip, ux, uy, size: Symbols) -> tuple:
    """An arrowhead at ``tip`` pointing along (ux, uy), in the proportions of :func:`symbols.arrow`."""
    back = (tip[0] - size.arrow * ux, tip[1] - size.arrow * uy)
    half = 0.2 * size.arrow
    return (tip, (back[0] - half * uy, back[1] + half * ux), (back[0] + half * uy, back[1] - half * ux))


def line_of_action_pane(made, step_id: str, size: Symbols) -> Sheet:
    """The line of action of force step ``step_id`` of ``made``, in the space diagram's true-size
    view (as :func:`~kinematics.drawing.panes.space_pane` places it), for a window to lay over its
    space diagram; empty when the step has none (or there is no such step)."""
    rec = Recorder()
    mech = made.construction.solution.mechanism
    view = TRUE_SIZE_SPACE
    rec.add_view(view)
    step = next((s for s in made.polygon.steps if s.id == step_id), None)
    if step is not None:
        draw_line_of_action(rec, step, view, max(1e3 * mech.size * mech.metres_per_unit, 1.0), size)
    return rec.sheet(0.0, 0.0)
