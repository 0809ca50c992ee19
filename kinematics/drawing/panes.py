"""Each view drawn alone, for a pane that zooms: the space diagram at true size
(sheet mm = machine mm, the file's origin kept), a polygon at its construction's
scale, each with its scale bar, on a sheet with no paper.

The symbols (pins, marks, arrowheads, text) come at the size asked for, so a
window that keeps them a constant size on screen records its views again at
each zoom, with sizes in drawing millimetres for that zoom. A view's ``box`` is
what the drawing covers to scale (its points and where its scale bar starts,
not the symbols), for fitting the pane, which keeps BAR_ROOM text heights free
under it for the bar.

>>> import kinematics
>>> from kinematics.drawing.symbols import Symbols
>>> mech = kinematics.load_mechanism({"kinepoly": 1, "length_unit": "mm",
...     "points": {"O": [0, 0], "A": [30, 40]}, "ground": ["O"], "links": {"crank": ["O", "A"]},
...     "driver": {"link": "crank", "pivot": "O", "speed": {"value": 60, "unit": "rpm"}}})
>>> sheet = space_pane(mech, kinematics.solve(mech), Symbols())
>>> sheet.views["space"].box
(0.0, -11.0, 30.0, 40.0)
"""

from __future__ import annotations

import math

import numpy as np

from ..model.units import METRES_PER_LENGTH_UNIT
from .annotate import printed_unit, scale_bar
from .declutter import declutter, text_box
from .polygons import draw_polygon, polygon_bounds
from .scaling import bar_value, plain
from .sheet import TRUE_SIZE_SPACE, Polyline, Recorder, Ref, Sheet, Text, View
from .space import draw_linkage, draw_paths, file_positions, positions, traced_points
from .style import CENTRODE_FIXED, CENTRODE_MOVING, pen_for
from .symbols import Symbols, label

# The space diagram's scale bar: about a quarter of the design long, this far under it (as
# fractions of the design's size), placed from the file's pose so it stays put while the driver
# turns. A polygon's bar: two fifths of the drawing's width.
SPACE_BAR_LENGTH, SPACE_BAR_BELOW = 0.25, 0.22
POLYGON_BAR_LENGTH = 0.4
# Symbols keep their size while the drawing is zoomed: a bar is at least this many text heights
# long (room for the numbers at its ends), and its caption takes this many over it (see
# annotate.scale_bar: the bar's thickness, the gap and the caption's height). The box a view
# fits leaves them out (they would grow as it zooms out); a pane keeps BAR_ROOM heights of the
# small text (a pane's bar is written in it, to take less of a small window) free under it for
# the bar's caption and its numbers.
BAR_LEAST, CAPTION_ROOM, BAR_ROOM = 16.0, 3.2, 5.6


def _bounds(points) -> tuple:
    points = list(points)
    xs, ys = [x for x, _ in points], [y for _, y in points]
    return (min(xs), min(ys), max(xs), max(ys))


def _with(box: tuple, other: tuple) -> tuple:
    return (min(box[0], other[0]), min(box[1], other[1]), max(box[2], other[2]), max(box[3], other[3]))


def space_pane(mech, solution, size: Symbols, draft: bool = False, length_unit: str = "mm") -> Sheet:
    """The space diagram of ``mech`` in the pose of ``solution`` (as the file places its points
    when None), with its scale bar in ``length_unit``; a ``draft`` as
    :class:`~kinematics.drawing.sheet.Recorder` says."""
    xy = positions(solution) if solution is not None else file_positions(mech)
    rec = Recorder(draft=draft)
    if not xy:
        rec.add_view(TRUE_SIZE_SPACE)
        return rec.sheet(0.0, 0.0, title=mech.title)
    view = TRUE_SIZE_SPACE
    draw_linkage(rec, mech, xy, view, size)
    reference = _bounds([view.place(mech.position_m(n)) for n in mech.points])
    design_mm = max(1e3 * mech.size * mech.metres_per_unit, 1.0)
    left, y = reference[0], reference[1] - SPACE_BAR_BELOW * design_mm
    longest = SPACE_BAR_LENGTH * design_mm
    words = Symbols(text=size.small_text)
    scale_bar(rec, (left, y - CAPTION_ROOM * words.text), 1e3 * METRES_PER_LENGTH_UNIT[length_unit], length_unit,
              max(longest, BAR_LEAST * words.text), "space diagram to scale", words, "space")
    box = _with(_bounds(view.place(p) for p in xy.values()), (left, y, left + longest, y))
    rec.add_view(View("space", box, view.origin, view.mm_per_unit, view.unit, view.scale_text))
    return rec.sheet(0.0, 0.0, title=mech.title)


def paths_pane(mech, sweep) -> Sheet:
    """The paths over the cycle ``sweep`` of the points a space diagram traces, at true size;
    the view's box is where every point goes over the cycle."""
    rec = Recorder()
    low, high = sweep.positions.min(axis=(0, 1)).tolist(), sweep.positions.max(axis=(0, 1)).tolist()
    view = View("space", (1e3 * low[0], 1e3 * low[1], 1e3 * high[0], 1e3 * high[1]), (0.0, 0.0), 1000.0, "m",
                "1:1")
    rec.add_view(view)
    draw_paths(rec, sweep, view, traced_points(mech))
    return rec.sheet(0.0, 0.0, title=mech.title)


