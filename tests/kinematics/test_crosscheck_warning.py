"""A cross-check figure above its threshold always comes with a warning that says why.

The figures are forced (monkeypatched) because the core now keeps well-posed designs far below the
threshold; what is tested is that the words follow the figure. Rounding of a coordinate is about
2.2e-16 of its distance from the origin (IEEE 754 double, numpy.finfo(float).eps), so a design
5e8 mm from the origin and 100 mm across keeps about 7 fewer digits of its lengths.
"""

import pytest

import kinematics
from kinematics.construction import construct as construct_module
from kinematics.construction.construct import CROSS_CHECK_LIMIT
from tests.designs import four_bar, load


def _design(offset_mm):
    design = four_bar(20, 60, 45, 55, 60.0, coupler_point=(30, 30))
    design["points"] = {k: [x + offset_mm, y] for k, (x, y) in design["points"].items()}
    return load(design)


def _forced(monkeypatch, figure):
    monkeypatch.setattr(construct_module, "_crosscheck", lambda *_: (figure, "B (velocity)"))


def _crosscheck_words(construction):
    return [w for w in construction.warnings if w.startswith("cross-check")]


def test_far_from_the_origin_the_warning_gives_the_distance(monkeypatch):
    _forced(monkeypatch, 1.21e-8)  # the figure reported for a design 5e8 mm from the origin
    words = _crosscheck_words(kinematics.construct(kinematics.solve(_design(5e8), None)))
    assert len(words) == 1
    assert "1.21e-08" in words[0] and "B (velocity)" in words[0] and "from the origin" in words[0]
    assert "5e+08 mm" in words[0]


def test_a_figure_no_known_cause_explains_says_so(monkeypatch):
    _forced(monkeypatch, 2e-9)
    words = _crosscheck_words(kinematics.construct(kinematics.solve(_design(0.0), None)))
    assert len(words) == 1 and "neither the conditioning" in words[0]


@pytest.mark.parametrize("figure", [0.0, 1e-12, CROSS_CHECK_LIMIT])
def test_at_or_below_the_threshold_there_is_no_such_warning(monkeypatch, figure):
    _forced(monkeypatch, figure)
    assert _crosscheck_words(kinematics.construct(kinematics.solve(_design(5e8), None))) == []
