"""Mechanism files: what loads, what is refused, and the exact words of each refusal."""

import copy
import json
import subprocess
import sys
from pathlib import Path

import jsonschema
import pytest

import kinematics
from kinematics.files.fileschema import SCHEMA_FILES, schema
from tests.designs import SAMPLE_FILES, SAMPLES, four_bar, slider_crank


def refusal(doc) -> str:
    with pytest.raises(kinematics.FileFormatError) as caught:
        kinematics.load_mechanism(doc)
    return str(caught.value)


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.name)
def test_every_sample_loads_passes_the_schema_and_saves_identical(path):
    doc = json.loads(path.read_text())
    jsonschema.Draft202012Validator(schema(doc["kinepoly"])).validate(doc)
    mech = kinematics.load_mechanism(path)
    assert json.loads(kinematics.dumps(mech)) == doc


@pytest.mark.parametrize("version", sorted(SCHEMA_FILES))
def test_schema_is_a_valid_draft_2020_12_schema(version):
    jsonschema.Draft202012Validator.check_schema(schema(version))


def test_extensions_are_kept_and_unfinished_designs_load():
    doc = {"kinepoly": 1, "points": {"A": [0, 0], "B": [10, 0]}, "links": {"bar": ["A", "B"]},
           "x-shop": {"drawing": "K-17"}}
    mech = kinematics.load_mechanism(doc)
    assert mech.driver is None
    assert json.loads(kinematics.dumps(mech))["x-shop"] == {"drawing": "K-17"}
    assert [f.location for f in kinematics.diagnose(mech)][0] == "driver"


MESSAGES = [
    (lambda d: d["links"]["coupler"].append("Q"), 'links.coupler[2]: unknown point "Q"'),
    (lambda d: d["links"].update(rod=["A"]), "links.rod: a link needs at least two points"),
    (lambda d: d.update(kinepoly=3), "kinepoly: this file is format version 3; this Kinepoly reads versions 1 to 2 "
                                      "(a newer Kinepoly wrote it)"),
    (lambda d: d["points"].update(a=[1, 2]), 'points.a: name "a" clashes with "A" (names must differ ignoring case)'),
    (lambda d: d["points"].update(ground=[1, 2]), 'points.ground: "ground" is reserved'),
    (lambda d: d["points"].update({"C\n": [1, 2]}),
     'points.C\n: "C\n" is not a valid name (a letter, then letters, digits or _)'),
    (lambda d: d["points"].update(B=[1, "2"]), "points.B: a point is [x, y] with two finite numbers"),
    # NaN is no JSON value, so no schema can refuse it: a parsed document is checked for JSON data first.
    (lambda d: d["points"].update(B=[1, float("nan")]), "points.B[1]: NaN is not a number this format accepts"),
    (lambda d: d.pop("links"), 'links: missing "links"'),
    (lambda d: d.update(colour="red"), 'colour: unknown key "colour" (own additions start with "x-")'),
    (lambda d: d["driver"].update(pivot="A"), "driver.pivot: the driver pivot A must be a ground point"),
    (lambda d: d["driver"].update(pivot="B"), 'driver.pivot: "B" is not a point of link crank'),
    (lambda d: d["driver"]["speed"].update(unit="Hz"), 'driver.speed.unit: unknown unit "Hz" (use rad/s or rpm)'),
    (lambda d: d.update(length_unit="ft"), 'length_unit: unknown length unit "ft" (use mm, m or in)'),
]


@pytest.mark.parametrize("edit, message", MESSAGES)
def test_refusals_name_the_place(edit, message):
    doc = four_bar(40, 120, 100, 140, 30)
    edit(doc)
    assert refusal(doc) == message


def test_slide_messages():
    doc = slider_crank(50, 180, 20, 30)
    off = copy.deepcopy(doc)
    off["points"]["D"][1] += 3.2
    assert refusal(off) == "slides.piston: point D is 3.2 mm off the line E-F in the reference pose"
    zero = copy.deepcopy(doc)
    zero["points"]["F"] = list(zero["points"]["E"])
    assert refusal(zero) == "slides.piston: guide line E-F has zero length"
    near = copy.deepcopy(doc)
    near["points"]["D"][1] += 0.01
    mech = kinematics.load_mechanism(near)
    assert mech.points["D"][1] == pytest.approx(-20.0, abs=1e-12)
    assert mech.warnings == ("slides.piston: point D was 0.01 mm off the line E-F and was moved onto it",)


