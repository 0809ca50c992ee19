"""The hover marks follow the drawing: a joint's lit pin and the rings on its images move with every
frame of a drag or a driver turn, and go when the pointer is no longer on the joint (after a drag
that left the pin behind, after Ctrl+Z with the pointer elsewhere), through real mouse and key events."""

import pytest
from PySide6.QtCore import QPoint, Qt
from PySide6.QtGui import QKeySequence
from PySide6.QtTest import QTest

from app.scene_backend import HOVER_COLOUR
from kinematics.drawing import Circle, Ref
from tests.designs import CLAW_FEED

# The ring is placed in scene millimetres from the same doubles the polygon is drawn from; a
# millionth of a millimetre leaves room for the rounding of the sheet's placing only.
PLACE_MM = 1e-6


def pin_item(scene, name):
    """The scene item of joint ``name``'s pin."""
    backend = scene.linkage
    entries = backend.by_ref[Ref("point", name)]
    return next(e.items[0] for e in entries if isinstance(e.primitive, Circle))


def lit(scene, name) -> bool:
    return pin_item(scene, name).brush().color().name() == HOVER_COLOUR


def assert_rings_on(window, name):
    """Both polygons ring the images of joint ``name`` where the current construction puts them."""
    construction = window.document.construction
    for scene, polygon in ((window.drawings.velocity_scene, construction.velocity),
                           (window.drawings.acceleration_scene, construction.acceleration)):
        assert scene.ring_visible(), f"{scene.kind}: no ring on {name}'s image"
        x, y = polygon.images[name]
        ring = scene._ring.pos()
        # Scene units are drawing mm, y down: an image at c sits at c / scale_per_mm.
        assert ring.x() == pytest.approx(x / polygon.scale_per_mm, abs=PLACE_MM), scene.kind
        assert ring.y() == pytest.approx(-y / polygon.scale_per_mm, abs=PLACE_MM), scene.kind


def assert_no_marks(window, name):
    drawings = window.drawings
    assert not drawings.velocity_scene.ring_visible()
    assert not drawings.acceleration_scene.ring_visible()
    assert not lit(drawings.space_scene, name)


def hover(window, name) -> QPoint:
    view = window.drawings.space_view
    at = view.mapFromScene(window.drawings.space_scene.joint_pos(name))
    QTest.mouseMove(view.viewport(), at + QPoint(30, 30))
    QTest.mouseMove(view.viewport(), at)
    assert_rings_on(window, name)
    return at


def test_the_rings_follow_the_images_through_a_drag_and_after_it(make_window):
    window = make_window(CLAW_FEED)
    view = window.drawings.space_view
    at = hover(window, "B")
    QTest.mousePress(view.viewport(), Qt.LeftButton, Qt.NoModifier, at)
    for step in range(1, 6):
        QTest.mouseMove(view.viewport(), at + QPoint(4 * step, -3 * step))
        assert_rings_on(window, "B")  # every frame, not only when hovered again
    QTest.mouseRelease(view.viewport(), Qt.LeftButton, Qt.NoModifier, at + QPoint(20, -15))
    assert view.joint_at(at + QPoint(20, -15)) == "B"  # the pointer is on the pin it let go
    assert_rings_on(window, "B")
    assert lit(window.drawings.space_scene, "B")


def test_turning_the_driver_by_its_pin_moves_the_rings_and_a_pointer_left_off_the_pin_drops_them(make_window):
    window = make_window(CLAW_FEED)
    view = window.drawings.space_view
    at = hover(window, "A")
    QTest.mousePress(view.viewport(), Qt.LeftButton, Qt.NoModifier, at)
    # Outwards and round: the pin stays on its circle about O2 while the pointer goes beyond it.
    path = [at + QPoint(-10 * k, -18 * k) for k in range(1, 5)]
    for pos in path:
        QTest.mouseMove(view.viewport(), pos)
        assert_rings_on(window, "A")
    QTest.mouseRelease(view.viewport(), Qt.LeftButton, Qt.NoModifier, path[-1])
    assert view.joint_at(path[-1]) is None, "the test wants the pointer off the pin when it lets go"
    assert_no_marks(window, "A")


def test_undo_with_the_pointer_elsewhere_drops_the_marks(make_window, qtbot):
    window = make_window(CLAW_FEED)
    window.activateWindow()
    qtbot.waitActive(window)  # shortcuts answer in the active window only
    view = window.drawings.space_view
    at = hover(window, "B")
    QTest.mousePress(view.viewport(), Qt.LeftButton, Qt.NoModifier, at)
    end = at + QPoint(40, -30)
    QTest.mouseMove(view.viewport(), end)
    QTest.mouseRelease(view.viewport(), Qt.LeftButton, Qt.NoModifier, end)
    assert_rings_on(window, "B")
    QTest.keyClick(window, Qt.Key_Z, Qt.ControlModifier)  # Ctrl+Z
    assert window.document.undo_stack.index() == 0
    assert view.joint_at(end) is None  # B went back; the pointer stayed
    assert_no_marks(window, "B")
    # Back under the pointer (redo): marked again, at the images of the pose redone.
    QTest.keySequence(window, QKeySequence(QKeySequence.StandardKey.Redo))
    assert window.document.undo_stack.index() == 1
    assert_rings_on(window, "B")
    assert lit(window.drawings.space_scene, "B")
