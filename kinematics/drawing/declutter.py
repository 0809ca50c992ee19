"""Labels set apart: a label that would cover an earlier label, or a mark
(pin, dot, arrowhead, block, fixed-pivot sign), goes to the first free side.

Runs on a view's labels once they are all recorded, in sheet millimetres, so
the printed sheet, the DXF drawing and the window (whose views are recorded
with symbols sized for the zoom in use) set their labels apart the same way.
"""

from __future__ import annotations

import math

from .sheet import Recorder, Text
from .symbols import stack_beside

# Sides tried, in order, for a label whose own side is taken: the diagonals first (a label
# there crosses neither the horizontal nor the vertical through its point), then square.
SIDES = tuple(math.radians(a) for a in (45, 135, 225, 315, 0, 90, 180, 270))
# A text's box, in capital heights: advance per character with some room (DejaVu Sans's
# widest capitals run to 1.36 h, most letters and digits 0.8-0.95 h, measured with Qt 6.11),
# and the line from the descenders (0.32 h below the baseline) to the ascent (1.27 h above).
ADVANCE, ROOM, DESCENT, ASCENT = 0.95, 0.4, 0.35, 1.3
# Where every side near its point is taken (a busy vertex of the force polygon), a label is
# fanned out further, a ring at a time: RING_STEP capital heights, or half the block's size if more.
RINGS, RING_STEP = 8, 1.5


def text_box(text: Text) -> tuple:
    """(x0, y0, x1, y1) a text's line covers, estimated from its length and height."""
    h = text.height
    width = (ADVANCE * len(text.text) + ROOM) * h
    x, y = text.position
    left = x - (0.0 if text.align == "left" else width if text.align == "right" else 0.5 * width)
    baseline = y - (0.0 if text.anchor == "baseline" else h if text.anchor == "top" else 0.5 * h)
    return (left, baseline - DESCENT * h, left + width, baseline + ASCENT * h)


def _overlap(a: tuple, b: tuple) -> bool:
    """True when boxes (x0, y0, x1, y1) share some area (touching edges do not)."""
    return a[0] < b[2] and b[0] < a[2] and a[1] < b[3] and b[1] < a[3]


def hits(box: tuple, others: list) -> bool:
    """True when ``box`` overlaps any of ``others`` (written out: it runs for every label of every frame)."""
    x0, y0, x1, y1 = box
    for a0, b0, a1, b1 in others:
        if x0 < a1 and a0 < x1 and y0 < b1 and b0 < y1:
            return True
    return False


def _block_box(texts) -> tuple:
    """The box covering the lines of one label block."""
    boxes = [text_box(text) for text in texts]
    return (min(b[0] for b in boxes), min(b[1] for b in boxes), max(b[2] for b in boxes), max(b[3] for b in boxes))


def declutter(rec: Recorder, view: str) -> None:
    """Move the labels of ``view`` so none covers an earlier one or a mark, where a side is
    free; where none is free of both, a side free of the other labels will do, further out
    (:data:`RINGS`) when every side near the point is taken. A block of stacked lines
    (:func:`~kinematics.drawing.symbols.stacked_label`) moves as one."""
    marks = [box for name, box in rec.marks if name == view]
    placed = []
    for first, count, at, gap, _ in rec.labels:
        texts = rec.primitives[first:first + count]
        if texts[0].view != view:
            continue
        box = text_box(texts[0]) if count == 1 else _block_box(texts)
        # Most labels are free where they were set: one look at every box tells.
        if hits(box, placed) or hits(box, marks):
            texts, box = _free_side(texts, box, at, gap, placed, marks)
            rec.primitives[first:first + count] = texts
        placed.append(box)


def _near(boxes: list, at, reach: float) -> list:
    """Those of ``boxes`` within ``reach`` of ``at`` (a few, of many)."""
    near = (at[0] - reach, at[1] - reach, at[0] + reach, at[1] + reach)
    return [other for other in boxes if _overlap(near, other)]


def _free_side(texts: list, box: tuple, at, gap: float, placed: list, marks: list) -> tuple:
    """The label block ``texts`` (covering ``box``) on the first side free of both ``placed``
    labels and ``marks``, else of the labels alone, else where it was; and its box. Each ring
    further out is tried only when no side of the one before is free of the labels."""
    size = max(box[2] - box[0], box[3] - box[1])
    # Where it was, if clear of the other labels, is the side to fall back on (the first tried).
    fallback = None if hits(box, _near(placed, at, gap + 1.5 * size)) else (texts, box)
    for ring in range(RINGS):
        distance = gap + ring * max(RING_STEP * texts[0].height, 0.5 * size)
        reach = distance + 1.5 * size
        near_placed, near_marks = _near(placed, at, reach), _near(marks, at, reach)
        for side in SIDES:
            candidate = stack_beside(at, side, distance, texts)
            side_box = _block_box(candidate)
            if hits(side_box, near_placed):
                continue
            if not hits(side_box, near_marks):
                return candidate, side_box
            fallback = fallback or (candidate, side_box)
        if fallback:
            return fallback
    return texts, box
