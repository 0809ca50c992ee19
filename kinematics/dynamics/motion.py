"""The kinematic input of the forces: a Solution or a Sweep as a batch of poses (:class:`Motion`)."""

from __future__ import annotations

import numpy as np

from ..cycle.sweep import Sweep
from ..model.mechanism import Mechanism
from ..solver.constraints import constraint_system
from ..solver.cylinder import LengthDrivenSystem
from ..solver.solve import DrivenSystem, Solution
from .bodies import Motion, cross

# Below this driver speed (rad/s, or a cylinder's m/s) the velocities per unit speed are solved
# for, not divided out.
NEAR_REST_RAD_S = 1e-150


def _complex(mechanism: Mechanism, names: tuple, array: np.ndarray) -> np.ndarray:
    """(N, n, 2) coordinates as (N, n) complex numbers, the points in the mechanism's order."""
    order = tuple(mechanism.points)
    if names != order:
        array = array[:, [names.index(p) for p in order]]
    return np.ascontiguousarray(array, float).view(complex)[..., 0]


def _unit_rates(mechanism: Mechanism, positions, angle_deg, length_m, velocities, omega):
    """Velocities (N, n) complex and link angular velocities (N, links) per unit driver speed
    (1 rad/s; for a cylinder 1 m/s of extension).

    At a driver speed other than zero they are the velocities divided by it (they are linear in
    it); at rest, or so near it that the velocities lose their digits to underflow, they come
    from the velocity equations solved again at unit speed."""
    driver = mechanism.driver
    speed = driver.linear_speed_m_s if driver.is_actuator else driver.speed_rad_s
    if abs(speed) > NEAR_REST_RAD_S:
        return velocities / speed, omega / speed
    system = constraint_system(mechanism)
    if driver.is_actuator:
        driven, theta = LengthDrivenSystem(system, mechanism), np.asarray(length_m, float)
    else:
        driven, theta = DrivenSystem(system), np.radians(angle_deg)
    x = np.stack([positions.real, positions.imag], axis=-1)
    unit, _ = driven.rates(x, driven.jacobian(x, theta), theta, 1.0, 0.0)
    unit = unit[..., 0] + 1j * unit[..., 1]
    index = {p: i for i, p in enumerate(mechanism.points)}
    first = [index[pts[0]] for pts in mechanism.links.values()]
    second = [index[pts[1]] for pts in mechanism.links.values()]
    side = positions[:, second] - positions[:, first]
    return unit, cross(side, unit[:, second] - unit[:, first]) / np.abs(side) ** 2


def _motion(mechanism, angle_deg, length_m, positions, velocities, accelerations, omega, alpha) -> Motion:
    unit_v, unit_w = _unit_rates(mechanism, positions, angle_deg, length_m, velocities, omega)
    return Motion(angle_deg=angle_deg, positions=positions, accelerations=accelerations, omega=omega,
                  alpha=alpha, unit_velocities=unit_v, unit_omega=unit_w, length_m=length_m)


def from_solution(solution: Solution) -> Motion:
    """One pose as a batch of one."""
    mech = solution.mechanism
    names = tuple(solution.point_names)

    def points(array):
        return _complex(mech, names, np.asarray(array, float)[None])

    length = None if solution.driver_length_m is None else np.array([float(solution.driver_length_m)])
    return _motion(mech, np.array([float(solution.driver_angle_deg)]), length, points(solution.positions),
                   points(solution.velocities), points(solution.accelerations),
                   np.array([[solution.angular_velocity[k] for k in mech.links]], float),
                   np.array([[solution.angular_acceleration[k] for k in mech.links]], float))


def from_sweep(result: Sweep) -> Motion:
    """Every pose of a sweep."""
    mech = result.mechanism
    names = tuple(result.point_names)

    def links(values):
        return np.stack([np.asarray(values[k], float) for k in mech.links], axis=1)

    length = None if result.driver_length_m is None else np.asarray(result.driver_length_m, float)
    return _motion(mech, np.asarray(result.driver_angle_deg, float), length, _complex(mech, names, result.positions),
                   _complex(mech, names, result.velocities), _complex(mech, names, result.accelerations),
                   links(result.angular_velocity), links(result.angular_acceleration))
