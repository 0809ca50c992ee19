"""A link's centre of mass on the space diagram: drawn where the force analysis puts it in every
pose, picked up and dragged with the real mouse as one undoable edit, saved with the design."""

import json
from pathlib import Path

import pytest
from PySide6.QtCore import QPointF, Qt
from PySide6.QtTest import QTest

import kinematics
from kinematics.drawing import Circle, Ref
from kinematics.dynamics import forces
from tests.app.test_drag import drag_from

SAMPLE = Path(__file__).resolve().parents[2] / "samples" / "cap-press-feeder.json"


def design() -> dict:
    return json.loads(SAMPLE.read_text(encoding="utf-8"))


def mark(window, link: str) -> QPointF:
    """Scene position of the centre-of-mass mark of ``link``, as drawn."""
    ring = next(p for p in window.drawings.space_scene.linkage.primitives_of(Ref("mass centre", link))
                if isinstance(p, Circle))
    return QPointF(ring.centre[0], -ring.centre[1])


def drag_mark(window, link: str, offsets_mm):
    return drag_from(window, mark(window, link), offsets_mm)


@pytest.mark.parametrize("angle", [None, 35.0, 200.0])
def test_mark_sits_where_the_force_analysis_puts_the_centre(make_window, angle):
    window = make_window(design())
    doc = window.document
    doc.set_angle(angle)
    window.drawings.refresh()
    # The Newton-Euler analysis carries each centre with its link on its own (kinematics.dynamics).
    found = forces(kinematics.solve(doc.mechanism, angle))
    for link in ("crank", "rod"):
        at = mark(window, link)
        centre_mm = found.inertia[link].centre_m * 1e3
        assert (at.x(), -at.y()) == pytest.approx(tuple(centre_mm), abs=1e-9)


def test_dragging_the_mark_moves_the_centre_and_undo_returns(make_window, tmp_path):
    window = make_window(design())
    doc = window.document
    before = doc.mechanism.mass_data.masses["rod"].centre
    torque_before = forces(doc.solution).drive_torque_n_m
    view = drag_mark(window, "rod", [(2.0, 1.0), (5.0, -2.0), (8.0, -4.0)])
    tolerance = 1.5 / view.transform().m11()  # the mouse moves in whole pixels (design in mm)
    after = doc.mechanism.mass_data.masses["rod"].centre
    assert after[0] == pytest.approx(before[0] + 8.0, abs=tolerance)
    assert after[1] == pytest.approx(before[1] - 4.0, abs=tolerance)
    assert doc.mechanism.mass_data.masses["crank"].centre == tuple(design()["masses"]["crank"]["centre"])
    assert dict(doc.mechanism.points) == {k: tuple(v) for k, v in design()["points"].items()}, "no joint moved"
    assert doc.undo_stack.count() == 1, "one drag is one undo step"
    assert (mark(window, "rod").x(), -mark(window, "rod").y()) == pytest.approx(after, abs=1e-9)
    assert forces(doc.solution).drive_torque_n_m != torque_before, "the forces follow the centre"
    path = tmp_path / "moved.json"
    assert window.save_to(path)
    saved = json.loads(path.read_text(encoding="utf-8"))
    assert saved["masses"]["rod"]["centre"] == pytest.approx(list(after), abs=1e-12)
    doc.undo_stack.undo()
    assert doc.mechanism.mass_data.masses["rod"].centre == before


def test_dragging_the_mark_in_a_turned_pose_edits_the_reference_pose(make_window):
    window = make_window(design())
    doc = window.document
    doc.set_angle(120.0)
    window.drawings.refresh()
    drag_mark(window, "crank", [(0.0, 3.0)])
    assert doc.angle_deg is None, "the driver is turned back to the pose the centre is stated in"
    assert doc.mechanism.mass_data.masses["crank"].centre != tuple(design()["masses"]["crank"]["centre"])
    assert doc.undo_stack.count() == 1
    assert window.note == "editing the reference pose (the driver was turned back to it)"


def test_a_pin_under_a_mark_is_still_picked_as_the_joint(make_window):
    data = design()
    data["masses"]["crank"]["centre"] = list(data["points"]["A"])  # the crank's centre on its crank pin
    window = make_window(data)
    view = window.drawings.space_view
    pin = window.drawings.space_scene.joint_pos("A")
    assert view.joint_at(view.mapFromScene(pin)) == "A"
    assert view.handle_at(view.mapFromScene(mark(window, "rod"))) == Ref("mass centre", "rod")


def test_the_pointer_left_on_a_dragged_mark_keeps_the_hand(make_window):
    window = make_window(design())
    view = drag_mark(window, "rod", [(3.0, 0.0)])
    # Let go on the mark, which followed the pointer: it is still something to pick up.
    QTest.mouseMove(view.viewport(), view.mapFromScene(mark(window, "rod")))
    view.hover_again()  # as after a drag, an undo or a driver turn under a still pointer
    assert view.handle_at(view._pointer) == Ref("mass centre", "rod")
    assert view.viewport().cursor().shape() == Qt.CursorShape.PointingHandCursor
