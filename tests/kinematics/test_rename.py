"""Renaming joints and links: every reference follows, bad names are refused in words, and a
renamed design saves, loads and solves exactly as the original (renaming is a pure relabelling)."""

import json

import numpy as np
import pytest

import kinematics
from kinematics import KinematicsError, rename_link, rename_point
from tests.designs import SAMPLE_FILES, SAMPLES, solve_at


def sample(name):
    return kinematics.load_mechanism(SAMPLES / name)


def document(mechanism):
    return json.loads(kinematics.dumps(mechanism))


def test_they_are_exported_beside_move_point():
    assert {"rename_point", "rename_link", "move_point"} <= set(kinematics.__all__)


def test_every_reference_to_a_point_follows_it():
    # Tile trimmer: A is the crank pin and slides in the lever's slot C-T; C is the lever's
    # pivot and the slot's first point; O2 is the driver's pivot.
    mech = sample("tile-trimmer-quick-return.json")
    renamed = rename_point(rename_point(rename_point(mech, "A", "crank_pin"), "C", "lever_pivot"), "O2", "O2_main")
    doc = document(renamed)
    assert list(doc["points"]) == ["lever_pivot", "O2_main", "crank_pin", "T", "R", "G1", "G2"]
    assert doc["points"]["crank_pin"] == list(mech.points["A"])
    assert doc["ground"] == ["lever_pivot", "O2_main", "G1", "G2"]
    assert doc["links"] == {"crank": ["O2_main", "crank_pin"], "lever": ["lever_pivot", "T"],
                            "rod": ["T", "R"]}
    assert doc["slides"] == {"slot": {"point": "crank_pin", "guide": "lever", "line": ["lever_pivot", "T"]},
                             "ram": {"point": "R", "guide": "ground", "line": ["G1", "G2"]}}
    assert (doc["driver"]["link"], doc["driver"]["pivot"]) == ("crank", "O2_main")


def test_an_output_point_follows_its_rename():
    renamed = rename_point(sample("cap-press-feeder.json"), "D", "ram_pin")
    doc = document(renamed)
    assert doc["output"] == {"point": "ram_pin"}
    assert doc["slides"]["ram"]["point"] == "ram_pin"
    assert doc["links"]["rod"] == ["A", "ram_pin"]


def test_every_reference_to_a_link_follows_it():
    # The lever guides the slot and is the output; the crank is the driver.
    mech = sample("tile-trimmer-quick-return.json")
    renamed = rename_link(rename_link(mech, "lever", "slotted_lever"), "crank", "input")
    doc = document(renamed)
    assert list(doc["links"]) == ["input", "slotted_lever", "rod"]
    assert doc["links"]["slotted_lever"] == ["C", "T"]
    assert doc["slides"]["slot"]["guide"] == "slotted_lever"
    assert doc["slides"]["ram"]["guide"] == "ground"
    assert doc["output"] == {"link": "slotted_lever"}
    assert doc["driver"]["link"] == "input"


def test_only_the_names_change():
    mech = sample("tile-trimmer-quick-return.json")
    before, after = document(mech), document(rename_link(rename_point(mech, "T", "tip"), "rod", "ram_rod"))
    for key in ("title", "notes", "length_unit", "analysis_angles_deg"):
        assert after.get(key) == before.get(key)
    assert list(after["points"].values()) == list(before["points"].values())
    assert {k: v for k, v in after["driver"].items() if k not in ("link", "pivot")} == \
        {k: v for k, v in before["driver"].items() if k not in ("link", "pivot")}


def test_the_same_name_is_no_edit_and_a_change_of_case_is_allowed():
    mech = sample("label-swing-arm.json")
    assert rename_point(mech, "A", "A") is mech and rename_link(mech, "crank", "crank") is mech
    assert "a" in rename_point(mech, "A", "a").points
    assert "Crank" in rename_link(mech, "crank", "Crank").links


FOUR_BAR = "label-swing-arm.json"  # points O2 A B O4 P; links crank coupler rocker
CLASH = "(names of points, links and slides must differ ignoring case)"


