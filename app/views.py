"""The three drawing views: zoom with the wheel, pan by dragging empty
space, fit to window; the space view also drags joints and reports hovering."""

from __future__ import annotations

import math

from PySide6.QtCore import QEvent, QPointF, QRect, QRectF, Qt, Signal
from PySide6.QtGui import QColor, QPainter, QPen, QPixmap
from PySide6.QtWidgets import QGraphicsView, QToolTip

from kinematics.drawing import Ref

from .drawing_kit import DASHES, label_font
from .scene_backend import ITEM_HANDLE, ITEM_REF

ZOOM_PER_WHEEL_STEP = 1.15
# Panning needs room beyond the drawing; the scene rect is the drawing grown by this factor.
PAN_ROOM = 4.0
REFIT_BELOW = 0.6  # a fitted drawing is fitted again once it fills less than this of its view
FIT_ROOM = 0.04  # room left round a fitted drawing, as a fraction of its size
GRID_MIN_PIXELS = 6.0
PICK_PIXELS = 4
LEGEND_TOP = 38.0
LEGEND_LINE = 16.0
LEGEND_WIDTH = 330.0  # pixels: room for the longest legend line
# The full legend takes at most this share of a polygon view's height; in a shorter view it folds
# into one row of swatches under the title, its words in the row's tooltip.
LEGEND_SHARE = 0.3
SWATCH, SWATCH_GAP = 24.0, 8.0  # a folded legend's swatch and the gap after it, pixels


class DrawingView(QGraphicsView):
    """A view that keeps its drawing fitted until the user zooms or pans.

    ``rescaled`` says the zoom changed, so screen-sized labels may need to be set apart again.
    """

    rescaled = Signal()

    def __init__(self, scene, parent=None):
        super().__init__(scene, parent)
        scene.setParent(self)  # the view does not own its scene; keep it alive as long as the view
        self.setRenderHints(QPainter.RenderHint.Antialiasing | QPainter.RenderHint.TextAntialiasing)
        self.setDragMode(QGraphicsView.DragMode.ScrollHandDrag)
        self.setTransformationAnchor(QGraphicsView.ViewportAnchor.AnchorUnderMouse)
        self.setHorizontalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self.setVerticalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self.setBackgroundBrush(QColor("#fbfbf8"))
        # The background brush covers every pixel: no fill before it, and nothing behind to paint.
        self.viewport().setAutoFillBackground(False)
        self.viewport().setAttribute(Qt.WidgetAttribute.WA_OpaquePaintEvent)
        self.auto_fit = True
        self.fit_rect = QRectF(-100, -100, 200, 200)
        self.bottom_pixels = 0.0  # room kept under the drawing for what keeps its screen size (a scale bar)

    def room_pixels(self) -> tuple:
        """Screen pixels kept free above and under the drawing when it is fitted."""
        return 0.0, self.bottom_pixels

    def show_rect(self, rect: QRectF):
        """The area to fit, with :meth:`room_pixels` above and under it; refits unless the user has
        zoomed or panned, or the drawing is still in view and fills at least REFIT_BELOW of it (a
        drawing that rescaled on every frame of a drag would be hard to follow, and each refit
        repaints the whole view once more)."""
        top, bottom = self.room_pixels()
        height = self.viewport().height()
        free = max(height - top - bottom, 0.3 * height)
        rect = rect.adjusted(0, -rect.height() * top / free, 0, rect.height() * bottom / free)
        self.fit_rect = QRectF(rect)
        visible = self.mapToScene(self.viewport().rect()).boundingRect()
        if self.auto_fit and visible.contains(rect) and max(rect.width() / max(visible.width(), 1e-12),
                                                              rect.height() / max(visible.height(), 1e-12)) \
                >= REFIT_BELOW:
            return
        if not self.sceneRect().contains(rect) or self.auto_fit:
            self.setSceneRect(rect.adjusted(-PAN_ROOM * rect.width(), -PAN_ROOM * rect.height(),
                                            PAN_ROOM * rect.width(), PAN_ROOM * rect.height()))
        if self.auto_fit:
            self._fit()

    def _fit(self):
        # A little room all round, so a drawing that grows a little during a drag is not refitted at once.
        room = FIT_ROOM * max(self.fit_rect.width(), self.fit_rect.height())
        self.fitInView(self.fit_rect.adjusted(-room, -room, room, room), Qt.AspectRatioMode.KeepAspectRatio)

    def fit_to_window(self):
        self.auto_fit = True
        self._fit()
        self.rescaled.emit()

    def zoom(self, factor: float):
        self.auto_fit = False
        self.scale(factor, factor)
        self.rescaled.emit()

    def wheelEvent(self, event):
        steps = event.angleDelta().y() / 120.0
        if steps:
            self.zoom(ZOOM_PER_WHEEL_STEP ** steps)
        event.accept()

    def mouseMoveEvent(self, event):
        if event.buttons() & Qt.MouseButton.LeftButton:
            self.auto_fit = False  # the user pans: stop refitting under them
        super().mouseMoveEvent(event)

    def resizeEvent(self, event):
        super().resizeEvent(event)
        if self.auto_fit:
            self._fit()
            self.rescaled.emit()


