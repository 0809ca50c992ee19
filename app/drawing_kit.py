"""Qt renderings of the shared visual language in :mod:`kinematics.drawing.style`.

Scene units are millimetres of drawing with y pointing down (Qt's way), so
every model coordinate goes through :func:`scene_xy`, which turns y up.
"""

from __future__ import annotations

import math

from PySide6.QtCore import QPointF, Qt
from PySide6.QtGui import QBrush, QColor, QFont, QPainterPath, QPen, QPolygonF

from kinematics.drawing.style import Pen

# Screen pixels per drawing millimetre of line weight at 96 dpi; pens are cosmetic so
# a line keeps its weight at any zoom (a 0.5 mm pen draws about 2 px wide).
PIXELS_PER_WEIGHT_MM = 96.0 / 25.4
DASHES = {"solid": Qt.PenStyle.SolidLine, "dashed": Qt.PenStyle.DashLine, "dotted": Qt.PenStyle.DotLine,
          "dashdot": Qt.PenStyle.DashDotLine}
# Arrowheads on polygons, in drawing mm: ISO 128-22 style, length about three times the width.
ARROW_LENGTH_MM = 3.5
ARROW_WIDTH_MM = 1.2
LABEL_PIXELS = 13


def scene_xy(x: float, y: float) -> QPointF:
    """A model point (x right, y up) as a scene point (y down)."""
    return QPointF(float(x), -float(y))


def qpen(pen: Pen, scale: float = 1.0) -> QPen:
    """A cosmetic QPen for a style Pen; ``scale`` thickens it (highlighting)."""
    result = QPen(QColor(pen.colour))
    result.setCosmetic(True)
    result.setWidthF(max(1.0, pen.weight_mm * PIXELS_PER_WEIGHT_MM * scale))
    result.setStyle(DASHES[pen.dash])
    result.setCapStyle(Qt.PenCapStyle.FlatCap)
    return result


def brush(pen: Pen, alpha: int = 255) -> QBrush:
    colour = QColor(pen.colour)
    colour.setAlpha(alpha)
    return QBrush(colour)


def label_font(pixels: int = LABEL_PIXELS, bold: bool = False) -> QFont:
    font = QFont("DejaVu Sans")
    font.setPixelSize(pixels)
    font.setBold(bold)
    return font


def arrowhead(start: tuple, end: tuple) -> QPolygonF:
    """The filled arrowhead at ``end`` of a vector from ``start`` (scene mm, (x, y)); empty for a null vector."""
    dx, dy = end[0] - start[0], end[1] - start[1]
    length = math.hypot(dx, dy)
    if length < 1e-9:
        return QPolygonF()
    # A vector shorter than two heads gets a head half its length, so its start stays visible.
    head = min(ARROW_LENGTH_MM, 0.5 * length)
    ux, uy = dx / length, dy / length
    half = 0.5 * ARROW_WIDTH_MM * head / ARROW_LENGTH_MM
    base_x, base_y = end[0] - ux * head, end[1] - uy * head
    return QPolygonF([QPointF(*end), QPointF(base_x - uy * half, base_y + ux * half),
                      QPointF(base_x + uy * half, base_y - ux * half)])


def hatch_path(size: float) -> QPainterPath:
    """The fixed-pivot sign in pixels about the pivot: a bearing triangle on a hatched ground line."""
    path = QPainterPath()
    path.moveTo(0, 0)
    path.lineTo(-0.6 * size, size)
    path.lineTo(0.6 * size, size)
    path.closeSubpath()
    path.moveTo(-size, size)
    path.lineTo(size, size)
    for i in range(5):
        x = -size + i * 0.5 * size
        path.moveTo(x + 0.45 * size, size)
        path.lineTo(x, 1.45 * size)
    return path


class Label:
    """A text that keeps its screen size at any zoom, set off from its anchor
    by a few pixels in a given direction so it does not sit on the line it names."""

    GAP_PIXELS = 5.0

    def __init__(self, scene, text: str, colour: str, z: float = 10.0, pixels: int = LABEL_PIXELS,
                 bold: bool = False):
        from PySide6.QtWidgets import QGraphicsItem, QGraphicsPathItem, QGraphicsSimpleTextItem

        self.anchor = QGraphicsPathItem()
        self.anchor.setFlag(QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations)
        self.anchor.setZValue(z)
        self.text = QGraphicsSimpleTextItem(text, self.anchor)
        self.shown = text  # the text set, read back without asking Qt
        self.text.setFont(label_font(pixels, bold))
        self.text.setBrush(QBrush(QColor(colour)))
        # Kept as a pixmap until the text changes: laying out the text anew at every paint of a
        # drag costs more than all the lines of a polygon.
        self.text.setCacheMode(QGraphicsItem.CacheMode.DeviceCoordinateCache)
        self._measure()
        scene.addItem(self.anchor)

    def offset(self, dx: float, dy: float, gap: float = GAP_PIXELS, flush_left: bool = False) -> tuple:
        """Where the text's top left corner goes from the anchor, in screen pixels (see :meth:`place`)."""
        width, height = self.size
        if flush_left:
            return 0.0, gap if dy > 0 else -gap - height
        norm = math.hypot(dx, dy) or 1.0
        ux, uy = dx / norm, dy / norm
        # Centre of the text goes out along the direction far enough to clear the anchor.
        reach = gap + 0.5 * abs(ux) * width + 0.5 * abs(uy) * height
        return ux * reach - 0.5 * width, uy * reach - 0.5 * height

    def place(self, at: QPointF, dx: float = 1.0, dy: float = -1.0, flush_left: bool = False,
              gap: float = GAP_PIXELS):
        """Put the label beside ``at`` (scene), towards screen direction (dx, dy);
        ``flush_left`` starts the text at ``at`` instead of centring it."""
        self.anchor.setPos(at)
        self.text.setPos(*self.offset(dx, dy, gap, flush_left))

    def set_text(self, text: str):
        if self.shown != text:
            self.shown = text
            self.text.setText(text)
            self._measure()

    def _measure(self):
        rect = self.text.boundingRect()
        self.size = (rect.width(), rect.height())  # screen pixels