@pytest.mark.parametrize("rename, old, new, message", [
    (rename_point, "A", "", "points.A: point A needs a name: the new name is empty"),
    (rename_point, "A", None, "points.A: point A needs a name in text, not NoneType"),
    (rename_point, "A", "crank pin",
     'points.A: point A cannot be called "crank pin": a name is a letter, then letters, digits or _'),
    (rename_point, "A", "2A", 'points.A: point A cannot be called "2A": a name is a letter, then letters, digits or _'),
    (rename_point, "A", "A\n",
     'points.A: point A cannot be called "A\n": a name is a letter, then letters, digits or _'),
    (rename_point, "A", "Ground", 'points.A: point A cannot be called "Ground": "ground" names the frame'),
    (rename_point, "A", "B", f'points.A: point A cannot be called "B": it clashes with point "B" {CLASH}'),
    (rename_point, "A", "p", f'points.A: point A cannot be called "p": it clashes with point "P" {CLASH}'),
    (rename_point, "A", "crank", f'points.A: point A cannot be called "crank": it clashes with link "crank" {CLASH}'),
    (rename_point, "Q", "tamper", 'points: unknown point "Q"'),
    (rename_link, "rocker", "", "links.rocker: link rocker needs a name: the new name is empty"),
    (rename_link, "rocker", "out-put",
     'links.rocker: link rocker cannot be called "out-put": a name is a letter, then letters, digits or _'),
    (rename_link, "rocker", "GROUND", 'links.rocker: link rocker cannot be called "GROUND": "ground" names the frame'),
    (rename_link, "rocker", "Coupler",
     f'links.rocker: link rocker cannot be called "Coupler": it clashes with link "coupler" {CLASH}'),
    (rename_link, "rocker", "O4",
     f'links.rocker: link rocker cannot be called "O4": it clashes with point "O4" {CLASH}'),
    (rename_link, "arm", "tamper", 'links: unknown link "arm"'),
    (rename_link, "A", "tamper", 'links: unknown link "A"'),
])
def test_bad_names_are_refused_in_words(rename, old, new, message):
    mech = sample(FOUR_BAR)
    with pytest.raises(KinematicsError) as caught:
        rename(mech, old, new)
    assert str(caught.value) == message
    assert document(mech) == document(sample(FOUR_BAR))


def test_a_name_may_not_take_a_slides_name():
    with pytest.raises(KinematicsError) as caught:
        rename_point(sample("cap-press-feeder.json"), "D", "RAM")
    assert str(caught.value) == f'points.D: point D cannot be called "RAM": it clashes with slide "ram" {CLASH}'


def rename_everything(mech):
    """Every point and every link under a new name (``..._2``), and the old-to-new tables."""
    points = {name: f"{name}_2" for name in mech.points}
    links = {name: f"{name}_2" for name in mech.links}
    for old, new in points.items():
        mech = rename_point(mech, old, new)
    for old, new in links.items():
        mech = rename_link(mech, old, new)
    return mech, points, links


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_a_renamed_design_round_trips_through_its_file(path):
    renamed, points, _links = rename_everything(kinematics.load_mechanism(path))
    text = kinematics.dumps(renamed)
    again = kinematics.load_mechanism(json.loads(text))
    assert again == renamed
    assert kinematics.dumps(again) == text
    assert not set(points) & set(again.points)


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_a_renamed_design_solves_to_the_same_numbers(path):
    # Identity property: renaming changes no number, so the original is the reference; exact equality.
    original = kinematics.load_mechanism(path)
    renamed, points, links = rename_everything(original)
    for angle in (None, 37.0, 211.5):
        before, after = solve_at(original, angle), solve_at(renamed, angle)
        assert after.point_names == tuple(points[n] for n in before.point_names)
        assert after.driver_angle_deg == before.driver_angle_deg
        for field in ("positions", "velocities", "accelerations"):
            assert np.array_equal(getattr(after, field), getattr(before, field)), field
        for field in ("link_angle_deg", "angular_velocity", "angular_acceleration"):
            assert getattr(after, field) == {links[n]: v for n, v in getattr(before, field).items()}, field
        assert after.sliding_velocity == before.sliding_velocity
        assert after.sliding_acceleration == before.sliding_acceleration
        assert after.condition == before.condition


@pytest.mark.parametrize("path", [p for p in SAMPLE_FILES if kinematics.load_mechanism(p).slides], ids=lambda p: p.stem)
def test_a_renamed_slide_round_trips_and_solves_to_the_same_numbers(path):
    # Identity property: renaming changes no number, so the original is the reference; exact equality.
    original = kinematics.load_mechanism(path)
    names = {old: f"s_{old}" for old in original.slides}
    renamed = original
    for old, new in names.items():
        renamed = kinematics.rename_slide(renamed, old, new)
    assert kinematics.load_mechanism(json.loads(kinematics.dumps(renamed))) == renamed
    before, after = solve_at(original, None), solve_at(renamed, None)
    assert np.array_equal(after.velocities, before.velocities)
    assert after.sliding_velocity == {names[k]: v for k, v in before.sliding_velocity.items()}


def test_a_slide_name_is_refused_in_words():
    mech = kinematics.load_mechanism(SAMPLES / "cap-press-feeder.json")
    with pytest.raises(KinematicsError, match='slide ram cannot be called "rod": it clashes with link "rod"'):
        kinematics.rename_slide(mech, "ram", "rod")
    with pytest.raises(KinematicsError, match='unknown slide "slot"'):
        kinematics.rename_slide(mech, "slot", "s")
