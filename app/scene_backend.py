"""The Qt scene backend: a Sheet's primitives as QGraphicsItems, kept from pose to pose.

The window's views draw what :mod:`kinematics.drawing` records, as the printer
and the DXF writer do. A primitive is known by what it draws (its
:class:`~kinematics.drawing.Ref`), its kind and its place among that Ref's
primitives of its kind: the first :meth:`SceneBackend.show` makes its items,
each later one moves them in place (nothing is touched where nothing moved),
makes the few new ones and drops those no longer drawn. Each item carries its
Ref (``setData(ITEM_REF)``) so a click or a hover leads back to the model; a
pin also says it is a joint's handle (``ITEM_HANDLE``).

Scene units are the sheet's millimetres with y turned down. The screen adds
looks only: cosmetic pens, fills (a pin over the lines under it, a plate, a
slider block, an image figure), a bar's broad body under its centre line, and
text in screen pixels at the height the sheet asks for.
"""

from __future__ import annotations

from functools import cache
from operator import attrgetter

from PySide6.QtCore import QPointF, Qt
from PySide6.QtGui import QBrush, QColor, QPainterPath, QPen, QPolygonF, QTransform
from PySide6.QtWidgets import (
    QGraphicsEllipseItem,
    QGraphicsItem,
    QGraphicsLineItem,
    QGraphicsPathItem,
    QGraphicsPolygonItem,
    QGraphicsSimpleTextItem,
)

from kinematics.drawing import Arrow, Circle, Hatch, Line, Polyline, Strokes, Text
from kinematics.drawing.style import IMAGE, SPACE_PATH

from .drawing_kit import font_for_capitals, qpen

ITEM_REF, ITEM_HANDLE = 0, 1
HANDLES = frozenset(("point", "mass centre"))  # what the mouse picks up on the space diagram: a joint, a centre of mass
BAR_COLOUR = "#c9d3de"
PLATE_COLOUR = "#dfe6ee"
HOVER_COLOUR = "#f1c40f"
BAR_PIXELS = 11.0  # a bar's body on screen, as wide as a pin
EMPHASIS = 2.4  # an emphasised line is drawn this many times its weight
IMAGE_ALPHA = 28
# Stacking: paths under everything, then bodies and fills, lines, vectors, marks, pins, text.
Z_PATH, Z_BODY, Z_FILL, Z_LINE, Z_HATCH, Z_SHAFT, Z_HEAD, Z_BLOCK, Z_PIN, Z_TEXT = (
    0.2, 0.5, 1.0, 2.0, 2.5, 3.0, 4.0, 4.5, 6.0, 8.0)


@cache
def _pen(pen, scale: float) -> QPen:
    return qpen(pen, scale)


@cache
def _brush(colour: str, alpha: int = 255) -> QBrush:
    qcolour = QColor(colour)
    qcolour.setAlpha(alpha)
    return QBrush(qcolour)


@cache
def _body_pen(pixels_per_mm: float) -> QPen:
    # In scene millimetres, not a cosmetic pen: an item's bounding box grows by half its pen's width
    # in scene units, so a cosmetic body 11 pixels wide seen zoomed out (a millimetre under a pixel)
    # drew beyond the box Qt repaints when it moves, and left copies of itself on screen.
    return QPen(QColor(BAR_COLOUR), BAR_PIXELS / pixels_per_mm)


def _points(points) -> QPolygonF:
    return QPolygonF([QPointF(x, -y) for x, y in points])


def _fill(primitive) -> QBrush | None:
    """The screen's fill for a closed outline or a circle (None: none)."""
    kind = primitive.ref.kind if primitive.ref else ""
    if kind in ("centre", "mass centre"):
        # An instantaneous centre's ring leaves the pin under it seen; a centre of mass's ring its quarters.
        return _brush("#000000", 0)
    if isinstance(primitive, Circle):
        # An open pin is filled with white on screen so the lines meeting there stop at its rim.
        return _brush(primitive.pen.colour) if primitive.filled else _brush("#ffffff")
    if kind == "link":
        return _brush(PLATE_COLOUR)
    if kind == "slide":
        return _brush(BAR_COLOUR)
    if primitive.pen == IMAGE:
        return _brush(IMAGE.colour, IMAGE_ALPHA)
    return None


