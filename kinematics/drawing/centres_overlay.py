"""The instantaneous centres drawn over the space diagram: one more recorded drawing.

Each centre on the view is a small mark (a ring round a cross at the exact point) labelled with
its two bodies, ``a|b``; centres that fall on one point share one mark and one label. A centre off
the view (see :mod:`kinematics.drawing.centre_places`) or at infinity is an arrow at the view's
edge pointing its way, labelled with where it is; the undetermined ones are named in a line at the
view's lower left. Everything is in the centres' own pen, so the DXF puts it on its own layer.
"""

from __future__ import annotations

import math

from . import symbols
from .centre_places import bounds_with_centres, centre_places, linkage_box, where_words
from .declutter import declutter
from .sheet import TRUE_SIZE_SPACE, Circle, Line, Recorder, Ref, Sheet, Strokes, Text, View
from .style import CENTRE, KENNEDY
from .symbols import Symbols

# Centres closer than this share of the linkage's size are one mark (a slotted lever's pins and
# blocks put several centres on one point).
SAME_PLACE = 1e-9
# Two arrows at the edge this close in direction (radians) are one arrow.
SAME_DIRECTION = 1e-9
# A line of Kennedy's theorem runs this share of the linkage's size past the outermost centre on it.
LINE_OVERRUN = 0.08


def _ids(view: View, name: str) -> dict:
    return {"view": view.name, "ref": Ref("centre", name)}


def _grouped(items, key, close) -> list:
    """``items`` in groups whose ``key`` values lie within ``close`` of the group's first."""
    groups = []
    for item in items:
        for group in groups:
            if close(key(group[0]), key(item)):
                group.append(item)
                break
        else:
            groups.append([item])
    return groups


def _edge(view: View, direction) -> tuple:
    """Where the ray from the view box's middle along ``direction`` leaves the box (sheet mm)."""
    x0, y0, x1, y1 = view.box
    cx, cy = 0.5 * (x0 + x1), 0.5 * (y0 + y1)
    dx, dy = direction
    reach = min(half / abs(d) for half, d in ((0.5 * (x1 - x0), dx), (0.5 * (y1 - y0), dy)) if abs(d) > 1e-12)
    return (cx + reach * dx, cy + reach * dy)


def _edge_arrow(rec: Recorder, view: View, direction, words: str, name: str, size: Symbols) -> None:
    dx, dy = direction
    tip = _edge(view, direction)
    length = 4.0 * size.arrow
    tail = (tip[0] - length * dx, tip[1] - length * dy)
    symbols.arrow(rec, tail, tip, CENTRE, size, **_ids(view, name))
    # The words beside the shaft, ending at the tip: along the edge, not back over the linkage.
    gap = 0.6 * size.small_text
    if abs(dx) >= abs(dy):
        position, align, anchor = (tip[0], max(tip[1], tail[1]) + gap), "right" if dx > 0 else "left", "baseline"
    else:
        position, align, anchor = (max(tip[0], tail[0]) + gap, tip[1]), "left", "top" if dy > 0 else "baseline"
    rec.add(Text(position=position, text=words, height=size.small_text, pen=CENTRE, align=align, anchor=anchor,
                 **_ids(view, name)))


def _beyond_words(group) -> str:
    """One arrow's words: the centres at infinity in its direction named together, the far ones each
    with its place."""
    infinite = [p for p in group if p.kind == "infinity"]
    words = [where_words(p) for p in group if p.kind != "infinity"]
    if infinite:
        angle = where_words(infinite[0]).rsplit(", ", 1)[1]
        words.insert(0, f"{', '.join(p.name for p in infinite)} at infinity, {angle}")
    return "; ".join(words)


