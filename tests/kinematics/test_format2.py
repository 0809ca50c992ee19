"""Format 2: mass data and loads in the file, the words of every refusal, the version a save
writes, and the edits (renames, moves) carrying the mass data."""

import copy
import json
from dataclasses import replace

import jsonschema
import pytest

import kinematics
from kinematics.edits.moves import move_point
from kinematics.edits.naming import rename_link, rename_point
from kinematics.files.fileschema import schema
from tests.designs import CLAW_FEED
from tests.kinematics.test_schema_agreement import FORMAT_2

BASE = FORMAT_2[0]  # an offset slider-crank: steel crank and rod, a block at D, a cutting force, a brake, gravity


def refusal(edit):
    doc = copy.deepcopy(BASE)
    edit(doc)
    with pytest.raises(kinematics.FileFormatError) as caught:
        kinematics.load_mechanism(doc)
    return caught.value.kind, str(caught.value)


LOAD_WORDS = ('a load is a force at a point ({"point": ..., "force": ...}, optionally on the one "link" named) '
              'or a torque on a link ({"link": ..., "torque": ...}), not both')
MESSAGES = [
    (lambda d: d["masses"]["rod"]["mass"].update(value=-1),
     ("structure", "masses.rod.mass.value: a mass cannot be negative (-1)")),
    (lambda d: d["masses"]["rod"]["inertia"].update(value=-1),
     ("structure", "masses.rod.inertia.value: a moment of inertia cannot be negative (-1)")),
    (lambda d: d["masses"]["rod"]["mass"].update(unit="lb"),
     ("structure", 'masses.rod.mass.unit: unknown mass unit "lb" (use kg or g)')),
    (lambda d: d["masses"]["rod"]["inertia"].update(unit="kg*cm^2"),
     ("structure", 'masses.rod.inertia.unit: unknown inertia unit "kg*cm^2" (use kg*m^2, kg*mm^2 or g*mm^2)')),
    (lambda d: d["masses"]["rod"].update(centre=[1, "x"]),
     ("structure", "masses.rod.centre: the centre of mass is [x, y] with two finite numbers")),
    (lambda d: d["masses"]["rod"].update(centre=[1, 2e9]),
     ("structure", "masses.rod.centre[1]: a number beyond ±1e+09")),
    (lambda d: d["masses"]["rod"].pop("centre"), ("structure", 'masses.rod: missing "centre"')),
    (lambda d: d["masses"].update(ground=d["masses"]["rod"]),
     ("structure", "masses.ground: the frame does not move: masses and loads go on moving links")),
    (lambda d: d["masses"].update(lever=d["masses"]["rod"]), ("reference", 'masses.lever: unknown link "lever"')),
    (lambda d: d["masses"].update(rod=3),
     ("structure", 'masses.rod: a link\'s mass is {"mass": ..., "centre": [x, y], "inertia": ...}')),
    (lambda d: d["point_masses"].update(Q={"value": 1, "unit": "kg"}),
     ("reference", 'point_masses.Q: unknown point "Q"')),
    (lambda d: d["point_masses"].update(O2={"value": 1, "unit": "kg"}),
     ("reference", "point_masses.O2: point O2 is fixed: a mass there is part of the frame and takes no part in "
                   "the motion")),
    (lambda d: d["point_masses"]["D"].update(value=-2),
     ("structure", "point_masses.D.value: a mass cannot be negative (-2)")),
    (lambda d: d["point_masses"].update(D=8),
     ("structure", 'point_masses.D: a point mass is {"value": mass, "unit": "kg" or "g"}')),
    (lambda d: d["loads"]["cutting"].update(point="Q"), ("reference", 'loads.cutting.point: unknown point "Q"')),
    (lambda d: d["loads"]["cutting"].update(point="O2"),
     ("reference", "loads.cutting.point: point O2 is fixed: a force there acts on the frame; name the link it "
                   "acts on")),
    (lambda d: d["loads"]["brake"].update(link="ground"),
     ("structure", "loads.brake.link: the frame does not move: masses and loads go on moving links")),
    (lambda d: d["loads"]["brake"].update(link="lever"), ("reference", 'loads.brake.link: unknown link "lever"')),
    (lambda d: d["loads"]["cutting"].update(link="crank"),
     ("reference", "loads.cutting.link: link crank does not hold point D")),
    (lambda d: d["loads"]["cutting"].update(over_deg=[10, "a"]),
     ("structure", "loads.cutting.over_deg: over_deg must be two finite angles [start, end] in degrees")),
    (lambda d: d["loads"]["cutting"].update(over_deg=[10, 370]),
     ("geometry", "loads.cutting.over_deg: over_deg [10, 370] starts and ends at the same angle; leave over_deg "
                  "out for a load that acts at every angle")),
    (lambda d: d["loads"]["cutting"]["force"].update(unit="kN"),
     ("structure", 'loads.cutting.force.unit: unknown force unit "kN" (use N)')),
    (lambda d: d["loads"]["brake"]["torque"].update(unit="kN*m"),
     ("structure", 'loads.brake.torque.unit: unknown torque unit "kN*m" (use N*m)')),
    (lambda d: d["loads"]["cutting"]["force"].update(value=[1]),
     ("structure", "loads.cutting.force.value: value is [x, y] with two finite numbers")),
    (lambda d: d["loads"]["cutting"].update(torque={"value": 1, "unit": "N*m"}),
     ("structure", f"loads.cutting: {LOAD_WORDS}")),
    (lambda d: d["loads"]["brake"].update(point="D"), ("structure", f"loads.brake: {LOAD_WORDS}")),
    (lambda d: d["gravity"].update(unit="g"), ("structure", 'gravity.unit: unknown acceleration unit "g" (use m/s^2)')),
    (lambda d: d.update(gravity=9.81), ("structure", 'gravity: gravity is {"value": [x, y], "unit": "m/s^2"}')),
    (lambda d: d.update(kinepoly=1),
     ("structure", 'masses: "masses" needs format version 2 or later: write "kinepoly": 2 (this file says 1)')),
]


