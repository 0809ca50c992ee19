"""The force polygon pane: the scene of :func:`kinematics.drawing.forces.force_pane` (the
polygon scene's items and emphasis, the force polygon's pens and scale words) and its view,
which says in words why there is no force polygon and reports the step under the mouse.

The numbers are the core's: the ForcePolygon is made by :func:`app.forces_data.pose_force_polygon`.
"""

from __future__ import annotations

from PySide6.QtCore import QRectF, Qt, Signal
from PySide6.QtGui import QColor, QPainter

from kinematics.drawing.forces import force_pen, scale_words
from kinematics.drawing.panes import polygon_pane

from .drawing_kit import label_font
from .polygon_scene import PolygonScene
from .views import LEGEND_LINE, LEGEND_TOP, PolygonView

MESSAGE_WIDTH = 360.0  # pixels the message wraps at
SIDE_ROOM = 0.15  # room each side of the force polygon for its labels, as a share of its width


class ForceScene(PolygonScene):
    """The force polygon's scene: :meth:`show` takes the Polygon of a ForcePolygon."""

    pen_of = staticmethod(force_pen)

    def __init__(self, parent=None):
        super().__init__("force", parent)

    def _record(self, polygon, solution, size, draft: bool):
        return polygon_pane(polygon, solution, size, draft, pen_of=force_pen, scale_text=scale_words(polygon),
                            stack_labels=True)

    @staticmethod
    def rect_for(polygon) -> QRectF:
        """The base scene's fit with room beside the drawing for the labels at the forces' ends."""
        rect = PolygonScene.rect_for(polygon)
        # A force's label is long ("F(crank→rod)ᵗ"): a share of the drawing's width, not the labels'
        # own boxes: those keep their size on screen, so a fit to them would zoom out without end.
        side = SIDE_ROOM * rect.width()
        return rect.adjusted(-side, 0.0, side, 0.0)


class ForceView(PolygonView):
    """The force polygon's view: ``message`` (why there is none, or the drive torque and the
    cross-check) under the title; ``step_hovered(step id or "")`` as the mouse goes over the steps."""

    step_hovered = Signal(str)

    def __init__(self, scene, parent=None):
        super().__init__(scene, "force polygon", parent)
        self.setMouseTracking(True)
        self.message = ""
        self._hovered = ""

    def set_message(self, text: str):
        if text != self.message:
            self.message = text
            self.viewport().update()

    def legend_height(self) -> float:
        return super().legend_height() + (2 * LEGEND_LINE if self.message else 0.0)

    def mouseMoveEvent(self, event):
        step = "" if event.buttons() else (self.step_at(event.position().toPoint()) or "")
        if step != self._hovered:
            self._hovered = step
            self.step_hovered.emit(step)
        super().mouseMoveEvent(event)

    def leaveEvent(self, event):
        if self._hovered:
            self._hovered = ""
            self.step_hovered.emit("")
        super().leaveEvent(event)

    def drawForeground(self, painter: QPainter, rect):
        super().drawForeground(painter, rect)
        if not self.message:
            return
        painter.save()
        painter.resetTransform()
        painter.setFont(label_font(11))
        painter.setPen(QColor("#1d2b3a"))
        top = LEGEND_TOP + LEGEND_LINE * len(self.scene().used_pens()) - 6
        painter.drawText(QRectF(10, top, MESSAGE_WIDTH, 3 * LEGEND_LINE), Qt.TextFlag.TextWordWrap, self.message)
        painter.restore()
