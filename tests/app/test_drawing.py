"""The window draws only what the core computed: table cells, polygon items and joints are
compared with the Solution and the Construction; items are moved in place between poses."""

import math
from pathlib import Path

import pytest
from PySide6.QtCore import QRectF, Qt
from PySide6.QtWidgets import QGraphicsLineItem, QGraphicsSimpleTextItem
from shapely.geometry import Point

import kinematics
from app.scene_backend import ITEM_REF
from kinematics import Component
from kinematics.drawing import Ref
from kinematics.drawing.scaling import plain
from tests.app.drawn import joints, on_screen, outline, texts
from tests.designs import CARTON_PUSHER, CLAW_FEED, SAMPLES, SWING_LEVER, UNFINISHED


def cell(window, row_name, column):
    model = window.table.results
    row = next(r for r in range(model.rowCount()) if model.item(r, 0).text() == row_name)
    return model.item(row, column).data(Qt.UserRole), model.item(row, column).text()


@pytest.mark.parametrize("length_unit, metres", [("mm", 1e-3), ("m", 1.0), ("in", 0.0254)])
def test_point_rows_show_the_solution_in_the_chosen_unit(make_window, length_unit, metres):
    window = make_window(CLAW_FEED)
    window.turn_driver(140.0)
    window.length_units.setCurrentText(length_unit)
    solution = window.document.solution
    vx, vy = solution.velocity("B")
    ax, ay = solution.acceleration("B")
    # 1 in = 0.0254 m exactly (international yard and pound agreement, 1959).
    speed, text = cell(window, "point B", 1)
    assert speed == pytest.approx(math.hypot(vx, vy) / metres, rel=1e-12)
    assert text == f"{speed:.5g}"
    assert cell(window, "point B", 3)[0] == pytest.approx(math.hypot(ax, ay) / metres, rel=1e-12)
    assert cell(window, "point B", 2)[0] == pytest.approx(math.degrees(math.atan2(vy, vx)) % 360.0)
    assert cell(window, "point B", 4)[0] == pytest.approx(math.degrees(math.atan2(ay, ax)) % 360.0)
    header = window.table.results.horizontalHeaderItem(1).text()
    assert f"({length_unit}/s)" in header


def test_link_rows_show_omega_in_rpm_or_rad_s_with_the_sense_in_words(make_window):
    window = make_window(CLAW_FEED)
    solution = window.document.solution
    omega = solution.angular_velocity["rocker"]
    assert cell(window, "link rocker", 1)[0] == pytest.approx(abs(omega))
    assert cell(window, "link rocker", 2)[1] == ("CCW" if omega > 0 else "CW")
    window.speed_units.setCurrentText("rpm")
    # 1 rpm = 2π rad per 60 s (SI Brochure, 9th ed., revolution = 2π rad).
    assert cell(window, "link crank", 1)[0] == pytest.approx(120.0, rel=1e-12)
    assert cell(window, "link rocker", 1)[0] == pytest.approx(abs(omega) * 60.0 / (2 * math.pi))
    alpha = solution.angular_acceleration["coupler"]
    assert cell(window, "link coupler", 3)[0] == pytest.approx(abs(alpha))
    assert cell(window, "link coupler", 4)[1] == ("CCW" if alpha > 0 else "CW")


def test_slide_rows_show_the_sliding_rates(make_window):
    window = make_window(CARTON_PUSHER)
    solution = window.document.solution
    row = "slide guide (D on ground)"
    assert cell(window, row, 1)[0] == pytest.approx(solution.sliding_velocity["guide"] * 1e3)
    assert cell(window, row, 3)[0] == pytest.approx(solution.sliding_acceleration["guide"] * 1e3)
    assert cell(window, row, 2)[1] == "+ = E→F"


@pytest.mark.parametrize("length_unit, metres", [("mm", 1e-3), ("m", 1.0), ("in", 0.0254)])
def test_component_rows_show_the_polygons_radial_tangential_and_coriolis_vectors(make_window, length_unit, metres):
    window = make_window(SWING_LEVER)
    window.turn_driver(65.0)
    window.length_units.setCurrentText(length_unit)
    components = kinematics.acceleration_components(window.document.construction)
    kinds = {c.component for c in components}
    assert {Component.RADIAL, Component.TANGENTIAL, Component.CORIOLIS} <= kinds
    for c in components:
        name = c.title
        # 1 in = 0.0254 m exactly (international yard and pound agreement, 1959).
        assert cell(window, name, 3)[0] == pytest.approx(c.magnitude / metres, rel=1e-12)
        if c.magnitude > 1e-9:
            assert cell(window, name, 4)[0] == pytest.approx(math.degrees(math.atan2(c.vector[1], c.vector[0])) % 360.0)
    coriolis = next(c for c in components if c.component is Component.CORIOLIS)
    assert coriolis.title == f"Coriolis {coriolis.what}"
    assert cell(window, coriolis.title, 3)[1] == f"{coriolis.magnitude / metres:.5g}"


@pytest.mark.parametrize("design", [CLAW_FEED, CARTON_PUSHER, SWING_LEVER], ids=["four-bar", "slider", "slot"])
def test_polygon_items_sit_at_the_construction_images_over_the_scale(make_window, design):
    window = make_window(design)
    window.turn_driver(75.0)
    construction = window.document.construction
    for polygon, scene in ((construction.velocity, window.drawings.velocity_scene),
                           (construction.acceleration, window.drawings.acceleration_scene)):
        scale = polygon.scale_per_mm
        checked = 0
        for step in polygon.steps:
            end = scene.end_of(step.id)
            x, y = step.geometry.coords[-1]
            assert (end.x(), end.y()) == pytest.approx((x / scale, -y / scale), abs=1e-9)
            names = [p for p in step.points if step.label == polygon.image_label(p)]
            if isinstance(step.geometry, Point) and names:
                image = polygon.images[names[0]]
                assert (end.x(), end.y()) == pytest.approx((image[0] / scale, -image[1] / scale), abs=1e-9)
                checked += 1
        assert checked >= 1
        bar = " ".join(item.text() for item in texts(scene, Ref("scale bar", scene.kind)))
        # Stated in the window's length unit (mm by default): 1 m = 1000 mm.  # common practice
        assert f"1 mm = {plain(scale * 1000.0)} mm/s" in bar


