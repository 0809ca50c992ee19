"""No edit makes a design the file format refuses: coordinates stay within ±1e9 length units."""

import pytest

import kinematics
from kinematics.files.storage import save_mechanism
from tests.designs import CLAW_FEED, load


@pytest.mark.parametrize("xy", [(2e9, 80.0), (0.0, -1.0000001e9)])
def test_a_move_beyond_the_format_limit_is_refused_with_the_place(xy):
    with pytest.raises(kinematics.KinematicsError) as caught:
        kinematics.move_point(load(CLAW_FEED), "P", xy)
    assert caught.value.location == "points.P"
    assert "limited to ±1e+09 length units" in caught.value.detail


def test_a_move_to_the_limit_saves_and_reopens(tmp_path):
    moved = kinematics.move_point(load(CLAW_FEED), "P", (1e9, -1e9))
    save_mechanism(moved, tmp_path / "far.json")
    assert kinematics.load_mechanism(tmp_path / "far.json") == moved