def centrodes_pane(found, solution, size: Symbols, marks=()) -> Sheet:
    """The fixed and moving centrodes ``found`` (a :class:`kinematics.cycle.centrodes.Centrodes`)
    at true size over a space diagram: the fixed one where the link's centre went on the frame;
    the moving one, stated in the link's own axes, carried into the pose of ``solution`` (it
    touches the fixed one at the pose's centre, where it rolls on it). Each named in small text
    where it passes nearest the link's first point, clear of ``marks`` (boxes in sheet mm: the
    space diagram's labels and pins) and of each other."""
    rec = Recorder()
    rec.marks.extend(("space", box) for box in marks)
    view = TRUE_SIZE_SPACE
    rec.add_view(view)
    mech = solution.mechanism
    first, second = (complex(*solution.position(p)) for p in mech.links[found.link][:2])
    along = (second - first) / abs(second - first)
    moving = tuple(np.column_stack(((z := first + (uv[:, 0] + 1j * uv[:, 1]) * along).real, z.imag))
                   for uv in found.moving)
    for kind, stretches, pen in (("fixed", found.fixed, CENTRODE_FIXED), ("moving", moving, CENTRODE_MOVING)):
        ref = Ref("centrode", kind)
        for stretch in stretches:
            points = tuple(view.place((float(x), float(y))) for x, y in stretch)
            rec.add(Polyline(points=points, pen=pen, view="space", ref=ref))
        if stretches:  # named where it passes nearest the link, so the name is seen with the linkage
            every = np.concatenate(stretches)
            near = every[int(np.argmin(np.hypot(every[:, 0] - first.real, every[:, 1] - first.imag)))]
            at = view.place((float(near[0]), float(near[1])))
            label(rec, at, f"{kind} centrode of {found.link}", view.place((first.real, first.imag)), pen,
                  Symbols(text=size.small_text), gap=size.pin, view="space", ref=ref)
    declutter(rec, "space")
    return rec.sheet(0.0, 0.0, title=mech.title)


def polygon_box(polygon) -> tuple:
    """The box (x0, y0, x1, y1) a :func:`polygon_pane` view fits: the drawing to scale, in sheet mm,
    without the symbols (so a pane can be fitted before it is recorded at the zoom it fits)."""
    scale = polygon.scale_per_mm
    return tuple(v / scale for v in polygon_bounds(polygon))


def shown_unit(unit: str, length_unit: str) -> str:
    """A polygon's SI unit restated in ``length_unit`` ("m/s^2" in mm: "mm/s^2"); a force's stays N.

    >>> shown_unit("m/s", "in"), shown_unit("N", "mm")
    ('in/s', 'N')
    """
    return length_unit + unit[1:] if unit.startswith("m") else unit


def polygon_pane(polygon, solution, size: Symbols, draft: bool = False, pen_of=pen_for,
                 scale_text: str = "", stack_labels: bool = False, labelled=None, length_unit: str = "m") -> Sheet:
    """``polygon`` of ``solution`` at its construction's scale (``polygon.scale_per_mm``), with
    its scale bar under it; a ``draft`` as :class:`~kinematics.drawing.sheet.Recorder` says.
    ``pen_of`` gives a step its pen, ``scale_text`` states the scale beside the bar ("1 mm = 0.05
    m/s" when empty), and the bar, in ``length_unit`` per second (per second squared); ``stack_labels``
    and ``labelled`` as :func:`~kinematics.drawing.polygons.draw_polygon` says. The drawing itself
    is the same whatever the unit: only the words of its scale change."""
    scale = polygon.scale_per_mm
    unit = shown_unit(polygon.unit, length_unit)
    per_shown = METRES_PER_LENGTH_UNIT[length_unit] if unit != polygon.unit else 1.0  # SI in one shown unit
    view = View(polygon.kind, (0.0, 0.0, 0.0, 0.0), (0.0, 0.0), 1.0 / scale, polygon.unit,
                scale_text or f"1 mm = {plain(scale / per_shown)} {printed_unit(unit)}")
    rec = Recorder(draft=draft)
    x0, y0, x1, y1 = polygon_box(polygon)
    width = max(x1 - x0, y1 - y0, 1.0)
    longest = POLYGON_BAR_LENGTH * width
    # Just under the drawing, on a grid of half the bar's length: the bar stays put while the
    # polygon changes a little from frame to frame of a drag (and is drawn from what was kept),
    # rather than trembling with its edge. Drawn first, its words are marks the labels keep clear of.
    mm_per_shown = view.mm_per_unit * per_shown
    grid = 0.5 * bar_value(longest, mm_per_shown) * mm_per_shown
    x, y = math.floor(x0 / grid) * grid, math.floor(y0 / grid) * grid
    words = Symbols(text=size.small_text)
    scale_bar(rec, (x, y - CAPTION_ROOM * words.text), mm_per_shown, unit,
              max(longest, BAR_LEAST * words.text), view.scale_text, words, polygon.kind)
    rec.marks.extend((polygon.kind, text_box(p)) for p in rec.primitives if isinstance(p, Text))
    draw_polygon(rec, polygon, solution, view, size, pen_of=pen_of, stack_labels=stack_labels, labelled=labelled)
    box = (x0, y0, x1, y1)  # the bar lies in the room the pane keeps under the drawing
    rec.add_view(View(polygon.kind, box, view.origin, view.mm_per_unit, view.unit, view.scale_text))
    return rec.sheet(0.0, 0.0)
