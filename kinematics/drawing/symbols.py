"""Symbol sizes and the small shapes every view draws (arrowheads, pins,
fixed-pivot marks, slider blocks, labels), in sheet millimetres."""

from __future__ import annotations

import math
from dataclasses import dataclass

from .hatching import ground_hatch
from .sheet import Arrow, Circle, Line, Polyline, Recorder, Text


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
    return True


def fixed_pivot(rec: Recorder, at, pen, size: Symbols, **ids) -> None:
    """The fixed-pivot mark: a triangle under the pin on a hatched base line."""
    x, y = at
    w, h = 2.4 * size.pin, 3.2 * size.pin
    base = y - size.pin - h
    rec.add(Polyline(points=((x, y - size.pin), (x - w, base), (x + w, base)), pen=pen, closed=True, **ids))
    rec.add(Line(start=(x - 1.6 * w, base), end=(x + 1.6 * w, base), pen=pen, **ids))
    band = ((x - 1.6 * w, base - 0.6 * w), (x + 1.6 * w, base - 0.6 * w), (x + 1.6 * w, base), (x - 1.6 * w, base))
    rec.add(ground_hatch(band, 45.0, 0.8 * w * math.sqrt(0.5), pen, **ids))


def pin(rec: Recorder, at, pen, size: Symbols, joint: bool, **ids) -> None:
    """A pin joint (open circle) or a point on one body only (filled dot)."""
    if joint:
        rec.add(Circle(centre=at, radius=size.pin, pen=pen, **ids))
    else:
        rec.add(Circle(centre=at, radius=size.dot, pen=pen, filled=True, **ids))


def slider_block(rec: Recorder, at, direction, pen, size: Symbols, **ids) -> None:
    """A sliding block centred on ``at``, long side along ``direction`` (unit vector)."""
    ux, uy = direction
    half_long, half_short = 3.0 * size.pin, 2.0 * size.pin
    corners = []
    for a, b in ((1, 1), (-1, 1), (-1, -1), (1, -1)):
        corners.append((at[0] + a * half_long * ux - b * half_short * uy,
                        at[1] + a * half_long * uy + b * half_short * ux))
    rec.add(Polyline(points=tuple(corners), pen=pen, closed=True, **ids))


def directions_at(point, segments, tolerance: float) -> list:
    """Directions (radians) of the ``segments`` ((x0, y0), (x1, y1)) that pass within ``tolerance`` of ``point``."""
    px, py = point
    out = []
    for (x0, y0), (x1, y1) in segments:
        dx, dy = x1 - x0, y1 - y0
        length2 = dx * dx + dy * dy
        if length2 == 0.0:
            continue
        t = min(1.0, max(0.0, ((px - x0) * dx + (py - y0) * dy) / length2))
        if math.hypot(x0 + t * dx - px, y0 + t * dy - py) <= tolerance:
            out.append(math.atan2(dy, dx))
    return out


# A label this far in angle from every line through its point is clear of them.
CLEAR_ANGLE = math.radians(40.0)


def _label_direction(away: float, avoid) -> float:
    """The direction to set a label in: clear of the lines through the point
    (``avoid``, radians, either sense), and as near ``away`` as that allows."""
    if not avoid:
        return away

    def clearance(c):
        return min(abs((c - a + 0.5 * math.pi) % math.pi - 0.5 * math.pi) for a in avoid)

    candidates = [away + k * math.pi / 8.0 for k in range(16)]
    return max(candidates, key=lambda c: min(clearance(c), CLEAR_ANGLE) + 0.3 * math.cos(c - away))


def label(rec: Recorder, at, text: str, away_from, pen, size: Symbols, gap: float, avoid=(), **ids) -> None:
    """Text beside ``at``, clear of a mark ``gap`` mm wide, on the side facing
    away from ``away_from`` unless that lies along one of the lines through the
    point (``avoid``: their directions in radians)."""
    dx, dy = at[0] - away_from[0], at[1] - away_from[1]
    away = math.atan2(dy, dx) if math.hypot(dx, dy) > 1e-9 else math.pi / 4.0
    direction = _label_direction(away, avoid)
    ux, uy = math.cos(direction), math.sin(direction)
    distance = gap + 0.6 * size.text
    position = (at[0] + distance * ux, at[1] + distance * uy)
    align = "left" if ux > 0.38 else "right" if ux < -0.38 else "centre"
    anchor = "baseline" if uy > 0.38 else "top" if uy < -0.38 else "middle"
    rec.add(Text(position=position, text=text, height=size.text, pen=pen, align=align, anchor=anchor, **ids))