@pytest.mark.parametrize("edit, expected", MESSAGES, ids=[m[1][1].split(":")[0] + f"#{i}" for i, m in
                                                          enumerate(MESSAGES)])
def test_every_refusal_names_its_place(edit, expected):
    assert refusal(edit) == expected


def test_a_file_path_is_named_before_the_place(tmp_path):
    doc = copy.deepcopy(BASE)
    doc["point_masses"]["D"]["value"] = -2
    path = tmp_path / "press.json"
    path.write_text(json.dumps(doc))
    with pytest.raises(kinematics.FileFormatError, match=r"press\.json: point_masses\.D\.value: a mass cannot be"):
        kinematics.load_mechanism(path)


def test_format_2_loads_into_mass_data_in_si():
    data = kinematics.load_mechanism(copy.deepcopy(BASE)).mass_data
    # g*mm^2 to kg*m^2 is 1e-9 (1 g = 1e-3 kg, 1 mm^2 = 1e-6 m^2): exact but for the float product.
    assert data.masses["crank"].inertia_kg_m2 == pytest.approx(BASE["masses"]["crank"]["inertia"]["value"] * 1e-9,
                                                               rel=1e-15)
    assert data.point_masses["D"].mass_kg == 1.5
    assert data.loads["cutting"].over_deg == (200, 320)
    assert data.loads["brake"].torque_n_m == -2.5
    assert list(data.gravity_m_s2) == [0, -9.80665]


def test_a_save_writes_format_1_without_mass_data_and_2_with_it():
    text = kinematics.dumps(kinematics.load_mechanism(copy.deepcopy(BASE)))
    assert json.loads(text) == BASE and json.loads(text)["kinepoly"] == 2
    plain = replace(kinematics.load_mechanism(copy.deepcopy(BASE)), mass_data=None)
    written = json.loads(kinematics.dumps(plain))
    assert written["kinepoly"] == 1 and not {"masses", "point_masses", "loads", "gravity"} & set(written)
    jsonschema.Draft202012Validator(schema(1)).validate(written)


def test_an_inertia_left_out_is_zero_and_stays_out():
    doc = copy.deepcopy(BASE)
    del doc["masses"]["rod"]["inertia"]
    mech = kinematics.load_mechanism(copy.deepcopy(doc))
    assert mech.mass_data.masses["rod"].inertia_kg_m2 == 0
    assert json.loads(kinematics.dumps(mech)) == doc


