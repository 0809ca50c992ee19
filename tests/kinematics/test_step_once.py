"""Each construction step appears once, and a cross-check figure below what doubles can resolve is
said as rounding, not as a number."""

import collections
import json

import pytest

import kinematics
from kinematics.construction.construct import Role
from kinematics.groups.steps import ROUNDING_FLOOR, agreement
from kinematics.reports.text import construction_text
from tests.designs import SAMPLE_FILES


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.name)
def test_every_point_of_a_polygon_is_found_and_named_by_one_step(path):
    construction = kinematics.construct(kinematics.solve(kinematics.load_mechanism(path)))
    for polygon in (construction.velocity, construction.acceleration):
        named = collections.Counter(s.label for s in polygon.steps if s.role in (Role.IMAGE, Role.INTERSECTION))
        assert [label for label, count in named.items() if count > 1] == [], path.name


def test_the_quick_return_names_the_lever_point_under_the_pin_in_one_step():
    quick = next(p for p in SAMPLE_FILES if "quick-return" in p.name)
    construction = kinematics.construct(kinematics.solve(kinematics.load_mechanism(quick)))
    texts = [s.text for s in construction.velocity.steps]
    assert sum("image of the point of lever under A" in t for t in texts) == 1
    texts = [s.text for s in construction.acceleration.steps]
    assert sum("image of the point of lever under A" in t for t in texts) == 1


def test_a_difference_below_the_rounding_floor_agrees_to_rounding():
    # IEEE 754 binary64: machine epsilon 2.2e-16, so a relative figure of 2.1e-32 says nothing.
    assert agreement(2.1e-32) == "agrees to rounding"
    assert agreement(0.0) == "agrees to rounding"
    assert agreement(3.2e-12) == "agrees to 3.2e-12 (largest relative difference)"
    assert agreement(ROUNDING_FLOOR) != "agrees to rounding"


def test_the_command_line_text_and_the_json_say_it_their_own_ways(capsys):
    from app.cli import main

    quick = next(p for p in SAMPLE_FILES if "quick-return" in p.name)
    construction = kinematics.construct(kinematics.solve(kinematics.load_mechanism(quick)))
    assert construction.max_relative_difference < ROUNDING_FLOOR  # the sample's figure, as measured
    assert construction_text(construction).splitlines()[-1] == \
        "cross-check against the numeric solver: agrees to rounding"
    assert main(["construct", str(quick), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["crosscheck"]["max_relative_difference"] == construction.max_relative_difference, \
        "machine-readable output keeps the number"
