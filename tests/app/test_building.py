"""Building a mechanism from nothing with real clicks, and the pure building edits."""

import copy
import json
import math
from dataclasses import replace
from pathlib import Path

import pytest
from PySide6.QtCore import QPointF, Qt
from PySide6.QtTest import QTest

import kinematics
from app import building
from app.building import BuildError
from kinematics.model.limits import MAX_LINKS_AND_SLIDES, MAX_POINTS
from tests.designs import CARTON_PUSHER, CLAW_FEED, UNFINISHED, load
from tests.kinematics.test_schema_agreement import FORMAT_2


def click_at(window, x_mm, y_mm):
    view = window.drawings.space_view
    QTest.mouseClick(view.viewport(), Qt.LeftButton, Qt.NoModifier, view.mapFromScene(QPointF(x_mm, -y_mm)))


def click_joint(window, name):
    view = window.drawings.space_view
    at = window.drawings.space_scene.joint_pos(name)
    QTest.mouseClick(view.viewport(), Qt.LeftButton, Qt.NoModifier, view.mapFromScene(at))


def test_a_four_bar_built_by_clicks_solves_and_saves(make_window, tmp_path):
    window = make_window(CLAW_FEED)
    window.new_design()
    window.snapping.setChecked(True)  # a 10 mm grid on an empty design: the clicks land on round numbers
    window.use_tool("pivot")
    click_at(window, 0.4, -0.3)
    click_at(window, 169.0, 2.0)
    window.use_tool("joint")
    click_at(window, 31.0, 41.0)
    click_at(window, 139.0, 111.0)
    doc = window.document
    assert dict(doc.mechanism.points) == {"O1": (0.0, 0.0), "O2": (170.0, 0.0), "A": (30.0, 40.0),
                                          "B": (140.0, 110.0)}
    assert doc.mechanism.ground == ("O1", "O2")
    window.use_tool("link")
    click_joint(window, "O1")
    click_joint(window, "A")
    click_joint(window, "A")  # the last one again finishes the link
    click_joint(window, "A")
    click_joint(window, "B")
    QTest.keyClick(window.drawings.space_view, Qt.Key_Return)
    click_joint(window, "O2")
    click_joint(window, "B")
    QTest.keyClick(window.drawings.space_view, Qt.Key_Enter)
    assert dict(doc.mechanism.links) == {"link1": ("O1", "A"), "link2": ("A", "B"), "link3": ("O2", "B")}
    assert "no driver" in window.status.text()
    window.use_tool("driver")
    click_joint(window, "O1")
    click_joint(window, "A")
    assert doc.mechanism.driver.link == "link1" and doc.mechanism.driver.pivot == "O1"
    assert doc.solution is not None and doc.construction is not None
    assert kinematics.diagnose(doc.mechanism) == []
    target = tmp_path / "built.json"
    assert window.save_to(target)
    assert kinematics.load_mechanism(target).links == doc.mechanism.links
    steps = doc.undo_stack.count()
    while doc.undo_stack.canUndo():
        doc.undo_stack.undo()
    assert steps == 4 + 3 + 1 and not doc.mechanism.points


def test_a_link_tool_click_on_empty_space_adds_a_joint(make_window):
    window = make_window(CLAW_FEED)
    window.use_tool("link")
    click_joint(window, "P")
    click_at(window, 60.0, 200.0)
    QTest.keyClick(window.drawings.space_view, Qt.Key_Escape)
    assert "cancelled" in window.status.text()
    assert "C" in window.document.mechanism.points and len(window.document.mechanism.links) == 3


def test_a_slide_and_a_deletion_by_clicks(make_window):
    window = make_window(CARTON_PUSHER)
    doc = window.document
    window.use_tool("delete")
    click_joint(window, "D")
    assert "D" not in doc.mechanism.points and "rod" not in doc.mechanism.links and not doc.mechanism.slides
    doc.undo_stack.undo()
    window.use_tool("slide")
    click_joint(window, "A")
    click_at(window, 0.0, 500.0)  # empty space: the tool asks again for a joint
    assert "click on a joint" in window.status.text()
    window.use_tool("select")
    assert not window.drawings.space_view.building


def test_the_design_tab_edits_place_fixing_title_and_speed(make_window):
    window = make_window(CLAW_FEED)
    doc, panel = window.document, window.properties
    panel.show_point("P")
    panel.x.setValue(75.0)
    assert doc.mechanism.points["P"] == (75.0, 140.0)
    panel.title.setText("claw feed, longer stroke")
    panel.title.editingFinished.emit()
    assert doc.mechanism.title == "claw feed, longer stroke"
    panel.speed_unit.setCurrentText("rad/s")
    panel.speed.setValue(10.0)
    assert doc.mechanism.driver.speed_rad_s == pytest.approx(10.0)
    assert doc.solution.angular_velocity["crank"] == pytest.approx(10.0)
    panel.show_point("B")
    panel.fixed.setChecked(True)
    assert "B" in doc.mechanism.ground and "mobility" in window.status.text()
    count = doc.undo_stack.count()
    assert count == 5
    doc.undo_stack.undo()
    assert "B" not in doc.mechanism.ground and panel.fixed.isChecked() is False


