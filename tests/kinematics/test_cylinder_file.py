"""The cylinder driver in a file: format 2's keys as docs/file-format.md states them, a save that
writes them back unchanged, and each refusal naming its place."""

import copy
import json
from pathlib import Path

import pytest

import kinematics
from kinematics.errors import FileFormatError
from kinematics.files.fileformat import dumps

SAMPLE = Path(__file__).resolve().parents[2] / "samples" / "crate-tipping-table.json"


def _document():
    return json.loads(SAMPLE.read_text())


def test_the_sample_loads_as_a_cylinder_driver():
    driver = kinematics.load_mechanism(SAMPLE).driver
    assert driver.is_actuator and driver.slide == "cylinder" and (driver.link, driver.pivot) == ("barrel", "C")
    assert driver.linear_speed_m_s == pytest.approx(0.040, rel=1e-15)  # 40 mm/s; exact but for rounding
    assert (driver.stroke_min, driver.stroke_max) == (580, 1060)


def test_a_save_writes_format_2_and_reads_back_the_same_design():
    mech = kinematics.load_mechanism(SAMPLE)
    text = dumps(mech)
    doc = json.loads(text)
    assert doc["kinepoly"] == 2 and doc["driver"] == _document()["driver"]
    assert dumps(kinematics.load_mechanism(doc)) == text


def test_without_a_stroke_none_is_written():
    doc = _document()
    del doc["driver"]["stroke"], doc["driver"]["acceleration"]
    saved = json.loads(dumps(kinematics.load_mechanism(doc)))["driver"]
    assert "stroke" not in saved and saved["acceleration"] == {"value": 0, "unit": "m/s^2"}


@pytest.mark.parametrize("change, message", [
    (lambda d: d.update(kinepoly=1) or [d.pop(k) for k in ("masses", "point_masses", "gravity")],
     'driver.kind: a cylinder driver ("kind": "actuator") needs format version 2 or later: write "kinepoly": 2'),
    (lambda d: d["driver"].update(slide="ram"),
     'driver.slide: unknown slide "ram" (the cylinder driver names the slide of its rod in its barrel)'),
    (lambda d: d["driver"]["speed"].update(unit="rpm"), 'driver.speed.unit: unknown unit "rpm" (use m/s or mm/s)'),
    (lambda d: d["driver"]["acceleration"].update(unit="rad/s^2"),
     'driver.acceleration.unit: unknown unit "rad/s^2" (use m/s^2 or mm/s^2)'),
    (lambda d: d["driver"]["stroke"].update(min=-5),
     "driver.stroke.min: a stroke length is a positive number of length units, at most 1e+09"),
    (lambda d: d["driver"]["stroke"].update(min=900, max=600),
     "driver.stroke: the stroke's min 900 must be below its max 600"),
    (lambda d: d["driver"]["stroke"].update(mid=3), 'driver.stroke.mid: unknown key "mid"'),
    (lambda d: d.update(driver={"kind": "linear", "link": "barrel", "pivot": "C", "speed": {"value": 1}}),
     'driver.kind: unknown driver kind "linear" (use "rotary" or "actuator")'),
    (lambda d: d["driver"].update(link="barrel"), 'driver.link: unknown key "link"'),
    (lambda d: d["driver"].pop("slide"), 'driver: missing "slide"'),
])
def test_refusals_name_the_place(change, message):
    doc = copy.deepcopy(_document())
    change(doc)
    with pytest.raises(FileFormatError) as caught:
        kinematics.load_mechanism(doc)
    assert str(caught.value) == f"document: {message}" or str(caught.value) == message


def test_the_drawn_length_outside_the_stroke_is_said_in_words():
    doc = _document()
    doc["driver"]["stroke"]["min"] = 810
    with pytest.raises(kinematics.CannotAssemble) as caught:
        kinematics.sweep(kinematics.load_mechanism(doc), 50)
    assert str(caught.value) == ("driver.stroke: the cylinder's length in the drawn pose, 800.034 mm, is outside "
                                 "its stroke 810 to 1060 mm")
