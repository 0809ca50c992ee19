"""A velocity or acceleration polygon drawn from a :class:`kinematics.Polygon`.

Only the Construction's steps are drawn; nothing is recomputed here. Items
are made once per step structure and moved in place when the pose changes.
Scene units are millimetres of drawing: a polygon coordinate c (m/s or
m/s²) sits at c / scale_per_mm.
"""

from __future__ import annotations

from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QBrush, QColor, QPen, QPolygonF
from PySide6.QtWidgets import (
    QGraphicsEllipseItem,
    QGraphicsItem,
    QGraphicsLineItem,
    QGraphicsPolygonItem,
    QGraphicsScene,
)

from kinematics import Role
from kinematics.drawing.style import ANNOTATION, IMAGE, pen_for

from .drawing_kit import Label, ScaleBar, arrowhead, brush, declutter, qpen, scene_xy, square

SCALE_BAR_MM = 20.0
HIGHLIGHT_WEIGHT = 2.6
HOVER_COLOUR = "#f1c40f"
DOT_PIXELS = 3.0
UNIT_TEXT = {"m/s": "m/s", "m/s^2": "m/s²"}


def polygon_unit(polygon) -> str:
    return UNIT_TEXT.get(polygon.unit, polygon.unit)


def nice_number(value: float) -> str:
    return f"{value:.4g}"


class _StepItems:
    """The graphics items of one step: a line, maybe an arrowhead, maybe a dot and a label."""

    def __init__(self, scene: QGraphicsScene, step):
        self.pen = pen_for(step)
        self.line = self.head = self.dot = self.label = None
        self.head_box = None  # the arrowhead's scene box (left, top, width, height), kept clear of labels
        if len(step.coords) == 1:
            self.dot = QGraphicsEllipseItem(-DOT_PIXELS, -DOT_PIXELS, 2 * DOT_PIXELS, 2 * DOT_PIXELS)
            self.dot.setFlag(QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations)
            self.dot.setZValue(5)
            scene.addItem(self.dot)
        else:
            self.line = QGraphicsLineItem()
            self.line.setZValue(1 if step.role is Role.DIRECTION else 3)
            scene.addItem(self.line)
            if step.is_vector:
                self.head = QGraphicsPolygonItem()
                self.head.setZValue(4)
                scene.addItem(self.head)
        if step.label:
            self.label = Label(scene, step.label, self.pen.colour, pixels=14, bold=True)
        for item in self.items():
            item.setData(0, step.id)
        self.emphasise(False)

    def items(self):
        found = [i for i in (self.line, self.head, self.dot) if i is not None]
        return found + ([self.label.anchor] if self.label else [])

    def emphasise(self, on: bool):
        pen = qpen(self.pen, HIGHLIGHT_WEIGHT if on else 1.0)
        if self.line is not None:
            self.line.setPen(pen)
        if self.head is not None:
            self.head.setPen(QPen(Qt.PenStyle.NoPen))  # filled only: an outline is stroked at many times the cost
            self.head.setBrush(brush(self.pen))
        if self.dot is not None:
            self.dot.setPen(qpen(self.pen, 0.7))
            self.dot.setBrush(brush(self.pen) if not on else QBrush(QColor(HOVER_COLOUR)))

    def update(self, step, ends: list):
        """Move the items to ``step``, whose ends are ``ends`` (scene mm, (x, y) tuples)."""
        tip = ends[-1]
        if self.dot is not None:
            self.dot.setPos(*tip)
            away = tip
        else:
            (x0, y0), (x1, y1) = ends
            self.line.setLine(x0, y0, x1, y1)
            if self.head is not None:
                head = arrowhead(ends[0], tip)
                self.head.setPolygon(head)
                box = head.boundingRect()
                self.head_box = (box.x(), box.y(), box.width(), box.height())
            away = (x1 - x0, y1 - y0)
        if self.label is not None:
            # Placed by the scene's declutter, which knows the zoom.
            self.label.set_text(step.label)
            self.label_at = (QPointF(*tip), away if away[0] or away[1] else (-1.0, -1.0))