_REF = attrgetter("ref")
# The field that decides a primitive's item kind or fill, for the kinds that have one.
_SHAPE = {Polyline: Polyline._fields.index("closed"), Circle: Circle._fields.index("filled")}


class _Drawn:
    """The items of one primitive, the primitive they show now and the zoom it was shown at;
    ``shaped_for`` is what the item was last shaped for (a text's words and size, a pin's radius
    in pixels), so it is reshaped only when that changes."""

    __slots__ = ("primitive", "items", "emphasised", "shaped_for", "zoom")

    def __init__(self, primitive, items):
        self.primitive, self.items, self.emphasised, self.shaped_for, self.zoom = None, items, False, None, None


class SceneBackend:
    """Shows Sheets in ``scene``, one after another, moving the same items."""

    def __init__(self, scene):
        self.scene = scene
        self.drawn: dict[tuple, _Drawn] = {}
        self.by_ref: dict = {}
        self.emphasised: frozenset = frozenset()
        self.pixels_per_mm = 1.0
        # What the last show drew, in its order: each primitive's entry, kind and Ref.
        self._order: list = []
        self._kinds: list = []
        self._refs: list = []

    # showing ------------------------------------------------------------
    def show(self, sheet, pixels_per_mm: float) -> None:
        """Show ``sheet``'s primitives; ``pixels_per_mm`` is the view's zoom (for text)."""
        primitives = sheet.primitives
        # From pose to pose of a drag the sheet usually draws the same things in the same order:
        # then each primitive keeps the entry of the one in its place last time, and only those
        # that changed are looked at (the lists are compared by C code, not primitive by primitive).
        if pixels_per_mm == self.pixels_per_mm and len(primitives) == len(self._order):
            kinds, refs = list(map(type, primitives)), list(map(_REF, primitives))
            if kinds == self._kinds and refs == self._refs:
                self._follow(primitives)
                return
        self._show(primitives, pixels_per_mm)

    def _follow(self, primitives) -> None:
        """Update the entries of the primitives that changed, each in the place it had last time."""
        order = self._order
        for entry, primitive in zip(order, primitives, strict=True):
            if entry.primitive != primitive:
                kind = type(primitive)
                if kind in _SHAPE and primitive[_SHAPE[kind]] != entry.primitive[_SHAPE[kind]]:
                    self._show(primitives, self.pixels_per_mm)  # an outline closed or a dot became a pin
                    return
                self._update(entry, primitive)

    def _show(self, primitives, pixels_per_mm: float) -> None:
        self.pixels_per_mm = pixels_per_mm
        counts: dict = {}
        keys = []
        order = []
        drawn = self.drawn
        for primitive in primitives:
            kind = type(primitive)
            # An open and a closed outline, a dot and a pin, take items of different kinds.
            base = (primitive.ref, kind, primitive[_SHAPE[kind]]) if kind in _SHAPE else (primitive.ref, kind)
            n = counts.get(base, 0)
            counts[base] = n + 1
            key = (base, n)
            keys.append(key)
            entry = drawn.get(key)
            if entry is None:
                entry = drawn[key] = self._make(primitive)
                self.by_ref.setdefault(primitive.ref, []).append(entry)
            order.append(entry)
            if entry.primitive == primitive and entry.zoom == pixels_per_mm:
                continue
            self._update(entry, primitive)
        if len(keys) != len(drawn):
            self._drop(drawn.keys() - set(keys))
        self._order = order
        self._kinds, self._refs = list(map(type, primitives)), list(map(_REF, primitives))

    def clear(self) -> None:
        self._drop(list(self.drawn))
        self._order, self._kinds, self._refs = [], [], []

    def _drop(self, keys) -> None:
        for key in keys:
            entry = self.drawn.pop(key)
            for item in entry.items:
                self.scene.removeItem(item)
            ref = key[0][0]
            self.by_ref[ref].remove(entry)
            if not self.by_ref[ref]:
                del self.by_ref[ref]

    def _make(self, primitive) -> _Drawn:
        kind = type(primitive)
        ref = primitive.ref
        if kind is Line:
            items = [QGraphicsLineItem()]
            items[0].setZValue(Z_LINE)
            if ref is not None and ref.kind == "link":
                body = QGraphicsLineItem()
                body.setZValue(Z_BODY)
                items.append(body)
        elif kind is Polyline:
            items = [QGraphicsPolygonItem() if primitive.closed else QGraphicsPathItem()]
            fill = _fill(primitive) if primitive.closed else None
            if fill is not None:
                items[0].setBrush(fill)
            items[0].setZValue(Z_PATH if primitive.pen == SPACE_PATH else Z_BLOCK if ref and ref.kind == "slide"
                               else Z_FILL if fill is not None else Z_LINE)
            if primitive.pen == SPACE_PATH:
                # A path of a whole cycle stays put while the links move over it: kept as a pixmap.
                items[0].setCacheMode(QGraphicsItem.CacheMode.DeviceCoordinateCache)
        elif kind is Strokes:
            items = [QGraphicsPathItem()]
            items[0].setZValue(Z_LINE)
        elif kind is Arrow:
            shaft, head = QGraphicsLineItem(), QGraphicsPolygonItem()
            shaft.setZValue(Z_SHAFT)
            head.setZValue(Z_HEAD)
            head.setPen(QPen(Qt.PenStyle.NoPen))  # filled only: an outline is stroked at many times the cost
            items = [shaft, head]
        elif kind is Circle:
            items = [QGraphicsEllipseItem()]
            # A pin or a dot is a symbol: drawn in screen pixels about its centre, which costs a
            # tenth of an ellipse the view's transform must flatten at every paint.
            items[0].setFlag(QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations)
            # Kept as a pixmap until its size or fill changes: a pin moves with every pose, and an
            # ellipse is outlined and filled as a path at every paint (twice the cost of a blit).
            items[0].setCacheMode(QGraphicsItem.CacheMode.DeviceCoordinateCache)
            items[0].setZValue(Z_PIN)
            if ref is not None and ref.kind in HANDLES:
                items[0].setData(ITEM_HANDLE, True)
        elif kind is Hatch:
            items = [QGraphicsPolygonItem()]
            items[0].setPen(QPen(Qt.PenStyle.NoPen))
            items[0].setZValue(Z_HATCH)
        elif kind is Text:
            text = QGraphicsSimpleTextItem()
            text.setFlag(QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations)
            # Kept as a pixmap until the text changes: laying out text at every paint costs more
            # than all the lines of a polygon.
            text.setCacheMode(QGraphicsItem.CacheMode.DeviceCoordinateCache)
            text.setZValue(Z_TEXT)
            items = [text]
        else:
            raise TypeError(f"no scene item for {kind.__name__}")
        entry = _Drawn(primitive, items)
        for item in items:
            item.setData(ITEM_REF, ref)
            self.scene.addItem(item)
        entry.emphasised = ref in self.emphasised
        return entry

    def _style(self, entry: _Drawn, primitive) -> None:
        """Pens and fills from the primitive's pen, plain or emphasised."""
        scale = EMPHASIS if entry.emphasised else 1.0
        kind = type(primitive)
        first = entry.items[0]
        if kind is Circle:
            first.setPen(_pen(primitive.pen, 1.0))
            first.setBrush(_brush(HOVER_COLOUR) if entry.emphasised else _fill(primitive))
        elif kind in (Hatch, Text):
            first.setBrush(_brush(primitive.pen.colour))
        else:
            first.setPen(_pen(primitive.pen, scale))
            if kind is Arrow:
                entry.items[1].setBrush(_brush(primitive.pen.colour))

    def _update(self, entry: _Drawn, primitive) -> None:
        kind = type(primitive)
        items = entry.items
        if entry.primitive is None or entry.primitive.pen is not primitive.pen:  # pens are shared constants
            self._style(entry, primitive)  # new, or its role changed (a step flagged ill-conditioned)
        if kind is Line:
            (x0, y0), (x1, y1) = primitive.start, primitive.end
            for item in items:
                item.setLine(x0, -y0, x1, -y1)
            if len(items) > 1 and entry.zoom != self.pixels_per_mm:
                items[1].setPen(_body_pen(self.pixels_per_mm))  # a bar's body keeps its width on screen
        elif kind is Polyline:
            if primitive.closed:
                items[0].setPolygon(_points(primitive.points))
            else:
                path = QPainterPath()
                path.addPolygon(_points(primitive.points))
                items[0].setPath(path)
        elif kind is Strokes:
            path = QPainterPath()
            ends = primitive.points
            for i in range(0, len(ends) - 1, 2):
                path.moveTo(ends[i][0], -ends[i][1])
                path.lineTo(ends[i + 1][0], -ends[i + 1][1])
            items[0].setPath(path)
        elif kind is Arrow:
            (x0, y0), (x1, y1) = primitive.start, primitive.end
            items[0].setLine(x0, -y0, x1, -y1)
            items[1].setPolygon(_points(primitive.head))
        elif kind is Circle:
            (x, y), r = primitive.centre, primitive.radius * self.pixels_per_mm
            # Moved, not reshaped, while its size holds: a new rectangle makes Qt work out the
            # ellipse's outline again.
            if entry.shaped_for != r:
                entry.shaped_for = r
                items[0].setRect(-r, -r, 2.0 * r, 2.0 * r)
            items[0].setPos(x, -y)
        elif kind is Hatch:
            items[0].setPolygon(_points(primitive.points))
        else:
            self._update_text(entry, primitive)
        entry.primitive, entry.zoom = primitive, self.pixels_per_mm

    def _update_text(self, entry: _Drawn, text: Text) -> None:
        item = entry.items[0]
        words = (text.text, text.height, text.align, text.anchor)
        shaped = entry.shaped_for  # the words, zoom and font size in pixels it was last shaped for
        if shaped is None or shaped[0] != words or shaped[1] != self.pixels_per_mm:
            pixels = max(1, round(text.height * self.pixels_per_mm))
            font, metrics = font_for_capitals(pixels)
            # A new font lays the item out again: set only when the size changed, not for new words.
            if shaped is None or shaped[2] != pixels:
                item.setFont(font)
            entry.shaped_for = (words, self.pixels_per_mm, pixels)
            item.setText(text.text)
            width = metrics.horizontalAdvance(text.text)
            # The item's own origin is the top left of its line; the sheet's anchor is on the baseline.
            dx = {"left": 0.0, "centre": -0.5 * width, "right": -width}[text.align]
            dy = {"baseline": 0.0, "middle": 0.5 * metrics.capHeight(), "top": metrics.capHeight()}[text.anchor]
            item.setTransform(QTransform.fromTranslate(dx, dy - metrics.ascent()))
        x, y = text.position
        item.setPos(x, -y)

    # asking -------------------------------------------------------------
    def items_of(self, ref) -> list:
        """The scene items drawing ``ref``, in drawing order."""
        return [item for entry in self.by_ref.get(ref, ()) for item in entry.items]

    def primitives_of(self, ref) -> list:
        """The primitives shown now for ``ref``."""
        return [entry.primitive for entry in self.by_ref.get(ref, ())]

    # emphasis -----------------------------------------------------------
    def emphasise(self, refs) -> None:
        """Draw what ``refs`` draw emphasised (broader lines, a lit pin), the rest plain."""
        refs = frozenset(refs)
        for ref in refs ^ self.emphasised:
            for entry in self.by_ref.get(ref, ()):
                entry.emphasised = ref in refs
                self._style(entry, entry.primitive)
        self.emphasised = refs