class ScaleBar:
    """A bar of ``length`` scene units with end and middle ticks, and its words beside it."""

    def __init__(self, scene, pen: Pen):
        from PySide6.QtWidgets import QGraphicsLineItem

        self.lines = [QGraphicsLineItem() for _ in range(4)]
        for line in self.lines:
            line.setPen(qpen(pen, 1.5))
            line.setZValue(9)
            scene.addItem(line)
        self.label = Label(scene, "", pen.colour, pixels=12)
        self._placed = None  # the last place() arguments
        self._visible = None

    def items(self):
        return [*self.lines, self.label.anchor]

    def set_visible(self, on: bool):
        if on != self._visible:
            self._visible = on
            for item in self.items():
                item.setVisible(on)

    def place(self, left: QPointF, length: float, tick: float, text: str):
        x, y = left.x(), left.y()
        if (x, y, length, tick, text) == self._placed:
            return  # as it is (a driver turn leaves the space diagram's bar where it was)
        self._placed = (x, y, length, tick, text)
        self.lines[0].setLine(x, y, x + length, y)
        for line, at in zip(self.lines[1:], (0.0, 0.5 * length, length), strict=True):
            line.setLine(x + at, y - tick, x + at, y + tick)
        self.label.set_text(text)
        self.label.place(QPointF(x, y + tick), 0.0, 1.0, flush_left=True)


def preferred_length(about: float) -> float:
    """The 1, 2 or 5 × 10ⁿ nearest below ``about`` (a scale bar's length).

    >>> preferred_length(37.0)
    20.0
    """
    if about <= 0 or not math.isfinite(about):
        return 1.0
    power = 10.0 ** math.floor(math.log10(about))
    return max(m * power for m in (1.0, 2.0, 5.0) if m * power <= about)


# Directions tried, in order, for a label that would cover another one.
_COMPASS = [(math.cos(math.radians(a)), -math.sin(math.radians(a))) for a in (45, 135, 225, 315, 0, 90, 180, 270)]


def overlap(a: tuple, b: tuple) -> bool:
    """True when boxes (left, top, width, height) share some area (touching edges do not)."""
    return a[0] < b[0] + b[2] and b[0] < a[0] + a[2] and a[1] < b[1] + b[3] and b[1] < a[1] + a[3]


def square(at: QPointF, half: float) -> tuple:
    """The box (left, top, width, height) of half-width ``half`` about ``at``."""
    return (at.x() - half, at.y() - half, 2.0 * half, 2.0 * half)


def declutter(labels, mm_per_pixel: float, obstacles=()):
    """Place labels, moving one that would overlap an earlier label or an obstacle to a free side.

    ``labels`` is a list of (Label, anchor QPointF, (dx, dy) preferred direction[, gap pixels]),
    placed in that order; ``obstacles`` are scene boxes (left, top, width, height). Where no side is
    free of both, a side free of the other labels will do. Label sizes are on-screen pixels, turned
    into scene units by ``mm_per_pixel``.
    """
    placed = []
    for label, anchor, preferred, *gap in labels:
        gap = gap[0] if gap else Label.GAP_PIXELS
        at = (anchor.x(), anchor.y(), label.size[0] * mm_per_pixel, label.size[1] * mm_per_pixel)
        # Only boxes that could touch one of this label's footprints matter (a few, of many); every
        # footprint lies within gap + 1.25 × its larger side of the anchor (see Label.offset).
        reach = 1.5 * max(at[2], at[3]) + 2.0 * gap * mm_per_pixel
        near = (at[0] - reach, at[1] - reach, 2.0 * reach, 2.0 * reach)
        near_placed = [other for other in placed if overlap(near, other)]
        near_obstacles = [other for other in obstacles if overlap(near, other)]
        fallback = chosen = None
        for direction in (preferred, *_COMPASS):  # tried in order, until one is free of everything
            box = _footprint(label, at, direction, gap, mm_per_pixel)
            if any(overlap(box, other) for other in near_placed):
                continue
            fallback = fallback or (direction, box)
            if not any(overlap(box, other) for other in near_obstacles):
                chosen = (direction, box)
                break
        direction, box = chosen or fallback or (preferred, _footprint(label, at, preferred, gap, mm_per_pixel))
        label.place(anchor, *direction, gap=gap)
        placed.append(box)


def _footprint(label: Label, at: tuple, direction: tuple, gap: float, mm_per_pixel: float) -> tuple:
    """The scene box ``label`` would cover placed towards ``direction``; ``at`` is its anchor's scene
    position and its size in scene units (x, y, width, height)."""
    dx, dy = label.offset(*direction, gap=gap)
    return (at[0] + dx * mm_per_pixel, at[1] + dy * mm_per_pixel, at[2], at[3])