def test_building_edits_refuse_what_makes_no_sense():
    mech = load(CLAW_FEED)
    with pytest.raises(BuildError, match="fixed points only"):
        building.join(mech, ["O2", "O4"])
    with pytest.raises(BuildError, match="at least two"):
        building.join(mech, ["A", "A"])
    with pytest.raises(BuildError, match="already joins"):
        building.join(mech, ["B", "O4"])
    with pytest.raises(BuildError, match="not fixed"):
        building.set_driver(mech, "A", "B")
    with pytest.raises(BuildError, match="no link joins"):
        building.set_driver(mech, "O2", "B")
    with pytest.raises(BuildError, match="must both be fixed, or both on one link"):
        building.add_slide(mech, "P", "O2", "B")


def test_a_new_slide_sets_its_joint_onto_the_line_and_a_deleted_pivot_drops_the_driver():
    bare = building.delete_point(load(CARTON_PUSHER), "F")
    bare = kinematics.move_point(bare, "D", (150.0, -10.0))  # free of its slide now: off the old line
    assert not bare.slides
    again, name = building.add_slide(building.add_point(bare, (260.0, -15.0), fixed=True)[0], "D", "E", "O1")
    e, f, d = (again.points[p] for p in ("E", "O1", "D"))
    assert abs((f[0] - e[0]) * (d[1] - e[1]) - (f[1] - e[1]) * (d[0] - e[0])) < 1e-9
    assert building.delete_point(again, "O2").driver is None
    assert building.snap((14.9, -25.1), 10.0) == (10.0, -30.0)
    assert json.loads(kinematics.dumps(again))["slides"][name]["line"] == ["E", "O1"]
    assert math.isclose(again.points["D"][1], -15.0, abs_tol=1e-9)


def test_snapping_draws_the_grid_and_lands_drags_on_it(make_window):
    window = make_window(CLAW_FEED)
    view = window.drawings.space_view

    def grid_pixels():
        image = view.viewport().grab().toImage()
        return sum(1 for x in range(0, image.width(), 3) for y in range(0, image.height(), 3)
                   if image.pixelColor(x, y).name() == "#e3e6ea")

    assert grid_pixels() == 0
    window.snapping.setChecked(True)
    step = window.grid_mm()
    assert step == 10.0  # a twentieth of the 245 mm diagonal, down to the 1-2-5 series
    assert grid_pixels() > 100
    start = window.drawings.space_scene.joint_pos("P")
    QTest.mousePress(view.viewport(), Qt.LeftButton, Qt.NoModifier, view.mapFromScene(start))
    QTest.mouseMove(view.viewport(), view.mapFromScene(start + QPointF(13.0, -4.0)))
    QTest.mouseRelease(view.viewport(), Qt.LeftButton, Qt.NoModifier, view.mapFromScene(start + QPointF(13.0, -4.0)))
    assert window.document.mechanism.points["P"] == (80.0, 140.0)


def test_random_building_never_fails(make_window):
    """Any tool clicked anywhere, on any joint, in any order: messages, never an exception."""
    import random

    window = make_window(CLAW_FEED)
    window.new_design()
    chance = random.Random(4242)
    tools = ["pivot", "joint", "link", "slide", "driver", "delete", "select"]
    for _ in range(150):
        window.use_tool(chance.choice(tools))
        names = list(window.document.mechanism.points)
        for _ in range(chance.randint(1, 4)):
            if names and chance.random() < 0.6:
                click_joint(window, chance.choice(names))
            else:
                click_at(window, chance.uniform(-80, 80), chance.uniform(-80, 80))
            names = list(window.document.mechanism.points)
        if chance.random() < 0.3:
            QTest.keyClick(window.drawings.space_view, chance.choice([Qt.Key_Return, Qt.Key_Escape]))
        assert window.status.text()
    doc = window.document
    built = doc.mechanism
    assert len(built.points) > 10 and built.links, "the clicks did build something"
    while doc.undo_stack.canUndo():
        doc.undo_stack.undo()
    assert not doc.mechanism.points


