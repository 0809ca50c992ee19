"""Symbol sizes and the small shapes every view draws (arrowheads, pins,
fixed-pivot marks, slider blocks, labels), in sheet millimetres.

Each mark a label must keep clear of is noted in the recorder's ``marks``
(view, box), and each label in its ``labels``, for
:func:`~kinematics.drawing.declutter.declutter`.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from functools import lru_cache

from .hatching import ground_hatch
from .sheet import Arrow, Circle, Hatch, Polyline, Recorder, Strokes, Text


@dataclass(frozen=True)
class Symbols:
    """Sizes in sheet mm. On paper these follow ISO 3098 (text heights 2.5 mm
    and up) and stay the same at every drawing scale; a true-size DXF drawing
    enlarges them with the drawing so they stay readable."""

    text: float = 2.5
    small_text: float = 1.8
    pin: float = 1.0
    dot: float = 0.45
    arrow: float = 3.0

    def scaled(self, factor: float) -> Symbols:
        """Every size multiplied by ``factor`` (a true-size drawing's enlargement)."""
        return Symbols(*(value * factor for value in (self.text, self.small_text, self.pin, self.dot, self.arrow)))


def arrow(rec: Recorder, start, end, pen, size: Symbols, **ids) -> bool:
    """A vector with its head at ``end`` (a head at most half the vector long);
    nothing, and False, for a zero vector."""
    dx, dy = end[0] - start[0], end[1] - start[1]
    length = math.hypot(dx, dy)
    if length < 1e-9:
        return False
    head = min(size.arrow, 0.5 * length)
    ux, uy = dx / length, dy / length
    back = (end[0] - head * ux, end[1] - head * uy)
    half = 0.2 * head  # head width 1:2.5 of its length, a usual drafting proportion  # common practice
    corners = (end, (back[0] - half * uy, back[1] + half * ux), (back[0] + half * uy, back[1] - half * ux))
    rec.add(Arrow(start=start, end=end, head=corners, pen=pen, **ids))
    mark(rec, corners, ids.get("view", ""))
    return True


def mark(rec: Recorder, points, view: str) -> None:
    """Note the box round ``points`` as one a label must keep clear of."""
    (x0, y0), *rest = points
    x1, y1 = x0, y0
    for x, y in rest:  # written out: every arrowhead of every frame comes here
        x0, x1, y0, y1 = min(x0, x), max(x1, x), min(y0, y), max(y1, y)
    rec.marks.append((view, (x0, y0, x1, y1)))


def dot_mark(rec: Recorder, at, radius: float, view: str) -> None:
    """Note the box of a round mark of ``radius`` about ``at``."""
    rec.marks.append((view, (at[0] - radius, at[1] - radius, at[0] + radius, at[1] + radius)))


# A fixed-pivot mark in pin radii: the triangle's half width and height, the hatched band's depth
# as a share of the half width.
PIVOT_HALF_WIDTH, PIVOT_HEIGHT, PIVOT_BAND = 2.4, 3.2, 0.6


def pivot_reach(size: Symbols) -> float:
    """How far below its pin a fixed-pivot mark reaches, its hatching included (sheet mm)."""
    return size.pin * (1.0 + PIVOT_HEIGHT + PIVOT_BAND * PIVOT_HALF_WIDTH)


def fixed_pivot(rec: Recorder, at, pen, size: Symbols, floor: float | None = None, **ids) -> None:
    """The fixed-pivot mark: a triangle under the pin on a hatched base line; or, standing on a
    hatched fixed guide at height ``floor`` (sheet mm) below the pin, a triangle down to that line
    alone (the guide's hatching is the ground there; two hatchings would run into each other)."""
    x, y = at
    if floor is not None:
        w = PIVOT_HALF_WIDTH * size.pin
        triangle = Polyline(points=((x, y - size.pin), (x - w, floor), (x + w, floor)), pen=pen, closed=True, **ids)
        rec.add(triangle)
        mark(rec, triangle.points, ids.get("view", ""))
        return
    triangle, base, hatch = _fixed_pivot_parts(float(x), float(y), pen, size, ids.get("view", ""), ids.get("ref"))
    rec.add(triangle)
    mark(rec, triangle.points, ids.get("view", ""))
    rec.add(base)
    rec.add(hatch)


@lru_cache(maxsize=256)
def _fixed_pivot_parts(x: float, y: float, pen, size: Symbols, view: str, ref) -> tuple:
    """The triangle, base line and hatching of a fixed pivot at (x, y): made once for each place
    and size, since a pivot stays where it is while the links move about it (its hatching is
    clipped line by line)."""
    ids = {"view": view, "ref": ref}
    w, h = PIVOT_HALF_WIDTH * size.pin, PIVOT_HEIGHT * size.pin
    base = y - size.pin - h
    triangle = ((x, y - size.pin), (x - w, base), (x + w, base))
    depth = PIVOT_BAND * w
    band = ((x - 1.6 * w, base - depth), (x + 1.6 * w, base - depth), (x + 1.6 * w, base), (x - 1.6 * w, base))
    return (Polyline(points=triangle, pen=pen, closed=True, **ids),
            Strokes(points=((x - 1.6 * w, base), (x + 1.6 * w, base)), pen=pen, **ids),  # the base line
            ground_hatch(band, 45.0, 0.8 * w * math.sqrt(0.5), pen, **ids))


def pin(rec: Recorder, at, pen, size: Symbols, joint: bool, **ids) -> None:
    """A pin joint (open circle) or a point on one body only (filled dot)."""
    radius = size.pin if joint else size.dot
    rec.add(Circle(centre=at, radius=radius, pen=pen, filled=not joint, **ids))
    dot_mark(rec, at, size.pin, ids.get("view", ""))  # a dot keeps a pin's room: it is picked with the mouse


MASS_CENTRE_RADIUS = 1.6  # the centre-of-mass mark's radius, in pin radii
_QUARTER = tuple(math.radians(15.0 * k) for k in range(7))  # a quarter turn in 15° steps


def mass_centre(rec: Recorder, at, pen, size: Symbols, **ids) -> None:
    """The centre-of-mass mark: a ring with two opposite quarters filled (the top right and the
    bottom left), so it reads apart from a pin and stays legible in grey-scale print."""
    x, y = at
    r = MASS_CENTRE_RADIUS * size.pin
    rec.add(Circle(centre=at, radius=r, pen=pen, **ids))
    for turn in (0.0, math.pi):
        rec.add(Hatch(points=((x, y), *((x + r * math.cos(a + turn), y + r * math.sin(a + turn)) for a in _QUARTER)),
                      pen=pen, **ids))
    dot_mark(rec, at, r, ids.get("view", ""))


def slider_block(rec: Recorder, at, direction, pen, size: Symbols, **ids) -> None:
    """A sliding block centred on ``at``, long side along ``direction`` (unit vector)."""
    ux, uy = direction
    half_long, half_short = 3.0 * size.pin, 2.0 * size.pin
    corners = []
    for a, b in ((1, 1), (-1, 1), (-1, -1), (1, -1)):
        corners.append((at[0] + a * half_long * ux - b * half_short * uy,
                        at[1] + a * half_long * uy + b * half_short * ux))
    rec.add(Polyline(points=tuple(corners), pen=pen, closed=True, **ids))
    mark(rec, corners, ids.get("view", ""))


def lines_near(segments, tolerance: float) -> list:
    """``segments`` ((x0, y0), (x1, y1)) made ready for :func:`directions_at`: each with its box
    grown by ``tolerance``, its direction and what the distance test needs (worked out once for
    all the labels of a view)."""
    out = []
    for (x0, y0), (x1, y1) in segments:
        dx, dy = x1 - x0, y1 - y0
        length2 = dx * dx + dy * dy
        if length2 > 0.0:
            out.append((min(x0, x1) - tolerance, max(x0, x1) + tolerance, min(y0, y1) - tolerance,
                        max(y0, y1) + tolerance, x0, y0, dx, dy, length2, math.atan2(dy, dx), tolerance))
    return out


def directions_at(point, lines: list) -> list:
    """Directions (radians) of the ``lines`` (from :func:`lines_near`) that pass within their
    tolerance of ``point``."""
    px, py = point
    out = []
    for left, right, bottom, top, x0, y0, dx, dy, length2, direction, tolerance in lines:
        # Most lines are far from the point: their box tells at once.
        if left <= px <= right and bottom <= py <= top:
            t = min(1.0, max(0.0, ((px - x0) * dx + (py - y0) * dy) / length2))
            if math.hypot(x0 + t * dx - px, y0 + t * dy - py) <= tolerance:
                out.append(direction)
    return out


# A label this far in angle from every line through its point is clear of them.
CLEAR_ANGLE = math.radians(40.0)


# The sixteen directions a label may take, as turns from its preferred one, with the bonus each
# gets for staying near it; tried in the order of that bonus, so the search can stop as soon as
# no direction left could score better (each keeps its place in the sixteen for ties).
_TURNS = sorted(((k * math.pi / 8.0, 0.3 * math.cos(k * math.pi / 8.0), k) for k in range(16)),
                key=lambda turn: (-turn[1], turn[2]))


def _label_direction(away: float, avoid) -> float:
    """The direction to set a label in: clear of the lines through the point
    (``avoid``, radians, either sense), and as near ``away`` as that allows.

    Of the sixteen directions, the one with the best score, clearance (up to CLEAR_ANGLE) plus a
    bonus for staying near ``away``; the first of the sixteen among equals.
    """
    # Written out in loops rather than min/max over generators: this runs for every label of
    # every view at every frame of a drag.
    half = 0.5 * math.pi
    best, best_score, best_k = away, -math.inf, 16
    for turn, bonus, k in _TURNS:
        if CLEAR_ANGLE + bonus < best_score:
            break  # no direction left can do better
        candidate = away + turn
        clearance = CLEAR_ANGLE  # clear enough: further does not count
        for line in avoid:
            gap = abs((candidate - line + half) % math.pi - half)
            if gap < clearance:
                clearance = gap
        score = clearance + bonus
        if score > best_score or (score == best_score and k < best_k):
            best, best_score, best_k = candidate, score, k
    return best


def label(rec: Recorder, at, text: str, away_from, pen, size: Symbols, gap: float, avoid=(), **ids) -> None:
    """Text beside ``at``, clear of a mark ``gap`` mm wide, on the side facing
    away from ``away_from`` unless that lies along one of the lines through the
    point (``avoid``: their directions in radians)."""
    stacked_label(rec, at, ((text, ids.get("ref")),), away_from, pen, size, gap, avoid, ids.get("view", ""))


# From one line's baseline to the next, in capital heights: more than the line's box as the
# declutter estimates it (1.65 h from the descenders to the ascent), so stacked lines never touch.
LINE_PITCH = 1.75


def stacked_label(rec: Recorder, at, lines, away_from, pen, size: Symbols, gap: float, avoid=(),
                  view: str = "") -> None:
    """Several labels of one place (``lines``: (text, ref) each), one a line, beside ``at`` as
    :func:`label` sets one (see :func:`stack_beside`), recorded as one block for the declutter."""
    dx, dy = at[0] - away_from[0], at[1] - away_from[1]
    away = math.atan2(dy, dx) if math.hypot(dx, dy) > 1e-9 else math.pi / 4.0
    direction = _label_direction(away, avoid)
    texts = [Text(at, words, size.text, pen, view=view, ref=ref) for words, ref in lines]
    rec.labels.append((len(rec.primitives), len(texts), at, gap, direction))
    for text in stack_beside(at, direction, gap, texts):
        rec.add(text)


def stack_beside(at, direction: float, gap: float, texts) -> list:
    """``texts`` (of one height) set beside ``at`` towards ``direction`` (radians), clear of a mark
    ``gap`` mm wide, one a line: each aligned and anchored on the side facing the point, the block
    growing away from it (upwards above it, downwards below it, centred on it at its side)."""
    height = texts[0].height
    pitch = LINE_PITCH * height
    uy = math.sin(direction)
    middle = 0.5 * (len(texts) - 1)
    out = []
    for i, text in enumerate(texts):
        shift = i * pitch if uy > 0.38 else -i * pitch if uy < -0.38 else (middle - i) * pitch
        placed = _beside(at, direction, gap, text.text, height, text.pen, text.view, text.ref)
        out.append(placed._replace(position=(placed.position[0], placed.position[1] + shift)))
    return out


def _beside(at, direction: float, gap: float, words: str, height: float, pen, view: str, ref) -> Text:
    ux, uy = math.cos(direction), math.sin(direction)
    distance = gap + 0.6 * height
    align = "left" if ux > 0.38 else "right" if ux < -0.38 else "centre"
    anchor = "baseline" if uy > 0.38 else "top" if uy < -0.38 else "middle"
    return Text((at[0] + distance * ux, at[1] + distance * uy), words, height, pen, align, anchor, view, ref)