def draw_centres(rec: Recorder, centres, view: View, size: Symbols, places=None) -> None:
    """Record the centres of ``centres`` (a :class:`kinematics.instantaneous.kennedy.Centres`) over
    the space diagram in ``view``; ``places`` are their :func:`centre_places` when already made."""
    places = centre_places(centres) if places is None else places
    x0, y0, x1, y1 = linkage_box(centres.solution)
    size_m = max(x1 - x0, y1 - y0, 1e-12)
    middle = view.place((0.5 * (x0 + x1), 0.5 * (y0 + y1)))
    on_view = [p for p in places if p.kind == "on view"]
    for group in _grouped(on_view, lambda p: p.at_m, lambda a, b: math.dist(a, b) <= SAME_PLACE * size_m):
        at = view.place(group[0].at_m)
        name = ", ".join(p.name for p in group)
        ids = _ids(view, group[0].name)
        ring, arm = 1.4 * size.pin, 2.4 * size.pin
        rec.add(Circle(centre=at, radius=ring, pen=CENTRE, **ids))
        rec.add(Strokes(points=((at[0] - arm, at[1]), (at[0] + arm, at[1]), (at[0], at[1] - arm),
                                (at[0], at[1] + arm)), pen=CENTRE, **ids))
        symbols.dot_mark(rec, at, arm, view.name)
        symbols.label(rec, at, name, middle, CENTRE, Symbols(text=size.small_text), gap=arm, **ids)
    beyond = [p for p in places if p.kind in ("off view", "infinity")]
    for group in _grouped(beyond, lambda p: p.direction,
                          lambda a, b: math.dist(a, b) <= SAME_DIRECTION):
        _edge_arrow(rec, view, group[0].direction, _beyond_words(group), group[0].name, size)
    # The centres' labels kept clear of the linkage's and of each other (the linkage's own were
    # placed first, and stay where they are unless a centre's mark now covers them).
    declutter(rec, view.name)
    lost = [p.name for p in places if p.kind == "undetermined"]
    if lost:
        bx0, by0, _, _ = view.box
        rec.add(Text(position=(bx0, by0), text="undetermined: " + ", ".join(lost), height=size.small_text,
                     pen=CENTRE, **_ids(view, lost[0])))


def centres_pane(centres, size: Symbols) -> Sheet:
    """The centres alone over a space diagram drawn as :func:`kinematics.drawing.panes.space_pane`
    draws it (sheet mm = machine mm, the file's origin kept), for a window that shows them over
    its own; the view's ``box`` is the linkage's grown to take in the centres on the view, and the
    edge arrows round it."""
    places = centre_places(centres)
    x0, y0, x1, y1 = (1000.0 * v for v in bounds_with_centres(centres.solution, places))
    # Room outside the drawing for the edge arrows, so they point away from the linkage, not over it.
    pad = 4.0 * size.arrow + size.text
    view = View("space", (x0 - pad, y0 - pad, x1 + pad, y1 + pad), (0.0, 0.0), 1000.0, "m", "1:1")
    rec = Recorder()
    rec.add_view(view)
    draw_centres(rec, centres, view, size, places)
    return rec.sheet(0.0, 0.0, title=centres.solution.mechanism.title)


def kennedy_pane(centres, name: str) -> Sheet:
    """The lines of Kennedy's theorem that found centre ``name`` and every centre sharing its mark
    (as :func:`draw_centres` groups them), at machine mm like :func:`centres_pane`: each from
    one of its two known centres to the other, through the centre found on it, a little beyond
    the outermost. Empty for a primary centre, which no construction found."""
    rec = Recorder()
    view = TRUE_SIZE_SPACE
    rec.add_view(view)
    x0, y0, x1, y1 = linkage_box(centres.solution)
    size_m = max(x1 - x0, y1 - y0, 1e-12)
    chosen = centres.centres[name]
    shared = [c for c in centres.centres.values() if c.kind == "point" and chosen.kind == "point"
              and math.dist(c.at_m, chosen.at_m) <= SAME_PLACE * size_m] or [chosen]
    steps = {step.id: step for step in centres.steps}
    for centre in shared:
        for sid in centre.lines:
            ends = steps[sid].coords
            if len(ends) != 2:
                continue  # the line at infinity: nothing to draw
            (ax, ay), (bx, by) = ends
            length = math.hypot(bx - ax, by - ay)
            ux, uy = (bx - ax) / length, (by - ay) / length
            along = [0.0, length]
            if centre.kind == "point":
                along.append((centre.at_m[0] - ax) * ux + (centre.at_m[1] - ay) * uy)
            low, high = min(along) - LINE_OVERRUN * size_m, max(along) + LINE_OVERRUN * size_m
            start, end = ((ax + t * ux, ay + t * uy) for t in (low, high))
            rec.add(Line(start=view.place(start), end=view.place(end), pen=KENNEDY, **_ids(view, centre.name)))
    return rec.sheet(0.0, 0.0, title=centres.solution.mechanism.title)
