"""Constraints given twice: a finding naming both, never a LinAlgError from the solver.

A repeated constraint adds a row to the constraint Jacobian without adding to its rank; the
Gruebler-Kutzbach count then falls below the true mobility (the redundant-constraint case
# common practice)."""

import copy

import numpy as np
import pytest

import kinematics
from tests.designs import CARTON_PUSHER


def repeated_slide():
    doc = copy.deepcopy(CARTON_PUSHER)
    doc["slides"]["again"] = dict(doc["slides"]["guide"])
    return doc


def slide_that_a_link_fixes():
    """The carton pusher's block D also held by a link "stop" through the ground points E and F:
    the link already keeps D on the line E-F, so the slide repeats it."""
    doc = copy.deepcopy(CARTON_PUSHER)
    doc["links"]["stop"] = ["E", "F", "D"]
    return doc


def test_a_slide_given_twice_is_a_finding_naming_both():
    (finding,) = kinematics.diagnose(kinematics.load_mechanism(repeated_slide()))
    assert finding.location == "slides.again"
    assert finding.message.startswith("slide again is redundant: at this geometry its constraints repeat "
                                      "those of slide guide")
    assert "Gruebler-Kutzbach count 0, true mobility 1" in finding.message


def test_a_slide_repeating_what_a_link_fixes_is_a_finding_naming_both():
    findings = kinematics.diagnose(kinematics.load_mechanism(slide_that_a_link_fixes()))
    assert [f.location for f in findings] == ["slides.guide"]
    assert "slide guide is redundant" in findings[0].message
    assert "link stop" in findings[0].message


@pytest.mark.parametrize("design", [repeated_slide, slide_that_a_link_fixes])
def test_no_linear_algebra_error_reaches_the_caller(design):
    mech = kinematics.load_mechanism(design())
    for analyse in (lambda: kinematics.solve(mech), lambda: kinematics.construct(kinematics.solve(mech)),
                    lambda: kinematics.sweep(mech, 36)):
        try:
            analyse()
        except np.linalg.LinAlgError as error:  # pragma: no cover - the failure this test is about
            pytest.fail(f"LinAlgError: {error}")
        except kinematics.MechanismFindings as refused:
            assert refused.findings[0].location.startswith("slides.")


def test_the_redundant_parallelogram_still_names_the_link():
    """The existing finding for links is unchanged in its place and opening words."""
    doc = {"kinepoly": 1, "points": {"O2": [0, 0], "A": [30, 40], "B": [130, 40], "O4": [100, 0],
                                     "C": [80, 40], "O6": [50, 0]},
           "ground": ["O2", "O4", "O6"],
           "links": {"crank": ["O2", "A"], "coupler": ["A", "B", "C"], "rocker": ["O4", "B"], "extra": ["O6", "C"]},
           "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 60, "unit": "rpm"}}}
    (finding,) = kinematics.diagnose(kinematics.load_mechanism(doc))
    assert finding.location == "links.extra"
    assert "link crank" in finding.message and "link rocker" in finding.message