def test_deleting_or_fixing_a_joint_drops_the_mass_data_it_leaves_without_a_place():
    # A slider-crank with steel links, a block and a cutting force at D and a brake on the rod.
    mech = kinematics.load_mechanism(copy.deepcopy(FORMAT_2[0]))
    gone = building.delete_point(mech, "D")  # the rod goes with D, and so do the block and the cutting force
    assert set(gone.mass_data.masses) == {"crank"} and not gone.mass_data.point_masses
    assert set(gone.mass_data.loads) == set()  # the brake acted on the rod
    fixed = building.set_fixed(mech, "D", True)
    assert not fixed.mass_data.point_masses and "cutting" not in fixed.mass_data.loads
    assert "brake" in fixed.mass_data.loads


def _at_the_point_limit():
    """The unfinished claw feed with its coupler carrying points up to the size limit."""
    design = copy.deepcopy(UNFINISHED)
    extra = {f"Q{i}": [70 + (i % 10) * 3, 150 + (i // 10) * 3] for i in range(MAX_POINTS - len(design["points"]))}
    design["points"].update(extra)
    design["links"]["coupler"] += list(extra)
    return design


def test_a_click_that_would_pass_the_size_limit_is_refused_in_words(make_window):
    """At 100 points a new joint would make a file the loader refuses (kinematics.model.limits): the
    click is refused with the limit in words, and the design keeps its points."""
    window = make_window(_at_the_point_limit())
    before = dict(window.document.mechanism.points)
    window.use_tool("joint")
    click_at(window, -80.0, -60.0)
    assert dict(window.document.mechanism.points) == before
    assert f"no room for another joint: Kinepoly analyses designs of at most {MAX_POINTS} points" in \
        window.status.text()


def test_no_edit_builds_a_design_past_the_limits():
    mech = kinematics.load_mechanism(_at_the_point_limit())
    with pytest.raises(BuildError, match=f"at most {MAX_POINTS} points"):
        building.add_point(mech, (0.0, 0.0), fixed=True)
    bars = building.empty()
    for k in range(MAX_LINKS_AND_SLIDES + 1):
        bars, p = building.add_point(bars, (10.0 * k, 0.0), fixed=True)
        bars, q = building.add_point(bars, (10.0 * k, 50.0))
        if k == MAX_LINKS_AND_SLIDES:
            with pytest.raises(BuildError, match=f"at most {MAX_LINKS_AND_SLIDES} links and slides"):
                building.join(bars, [p, q])
            with pytest.raises(BuildError, match=f"at most {MAX_LINKS_AND_SLIDES} links and slides"):
                building.add_slide(bars, q, "O1", "O2")
        else:
            bars, _ = building.join(bars, [p, q])
    kinematics.load_mechanism(json.loads(kinematics.dumps(bars)))  # the largest it allowed still loads


def test_a_cylinder_built_by_clicks_drives_a_tipping_table(make_window):
    window = make_window(CLAW_FEED)
    window.new_design()
    window.snapping.setChecked(True)
    window.use_tool("pivot")
    click_at(window, 0.0, 0.0)  # O1: the barrel's pivot
    click_at(window, 300.0, 100.0)  # O2: the table's hinge
    window.use_tool("joint")
    click_at(window, 150.0, 200.0)  # A: where the rod is pinned to the table
    window.use_tool("link")
    click_joint(window, "O2")
    click_joint(window, "A")
    QTest.keyClick(window.drawings.space_view, Qt.Key_Return)
    QTest.keyClick(window.drawings.space_view, Qt.Key_C)  # the Cylinder tool's key
    assert window.builder.tool == "cylinder"
    click_joint(window, "O1")
    click_joint(window, "A")
    doc = window.document
    mech = doc.mechanism
    assert mech.driver.is_actuator and mech.driver.slide == "cylinder" and mech.driver.pivot == "O1"
    barrel = mech.slides["cylinder"].guide
    assert barrel == "barrel" and mech.links[barrel][0] == "O1" and mech.slides["cylinder"].point == "A"
    assert window.properties.link.currentText() == "barrel", "the new barrel is the link the Design tab shows"
    assert doc.undo_stack.count() == 5 and doc.solution is not None
    # The table turns about O2 with v_A = ω × r_O2A, and the cylinder's extension rate is v_A along the
    # cylinder's axis: ω = L̇ / ((k × r_O2A) · u_O1A)  # common practice (rigid-body kinematics)
    r = complex(*doc.solution.position("A")) - complex(*doc.solution.position("O2"))
    u = complex(*doc.solution.position("A")) - complex(*doc.solution.position("O1"))
    u /= abs(u)
    omega = 0.05 / ((1j * r) * u.conjugate()).real
    assert doc.solution.angular_velocity["link1"] == pytest.approx(omega, rel=1e-9)
    doc.undo_stack.undo()
    assert doc.mechanism.driver is None and "cylinder" not in doc.mechanism.slides, "one undo step"


def test_a_cylinder_refuses_what_cannot_be_one():
    mech = load(CLAW_FEED)
    with pytest.raises(BuildError, match="A is not fixed: a cylinder's barrel is pivoted on the frame"):
        building.add_cylinder(mech, "A", "B")
    with pytest.raises(BuildError, match="O4 is fixed: a cylinder's rod end is pinned to a moving link"):
        building.add_cylinder(mech, "O2", "O4")
    with pytest.raises(BuildError, match="two joints"):
        building.add_cylinder(mech, "O2", "O2")


def test_the_design_tab_renames_a_slide_and_runs_it_along_another_line(make_window, qtbot):
    design = copy.deepcopy(CARTON_PUSHER)
    design["points"]["G"] = [260, 10]
    design["ground"].append("G")
    window = make_window(design)
    doc, panel = window.document, window.properties
    assert panel.slide.currentText() == "guide" and "D slides on the frame" in panel.slide_about.text()
    panel.slide_name.setFocus()
    panel.slide_name.selectAll()
    qtbot.keyClicks(panel.slide_name, "ram")
    qtbot.keyClick(panel.slide_name, Qt.Key_Return)
    assert list(doc.mechanism.slides) == ["ram"] and doc.mechanism.slides["ram"].name == "ram"
    panel.slide_to.setCurrentText("G")
    slide = doc.mechanism.slides["ram"]
    assert slide.line == ("E", "G") and slide.guide == "ground"
    # D is set onto the new line E-G: its cross product with the line's direction is zero.  # common practice
    (ex, ey), (gx, gy), (dx, dy) = (doc.mechanism.points[n] for n in ("E", "G", "D"))
    assert abs((gx - ex) * (dy - ey) - (gy - ey) * (dx - ex)) <= 1e-9 * math.hypot(gx - ex, gy - ey) ** 2
    assert doc.solution is not None
    panel.slide_to.setCurrentText("A")  # one fixed point and one on a link: no guide holds both
    assert doc.mechanism.slides["ram"].line == ("E", "G"), "refused, the design kept"
    assert "must both be fixed, or both on one link" in panel.slide_refusal.text()
    assert panel.slide_to.currentText() == "G", "the chooser shows the slide's line again"
    assert doc.undo_stack.count() == 2
    doc.undo_stack.undo()
    assert doc.mechanism.slides["ram"].line == ("E", "F")


def test_the_cylinders_own_line_is_not_changed_from_the_design_tab():
    mech = kinematics.load_mechanism(json.loads((Path(__file__).parents[2] / "samples" /
                                                 "crate-tipping-table.json").read_text()))
    with pytest.raises(BuildError, match="cylinder that drives the design"):
        building.set_slide_line(mech, "cylinder", "C", "B")
    renamed = kinematics.rename_slide(mech, "cylinder", "ram")
    assert renamed.driver.slide == "ram" and kinematics.solve(renamed) is not None


def test_a_bars_length_is_typed_in_the_design_tab(make_window, qtbot):
    window = make_window(CLAW_FEED)
    doc, panel = window.document, window.properties
    panel.show_link("crank")
    assert panel.link_length.isEnabled() and panel.link_length.value() == pytest.approx(50.0)  # 3-4-5
    panel.link_length.setFocus()
    panel.link_length.selectAll()
    qtbot.keyClicks(panel.link_length.lineEdit(), "60")
    qtbot.keyClick(panel.link_length.lineEdit(), Qt.Key_Return)
    a = doc.mechanism.points["A"]
    # The free end A moved along O2A: (30, 40) scaled to 60 mm is (36, 48).  # common practice
    assert a == pytest.approx((36.0, 48.0), abs=1e-12)
    assert doc.solution is not None and doc.undo_stack.count() == 1
    panel.show_link("coupler")
    assert not panel.link_length.isEnabled(), "a plate has no one length"
    with pytest.raises(BuildError, match="only a bar"):
        building.set_link_length(doc.mechanism, "coupler", 100.0)
    fixed = kinematics.load_mechanism({**copy.deepcopy(CLAW_FEED), "ground": ["O2", "O4", "B"]})
    with pytest.raises(BuildError, match="both ends of rocker are fixed"):
        building.set_link_length(fixed, "rocker", 90.0)
    doc.undo_stack.undo()
    assert doc.mechanism.points["A"] == (30.0, 40.0)


def test_a_bar_of_no_length_cannot_be_lengthened():
    # The loader refuses such a file; the Design tab's place fields can still type one (unchecked edit).
    mech = load(CLAW_FEED)
    mech = replace(mech, points={**mech.points, "A": (0.0, 0.0)})
    with pytest.raises(BuildError, match="the two joints of crank are at one place"):
        building.set_link_length(mech, "crank", 50.0)
