"""What the space view repaints after a move covers everything that moved: each item draws inside
the box Qt repaints for it (labels, scale bars, bars' bodies), checked after real drags in a
zoomed-out view, and what the screen holds after the drags is what a full repaint draws."""

import numpy as np
import pytest
from PySide6.QtCore import QPoint, QRect, Qt
from PySide6.QtGui import QImage, QPainter
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication, QStyleOptionGraphicsItem

from tests.app.test_random_far_drags import wheel_out
from tests.designs import CLAW_FEED

# Qt's view grows each dirty rectangle by 2 pixels for antialiasing (QGraphicsViewPrivate::updateRectF,
# qgraphicsview.cpp; from memory): ink within that margin of an item's box is repainted with it.
ANTIALIAS_MARGIN_PX = 2


def ink_box(item, view) -> QRect | None:
    """The viewport pixels ``item`` paints, alone, as the view paints it (None: none)."""
    image = QImage(view.viewport().size(), QImage.Format.Format_ARGB32_Premultiplied)
    image.fill(0)
    painter = QPainter(image)
    painter.setRenderHints(view.renderHints())
    painter.setTransform(item.deviceTransform(view.viewportTransform()))
    option = QStyleOptionGraphicsItem()
    option.exposedRect = item.boundingRect()
    item.paint(painter, option, None)
    painter.end()
    alpha = np.frombuffer(image.constBits(), dtype=np.uint32).reshape(image.height(), image.width()) >> 24
    rows, cols = np.nonzero(alpha)
    if not len(rows):
        return None
    return QRect(QPoint(int(cols.min()), int(rows.min())), QPoint(int(cols.max()), int(rows.max())))


def screen(window) -> np.ndarray:
    """What the window's space view shows now: the pixels in the window's backing store, as
    partial repaints left them (not a fresh rendering)."""
    QApplication.processEvents()
    view = window.drawings.space_view
    shot = window.screen().grabWindow(window.winId()).toImage()
    port = view.viewport()
    part = shot.copy(port.rect().translated(port.mapTo(window, QPoint(0, 0)))).convertToFormat(
        QImage.Format.Format_ARGB32)
    return np.frombuffer(part.constBits(), dtype=np.uint32).reshape(part.height(), part.width()).copy()


def drags_zoomed_out(window, notches: int):
    view = window.drawings.space_view
    wheel_out(view, notches)
    port = view.viewport()
    for name, (dx, dy) in (("B", (9, -6)), ("P", (-7, 8)), ("A", (6, 9)), ("B", (-12, 4)), ("P", (10, 10))):
        at = view.mapFromScene(window.drawings.space_scene.joint_pos(name))
        QTest.mousePress(port, Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier, at)
        for k in range(1, 4):
            QTest.mouseMove(port, at + QPoint(k * dx, k * dy))
        QTest.mouseRelease(port, Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier, at + QPoint(3 * dx, 3 * dy))
    QApplication.processEvents()


@pytest.mark.parametrize("notches", [4, 12])
def test_every_item_draws_inside_the_box_repainted_for_it(make_window, notches):
    window = make_window(CLAW_FEED)
    view = window.drawings.space_view
    drags_zoomed_out(window, notches)
    for item in view.scene().items():
        if not item.isVisible():
            continue
        ink = ink_box(item, view)
        if ink is None:
            continue
        box = item.deviceTransform(view.viewportTransform()).mapRect(item.boundingRect()).toAlignedRect()
        repainted = box.adjusted(-ANTIALIAS_MARGIN_PX, -ANTIALIAS_MARGIN_PX, ANTIALIAS_MARGIN_PX,
                                 ANTIALIAS_MARGIN_PX)
        assert repainted.contains(ink), (f"{type(item).__name__} of {item.data(0)} paints {ink} beyond the "
                                         f"{repainted} repainted for it")


def test_the_screen_after_drags_is_what_a_full_repaint_draws(make_window):
    window = make_window(CLAW_FEED)
    drags_zoomed_out(window, 12)
    left = screen(window)
    window.drawings.space_view.viewport().update()
    fresh = screen(window)
    stale = int(np.count_nonzero(left != fresh))
    assert stale == 0, f"{stale} pixels of old drawing left on screen"
