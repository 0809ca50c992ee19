"""One choice of units for every number the window shows: the table, the construction steps, the
Design tab's places, the polygons' scales and every scale bar follow the tool bar's length and ω
choices; the drawings themselves and the saved file do not change."""

import json
import math
import re
from pathlib import Path

import pytest
from PySide6.QtWidgets import QApplication

from kinematics.drawing import Text
from kinematics.reports.shown_units import in_units

SAMPLE = Path(__file__).resolve().parents[2] / "samples" / "tile-trimmer-quick-return.json"


def _window(make_window):
    window = make_window(json.loads(SAMPLE.read_text(encoding="utf-8")))
    QApplication.processEvents()
    return window


def _bar_words(scene) -> list:
    return [p.text for p in scene.sheet.primitives if isinstance(p, Text) and p.ref and p.ref.kind == "scale bar"]


def test_the_steps_read_in_the_chosen_units_from_the_cores_own_numbers(make_window):
    window = _window(make_window)
    window.length_units.setCurrentText("in")
    window.speed_units.setCurrentText("rpm")
    QApplication.processEvents()
    step = window.document.construction.velocity.steps[1]  # the crank pin's velocity, ω·r
    line = window.steps.item(1).text()
    # 1 in = 25.4 mm exactly (international inch, 1959); 1 rev/min = 2π/60 rad/s  # common practice
    speed = re.search(r"= (\S+) rpm × (\S+) in = (\S+) in/s", line)
    assert speed, line
    omega, r, v = (float(g) for g in speed.groups())
    solution = window.document.solution
    assert omega == pytest.approx(solution.angular_velocity["crank"] * 60 / (2 * math.pi), rel=5e-4)
    assert v == pytest.approx(float(re.search(r"= (\S+) m/s", step.text).group(1)) / 0.0254, rel=5e-4)
    assert r == pytest.approx(0.06 / 0.0254, rel=5e-4)
    assert " m/s" not in line and "rad/s," not in line


def test_the_scales_and_bars_follow_the_choice_and_the_drawing_stays(make_window):
    window = _window(make_window)
    velocity = window.drawings.velocity_scene
    window.length_units.setCurrentText("m")
    QApplication.processEvents()
    in_metres = (velocity.sheet.views["velocity"].scale_text, _bar_words(velocity))
    lines_m = sorted(p.start for p in velocity.sheet.primitives if hasattr(p, "start"))
    window.length_units.setCurrentText("mm")
    QApplication.processEvents()
    in_mm = (velocity.sheet.views["velocity"].scale_text, _bar_words(velocity))
    per_mm_m = float(re.match(r"1 mm = (\S+) m/s", in_metres[0]).group(1))
    per_mm_mm = float(re.match(r"1 mm = (\S+) mm/s", in_mm[0]).group(1))
    assert per_mm_mm == pytest.approx(1000.0 * per_mm_m, rel=1e-12)
    assert any(w.endswith(" mm/s") for w in in_mm[1]) and any(w.endswith(" m/s") for w in in_metres[1])
    assert sorted(p.start for p in velocity.sheet.primitives if hasattr(p, "start")) == lines_m, \
        "only the words change: the polygon is drawn at the construction's own scale"
    acceleration = window.drawings.acceleration_scene.sheet.views["acceleration"].scale_text
    assert acceleration.endswith(" mm/s²")
    assert any(w.endswith(" mm") for w in _bar_words(window.drawings.space_scene))
    window.length_units.setCurrentText("in")
    QApplication.processEvents()
    assert any(w.endswith(" in") for w in _bar_words(window.drawings.space_scene))


def test_the_design_tab_shows_and_takes_places_in_the_chosen_unit(make_window, tmp_path):
    window = _window(make_window)
    panel, doc = window.properties, window.document
    file_x = doc.mechanism.points["T"][0]  # the sample is in mm
    window.length_units.setCurrentText("m")
    panel.show_point("T")
    assert panel.x.suffix() == " m" and panel.x.value() == pytest.approx(file_x / 1000.0, abs=1e-6)
    panel.x.setValue(panel.x.value())  # no change: nothing edited
    assert doc.undo_stack.count() == 0
    panel.x.setValue(0.25)
    assert doc.mechanism.points["T"][0] == pytest.approx(250.0, rel=1e-12), "saved in the file's own unit"
    path = tmp_path / "t.json"
    assert window.save_to(path)
    assert json.loads(path.read_text())["length_unit"] == "mm"


def test_in_units_leaves_what_is_not_an_si_length_or_speed():
    text = "torque 3.574 N·m, α = 3.15 rad/s², 12 mm, angle 30.0°, kg·m² 0.5"
    assert in_units(text, "in", "rpm") == text