def test_renames_carry_the_mass_data():
    mech = kinematics.load_mechanism(copy.deepcopy(BASE))
    renamed = rename_link(rename_point(mech, "D", "ram"), "rod", "conrod")
    data = renamed.mass_data
    assert set(data.masses) == {"crank", "conrod"} and data.masses["conrod"].link == "conrod"
    assert data.point_masses["ram"].point == "ram" and "D" not in data.point_masses
    assert data.loads["cutting"].point == "ram" and data.loads["brake"].link == "conrod"
    assert data.masses["conrod"].centre == mech.mass_data.masses["rod"].centre
    # What a save writes loads again: every name the mass data gives exists.
    assert kinematics.load_mechanism(json.loads(kinematics.dumps(renamed))).mass_data == data


def test_a_link_on_a_pinned_load_carries_its_new_name():
    doc = copy.deepcopy(FORMAT_2[1])  # the claw feed, its pad force on the coupler at P
    renamed = rename_link(kinematics.load_mechanism(doc), "coupler", "claw")
    assert renamed.mass_data.loads["pad"].link == "claw"


def test_a_centre_of_mass_follows_its_links_first_two_points():
    # A bar's centre at its midpoint stays at the midpoint when an end moves (common practice: the
    # centre is fixed in the link's shape, which the move stretches and turns).
    mech = kinematics.load_mechanism(copy.deepcopy(FORMAT_2[1]))
    a, b = mech.points["O2"], mech.points["A"]
    crank = replace(mech.mass_data.masses["crank"], centre=((a[0] + b[0]) / 2, (a[1] + b[1]) / 2))
    mech = replace(mech, mass_data=replace(mech.mass_data, masses={**mech.mass_data.masses, "crank": crank}))
    moved = move_point(mech, "A", (0.0, 60.0))
    assert moved.mass_data.masses["crank"].centre == pytest.approx((0.0, 30.0), abs=1e-12)
    # The coupler's centre, in the frame of its first two points A and B, is where it was: A moved, so the
    # coupler's centre moves by the same similarity (a 3-4-5 offset keeps its fractions).
    before, after = mech.mass_data.masses["coupler"].centre, moved.mass_data.masses["coupler"].centre
    za, zb, za2 = complex(*mech.points["A"]), complex(*mech.points["B"]), complex(0.0, 60.0)
    assert (complex(*after) - za2) / (zb - za2) == pytest.approx((complex(*before) - za) / (zb - za), abs=1e-12)
    # A link not holding the moved point keeps its centre.
    assert moved.mass_data.masses["rocker"].centre == mech.mass_data.masses["rocker"].centre


def test_a_third_point_moved_leaves_the_centre_where_it_was():
    mech = kinematics.load_mechanism(copy.deepcopy(FORMAT_2[1]))
    moved = move_point(mech, "P", (80.0, 150.0))  # the coupler's third point: its frame is A and B
    assert moved.mass_data.masses["coupler"].centre == mech.mass_data.masses["coupler"].centre


def test_a_move_that_would_carry_a_centre_past_the_format_limit_is_refused():
    mech = kinematics.load_mechanism(copy.deepcopy(CLAW_FEED))
    crank = kinematics.LinkMass("crank", 1.0, (0.0, 5e8))
    mech = replace(mech, mass_data=kinematics.MassData(masses={"crank": crank}))
    with pytest.raises(kinematics.KinematicsError) as caught:
        move_point(mech, "A", (300.0, 400.0))  # tenfold along itself: the centre from y = 5e8 to 5e9
    assert str(caught.value) == ("points.A: moving point A would carry the centre of mass of link crank to "
                                 "(0, 5e+09), beyond ±1e+09 length units (the file format's limit)")


def test_the_documented_examples_load():
    """Every JSON example of docs/file-format.md loads; the cylinder one its driver, the mass one its mass data."""
    from pathlib import Path

    text = (Path(__file__).resolve().parents[2] / "docs" / "file-format.md").read_text()
    examples = [json.loads(block.split("```", 1)[0]) for block in text.split("```json\n")[1:]]
    assert [doc["kinepoly"] for doc in examples] == [1, 2, 2]
    for doc in examples:
        kinematics.load_mechanism(doc)
    assert kinematics.load_mechanism(examples[1]).driver.stroke_max == 1060
    data = kinematics.load_mechanism(examples[2]).mass_data
    assert data.loads["pressing"].over_deg == (280, 350) and data.masses["rod"].inertia_unit == "kg*mm^2"

