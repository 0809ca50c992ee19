"""A velocity or acceleration polygon, as
:func:`kinematics.drawing.panes.polygon_pane` records it from the
Construction's steps, shown through the scene backend (items made once,
moved in place when the pose changes). Scene units are millimetres of
drawing, y down: a polygon coordinate c (m/s or m/s²) sits at c / scale_per_mm.
"""

from __future__ import annotations

from PySide6.QtCore import QPointF, QRectF
from PySide6.QtGui import QColor, QPen
from PySide6.QtWidgets import QGraphicsEllipseItem, QGraphicsItem, QGraphicsScene

from kinematics.drawing import Arrow, Circle, Line, Ref
from kinematics.drawing.panes import polygon_box, polygon_pane
from kinematics.drawing.style import pen_for

from .scene_backend import HOVER_COLOUR, SceneBackend
from .space_scene import scene_rect, screen_symbols

RING_PIXELS = 9.0
MARGIN_MM = 4.0  # room round a polygon when fitting, drawing mm


class PolygonScene(QGraphicsScene):
    """The scene of one polygon; :meth:`show` draws a Polygon, reusing items."""

    def __init__(self, kind: str, parent=None):
        super().__init__(parent)
        # Every item moves with each pose: a spatial index would be rebuilt each frame for nothing.
        self.setItemIndexMethod(QGraphicsScene.ItemIndexMethod.NoIndex)
        self.kind = kind
        self.length_unit = "m"  # the length system its scale is stated in (the window's choice)
        self.polygon = None
        self.sheet = None
        self.drawing = SceneBackend(self)
        self.content_rect = QRectF(-60, -60, 120, 120)
        self.selected_step = None
        self.marked = None  # the joint whose image is ringed, None for none
        self._steps = frozenset()
        self._pens = []  # the style pens of the steps, in first-use order
        self._ring = QGraphicsEllipseItem(-RING_PIXELS, -RING_PIXELS, 2 * RING_PIXELS, 2 * RING_PIXELS)
        self._ring.setFlag(QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations)
        self._ring.setPen(QPen(QColor(HOVER_COLOUR), 3))
        self._ring.setZValue(20)
        self._ring.setVisible(False)
        self.addItem(self._ring)

    # The recording of the polygon and the pens of its steps (the force polygon has its own).
    pen_of = staticmethod(pen_for)

    def _record(self, polygon, solution, size, draft: bool):
        return polygon_pane(polygon, solution, size, draft, length_unit=self.length_unit)

    def used_pens(self) -> list:
        """The style pens in use, in first-use order, for the legend."""
        return list(self._pens)

    def show(self, polygon, solution, mm_per_pixel: float, draft: bool = False):
        """Draw ``polygon`` of ``solution`` with symbols for a zoom of ``mm_per_pixel`` (or clear the
        drawing for None); a ``draft`` while the pose follows the mouse."""
        self.polygon = polygon
        if polygon is None:
            self.sheet = None
            self.drawing.clear()
            self._pens, self._steps = [], frozenset()
            self._ring.setVisible(False)
            self.select_step(None)
            return
        steps = frozenset(s.id for s in polygon.steps)
        if steps != self._steps:
            self._steps = steps
            self._pens = list(dict.fromkeys(self.pen_of(s) for s in polygon.steps))
            if self.selected_step not in steps:
                self.select_step(None)
        self.sheet = self._record(polygon, solution, screen_symbols(mm_per_pixel), draft)
        self.drawing.show(self.sheet, 1.0 / mm_per_pixel)
        self.content_rect = self.rect_for(polygon)
        self.mark_point(self.marked)  # the ring goes where the image went

    @staticmethod
    def rect_for(polygon) -> QRectF:
        """The scene area a view fits for ``polygon`` (its drawing to scale, with a margin): known
        before it is drawn, as the symbols it leaves out are drawn for the zoom the fit makes."""
        return scene_rect(polygon_box(polygon)).adjusted(-MARGIN_MM, -MARGIN_MM, MARGIN_MM, MARGIN_MM)

    def has_step(self, step_id: str) -> bool:
        return step_id in self._steps

    def end_of(self, step_id: str) -> QPointF:
        """Scene position of the end of a step's drawing (a dot's centre, a line's second end)."""
        for p in self.drawing.primitives_of(Ref("step", step_id)):
            if isinstance(p, (Line, Arrow)):
                return QPointF(p.end[0], -p.end[1])
            if isinstance(p, Circle):
                return QPointF(p.centre[0], -p.centre[1])
        raise KeyError(step_id)

    def select_step(self, step_id: str | None):
        """Emphasise one step's geometry (None clears)."""
        self.selected_step = step_id if step_id in self._steps else None
        self.drawing.emphasise({Ref("step", self.selected_step)} if self.selected_step else ())

    def mark_point(self, name: str | None):
        """Ring the image of joint ``name`` (None hides the ring), in this pose and the ones that follow."""
        self.marked = name
        images = self.polygon.images if self.polygon is not None else {}
        if name not in images:
            self._ring.setVisible(False)
            return
        x, y = self.sheet.views[self.kind].place(images[name])
        self._ring.setPos(x, -y)
        self._ring.setVisible(True)

    def ring_visible(self) -> bool:
        return self._ring.isVisible()
