"""The output's mechanical advantage over the cycle: closed forms, locking angles, and where the
check report and the peaks table state it."""

import json
import math

import numpy as np
import pytest

import kinematics
from app.cli import main
from kinematics.cycle.advantage import advantage_over_cycle
from kinematics.cycle.measures import clear_of_dead_points, rate_zeros
from kinematics.cycle.peaks import peaks
from kinematics.reports.check_text import check_sentences
from tests.designs import four_bar, load, slider_crank, slotted_lever

# The sweep evaluates the same closed forms as the formulas below in another order: agreement to a
# few hundred ulps of the crank radius (1e-12 relative, with margin) is what rounding allows.
CLOSED_FORM = 1e-12


def test_slider_crank_velocity_ratio_over_the_cycle_is_r_sin_theta_plus_beta_over_cos_beta():
    # In-line slider-crank, crank r at θ, rod l at β (sin β = r sin θ / l): dx/dθ = −r·sin(θ + β)/cos β
    # (common practice). The slide runs along +x, so the ratio is that, in m/rad.
    r, rod = 30.0, 110.0
    cycle = advantage_over_cycle(kinematics.sweep(load(slider_crank(r, rod, 0.0, 20.0)), 720))
    theta = np.radians(cycle.driver_angle_deg)
    beta = np.arcsin(r * np.sin(theta) / rod)
    expected = -r / 1000 * np.sin(theta + beta) / np.cos(beta)
    assert cycle.unit == "m/rad" and cycle.advantage_unit == "N/(N·m)"
    assert np.allclose(cycle.velocity_ratio, expected, rtol=0, atol=CLOSED_FORM * r / 1000)
    moving = np.abs(expected) > 1e-6
    assert np.allclose(cycle.mechanical_advantage[moving], 1 / expected[moving], rtol=1e-9)
    # The piston stops at inner and outer dead centre, 0° and 180°, once each (common practice),
    # though both are swept poses exactly: a sample at zero is one lock, not two crossings.
    assert [round(a, 9) for a in sorted(cycle.locks_at_deg)] == [0.0, 180.0]
    dead_centres = np.isclose(np.abs(np.sin(theta)), 0.0, atol=1e-12)
    assert dead_centres.sum() == 2 and np.isinf(cycle.mechanical_advantage[dead_centres]).all()
    # The least advantage is where |dx/dθ| is largest, near the crank at right angles to the rod (the
    # two strokes mirror each other in line, so either of the two mirrored angles).
    at = np.flatnonzero(cycle.driver_angle_deg == cycle.least_at_deg)
    assert abs(expected[at[0]]) == pytest.approx(np.abs(expected).max(), rel=1e-12)
    assert cycle.least_advantage == pytest.approx(1 / np.abs(expected).max(), rel=1e-9)


def test_slotted_lever_least_advantage_and_locks_in_closed_form():
    # Crank r, centres d apart, slot through the lever pivot (common practice): the lever turns fastest
    # with the crank pin nearest its pivot, ω_lever/ω_crank = r/(d − r), so the least advantage is
    # (d − r)/r there (θ = 270° with the crank pivot above the lever's); the lever stops (locks) where
    # crank and lever are perpendicular, θ = 270° ± arccos(r/d) (the quick stroke's 2·arccos(r/d) between).
    r, d = 40.0, 110.0
    cycle = advantage_over_cycle(kinematics.sweep(load(slotted_lever(r, d, 65.0)), 720))
    assert cycle.unit == "rad/rad" and cycle.advantage_unit == "N·m/N·m"
    assert cycle.least_at_deg == pytest.approx(270.0, abs=1e-9)
    assert cycle.least_advantage == pytest.approx((d - r) / r, rel=1e-12)
    half = math.degrees(math.acos(r / d))
    # Locks by linear interpolation between poses 0.5° apart: the rate is smooth and crosses zero with
    # a slope, so the interpolation error is of the order of the step squared times its curvature.
    assert sorted(cycle.locks_at_deg) == pytest.approx([270.0 - half, 270.0 + half], abs=2e-3)


def test_a_rocking_driver_leaves_its_dead_points_out_of_the_least_advantage():
    # A double rocker (Grashof with the coupler shortest; common practice): at the driver's own dead
    # points the advantage falls to zero, which says nothing about the output.
    result = kinematics.sweep(load(four_bar(80, 60, 90, 100, 60)), 720)
    assert not result.full_turn
    cycle = advantage_over_cycle(result)
    clear = clear_of_dead_points(result)
    assert cycle.least_at_deg in result.driver_angle_deg[clear]
    assert cycle.least_advantage == pytest.approx(1 / np.abs(cycle.velocity_ratio[clear]).max(), rel=1e-15)


def test_rate_zeros_interpolates_and_counts_a_zero_sample_once():
    angles = np.arange(0.0, 360.0, 90.0)
    assert rate_zeros(angles, np.array([1.0, -1.0, 0.0, 1.0]), True) == ([0, 2], [45.0, 180.0])
    # A rocking driver does not run on from its last sample to its first.
    assert rate_zeros(angles, np.array([1.0, 2.0, 3.0, -1.0]), False) == ([2], [247.5])
    assert rate_zeros(angles, np.array([1.0, 2.0, 3.0, -1.0]), True) == ([2, 3], [247.5, 315.0])
    assert rate_zeros(angles, np.array([0.0, 0.0, 1.0, 1.0]), False) == ([0], [0.0])


def test_check_report_states_the_least_advantage_and_the_locks():
    lines = check_sentences(load(slotted_lever(40.0, 110.0, 65.0))).lines
    line = next(x for x in lines if x.startswith("mechanical advantage"))
    assert line.startswith("mechanical advantage of link lever: least 1.75 N·m/N·m at driver angle 270.00°; "
                           "the output locks (toggle, infinite advantage) at ")


def test_a_crank_output_never_locks_and_says_so():
    doc = four_bar(40, 120, 100, 140, 30)
    doc["output"] = {"link": "crank"}
    line = next(x for x in check_sentences(load(doc)).lines if x.startswith("mechanical advantage"))
    assert line == ("mechanical advantage of link crank: least 1 N·m/N·m at driver angle 30.00°; the output never "
                    "locks in the cycle")


def test_peaks_table_and_json_carry_the_advantage(tmp_path, capsys):
    table = peaks(kinematics.sweep(load(slider_crank(30.0, 110.0, 0.0, 20.0)), 720))
    assert table["mechanical_advantage"]["advantage_unit"] == "N/(N·m)"
    assert sorted(round(a, 9) for a in table["mechanical_advantage"]["locks_at_deg"]) == [0.0, 180.0]
    path = tmp_path / "press.json"
    path.write_text(json.dumps(slider_crank(30.0, 110.0, 0.0, 20.0)))
    assert main(["sweep", str(path), "--peaks"]) == 0
    assert "mechanical advantage of point D: least " in capsys.readouterr().out
    assert main(["sweep", str(path), "--steps", "720", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["peaks"]["mechanical_advantage"]["least_advantage"] == pytest.approx(
        table["mechanical_advantage"]["least_advantage"], rel=1e-15)