class PolygonView(DrawingView):
    """A polygon view with its legend in the top left corner (screen pixels), folded into a row
    of swatches when the view is short; a click on a step's drawing emits ``step_clicked(step id)``,
    a press elsewhere pans."""

    step_clicked = Signal(str)

    def __init__(self, scene, title: str, parent=None):
        super().__init__(scene, parent)
        self.title = title
        self._legend_key = self._legend_pixmap = None
        # The legend is drawn in view pixels over the scene: any change repaints the whole view.
        self.setViewportUpdateMode(QGraphicsView.ViewportUpdateMode.FullViewportUpdate)

    def step_at(self, pos) -> str | None:
        """The step drawn within a few pixels of ``pos`` (lines are thin: aim need not be exact)."""
        near = QRect(pos.x() - PICK_PIXELS, pos.y() - PICK_PIXELS, 2 * PICK_PIXELS, 2 * PICK_PIXELS)
        for item in self.items(near):
            ref = item.data(ITEM_REF)
            if isinstance(ref, Ref) and ref.kind == "step":
                return ref.name
        return None

    def mousePressEvent(self, event):
        step = self.step_at(event.position().toPoint()) if event.button() == Qt.MouseButton.LeftButton else None
        if step is None:
            super().mousePressEvent(event)
            return
        self.step_clicked.emit(step)
        event.accept()

    def folded(self) -> bool:
        """True when the legend is folded into one row of swatches (the view is too short for it)."""
        return LEGEND_TOP + LEGEND_LINE * len(self.scene().used_pens()) > LEGEND_SHARE * self.viewport().height()

    def legend_rows_height(self) -> float:
        """Pixels the title and legend take at the top of the view."""
        if self.folded():
            return LEGEND_TOP + 0.5 * LEGEND_LINE
        return LEGEND_TOP + LEGEND_LINE * len(self.scene().used_pens())

    def legend_height(self) -> float:
        """Pixels kept free at the top of the view: the title and legend (and what a view adds under them)."""
        return self.legend_rows_height()

    def legend_words(self) -> str:
        """The folded legend's tooltip: each pen's words, one a line."""
        return "\n".join(pen.legend for pen in self.scene().used_pens())

    def viewportEvent(self, event):
        if event.type() == QEvent.Type.ToolTip:
            pos = event.position().toPoint() if hasattr(event, "position") else event.pos()
            if self.folded() and pos.y() < self.legend_rows_height() and pos.x() < LEGEND_WIDTH:
                QToolTip.showText(event.globalPos(), self.legend_words(), self.viewport())
                return True
            QToolTip.hideText()
        return super().viewportEvent(event)

    def room_pixels(self) -> tuple:
        # Room above the drawing for the legend, so it never covers a vector.
        return self.legend_height(), self.bottom_pixels

    def drawForeground(self, painter: QPainter, rect):
        painter.save()
        painter.resetTransform()
        painter.drawPixmap(0, 0, self._legend())
        painter.restore()

    def _legend(self) -> QPixmap:
        """The title and legend, drawn once for each set of pens in use (text is slow to lay out)."""
        pens = tuple(self.scene().used_pens())
        ratio, folded = self.devicePixelRatioF(), self.folded()
        if self._legend_key != (pens, ratio, folded):
            pixmap = QPixmap(int(LEGEND_WIDTH * ratio), int(self.legend_rows_height() * ratio))
            pixmap.setDevicePixelRatio(ratio)
            pixmap.fill(Qt.GlobalColor.transparent)
            painter = QPainter(pixmap)
            painter.setRenderHint(QPainter.RenderHint.TextAntialiasing)  # crisp swatches: no antialiasing for them
            painter.setFont(label_font(13, bold=True))
            painter.setPen(QColor("#1d2b3a"))
            painter.drawText(QPointF(10, 20), self.title)
            painter.setFont(label_font(11))
            y = LEGEND_TOP
            for i, pen in enumerate(pens):
                line = QPen(QColor(pen.colour), max(2.0, pen.weight_mm * 5.0))
                line.setStyle(DASHES[pen.dash])
                painter.setPen(line)
                if folded:  # side by side in one row; the words are the row's tooltip
                    x = 10 + i * (SWATCH + SWATCH_GAP)
                    painter.drawLine(QPointF(x, y - 4), QPointF(x + SWATCH, y - 4))
                    continue
                painter.drawLine(QPointF(10, y - 4), QPointF(34, y - 4))
                painter.setPen(QColor("#1d2b3a"))
                painter.drawText(QPointF(40, y), pen.legend)
                y += LEGEND_LINE
            painter.end()
            self._legend_key, self._legend_pixmap = (pens, ratio, folded), pixmap
        return self._legend_pixmap


