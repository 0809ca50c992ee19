"""The force polygon pane: the scene of :func:`kinematics.drawing.forces.force_pane` (the
polygon scene's items and emphasis, the force polygon's pens and scale words) and its view,
which says in words why there is no force polygon and reports the step under the mouse.

The numbers are the core's: the ForcePolygon is made by :func:`app.forces_data.pose_force_polygon`.
"""

from __future__ import annotations

from PySide6.QtCore import QRect, QRectF, Qt, Signal
from PySide6.QtGui import QColor, QFontMetrics, QPainter

from kinematics.drawing import Ref, Text
from kinematics.drawing.declutter import text_box
from kinematics.drawing.forces import force_pen, scale_words, screen_labelled
from kinematics.drawing.panes import polygon_pane

from .drawing_kit import label_font
from .polygon_scene import PolygonScene
from .space_scene import scene_rect
from .views import PolygonView

MESSAGE_WIDTH = 360.0  # pixels the message wraps at
LABEL_ROOM = 0.6  # the most room each side of the force polygon its labels take, a share of its size


class ForceScene(PolygonScene):
    """The force polygon's scene: :meth:`show` takes the Polygon of a ForcePolygon."""

    pen_of = staticmethod(force_pen)

    def __init__(self, parent=None):
        super().__init__("force", parent)

    def _record(self, polygon, solution, size, draft: bool):
        self._drawn = (polygon, solution, size, draft)
        chosen = self.selected_step or ""
        return polygon_pane(polygon, solution, size, draft, pen_of=force_pen, scale_text=scale_words(polygon),
                            stack_labels=True, labelled=lambda step: screen_labelled(step, chosen))

    def select_step(self, step_id: str | None):
        """Emphasise one step (None clears) beside the forces at the joint the mouse is on, and
        label it (the pane labels only the forces found and the step chosen)."""
        step_id = step_id if step_id in self._steps else None
        if step_id != self.selected_step and self.sheet is not None:
            self.selected_step = step_id
            polygon, solution, size, draft = self._drawn
            self.sheet = self._record(polygon, solution, size, draft)
            self.drawing.show(self.sheet, self.drawing.pixels_per_mm)
        self.selected_step = step_id
        self._emphasise()

    def mark_point(self, name: str | None):
        """Emphasise every force at joint ``name`` (None: none), in this pose and the ones that follow."""
        self.marked = name
        self._emphasise()

    def _emphasise(self):
        at_joint = set(self.forces_at(self.marked)) if self.marked is not None else set()
        chosen = {self.selected_step} if self.selected_step else set()
        self.drawing.emphasise({Ref("step", step) for step in at_joint | chosen})

    def forces_at(self, name: str) -> list:
        """The ids of the force vectors drawn at joint ``name``."""
        steps = self.polygon.steps if self.polygon is not None else ()
        return [s.id for s in steps if s.is_vector and name in s.points]

    def fit_rect(self, polygon) -> QRectF:
        """The area a view fits for ``polygon`` as drawn: the drawing and its labels (long, "F(crank→rod)ᵗ",
        and fanned out at a busy vertex). The labels keep their size on screen, so the view fits
        again after drawing at the new zoom; their room is held to LABEL_ROOM of the drawing's size
        each side, so a view too small for them cannot zoom out without end."""
        rect = self.rect_for(polygon)
        labels = QRectF()
        for primitive in self.sheet.primitives if self.sheet is not None else ():
            if isinstance(primitive, Text) and primitive.ref is not None and primitive.ref.kind == "step":
                labels = labels.united(scene_rect(text_box(primitive)))
        most = LABEL_ROOM * max(rect.width(), rect.height())
        return rect.united(labels).intersected(rect.adjusted(-most, -most, most, most))


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

    def _message_lines(self) -> tuple:
        """Where the message goes under the legend and its words as drawn: wrapped to the view's
        width (at most MESSAGE_WIDTH); in a view whose legend is folded, one line cut short with
        "…" (the whole message is the legend's tooltip there)."""
        width = max(min(MESSAGE_WIDTH, self.viewport().width() - 20.0), 60.0)
        metrics = QFontMetrics(label_font(11))
        if self.folded():
            words = metrics.elidedText(self.message, Qt.TextElideMode.ElideRight, int(width))
            return QRectF(10.0, self.legend_rows_height() - 6.0, width, metrics.height() + 4.0), words
        lines = metrics.boundingRect(QRect(0, 0, int(width), 10_000), Qt.TextFlag.TextWordWrap, self.message)
        return QRectF(10.0, self.legend_rows_height() - 6.0, width, lines.height() + 4.0), self.message

    def legend_words(self) -> str:
        return super().legend_words() + (f"\n\n{self.message}" if self.message else "")

    def legend_height(self) -> float:
        return super().legend_height() + (self._message_lines()[0].height() if self.message else 0.0)

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
        where, words = self._message_lines()
        painter.drawText(where, Qt.TextFlag.TextWordWrap, words)
        painter.restore()
