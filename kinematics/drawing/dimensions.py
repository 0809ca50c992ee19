"""The links' lengths as dimensions on the space diagram, on demand: for each side of each link
(a bar's one, a plate's outline), a dimension line parallel to it and set off to the side away
from the mechanism's middle, with extension lines from the joints, arrowheads at both ends and the
length, joint to joint, in the length unit chosen (after the manner of ISO 129-1: the value
above the dimension line; here written level, with its unit, for a screen).

>>> import kinematics
>>> from kinematics.drawing.symbols import Symbols
>>> mech = kinematics.load_mechanism({"kinepoly": 1, "length_unit": "mm",
...     "points": {"O": [0, 0], "A": [30, 40]}, "ground": ["O"], "links": {"crank": ["O", "A"]},
...     "driver": {"link": "crank", "pivot": "O", "speed": {"value": 60, "unit": "rpm"}}})
>>> sheet = dimensions_pane(mech, kinematics.solve(mech), Symbols())
>>> [p.text for p in sheet.primitives if hasattr(p, "text")]
['50 mm']
"""

from __future__ import annotations

import math

from ..model.units import METRES_PER_LENGTH_UNIT
from .declutter import declutter
from .sheet import TRUE_SIZE_SPACE, Line, Recorder, Ref, Sheet, View
from .space import file_positions, outline, positions
from .style import DIMENSION
from .symbols import Symbols, arrow, label

OFFSET = 5.0  # the dimension line's distance from the link, in pin radii
OVERRUN = 1.5  # an extension line runs this many pin radii past the dimension line


def _sides(mech, xy) -> list:
    """(link, first joint, second joint, closed) of each side of each link, in file order; a
    plate's sides are closed (its outline)."""
    found = []
    for link, names in mech.links.items():
        order, closed = outline(names, xy)
        ring = list(order) + ([order[0]] if closed else [])
        found += [(link, p, q, closed) for p, q in zip(ring, ring[1:], strict=False)]
    return found


def _centroid(view: View, xy, names) -> tuple:
    points = [view.place(xy[n]) for n in dict.fromkeys(names)]
    return (sum(x for x, _ in points) / len(points), sum(y for _, y in points) / len(points))


def dimensions_pane(mech, solution, size: Symbols, length_unit: str = "mm", marks=()) -> Sheet:
    """The lengths of ``mech``'s links in the pose of ``solution`` (as the file places them when
    None) at machine mm, as a space diagram's overlay; their words clear of ``marks`` (boxes, sheet
    mm) and of each other."""
    xy = positions(solution) if solution is not None else file_positions(mech)
    rec = Recorder()
    rec.marks.extend(("space", box) for box in marks)
    view = TRUE_SIZE_SPACE
    rec.add_view(view)
    if not xy:
        return rec.sheet(0.0, 0.0, title=mech.title)
    cx = sum(x for x, _ in xy.values()) / len(xy)
    cy = sum(y for _, y in xy.values()) / len(xy)
    middle = view.place((cx, cy))
    per_metre = 1.0 / METRES_PER_LENGTH_UNIT[length_unit]
    words = Symbols(text=size.small_text, arrow=0.7 * size.arrow)
    for link, p, q, closed in _sides(mech, xy):
        a, b = view.place(xy[p]), view.place(xy[q])
        # A plate's side is set off outside the plate; a bar's away from the mechanism's middle.
        away = _centroid(view, xy, mech.links[link]) if closed else middle
        length = math.hypot(b[0] - a[0], b[1] - a[1])
        if length < 4.0 * size.arrow:
            continue  # too short on the drawing to carry a dimension
        nx, ny = -(b[1] - a[1]) / length, (b[0] - a[0]) / length
        mid = (0.5 * (a[0] + b[0]), 0.5 * (a[1] + b[1]))
        if (mid[0] - away[0]) * nx + (mid[1] - away[1]) * ny < 0:
            nx, ny = -nx, -ny
        ids = {"view": "space", "ref": Ref("dimension", f"{link}:{p}-{q}")}
        d, gap = OFFSET * size.pin, 0.5 * size.pin
        a2, b2 = (a[0] + d * nx, a[1] + d * ny), (b[0] + d * nx, b[1] + d * ny)
        for end in (a, b):
            reach = d + OVERRUN * size.pin
            rec.add(Line(start=(end[0] + gap * nx, end[1] + gap * ny),
                         end=(end[0] + reach * nx, end[1] + reach * ny), pen=DIMENSION, **ids))
        centre = (0.5 * (a2[0] + b2[0]), 0.5 * (a2[1] + b2[1]))
        arrow(rec, centre, a2, DIMENSION, words, **ids)
        arrow(rec, centre, b2, DIMENSION, words, **ids)
        metres = math.dist(xy[p], xy[q])
        label(rec, centre, f"{metres * per_metre:.4g} {length_unit}", (centre[0] - nx, centre[1] - ny), DIMENSION,
              words, gap=0.5 * size.pin, **ids)
    declutter(rec, "space")
    return rec.sheet(0.0, 0.0, title=mech.title)
