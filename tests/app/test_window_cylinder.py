"""A cylinder-driven design in the window: the forces at the pose name the cylinder's axial force."""

import json
import math
from pathlib import Path

import pytest
from PySide6.QtCore import Qt

import kinematics
from tests.designs import CLAW_FEED

TABLE = Path(__file__).resolve().parents[2] / "samples" / "crate-tipping-table.json"


def test_the_forces_pane_gives_the_cylinder_force_not_a_torque(make_window):
    window = make_window(CLAW_FEED)
    assert window.open_path(str(TABLE))
    model = window.forces_table.model
    titles = [model.item(r, 0).text() for r in range(model.rowCount())]
    assert "drive force of cylinder" in titles
    assert not any(t.startswith("drive torque") for t in titles)
    row = titles.index("drive force of cylinder")
    shown = model.item(row, 1).data(Qt.ItemDataRole.UserRole)
    # The core's force at the pose on screen (the window reads it, never recomputes it).
    found = kinematics.dynamics.forces(window.document.solution)
    assert shown == pytest.approx(found.drive_force_n, rel=1e-12)
    assert model.item(row, 2).text() == "push"


def _open_table(make_window):
    window = make_window(CLAW_FEED)
    assert window.open_path(str(TABLE))
    return window


def test_the_driver_control_is_the_cylinders_length_over_its_stroke(make_window, qtbot):
    window = _open_table(make_window)
    control = window.angle
    assert control.caption.text() == "cylinder length" and control.spin.suffix() == " mm"
    # The sample's stroke, 580 to 1060 mm, assembles throughout: the control spans it.
    assert (control.spin.minimum(), control.spin.maximum()) == (580.0, 1060.0)
    assert control.spin.value() == pytest.approx(800.0, abs=0.05)
    control.spin.selectAll()
    qtbot.keyClicks(control.spin, "700")
    qtbot.keyClick(control.spin, Qt.Key.Key_Return)
    assert window.document.solution.driver_length_m == pytest.approx(0.7, rel=1e-12)
    # The slider's End key runs the cylinder out to the stroke's far end.
    control.slider.setFocus()
    qtbot.keyClick(control.slider, Qt.Key.Key_End)
    assert window.document.solution.driver_length_m == pytest.approx(1.060, rel=1e-12)
    assert "cylinder at length 1060.00 mm" in window.status.text()  # as the spin box shows it


def test_play_runs_the_cylinder_to_the_end_of_its_stroke_and_back(make_window, qtbot):
    window = _open_table(make_window)
    control = window.angle
    qtbot.mouseClick(control.play, Qt.MouseButton.LeftButton)
    for _ in range(200):  # more frames than one run over the stroke
        control.advance()
    control.stop()
    lengths_mm = window.document.solution.driver_length_m * 1e3
    assert 580.0 <= lengths_mm <= 1060.0 and control.direction == -1.0


def test_the_cycle_plots_a_stroke_against_the_cylinders_length(make_window, qtbot):
    window = _open_table(make_window)
    window.document.catch_up_sweep() if hasattr(window.document, "catch_up_sweep") else None
    qtbot.waitUntil(lambda: window.document.sweep is not None)
    axis = window.cycle.axis if window.cycle is not None and window.cycle.axis is not None else None
    from app import cycle_series

    axis = axis or cycle_series.cycle_axis(window.document.sweep)
    assert (axis.kind, axis.unit) == ("length", "mm")
    # The stroke's ends are swept exactly (the sample's whole stroke assembles).
    assert axis.span == pytest.approx((580.0, 1060.0), rel=1e-12)
    assert axis.x_of_angle(window.document.shown_angle_deg) == pytest.approx(800.0, abs=1.0)


