"""The window's toggle that draws the instantaneous centres over the space diagram."""

import json
import math

from PySide6.QtCore import QPoint, Qt
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication

import kinematics
from kinematics.cycle.centrodes import centrodes
from kinematics.drawing import Circle, Polyline, Ref, Text
from kinematics.drawing.centre_places import centre_places
from kinematics.drawing.panes import centrodes_pane
from kinematics.drawing.symbols import Symbols
from tests.designs import SAMPLE_FILES, four_bar

SHOTS = "/work/notes/shots-centres"
SIX_BAR = next(p for p in SAMPLE_FILES if p.name.startswith("stacker-transfer"))


def centre_items(window):
    return [item for item in window.drawings.space_scene.items()
            if isinstance(item.data(0), Ref) and item.data(0).kind == "centre"]


def test_ctrl_k_shows_the_centres_where_the_core_finds_them_and_hides_them_again(make_window):
    window = make_window(json.loads(SIX_BAR.read_text()))
    assert not centre_items(window)
    QTest.keyClick(window, Qt.Key_K, Qt.ControlModifier)
    QApplication.processEvents()
    assert window.centres_action.isChecked()
    scene = window.drawings.space_scene
    found = kinematics.centres(window.document.solution, window.document.construction)
    shown = {p.ref.name for p in scene.centres_sheet.primitives if isinstance(p, Circle)}
    for place in centre_places(found):
        if place.kind == "on view":  # marks of centres on one point carry the first one's name
            x, y = 1000.0 * place.at_m[0], 1000.0 * place.at_m[1]
            assert any(math.dist((x, y), p.centre) <= 1e-9 for p in scene.centres_sheet.primitives
                       if isinstance(p, Circle)), place.name
    assert shown and centre_items(window)
    labels = " ".join(p.text for p in scene.centres_sheet.primitives if isinstance(p, Text))
    assert "ground|arm" in labels
    # The view takes in the centres on it (ground|arm lies well above the linkage).
    arm = found.centre("ground", "arm").at_m
    assert window.drawings.space_scene.drawing_rect().contains(1000.0 * arm[0], -1000.0 * arm[1])
    window.drawings.space_view.grab().save(f"{SHOTS}/window-centres-six-bar.png")
    QTest.keyClick(window, Qt.Key_K, Qt.ControlModifier)
    QApplication.processEvents()
    assert not window.centres_action.isChecked() and not centre_items(window)


def marks(window) -> dict:
    return {p.ref.name: p.centre for p in window.drawings.space_scene.centres_sheet.primitives
            if isinstance(p, Circle)}


def test_the_centres_follow_the_pose(make_window):
    window = make_window(four_bar(40, 120, 100, 140, 30))
    QTest.keyClick(window, Qt.Key_K, Qt.ControlModifier)
    before = marks(window)
    window.document.set_angle(75.0)
    QApplication.processEvents()
    after = marks(window)
    assert before["crank|coupler"] != after["crank|coupler"]
    # The coupler's centre where the crank and rocker lines meet (common practice), drawn in mm.
    found = kinematics.centres(window.document.solution)
    pole = next(p for p in centre_places(found) if p.name == "ground|coupler")
    assert pole.kind == "on view"
    x, y = pole.at_m
    assert math.dist(after["ground|coupler"], (1000 * x, 1000 * y)) <= 1e-9  # rounding of the mm scale
    window.drawings.space_view.grab().save(f"{SHOTS}/window-centres-four-bar.png")


def test_far_centres_point_from_the_view_edge_outside_the_linkage(make_window):
    # Crank and rocker nearly parallel: the coupler's pole and the crank-rocker centre lie far off
    # (common practice); the window shows arrows at the edge, clear of the linkage's own box.
    window = make_window(four_bar(40, 120, 41, 120, 89))
    QTest.keyClick(window, Qt.Key_K, Qt.ControlModifier)
    QApplication.processEvents()
    sheet = window.drawings.space_scene.centres_sheet
    arrows = [p for p in sheet.primitives if type(p).__name__ == "Arrow"]
    assert len(arrows) == 2
    xs, ys = window.document.solution.positions[:, 0] * 1000, window.document.solution.positions[:, 1] * 1000
    for arrow in arrows:
        x, y = arrow.end
        assert not (xs.min() <= x <= xs.max() and ys.min() <= y <= ys.max())
    words = " ".join(p.text for p in sheet.primitives if isinstance(p, Text))
    assert "ground|coupler off the view at (" in words
    window.drawings.space_view.grab().save(f"{SHOTS}/window-centres-far.png")


