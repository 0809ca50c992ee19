"""The numeric solver for a cylinder driver: the driver row is the cylinder's length,
|B − C|² = L², in place of the rotary driver's angle; the pose at a length is reached from the
reference pose by extending or retracting the cylinder (continuation in L), and the rates come
from the same three linear solves with their exact right-hand sides.
"""

from __future__ import annotations

import math

import numpy as np

from ..errors import CannotAssemble, KinematicsError
from ..groups.decompose import decompose
from ..groups.poses import pose_warnings
from ..model.mechanism import Mechanism
from .constraints import ConstraintSystem, constraint_system
from .solve import DrivenSystem, Solution, _link_jerks, _link_rates, _slide_jerks, _slide_rates, track


class LengthDrivenSystem(DrivenSystem):
    """The constraint system with the cylinder's row (|w|² − L²)/(2L), w = B − C, over the unknowns.

    The parameter every method calls ``theta`` is here the length L (m); its rates L̇, L̈ are the
    ``omega`` and ``alpha`` arguments, so the continuation of :func:`track` runs unchanged."""

    def __init__(self, system: ConstraintSystem, mechanism: Mechanism):
        super().__init__(system)
        slide = mechanism.slides[mechanism.driver.slide]
        self.pivot = system.names.index(slide.line[0])
        self.rod_end = system.names.index(slide.point)
        self.pair_columns = np.array([2 * self.rod_end, 2 * self.rod_end + 1, 2 * self.pivot, 2 * self.pivot + 1])

    def _axis(self, x):
        return x[..., self.rod_end, :] - x[..., self.pivot, :]

    def residual(self, x, theta):
        """The constraint values with the cylinder's row (|w|² − L²)/(2L) last, ``theta`` = L (m)."""
        w = self._axis(x)
        drive = (np.sum(w * w, axis=-1) - theta ** 2) / (2.0 * theta)
        return np.concatenate([self.system.values(x), drive[..., None]], axis=-1)

    def jacobian(self, x, theta):
        """The residual's derivative with respect to the unknown coordinates (its last row w/L, −w/L)."""
        jac = self.system.jacobian(x)
        w = self._axis(x) / np.asarray(theta, float)[..., None]
        row = np.zeros(x.shape[:-2] + (1, 2 * self.n))
        row[..., 0, self.pair_columns] = np.concatenate([w, -w], axis=-1)
        return np.concatenate([jac, row], axis=-2)[..., self.columns]

    def rates(self, x, jac, theta, omega, alpha):
        """(w/L)·ẇ = L̇ and (w/L)·ẅ = (L̇² + L·L̈ − ẇ·ẇ)/L."""
        length = np.asarray(theta, float)
        rhs = np.zeros(jac.shape[:-1])
        rhs[..., -1] = omega
        xdot = self.full(np.linalg.solve(jac, rhs[..., None])[..., 0], self.zeros)
        wdot = self._axis(xdot)
        driver_term = (omega ** 2 + length * alpha - np.sum(wdot * wdot, axis=-1)) / length
        rhs = np.concatenate([-self.system.quadratic_term(xdot), driver_term[..., None]], axis=-1)
        xddot = self.full(np.linalg.solve(jac, rhs[..., None])[..., 0], self.zeros)
        return xdot, xddot

    def jerk(self, x, jac, xdot, xddot, theta, omega, alpha, alpha_dot=0.0):
        """(w/L)·w⃛ = (3·L̇·L̈ + L·L⃛ − 3·ẇ·ẅ)/L."""
        length = np.asarray(theta, float)
        wdot, wddot = self._axis(xdot), self._axis(xddot)
        driver_term = (3.0 * omega * alpha + length * alpha_dot - 3.0 * np.sum(wdot * wddot, axis=-1)) / length
        rhs = np.concatenate([-self.system.cubic_term(xdot, xddot), driver_term[..., None]], axis=-1)
        return self.full(np.linalg.solve(jac, rhs[..., None])[..., 0], self.zeros)


def reference_length_m(mechanism: Mechanism) -> float:
    """The cylinder's length in the reference pose, m."""
    slide = mechanism.slides[mechanism.driver.slide]
    (cx, cy), (bx, by) = mechanism.position_m(slide.line[0]), mechanism.position_m(slide.point)
    return math.hypot(bx - cx, by - cy)


def solve_length(mechanism: Mechanism, length_m=None) -> Solution:
    """The pose of a cylinder-driven design at cylinder length ``length_m`` (m; None: the reference pose)."""
    decompose(mechanism)  # refuses a cylinder that is not one, naming the driver's slide
    system = constraint_system(mechanism)
    driven = LengthDrivenSystem(system, mechanism)
    driver = mechanism.driver
    speed, accel = driver.linear_speed_m_s, driver.linear_acceleration_m_s2
    start = reference_length_m(mechanism)
    target = start if length_m is None else float(length_m)
    if not (math.isfinite(target) and target > 0.0):
        raise KinematicsError(f"a cylinder length is a positive number of metres, not {length_m!r}", "length")
    q = system.x0.reshape(-1)[driven.columns]
    size = mechanism.size * mechanism.metres_per_unit
    where = f"cylinder length {target * 1000:.3f} mm"
    if target != start:
        tracked = track(driven, q, start, abs(target - start), 1.0 if target > start else -1.0, size)
        if tracked is None:
            raise CannotAssemble(f"cannot assemble at cylinder length {target * 1000:.3f} mm", where)
        q = tracked[0]
    x = driven.full(q)
    jac = driven.jacobian(x, target)
    condition = float(np.linalg.cond(jac))
    if not np.isfinite(condition) or condition > 1e14:
        raise CannotAssemble(f"the linkage is at a dead point at cylinder length {target * 1000:.3f} mm: "
                             "velocities are not defined there", where)
    xdot, xddot = driven.rates(x, jac, target, speed, accel)
    xjerk = driven.jerk(x, jac, xdot, xddot, target, speed, accel)
    index = {n: i for i, n in enumerate(system.names)}
    angle, omega, alpha = _link_rates(mechanism, index, x, xdot, xddot)
    slide_v, slide_a = _slide_rates(mechanism, index, x, xdot, xddot, omega, alpha)
    jerk = _link_jerks(mechanism, index, x, xjerk, omega)
    slide_j = _slide_jerks(mechanism, index, x, xjerk, omega, alpha, jerk, slide_v)
    axis = x[driven.rod_end] - x[driven.pivot]
    warnings = pose_warnings(mechanism, decompose(mechanism), {n: tuple(x[i]) for i, n in enumerate(system.names)})
    return Solution(mechanism=mechanism, driver_angle_deg=math.degrees(math.atan2(axis[1], axis[0])),
                    point_names=system.names, positions=x, velocities=xdot, accelerations=xddot,
                    link_angle_deg=angle, angular_velocity=omega, angular_acceleration=alpha,
                    sliding_velocity=slide_v, sliding_acceleration=slide_a, jerks=xjerk, angular_jerk=jerk,
                    sliding_jerk=slide_j, condition=condition, warnings=tuple(warnings), driver_length_m=target)
