"""The forces of a pose drawn on the space diagram, where they act: each inertia force on its
offset line of action (the trade's single equivalent force, moved off the centre of mass by
h = I·α/(m·|a_G|)), each weight and load at its point, and each joint force the force polygon
found as an arrow ending at its pin (the force on the link named second in its label).

The arrows share one force scale of the 1, 2, 5 series, chosen so that the largest is about
ARROW_SHARE of the design's size, stated in words under the linkage. Every vector and every
place is a step's of the :class:`~kinematics.forcepolygon.ForcePolygon`: nothing here computes a
force.

>>> import kinematics
>>> from kinematics.forcepolygon import force_polygon
>>> from kinematics.drawing.symbols import Symbols
>>> mech = kinematics.load_mechanism({"kinepoly": 2, "length_unit": "mm",
...     "points": {"O": [0, 0], "A": [30, 40]}, "ground": ["O"], "links": {"crank": ["O", "A"]},
...     "driver": {"link": "crank", "pivot": "O", "speed": {"value": 60, "unit": "rpm"}},
...     "point_masses": {"A": {"value": 2.0, "unit": "kg"}}})
>>> sheet = space_forces_pane(force_polygon(kinematics.construct(kinematics.solve(mech))), Symbols())
>>> sheet.views["space"].scale_text  # m·ω²·r = 3.95 N over at most 0.2 × 50 mm: 0.5 N per mm
'forces drawn 1 mm = 0.5 N'
"""

from __future__ import annotations

import math
from dataclasses import replace

from ..groups.steps import Component, Role
from .centre_places import linkage_box
from .declutter import declutter, text_box
from .forces import FORCE_KNOWN, FORCE_RESULT
from .scaling import plain, polygon_scale
from .sheet import Recorder, Ref, Sheet, Text, View
from .space import positions
from .symbols import Symbols, arrow, label

ARROW_SHARE = 0.2  # the largest force's arrow, as a share of the design's size
APPLIED = (Component.INERTIA, Component.GRAVITY, Component.LOAD)


def _placed_forces(made) -> list:
    """(step, point of application in m, force (Fx, Fy) in N) of every force drawn."""
    at = positions(made.construction.solution)
    found = []
    for step in made.polygon.steps:
        if not step.is_vector:
            continue
        (x0, y0), (x1, y1) = step.coords
        force = (x1 - x0, y1 - y0)
        if step.role is Role.KNOWN and step.component in APPLIED and len(step.space) == 1:
            found.append((step, step.space[0], force))
        elif step.role is Role.RESULT and step.component is not Component.TORQUE and step.points:
            found.append((step, at[step.points[0]], force))
    return found


def space_forces_pane(made, size: Symbols, marks=()) -> Sheet:
    """The forces of ``made`` on the space diagram's true-size view (as
    :func:`~kinematics.drawing.forces.line_of_action_pane` places it), for a window to lay over
    its space diagram; the view's ``scale_text`` states the force scale, its ``box`` (sheet mm)
    covers the arrows, for a view to fit. The labels keep clear of each other and of ``marks``
    (boxes (x0, y0, x1, y1) in the same millimetres: the space diagram's own labels and pins)."""
    rec = Recorder()
    rec.marks.extend(("space", box) for box in marks)
    mech = made.construction.solution.mechanism
    design_mm = max(1e3 * mech.size * mech.metres_per_unit, 1.0)
    forces = _placed_forces(made)
    largest = max((math.hypot(*force) for _, _, force in forces), default=0.0)
    n_per_mm = polygon_scale(largest / (ARROW_SHARE * design_mm))
    words = f"forces drawn 1 mm = {plain(n_per_mm)} N"
    view = View("space", (0.0, 0.0, 0.0, 0.0), (0.0, 0.0), 1000.0, "m", words)
    x0, y0, _, _ = linkage_box(made.construction.solution)
    corner = view.place((x0, y0))
    caption = Text((corner[0], corner[1] - 0.15 * design_mm), words, size.small_text, FORCE_RESULT, view="space",
                   ref=Ref("force arrow", ""))
    rec.add(caption)
    rec.marks.append(("space", text_box(caption)))
    # Smaller words than the linkage's own names: a force's name is long ("F(frame→block D)").
    words_size = replace(size, text=size.small_text)
    ends = []
    for step, point, (fx, fy) in forces:
        tip = view.place(point)
        tail = (tip[0] - fx / n_per_mm, tip[1] - fy / n_per_mm)
        ends += [tip, tail]
        pen = FORCE_RESULT if step.role is Role.RESULT else FORCE_KNOWN
        ids = {"view": "space", "ref": Ref("force arrow", step.id)}
        if arrow(rec, tail, tip, pen, size, **ids):
            label(rec, tail, step.label, tip, pen, words_size, gap=size.dot, avoid=(math.atan2(fy, fx),), **ids)
    if ends:
        xs, ys = [x for x, _ in ends], [y for _, y in ends]
        view = View("space", (min(xs), min(ys), max(xs), max(ys)), view.origin, view.mm_per_unit, "m", words)
    rec.add_view(view)
    declutter(rec, "space")
    return rec.sheet(0.0, 0.0)
