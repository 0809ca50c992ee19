"""`kinepoly centres` and the output's advantage and the centrodes over the cycle."""

import json

import numpy as np
import pytest

import kinematics
from app.cli import main
from kinematics.cycle.advantage import advantage_over_cycle
from kinematics.cycle.centrodes import centrodes
from kinematics.cycle.measures import output_motion
from tests.designs import CARTON_PUSHER, SAMPLE_FILES, four_bar, load, slider_crank

QUICK_RETURN = next(p for p in SAMPLE_FILES if p.name.startswith("tile-trimmer"))


def test_cli_json_is_si_and_names_pairs_in_the_file_order(tmp_path, capsys):
    path = tmp_path / "pusher.json"
    path.write_text(json.dumps(CARTON_PUSHER))
    assert main(["centres", str(path), "--angle", "30", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert list(data["centres"])[:4] == ["ground|crank", "crank|rod", "rod|guide", "ground|guide"]
    assert data["centres"]["ground|crank"] == {"at": [0.0, 0.0]}  # metres
    assert data["centres"]["ground|guide"] == {"direction": [0.0, 1.0]}
    assert len(data["centres"]) == 6
    assert data["crosscheck"]["max_relative_difference"] <= 1e-9


def test_cli_json_states_an_undetermined_centre_with_its_reason(capsys):
    assert main(["centres", str(QUICK_RETURN), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["centres"]["crank|rod"] == {"undetermined": (
        "the lines through I ground|crank, I ground|rod and through I crank|lever, I lever|rod coincide "
        "(Kennedy's theorem for crank, rod with ground and with lever)")}
    assert data["centres"]["ground|rod"] == {"direction": [0.0, 1.0]}


def test_cli_table_in_mm_with_how_each_was_found(capsys):
    assert main(["centres", str(QUICK_RETURN)]) == 0
    out = capsys.readouterr().out
    assert "ground|crank        0.000    150.000  primary: the pin O2" in out
    assert "ground|rod    at infinity, direction 90.00°  the lines through I ground|lever, I lever|rod and " \
           "through I ground|ram, I rod|ram are parallel" in out
    assert "crank|rod               undetermined  the lines through" in out
    assert "largest relative difference" in out
    assert "link lever: velocity ratio 0.285714 rad/rad, mechanical advantage 3.5 N·m/N·m" in out


def test_cli_refuses_a_bad_angle_with_its_place(capsys):
    assert main(["centres", str(QUICK_RETURN), "--angle", "inf"]) == 2
    assert "angle" in capsys.readouterr().err


def test_cycle_advantage_locks_where_the_rocker_stops():
    # The output locks (infinite advantage) at the rocker's limit positions, where its rate reverses
    # (common practice): the same angles as the check report's rate reversals.
    result = kinematics.sweep(load(four_bar(40, 120, 100, 140, 30)), 720)
    cycle = advantage_over_cycle(result)
    assert cycle.unit == "rad/rad" and cycle.velocity_ratio.shape == result.driver_angle_deg.shape
    reversals = output_motion(result.mechanism, result)["rate_reversals_deg"]
    assert np.allclose(sorted(cycle.locks_at_deg), sorted(a % 360.0 for a in reversals), atol=1e-9)
    least = int(np.argmax(np.abs(cycle.velocity_ratio)))
    assert cycle.least_at_deg == result.driver_angle_deg[least]
    assert cycle.least_advantage == pytest.approx(1 / abs(cycle.velocity_ratio[least]), rel=1e-12)


def test_cycle_advantage_of_an_in_line_slider_crank_locks_at_its_dead_centres():
    # In line, the piston stops at θ = 0° and 180° (inner and outer dead centre; common practice).
    cycle = advantage_over_cycle(kinematics.sweep(load(slider_crank(30.0, 110.0, 0.0, 50.0)), 720))
    assert cycle.unit == "m/rad"
    assert sorted(round(a, 6) % 360.0 for a in cycle.locks_at_deg) == [0.0, 180.0]


def test_fixed_centrode_of_a_four_bar_runs_through_the_crank_and_rocker_lines():
    # Each point of the fixed centrode is where the crank and rocker lines meet (common practice);
    # the moving centrode is the same point in the coupler's frame, at the same distance from A.
    result = kinematics.sweep(load(four_bar(40, 120, 100, 140, 30)), 360)
    found = centrodes(result)
    assert found.link == "coupler" and found.fixed
    index = {n: i for i, n in enumerate(result.point_names)}
    o2, a, b, o4 = (result.positions[:, index[p]] for p in ("O2", "A", "B", "O4"))
    u, w = a - o2, b - o4
    t = ((o4 - o2)[:, 0] * w[:, 1] - (o4 - o2)[:, 1] * w[:, 0]) / (u[:, 0] * w[:, 1] - u[:, 1] * w[:, 0])
    meets = o2 + t[:, None] * u
    for piece in found.fixed:
        nearest = np.min(np.linalg.norm(meets[None, :, :] - piece[:, None, :], axis=2), axis=1)
        assert nearest.max() <= 1e-9
    for fixed, moving in zip(found.fixed, found.moving, strict=True):
        assert len(fixed) == len(moving)
        assert np.all(np.linalg.norm(moving, axis=1) <= 20.0 * result.mechanism.size / 1000 + 1e-12)


def test_a_mechanism_with_no_output_says_so():
    doc = four_bar(40, 120, 100, 140, 30)
    del doc["output"]
    with pytest.raises(kinematics.KinematicsError, match="names no output") as err:
        advantage_over_cycle(kinematics.sweep(load(doc), 90))
    assert err.value.location == "output"