class SpaceView(DrawingView):
    """The space diagram's view: press on a joint or a link's centre of mass to drag it, elsewhere
    to pan.

    Signals carry machine millimetres (x right, y up).
    """

    drag_started = Signal(str, tuple)
    centre_drag_started = Signal(str, tuple)  # a link's centre of mass picked up: the link's name
    dragged = Signal(tuple)
    drag_finished = Signal()
    hovered = Signal(object)
    centre_hovered = Signal(str)  # the instantaneous centre under the pointer ("" for none)
    picked = Signal(object, tuple)  # a building tool's click: joint name or None, and where
    finished = Signal()  # Enter: close the chain being built
    cancelled = Signal()  # Esc: drop it

    def __init__(self, scene, parent=None):
        super().__init__(scene, parent)
        # One rectangle round all that moved: a region of many small ones is slower to paint through.
        self.setViewportUpdateMode(QGraphicsView.ViewportUpdateMode.BoundingRectViewportUpdate)
        self.setMouseTracking(True)
        self.dragging = None
        self._hover = None
        self._hand = None  # the pointing hand is shown (None: no cursor set yet)
        self._centre = ""  # the instantaneous centre under the pointer
        self._pointer = None  # where the pointer is in the viewport, None when it is not over it
        self.building = False  # a building tool is active: clicks pick instead of drag
        self.grid_mm = 0.0  # grid spacing drawn behind the diagram (0: none)

    def drawBackground(self, painter: QPainter, rect):
        super().drawBackground(painter, rect)
        step = self.grid_mm
        if not step or step * self.transform().m11() < GRID_MIN_PIXELS:  # too dense to read at this zoom
            return
        pen = QPen(QColor("#e3e6ea"))
        pen.setCosmetic(True)
        painter.save()
        painter.setRenderHint(QPainter.RenderHint.Antialiasing, False)  # crisp one-pixel grid lines
        painter.setPen(pen)
        x = math.floor(rect.left() / step) * step
        while x <= rect.right():
            painter.drawLine(QPointF(x, rect.top()), QPointF(x, rect.bottom()))
            x += step
        y = math.floor(rect.top() / step) * step
        while y <= rect.bottom():
            painter.drawLine(QPointF(rect.left(), y), QPointF(rect.right(), y))
            y += step
        painter.restore()

    def keyPressEvent(self, event):
        if self.building and event.key() in (Qt.Key.Key_Return, Qt.Key.Key_Enter):
            self.finished.emit()
        elif self.building and event.key() == Qt.Key.Key_Escape:
            self.cancelled.emit()
        else:
            super().keyPressEvent(event)

    def handle_at(self, pos):
        """The Ref of what the mouse picks up at ``pos`` (view pixels): a joint's pin before a
        centre of mass drawn over it; None where there is neither."""
        found = [item.data(ITEM_REF) for item in self.items(pos) if item.data(ITEM_HANDLE)]
        return next((ref for ref in found if ref.kind == "point"), found[0] if found else None)

    def joint_at(self, pos) -> str | None:
        """The joint whose pin is under ``pos`` (view pixels), if any."""
        ref = self.handle_at(pos)
        return ref.name if ref is not None and ref.kind == "point" else None

    def _machine_mm(self, pos) -> tuple:
        at = self.mapToScene(pos)
        return (at.x(), -at.y())

    def mousePressEvent(self, event):
        if self.building and event.button() == Qt.MouseButton.LeftButton:
            pos = event.position().toPoint()
            self.setFocus()
            self.picked.emit(self.joint_at(pos), self._machine_mm(pos))
            event.accept()
            return
        ref = self.handle_at(event.position().toPoint()) if event.button() == Qt.MouseButton.LeftButton else None
        if ref is None:
            super().mousePressEvent(event)
            return
        self.dragging = ref.name
        at = self._machine_mm(event.position().toPoint())
        if ref.kind == "point":
            self._hover_on(ref.name)  # the joint held is the one lit while it is dragged
            self.drag_started.emit(ref.name, at)
        else:
            self.centre_drag_started.emit(ref.name, at)
        event.accept()

    def mouseMoveEvent(self, event):
        pos = event.position().toPoint()
        self._pointer = pos
        if self.dragging is not None:
            self.dragged.emit(self._machine_mm(pos))
            event.accept()
            return
        if event.buttons():
            self._hover_on(None)
            self._hover_centre("")
        else:
            self._hover_under(pos)
        super().mouseMoveEvent(event)

    def _hover_under(self, pos):
        """Light what is under ``pos`` (view pixels; None: the pointer is off the view): the joint,
        else the hand over a centre of mass, else the instantaneous centre's Kennedy lines."""
        ref = self.handle_at(pos) if pos is not None else None
        joint = ref.name if ref is not None and ref.kind == "point" else None
        self._hover_on(joint, ref is not None)
        self._hover_centre("" if pos is None or joint else self.centre_at(pos))

    def centre_at(self, pos) -> str:
        """The instantaneous centre whose mark is under ``pos`` (view pixels), "" where none is."""
        for item in self.items(pos):
            ref = item.data(ITEM_REF)
            if isinstance(ref, Ref) and ref.kind == "centre":
                return ref.name
        return ""

    def _hover_centre(self, name: str):
        if name != self._centre:
            self._centre = name
            self.centre_hovered.emit(name)

    def leaveEvent(self, event):
        self._pointer = None
        self._hover_centre("")
        if self.dragging is None:
            self._hover_on(None)
        super().leaveEvent(event)

    def _hover_on(self, name, handle: bool = False):
        """``name``: the joint under the pointer (None: none); ``handle``: something the mouse can
        pick up is under it (a joint, or a centre of mass, which is not lit)."""
        hand = bool(name or handle)
        if hand != self._hand:
            self._hand = hand
            self.viewport().setCursor(Qt.CursorShape.PointingHandCursor if hand else Qt.CursorShape.OpenHandCursor)
        if name != self._hover:
            self._hover = name
            self.hovered.emit(name)

    def hover_again(self):
        """The drawing changed under a still pointer (a drag let go, an undo, a driver turned): the
        joint lit is the one under the pointer now, none when the pointer is on none. While a
        joint is dragged it stays the one lit."""
        if self.dragging is None:
            self._hover_under(self._pointer)

    def mouseReleaseEvent(self, event):
        if self.dragging is not None and event.button() == Qt.MouseButton.LeftButton:
            self.dragged.emit(self._machine_mm(event.position().toPoint()))
            self.dragging = None
            self.drag_finished.emit()
            self.hover_again()  # a pin that could not follow the pointer (a crank's) is left behind
            event.accept()
            return
        super().mouseReleaseEvent(event)