def test_hovering_a_centre_shows_the_two_lines_of_kennedys_theorem_that_found_it(make_window):
    from PySide6.QtCore import QPointF
    from PySide6.QtWidgets import QGraphicsLineItem

    window = make_window(json.loads(SIX_BAR.read_text()))
    QTest.keyClick(window, Qt.Key_K, Qt.ControlModifier)
    QApplication.processEvents()
    scene, view = window.drawings.space_scene, window.drawings.space_view
    found = scene.found_centres
    name = "ground|coupler"  # a secondary centre of the six-bar, found by Kennedy's theorem
    assert not found.centres[name].primary and len(found.centres[name].lines) == 2
    ring = next(p for p in scene.centres_sheet.primitives if isinstance(p, Circle) and p.ref == Ref("centre", name))
    at = view.mapFromScene(QPointF(ring.centre[0], -ring.centre[1]))
    QTest.mouseMove(view.viewport(), at)
    QApplication.processEvents()
    lines = [item for item in scene.items()
             if isinstance(item, QGraphicsLineItem) and item.data(0) == Ref("centre", name)]
    assert len(lines) == 2
    # Kennedy's theorem: the three centres of three bodies lie on one line  # common practice
    # Each line drawn passes through the centre found and through its triple's two other centres.
    size = 1000.0 * window.document.mechanism.size * window.document.mechanism.metres_per_unit
    g = complex(*(1000.0 * v for v in found.centres[name].at_m))
    for item in lines:
        line = item.line()
        a, b = complex(line.x1(), -line.y1()), complex(line.x2(), -line.y2())
        u = (b - a) / abs(b - a)
        assert abs(((g - a) * u.conjugate()).imag) <= 1e-9 * size
        step = next(s for s in found.steps if s.id in found.centres[name].lines
                    and abs(((complex(*s.coords[0]) * 1000.0 - a) * u.conjugate()).imag) <= 1e-9 * size)
        for end in step.coords:
            assert abs(((complex(*end) * 1000.0 - a) * u.conjugate()).imag) <= 1e-9 * size
    QTest.mouseMove(view.viewport(), at + QPoint(200, 200))
    QApplication.processEvents()
    assert not [item for item in scene.items() if isinstance(item, QGraphicsLineItem)
                and item.data(0) == Ref("centre", name)], "the lines go when the pointer leaves the centre"


def _distance_to_polyline(z: complex, points) -> float:
    best = math.inf
    for (x0, y0), (x1, y1) in zip(points, points[1:], strict=False):
        a, b = complex(x0, y0), complex(x1, y1)
        t = min(max(((z - a) * (b - a).conjugate()).real / max(abs(b - a) ** 2, 1e-30), 0.0), 1.0)
        best = min(best, abs(z - (a + t * (b - a))))
    return best


def test_the_centrodes_toggle_draws_both_touching_at_the_poses_centre(make_window):
    baler = next(p for p in SAMPLE_FILES if p.name.startswith("baler"))
    window = make_window(json.loads(baler.read_text()))
    QTest.keyClick(window, Qt.Key_K, Qt.ControlModifier | Qt.ShiftModifier)
    QApplication.processEvents()
    assert window.centrodes_action.isChecked() and window.note == ""
    scene, doc = window.drawings.space_scene, window.document
    drawn = [item for item in scene.items() if isinstance(item.data(0), Ref) and item.data(0).kind == "centrode"]
    assert drawn
    found = centrodes(doc.sweep)
    assert scene.centrodes_found[1] is not None and len(found.fixed) == len(scene.centrodes_found[1].fixed)
    # The pose's coupler centre by Kennedy's theorem (kinematics.centres, its own construction) lies
    # on the fixed centrode (the velocity-based path over the cycle) and on the moving one carried
    # into the pose: the moving centrode rolls on the fixed one there (common practice).
    pose = complex(*kinematics.centres(doc.solution).centre("ground", found.link).at_m) * 1000.0
    size = 1000.0 * doc.mechanism.size * doc.mechanism.metres_per_unit
    pane = centrodes_pane(found, doc.solution, Symbols())
    for kind in ("fixed", "moving"):
        lines = [p.points for p in pane.primitives if isinstance(p, Polyline) and p.ref == Ref("centrode", kind)]
        assert min(_distance_to_polyline(pose, pts) for pts in lines) <= 0.01 * size, kind
    QTest.keyClick(window, Qt.Key_K, Qt.ControlModifier | Qt.ShiftModifier)
    QApplication.processEvents()
    assert not [item for item in scene.items() if isinstance(item.data(0), Ref) and item.data(0).kind == "centrode"]


def test_the_centrodes_wait_for_the_sweep_when_the_coupler_is_renamed(make_window):
    baler = next(p for p in SAMPLE_FILES if p.name.startswith("baler"))
    window = make_window(json.loads(baler.read_text()))
    window.centrodes_action.setChecked(True)
    QApplication.processEvents()
    doc, scene = window.document, window.drawings.space_scene
    before = doc.sweep  # a drag holds the sweep back: for a while it is of the design before the edit
    doc.edit(kinematics.rename_link(doc.mechanism, "coupler", "bridge"), "rename", check=False)
    said = scene.show_centrodes(before, doc.solution, 1.0, True)
    assert said == "the centrodes wait for the cycle's sweep to catch up with the edit"
    assert scene.show_centrodes(doc.sweep, doc.solution, 1.0, True) == "", "drawn again once it caught up"