def test_joints_sit_at_the_solved_positions(make_window):
    window = make_window(CLAW_FEED)
    window.turn_driver(250.0)
    solution = window.document.solution
    scene = window.drawings.space_scene
    assert joints(scene) == set(solution.point_names)
    for name in solution.point_names:
        x, y = solution.position(name)
        at = scene.joint_pos(name)
        assert (at.x(), at.y()) == pytest.approx((1e3 * x, -1e3 * y), abs=1e-9)


def test_items_are_moved_in_place_while_the_step_structure_holds(make_window):
    window = make_window(CLAW_FEED)
    for scene in (window.drawings.velocity_scene, window.drawings.space_scene):
        window.turn_driver(99.0)
        before = {id(item): item.data(ITEM_REF) for item in scene.items()}
        lines = [item for item in scene.items() if isinstance(item, QGraphicsLineItem)]
        moved = [line.line() for line in lines]
        window.turn_driver(100.0)
        window.turn_driver(101.0)
        assert {id(item): item.data(ITEM_REF) for item in scene.items()} == before
        assert all(line.scene() is scene for line in lines)
        assert [line.line() for line in lines] != moved


def test_the_legend_is_painted_in_each_pen_used(make_window):
    window = make_window(CLAW_FEED)
    view = window.drawings.velocity_view
    image = view.viewport().grab().toImage()
    pens = view.scene().used_pens()
    assert pens
    from app.views import LEGEND_LINE, LEGEND_TOP

    for i, pen in enumerate(pens):
        if pen.dash != "solid":
            continue
        colour = image.pixelColor(22, int(LEGEND_TOP + i * LEGEND_LINE - 4)).name()
        assert colour == pen.colour, f"legend line {i} ({pen.legend})"


def test_an_unfinished_design_draws_its_space_diagram_and_says_what_is_missing(make_window):
    window = make_window(UNFINISHED)
    assert joints(window.drawings.space_scene) == set(CLAW_FEED["points"])
    assert not window.drawings.velocity_scene.items() or window.drawings.velocity_scene.sheet is None
    assert "no driver" in window.status.text()
    assert window.table.results.rowCount() == 0


def test_coupler_paths_follow_the_cycle_sweep(make_window):
    window = make_window(CLAW_FEED)
    sweep = window.document.sweep
    (path,) = (outline(item) for item in window.drawings.space_scene.paths.items_of(Ref("path", "P")))
    track = sweep.positions[:, sweep.point_names.index("P")] * 1e3
    assert len(path) >= len(track)
    for i in (0, len(track) // 3, len(track) - 1):
        assert path[i] == pytest.approx((track[i][0], -track[i][1]), abs=1e-9)


def test_no_two_visible_polygon_labels_overlap(make_window):
    for design in (CLAW_FEED, CARTON_PUSHER, SWING_LEVER):
        window = make_window(design)
        for angle in (20.0, 90.0, 200.0):
            window.turn_driver(angle)
            for scene, view in ((window.drawings.velocity_scene, window.drawings.velocity_view),
                                (window.drawings.acceleration_scene, window.drawings.acceleration_view)):
                # Each label keeps its pixel size: its box in the viewport's pixels.
                boxes = [on_screen(view, item) for item in scene.items() if isinstance(item, QGraphicsSimpleTextItem)
                         and item.data(ITEM_REF).kind == "step"]
                # Eight directions may all be taken in a crowded spot; most labels must stand free.
                crowded = sum(1 for i, a in enumerate(boxes) if any(a.intersects(b) for b in boxes[:i]))
                assert crowded <= len(boxes) // 4, (design["title"], angle, scene.kind)


def test_solver_rounding_reads_as_zero_not_as_a_sense(make_window):
    window = make_window(CARTON_PUSHER)  # the crank turns at constant speed: α = 0 exactly in theory
    for angle in (30.0, 250.0, 333.0):
        window.turn_driver(angle)
        raw = window.document.solution.angular_acceleration["crank"]
        assert abs(raw) < 1e-9
        assert cell(window, "link crank", 3) == (0.0, "α 0")
        assert cell(window, "link crank", 4)[1] == "none"
        assert cell(window, "link rod", 3)[0] > 1.0  # real values are untouched


def test_joint_labels_stand_clear_of_each_other_and_of_the_joints(make_window):
    crowded = {**CLAW_FEED, "points": {**CLAW_FEED["points"], "P": [146, 113]}}  # P 7 mm from B
    for design in (crowded, SAMPLES / "tile-trimmer-quick-return.json", SAMPLES / "baler-tamper-watt.json"):
        window = make_window(crowded)
        if isinstance(design, Path):
            assert window.open_path(design)
        view, scene = window.drawings.space_view, window.drawings.space_scene
        boxes, dots = [], []
        for name in joints(scene):
            (label,) = texts(scene, Ref("point", name))
            boxes.append(on_screen(view, label))
            centre = view.mapFromScene(scene.joint_pos(name)).toPointF()
            dots.append(QRectF(centre.x() - 4, centre.y() - 4, 8, 8))
        for i, box in enumerate(boxes):
            assert not any(box.intersects(other) for other in boxes[:i]), (design, i)
            assert not any(box.intersects(dot) for dot in dots), (design, i)