def test_the_driver_tool_makes_a_slide_a_cylinder_by_its_pivot_and_rod_end(make_window, qtbot):
    """The sample with its barrel turned by a crank instead; the Driver tool, clicked on C (the
    barrel's pivot) and B (the slide's joint), makes the slide the cylinder again; undo goes back."""
    from dataclasses import replace

    from kinematics import Driver
    from tests.app.test_building import click_joint

    cylinder = kinematics.load_mechanism(TABLE)
    turned = replace(cylinder, driver=Driver("barrel", "C", 2.0, "rpm"))
    window = make_window(json.loads(kinematics.dumps(turned)))
    assert not window.document.mechanism.driver.is_actuator
    window.use_tool("driver")
    click_joint(window, "C")
    click_joint(window, "B")
    driver = window.document.mechanism.driver
    assert driver.is_actuator and driver.slide == "cylinder" and driver.pivot == "C"
    assert window.angle.caption.text() == "cylinder length"
    # The pose keeps the drawn length, |CB| of the file (mm).
    assert window.angle.spin.value() == pytest.approx(math.dist(cylinder.points["C"], cylinder.points["B"]), abs=0.05)
    window.document.undo_stack.undo()
    assert not window.document.mechanism.driver.is_actuator
    assert window.angle.caption.text() == "driver angle"


def _type(qtbot, field, text: str):
    """Select the field's number and type ``text`` with the keyboard, then Enter."""
    field.setFocus()
    field.selectAll()
    qtbot.keyClicks(field.lineEdit(), text)
    qtbot.keyClick(field.lineEdit(), Qt.Key.Key_Return)


def test_the_design_tab_edits_the_cylinders_speed_acceleration_and_stroke(make_window, qtbot, tmp_path):
    window = _open_table(make_window)
    doc, panel = window.document, window.properties
    form = panel.form
    assert form.labelForField(panel.speed).text() == "extension speed"
    assert [panel.speed_unit.itemText(i) for i in range(panel.speed_unit.count())] == ["mm/s", "m/s"]
    assert (panel.speed.value(), panel.stroke_min.value(), panel.stroke_max.value()) == (40.0, 580.0, 1060.0)
    assert panel.alpha.suffix() == " mm/s²" and form.isRowVisible(panel.stroke_max)
    _type(qtbot, panel.speed, "55")
    assert doc.mechanism.driver.linear_speed_m_s == pytest.approx(0.055, rel=1e-12)
    # The solution's own sliding velocity of the cylinder is the speed typed.
    assert doc.solution.sliding_velocity["cylinder"] == pytest.approx(0.055, rel=1e-9)
    _type(qtbot, panel.alpha, "12")
    assert doc.mechanism.driver.linear_acceleration_m_s2 == pytest.approx(0.012, rel=1e-12)
    _type(qtbot, panel.stroke_max, "1000")
    assert doc.mechanism.driver.stroke_max == 1000.0
    assert kinematics.sweep(doc.mechanism, 20).driver_length_m.max() <= 1.0 + 1e-12
    before = doc.mechanism
    _type(qtbot, panel.stroke_min, "1100")
    assert doc.mechanism is before, "a stroke out of order is not kept"
    assert "the stroke from 1100 mm must be below the stroke to 1000 mm" in window.status.text()
    assert panel.stroke_min.value() == 580.0, "the field shows the design's stroke again"
    assert doc.undo_stack.count() == 3
    path = tmp_path / "table.json"
    assert window.save_to(path)
    saved = json.loads(path.read_text(encoding="utf-8"))["driver"]
    assert saved["speed"] == {"value": 55.0, "unit": "mm/s"}
    assert saved["acceleration"] == {"value": 12.0, "unit": "mm/s^2"}
    assert saved["stroke"] == {"min": 580, "max": 1000.0}


def test_a_crank_driven_design_shows_no_stroke_rows(make_window):
    window = make_window(CLAW_FEED)
    panel = window.properties
    assert not panel.form.isRowVisible(panel.stroke_min) and not panel.form.isRowVisible(panel.stroke_max)
    assert panel.form.labelForField(panel.speed).text() == "speed" and panel.alpha.suffix() == " rad/s²"


def test_a_speed_edit_in_a_metre_design_keeps_the_strokes_digits(make_window, qtbot):
    doc_json = json.loads(TABLE.read_text())
    doc_json["length_unit"] = "m"
    doc_json["points"] = {k: [x / 1000.0, y / 1000.0] for k, (x, y) in doc_json["points"].items()}
    doc_json["driver"]["stroke"] = {"min": 0.5805, "max": 1.0604}
    window = make_window(doc_json)
    window.length_units.setCurrentText("m")
    panel = window.properties
    assert panel.stroke_min.text() == "0.580500 m"
    _type(qtbot, panel.speed, "45")
    driver = window.document.mechanism.driver
    assert (driver.stroke_min, driver.stroke_max) == (0.5805, 1.0604), "a stroke not edited is kept exactly"
