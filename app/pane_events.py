"""What the window does with events on its three drawing panes, watched from outside the views
(an event filter), so the views themselves stay as they are: a dropped file opens, the middle
button pans, and on the space diagram a left click selects, a right click opens the joint's,
link's or empty space's menu, and the arrow keys nudge the selected joint."""

from __future__ import annotations

from PySide6.QtCore import QEvent, QObject, QPoint, Qt

from kinematics.drawing import Ref

from .scene_backend import ITEM_REF

WATCHED = frozenset((QEvent.Type.DragEnter, QEvent.Type.DragMove, QEvent.Type.Drop, QEvent.Type.KeyPress,
                     QEvent.Type.MouseButtonPress, QEvent.Type.MouseMove, QEvent.Type.MouseButtonRelease,
                     QEvent.Type.ContextMenu))
ARROWS = {Qt.Key.Key_Left: (-1, 0), Qt.Key.Key_Right: (1, 0), Qt.Key.Key_Up: (0, 1), Qt.Key.Key_Down: (0, -1)}


def item_under(view, pos: QPoint) -> tuple[str | None, str | None]:
    """(kind, name) of the joint or link drawn at view pixel ``pos`` (joints first), or (None, None)."""
    joint = view.joint_at(pos)
    if joint is not None:
        return "point", joint
    for item in view.items(pos):
        ref = item.data(ITEM_REF)
        if isinstance(ref, Ref) and ref.kind == "link":
            return "link", ref.name
    return None, None


def local_files(mime) -> list[str]:
    return [u.toLocalFile() for u in mime.urls() if u.isLocalFile()] if mime.hasUrls() else []


class PaneEvents(QObject):
    """Installed on the window's drawings; ``window`` has ``open_path``, ``design_actions``
    and ``builder``."""

    def __init__(self, window):
        super().__init__(window)
        self.window = window
        drawings = window.drawings
        self.space = drawings.space_view
        self.views = (drawings.space_view, drawings.velocity_view, drawings.acceleration_view)
        self._panning = None  # (view, last pixel) while the middle button is held
        self.menu = None  # the last right-click menu
        # Each viewport with its view, kept so that an event during the window's teardown is matched
        # without asking a view that may already be gone for its viewport.
        self._viewports = tuple((view.viewport(), view) for view in self.views)
        for viewport, _view in self._viewports:
            viewport.installEventFilter(self)
        self.space.installEventFilter(self)  # key presses go to the view, not its viewport

    def eventFilter(self, watched, event):
        kind = event.type()
        if kind not in WATCHED:  # paint and the rest: back to Qt at once (this runs on every frame)
            return False
        if kind in (QEvent.Type.DragEnter, QEvent.Type.DragMove):
            if local_files(event.mimeData()):
                event.acceptProposedAction()
                return True
            return False
        if kind == QEvent.Type.Drop:
            files = local_files(event.mimeData())
            if files:
                event.acceptProposedAction()
                self.window.open_path(files[0], ask=True)
                return True
            return False
        if watched is self.space and kind == QEvent.Type.KeyPress:
            return self._key(event)
        view = next((v for viewport, v in self._viewports if viewport is watched), None)
        if view is None:
            return False
        if kind in (QEvent.Type.MouseButtonPress, QEvent.Type.MouseMove, QEvent.Type.MouseButtonRelease):
            return self._mouse(view, event)
        if kind == QEvent.Type.ContextMenu and view is self.space:
            self._context_menu(event)
            return True
        return False

    def _mouse(self, view, event) -> bool:
        kind = event.type()
        pos = event.position().toPoint()
        if kind == QEvent.Type.MouseButtonPress and event.button() == Qt.MouseButton.MiddleButton:
            self._panning = (view, pos)
            view.auto_fit = False  # the user pans: stop refitting under them
            view.viewport().setCursor(Qt.CursorShape.ClosedHandCursor)
            return True
        if self._panning is not None and self._panning[0] is view:
            if kind == QEvent.Type.MouseMove:
                last = self._panning[1]
                view.horizontalScrollBar().setValue(view.horizontalScrollBar().value() - (pos.x() - last.x()))
                view.verticalScrollBar().setValue(view.verticalScrollBar().value() - (pos.y() - last.y()))
                self._panning = (view, pos)
                return True
            if kind == QEvent.Type.MouseButtonRelease and event.button() == Qt.MouseButton.MiddleButton:
                self._panning = None
                view.viewport().unsetCursor()
                return True
        if (kind == QEvent.Type.MouseButtonPress and view is self.space and event.button() == Qt.MouseButton.LeftButton
                and not view.building):
            self.window.design_actions.select(*item_under(view, pos))  # and on to the view: a joint's drag starts
        return False

    def _key(self, event) -> bool:
        step = ARROWS.get(event.key())
        if step is None:
            return False
        fine = bool(event.modifiers() & Qt.KeyboardModifier.ShiftModifier)
        return self.window.design_actions.nudge(*step, fine=fine)  # nothing selected: the view pans as before

    def _context_menu(self, event):
        pos = event.pos()
        at = self.space.mapToScene(pos)
        self.menu = self.window.design_actions.context_menu(*item_under(self.space, pos), (at.x(), -at.y()))
        self.menu.popup(event.globalPos())
