"""The change-point search of a sweep has a fixed budget, whatever the design.

The design: a four-bar whose frame O2O4 has zero length, crank 60, coupler 40, rocker 20 + 1e-6
(s + l = p + q within a hair: 0 + 60 against 40 + 20.000001). With the pivots together the
triangle A-B-O4 keeps its shape, so the coupler and rocker stay within a hair of straight over the
whole turn and nearly every probe of their nearness is a suspect peak. A change point is where the
Grashof sum s + l equals p + q (Norton, Design of Machinery, 5th ed., §2.14, Class III; # from memory).
"""

import numpy as np
import pytest

from kinematics.cycle import sweep as sweep_module
from kinematics.cycle.sweep import CHANGE_POINT_BATCH, CHANGE_POINT_ROUNDS, CHANGE_POINT_SUSPECTS, PROBE_STEPS, sweep
from kinematics.errors import ParallelLines
from tests.designs import four_bar, load


def _counting(monkeypatch):
    placed = []
    place = sweep_module._place

    def counted(mech, decomposition, angles_rad):
        placed.append(len(angles_rad))
        return place(mech, decomposition, angles_rad)

    monkeypatch.setattr(sweep_module, "_place", counted)
    return placed


def test_a_design_near_straight_all_turn_is_searched_within_the_budget(monkeypatch):
    mech = load(four_bar(60.0, 40.0, 20.0 + 1e-6, 0.0, 60.0))
    placed = _counting(monkeypatch)
    result = sweep(mech, steps=180)
    assert result.full_turn and len(result.driver_angle_deg) == 180
    # The probe, the change-point rounds, the 180 swept poses: nothing else is placed.
    assert placed[0] == PROBE_STEPS and placed[-1] == 180
    search = placed[1:-1]
    assert len(search) == CHANGE_POINT_ROUNDS
    assert sum(search) <= CHANGE_POINT_ROUNDS * CHANGE_POINT_SUSPECTS * (CHANGE_POINT_BATCH + 2)
    # Golden-section search point by point placed 121 single angles per suspect peak: here
    # thousands of peaks, hundreds of thousands of placements.
    probe = sweep_module._place(mech, sweep_module.decompose(mech), np.radians(result.driver_angle_deg[0]
                                                                               + np.arange(PROBE_STEPS) * 0.1))
    nearness = next(iter(probe.nearness.values()))
    assert (nearness > 0.999).sum() > 1000, "the design is the hostile case it is meant to be"


def test_the_bounded_search_still_finds_an_exact_change_point():
    # s + l = p + q exactly: crank 20, coupler 50, rocker 40, frame 30 (20 + 50 = 40 + 30).
    mech = load(four_bar(20.0, 50.0, 40.0, 30.0, 60.0))
    with pytest.raises(ParallelLines, match="change point"):
        sweep(mech, steps=180)
