"""The kinematic input of the forces: a Solution or a Sweep as a batch of poses (:class:`Motion`)."""

from __future__ import annotations

import numpy as np

from ..cycle.sweep import Sweep
from ..model.mechanism import Mechanism
from ..solver.constraints import constraint_system
from ..solver.solve import Solution, _Driven
from .bodies import Motion, cross


def _ordered(mechanism: Mechanism, names: tuple, array: np.ndarray) -> np.ndarray:
    """``array`` (N, n, 2) with its point axis in the mechanism's point order."""
    order = tuple(mechanism.points)
    if names == order:
        return array
    return array[:, [names.index(p) for p in order]]


def _unit_rates(mechanism: Mechanism, positions: np.ndarray, angle_deg: np.ndarray, velocities, omega):
    """Velocities (N, n, 2) and link angular velocities (N, links) per unit driver speed.

    At a driver speed other than zero they are the velocities divided by it (they are linear in
    it); at rest they come from the velocity equations solved again at unit speed."""
    speed = mechanism.driver.speed_rad_s
    if speed != 0.0:
        return velocities / speed, omega / speed
    driven = _Driven(constraint_system(mechanism))
    theta = np.radians(angle_deg)
    unit, _ = driven.rates(positions, driven.jacobian(positions, theta), theta, 1.0, 0.0)
    first = [list(mechanism.points).index(pts[0]) for pts in mechanism.links.values()]
    second = [list(mechanism.points).index(pts[1]) for pts in mechanism.links.values()]
    side = positions[:, second] - positions[:, first]
    turning = cross(side, unit[:, second] - unit[:, first]) / np.einsum("...i,...i->...", side, side)
    return unit, turning


def _motion(mechanism, angle_deg, positions, velocities, accelerations, omega, alpha) -> Motion:
    unit_v, unit_w = _unit_rates(mechanism, positions, angle_deg, velocities, omega)
    return Motion(angle_deg=angle_deg, positions=positions, accelerations=accelerations, omega=omega,
                  alpha=alpha, unit_velocities=unit_v, unit_omega=unit_w)


def from_solution(solution: Solution) -> Motion:
    """One pose as a batch of one."""
    mech = solution.mechanism
    names = tuple(solution.point_names)

    def points(array):
        return _ordered(mech, names, np.asarray(array, float)[None])

    return _motion(mech, np.array([float(solution.driver_angle_deg)]), points(solution.positions),
                   points(solution.velocities), points(solution.accelerations),
                   np.array([[solution.angular_velocity[k] for k in mech.links]], float),
                   np.array([[solution.angular_acceleration[k] for k in mech.links]], float))


def from_sweep(result: Sweep) -> Motion:
    """Every pose of a sweep."""
    mech = result.mechanism
    names = tuple(result.point_names)

    def links(values):
        return np.stack([np.asarray(values[k], float) for k in mech.links], axis=1)

    return _motion(mech, np.asarray(result.driver_angle_deg, float), _ordered(mech, names, result.positions),
                   _ordered(mech, names, result.velocities), _ordered(mech, names, result.accelerations),
                   links(result.angular_velocity), links(result.angular_acceleration))