def test_file_level_refusals(tmp_path: Path):
    repeated = tmp_path / "repeated.json"
    repeated.write_text('{"kinepoly": 1, "points": {"A": [0, 0], "A": [1, 1]}, "links": {}}')
    with pytest.raises(kinematics.FileFormatError, match='the key "A" appears twice in one object'):
        kinematics.load_mechanism(repeated)
    broken = tmp_path / "broken.json"
    broken.write_text('{"kinepoly": 1,\n "points": {\n}')
    with pytest.raises(kinematics.FileFormatError) as caught:
        kinematics.load_mechanism(broken)
    assert caught.value.location == f"{broken} line 3 column 2"
    latin = tmp_path / "latin.json"
    latin.write_bytes('{"kinepoly": 1, "title": "Presse für Dosen"}'.encode("latin-1"))
    with pytest.raises(kinematics.FileFormatError, match="not UTF-8 text"):
        kinematics.load_mechanism(latin)
    nan = tmp_path / "nan.json"
    nan.write_text('{"kinepoly": 1, "points": {"A": [NaN, 0]}, "links": {}}')
    with pytest.raises(kinematics.FileFormatError, match="NaN is not a number this format accepts"):
        kinematics.load_mechanism(nan)


def test_analysis_findings_name_the_place():
    doc = four_bar(40, 120, 100, 140, 30)
    doc["driver"] = None
    del doc["driver"]
    findings = kinematics.diagnose(kinematics.load_mechanism(doc))
    assert [str(f) for f in findings] == ["driver: no driver: choose the driving link, its pivot and its speed"]
    loose = four_bar(40, 120, 100, 140, 30)
    loose["links"].pop("rocker")
    loose.pop("output")
    assert [str(f) for f in kinematics.diagnose(kinematics.load_mechanism(loose))] == [
        "mobility is 2 (expected 1): the linkage needs another link or constraint (Gruebler-Kutzbach count 2)"]
    with pytest.raises(kinematics.MechanismFindings):
        kinematics.solve(kinematics.load_mechanism(loose))


def test_redundant_parallelogram_link_is_named():
    """A parallelogram with a third parallel link: Gruebler-Kutzbach counts 0, the Jacobian's rank
    gives 1 (the classic redundant-constraint case  # common practice)."""
    doc = {"kinepoly": 1, "points": {"O2": [0, 0], "A": [30, 40], "B": [130, 40], "O4": [100, 0],
                                     "C": [80, 40], "O6": [50, 0]},
           "ground": ["O2", "O4", "O6"],
           "links": {"crank": ["O2", "A"], "coupler": ["A", "B", "C"], "rocker": ["O4", "B"], "extra": ["O6", "C"]},
           "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 60, "unit": "rpm"}}}
    (finding,) = kinematics.diagnose(kinematics.load_mechanism(doc))
    assert finding.location == "links.extra"
    assert finding.message.startswith("link extra is redundant: at this geometry its constraints repeat")
    assert "Gruebler-Kutzbach count 0, true mobility 1" in finding.message


def test_cannot_assemble_names_the_angle():
    # A triple rocker cannot turn its input fully (s + l > p + q  # common practice).
    mech = kinematics.load_mechanism(four_bar(100, 60, 90, 120, 60))
    with pytest.raises(kinematics.CannotAssemble) as caught:
        kinematics.solve(mech, 212.0)
    assert str(caught.value).endswith("cannot assemble at driver angle 212.00°")


def test_core_never_imports_qt():
    code = "import sys, kinematics, app.cli, kinematics.cycle.sweep, kinematics.cycle.checks; " \
           "print(any(m.startswith('PySide6') for m in sys.modules))"  # the analysis verbs run without Qt
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert out.stdout.strip() == "False"


def test_dead_point_and_toggle_are_told_apart():
    rocker = kinematics.load_mechanism(four_bar(100, 60, 90, 120, 60))
    from kinematics.cycle.sweep import driver_range

    _, (low, high) = driver_range(rocker)
    near_dead = kinematics.solve(rocker, high - 0.01)
    assert any(w.startswith("near a dead point of the driver: links coupler and rocker are")
               for w in near_dead.warnings)
    # A crank-rocker's limit position: crank and coupler in line, the rocker at rest (well-conditioned).
    press = kinematics.load_mechanism(SAMPLES / "tablet-press-toggle.json")
    toggle = kinematics.solve(press, 42.0)
    assert toggle.warnings == ("near toggle: links upper and lower are 2.46° from being in line at B (within 3°); "
                               "the links they drive move slowly for the driver's speed here (a small velocity "
                               "ratio), and stop only exactly in line",)
    assert toggle.condition < 1e3
