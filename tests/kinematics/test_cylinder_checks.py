"""`kinepoly check` and `sweep --peaks` on a cylinder-driven design speak of its stroke in mm and of
its own transmission angle, against the triangle C-O-B solved by the law of cosines (any handbook)."""

import json
import math
from pathlib import Path

import pytest

from app.cli import main
from kinematics.cycle.checks import report
from kinematics.cycle.peaks import peaks
from kinematics.cycle.sweep import sweep
from kinematics.files.fileformat import load_mechanism

SAMPLE = Path(__file__).resolve().parents[2] / "samples" / "crate-tipping-table.json"
# The sample's triangle: barrel pivot C, table hinge O, rod end B (m), from the file's points.
_POINTS = {n: (x / 1000, y / 1000) for n, (x, y) in json.loads(SAMPLE.read_text())["points"].items()}
D_M = math.dist(_POINTS["C"], _POINTS["O"])
R_M = math.dist(_POINTS["O"], _POINTS["B"])  # fixed in the table


def _angle_at_b_deg(length_m):
    """Law of cosines: the angle at B between BC (the cylinder) and BO (the table)."""
    return math.degrees(math.acos((length_m ** 2 + R_M ** 2 - D_M ** 2) / (2 * length_m * R_M)))


def _angle_at_o_deg(length_m):
    return math.degrees(math.acos((D_M ** 2 + R_M ** 2 - length_m ** 2) / (2 * D_M * R_M)))


def test_the_cylinders_transmission_angle_and_the_tables_travel_by_the_law_of_cosines():
    """The stroke's ends (580 and 1060 mm) are swept exactly, so the extremes agree to 1e-9 (the
    closed forms' rounding); the angle at B falls monotonically over this stroke, so its extremes
    are at the ends."""
    data = report(load_mechanism(str(SAMPLE)), steps=241)
    (name, angle), = data["transmission"].items()
    assert name == "cylinder/table at B"
    assert angle["max_deg"] == pytest.approx(_angle_at_b_deg(0.580), rel=1e-9)
    assert angle["min_deg"] == pytest.approx(_angle_at_b_deg(1.060), rel=1e-9)
    assert angle["at_length_m"] == pytest.approx(1.060, rel=1e-12)
    assert data["stroke_m"] == pytest.approx([0.580, 1.060], rel=1e-12)
    travel = _angle_at_o_deg(1.060) - _angle_at_o_deg(0.580)
    assert data["output"]["travel"] == pytest.approx(travel, rel=1e-9)


def test_peaks_are_placed_by_length_and_the_given_stroke_is_not_trimmed():
    table = peaks(sweep(load_mechanism(str(SAMPLE)), 49))
    assert table["parameter"] == "length" and table["dead_point_share_left_out"] == 0.0
    assert "at_deg" not in table["points"]["T"]
    # The table turns fastest where the cylinder's lever about O is shortest: at the short end here.
    assert table["points"]["T"]["at_length_m"] == pytest.approx(0.580)


def test_check_and_peaks_text_speak_of_the_stroke(capsys):
    assert main(["check", str(SAMPLE)]) == 0
    out = capsys.readouterr().out
    assert "cylinder: stroke 580.0 to 1060.0 mm, 480.0 mm long" in out
    assert "construction order: cylinder\n" in out
    assert "dead points" not in out and "0.580°" not in out
    assert "at length 580.00 mm" in out
    assert main(["sweep", str(SAMPLE), "--peaks", "--steps", "49"]) == 0
    out = capsys.readouterr().out
    assert "at [mm]" in out and "at [°]" not in out
    assert "the cylinder strokes from 580.0 to 1060.0 mm" in out and "dead points" not in out
