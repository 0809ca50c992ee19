"""solve() is a function of the mechanism and the angle alone, and its results are values.

No outside reference is needed here: what is checked is that two computations of the same
thing are the same to the bit, and that the frozen results refuse to be written.
"""

import numpy as np
import pytest

import kinematics
from tests.designs import SAMPLE_FILES, TRIPLE_ROCKER, load, solve_at

HISTORY_DEG = (37.0, 250.0, 99.9, 100.1, 104.9, 95.1, 300.0, 100.0001)


def _same(first, second):
    for name in ("positions", "velocities", "accelerations"):
        assert np.array_equal(getattr(first, name), getattr(second, name)), name
    for name in ("link_angle_deg", "angular_velocity", "angular_acceleration", "sliding_velocity",
                 "sliding_acceleration"):
        assert dict(getattr(first, name)) == dict(getattr(second, name)), name
    assert first.warnings == second.warnings


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_a_pose_does_not_depend_on_the_poses_solved_before(path):
    fresh = solve_at(kinematics.load_mechanism(path), 100.0)
    worn = kinematics.load_mechanism(path)  # equal to the first, its own caches
    for angle in HISTORY_DEG:
        solve_at(worn, angle)
    _same(fresh, solve_at(worn, 100.0))


def test_a_rocking_driver_is_the_same_whatever_came_before():
    mech = load(TRIPLE_ROCKER)
    low, high = kinematics.sweep(mech, 90).range_deg
    inside = 0.5 * (low + high)
    fresh = kinematics.solve(load(TRIPLE_ROCKER), inside)
    for angle in (low + 0.5, high - 0.5, inside + 7.0, inside - 3.0):
        kinematics.solve(mech, angle)
    _same(fresh, kinematics.solve(mech, inside))


def test_a_crank_dragged_back_and_forth_stays_on_its_branch():
    """Small turns either way across several checkpoints give the closed-form poses of the sweep
    (the dyads' own branch), to 1e-9 of the linkage's size: Newton converges to 1e-12 of it,
    and a jump to the other branch would differ by a good part of it."""
    path = SAMPLE_FILES[0]
    mech = kinematics.load_mechanism(path)
    swept = kinematics.sweep(mech, 3600)
    size = mech.size * mech.metres_per_unit
    index = [swept.point_names.index(n) for n in kinematics.solve(mech).point_names]
    k = 600
    for step in (1, 3, -2, 5, -7, 40, -90, 2, 130, -1):
        k += step
        solution = kinematics.solve(mech, float(swept.driver_angle_deg[k]))
        assert np.abs(solution.positions - swept.positions[k, index]).max() < 1e-9 * size


def test_a_solution_cannot_be_written():
    solution = kinematics.solve(kinematics.load_mechanism(SAMPLE_FILES[0]), 30.0)
    for array in (solution.positions, solution.velocities, solution.accelerations):
        with pytest.raises(ValueError, match="read-only"):
            array[0, 0] = 1.0
    link = next(iter(solution.angular_velocity))
    for mapping in (solution.link_angle_deg, solution.angular_velocity, solution.angular_acceleration,
                    solution.sliding_velocity, solution.sliding_acceleration):
        with pytest.raises(TypeError):
            mapping[link] = 1.0


def test_a_sweep_cannot_be_written():
    result = kinematics.sweep(kinematics.load_mechanism(SAMPLE_FILES[0]), 36)
    for array in (result.driver_angle_deg, result.positions, result.velocities, result.accelerations,
                  result.time_s):
        with pytest.raises(ValueError, match="read-only"):
            array[0] = 1.0
    link = next(iter(result.angular_velocity))
    with pytest.raises(ValueError, match="read-only"):
        result.angular_velocity[link][0] = 1.0
    with pytest.raises(TypeError):
        result.angular_velocity[link] = np.zeros(36)