class PolygonScene(QGraphicsScene):
    """The scene of one polygon; :meth:`show` draws a Polygon, reusing items."""

    def __init__(self, kind: str, parent=None):
        super().__init__(parent)
        # Every item moves with each pose: a spatial index would be rebuilt each frame for nothing.
        self.setItemIndexMethod(QGraphicsScene.ItemIndexMethod.NoIndex)
        self.kind = kind
        self.polygon = None
        self.structure = None
        self.step_items: dict[str, _StepItems] = {}
        self._pens = []  # the style pens of the step items, in first-use order
        self.figures: dict[str, QGraphicsPolygonItem] = {}
        self.content_rect = QRectF(-60, -60, 120, 120)
        self.selected_step = None
        self.scale_bar = ScaleBar(self, ANNOTATION)
        self._ring = QGraphicsEllipseItem(-9, -9, 18, 18)
        self._ring.setFlag(QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations)
        self._ring.setPen(QPen(QColor(HOVER_COLOUR), 3))
        self._ring.setZValue(20)
        self._ring.setVisible(False)
        self.addItem(self._ring)

    def _figure(self, link: str) -> QGraphicsPolygonItem:
        figure = QGraphicsPolygonItem()
        figure.setPen(qpen(IMAGE))
        figure.setBrush(brush(IMAGE, 28))
        figure.setZValue(0.5)
        figure.setData(0, ("image of", link))
        self.addItem(figure)
        return figure

    def used_pens(self) -> list:
        """The style pens in use, in first-use order, for the legend."""
        return list(self._pens)

    def show(self, polygon, plates: dict | None = None):
        """Draw ``polygon`` (or clear the drawing for None).

        ``plates`` maps each link of three or more points to its point names;
        the image figure of each is outlined through the images of its points.
        """
        plates = plates or {}
        structure = None if polygon is None else (tuple((s.id, s.role, len(s.coords), bool(s.label))
                                                        for s in polygon.steps), tuple(plates.items()))
        if structure != self.structure:
            for item in [i for items in self.step_items.values() for i in items.items()] + list(self.figures.values()):
                self.removeItem(item)
            self.step_items = {} if polygon is None else {s.id: _StepItems(self, s) for s in polygon.steps}
            self._pens = list(dict.fromkeys(items.pen for items in self.step_items.values()))
            self.figures = {} if polygon is None else {name: self._figure(name) for name in plates}
            self.structure = structure
            self.selected_step = None
        self.polygon = polygon
        self.scale_bar.set_visible(polygon is not None)
        if polygon is None:
            self._ring.setVisible(False)
            return
        scale = polygon.scale_per_mm
        xs, ys = [0.0], [0.0]  # scene mm of every end, and the pole
        for step in polygon.steps:
            ends = [(x / scale, -y / scale) for x, y in step.coords]  # y down
            xs += [x for x, _ in ends]
            ys += [y for _, y in ends]
            self.step_items[step.id].update(step, ends)
        for name, figure in self.figures.items():
            figure.setPolygon(QPolygonF([scene_xy(*(c / scale for c in polygon.images[p])) for p in plates[name]]))
        self._place_scale_bar(polygon, (min(xs), min(ys)), (max(xs), max(ys)))

    def _place_scale_bar(self, polygon, low, high):
        """Put the scale bar under the drawing, which spans ``low`` to ``high`` (scene mm), and fit around both."""
        scale = polygon.scale_per_mm
        (low_x, low_y), (high_x, high_y) = low, high
        margin = 8.0
        left, bottom = low_x, high_y + margin
        self.content_rect = QRectF(low_x - margin, low_y - margin, max(high_x - low_x, SCALE_BAR_MM) + 2 * margin,
                                   high_y - low_y + 4.0 * margin)
        unit = polygon_unit(polygon)
        self.scale_bar.place(QPointF(left, bottom), SCALE_BAR_MM, 1.0,
                             f"bar {nice_number(SCALE_BAR_MM * scale)} {unit}\n"
                             f"drawing scale 1 mm = {nice_number(scale)} {unit}")

    def declutter(self, mm_per_pixel: float):
        """Place the step labels clear of each other, the dots and the arrowheads (needs the view's
        zoom, so the view calls it after :meth:`show`)."""
        labels, seen = [], set()
        for items in self.step_items.values():
            if items.label is None:
                continue
            tip = items.label_at[0]
            # A mark and the intersection that found it carry the same label at one place: show it once.
            key = (items.label.shown, round(tip.x() / mm_per_pixel), round(tip.y() / mm_per_pixel))
            items.label.anchor.setVisible(key not in seen)
            if key not in seen:
                seen.add(key)
                labels.append((items.label, *items.label_at))
        obstacles = [square(items.dot.pos(), DOT_PIXELS * mm_per_pixel) for items in self.step_items.values()
                     if items.dot is not None]
        obstacles += [items.head_box for items in self.step_items.values() if items.head_box is not None]
        declutter(labels, mm_per_pixel, obstacles)

    def end_of(self, step_id: str) -> QPointF:
        """Scene position of the end of a step's drawing (a dot's centre, a line's second end)."""
        items = self.step_items[step_id]
        return items.dot.pos() if items.dot is not None else items.line.line().p2()

    def select_step(self, step_id: str | None):
        """Emphasise one step's geometry (None clears)."""
        if self.selected_step in self.step_items:
            self.step_items[self.selected_step].emphasise(False)
        self.selected_step = step_id if step_id in self.step_items else None
        if self.selected_step:
            self.step_items[self.selected_step].emphasise(True)

    def mark_point(self, name: str | None):
        """Ring the image of joint ``name`` (None hides the ring)."""
        images = self.polygon.images if self.polygon is not None else {}
        if name not in images:
            self._ring.setVisible(False)
            return
        x, y = images[name]
        self._ring.setPos(scene_xy(x / self.polygon.scale_per_mm, y / self.polygon.scale_per_mm))
        self._ring.setVisible(True)

    def ring_visible(self) -> bool:
        return self._ring.isVisible()

