"""The numeric solver: Newton-Raphson on the constraint equations for the
pose, then two linear solves with the exact right-hand sides for velocity
and acceleration (no finite differences).

Branch rule: the pose at driver angle θ is reached from the reference pose
by turning the driver the way its speed turns, through
((θ − θ_ref)·sgn ω) mod 360°; if that way meets a dead point first, the other
way; otherwise the linkage cannot assemble there.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..errors import CannotAssemble
from ..groups.decompose import decompose
from ..groups.poses import pose_warnings
from ..model.mechanism import Mechanism
from ..model.memo import frozen_fields, remembered
from ..model.units import angle_text
from .constraints import ConstraintSystem, constraint_system, reference_driver_angle

MAX_STEP_RAD = math.radians(10.0)
# Poses kept along each way from the reference pose, this far apart: one tracking step each.
CHECKPOINT_RAD = MAX_STEP_RAD
MIN_STEP_RAD = 1e-9
NEWTON_ITERATIONS = 12
# A corrected pose farther than this (relative to size) from its prediction jumped branch.
BRANCH_JUMP_RELATIVE = 0.02
# Condition figure of the Jacobian above which a pose is flagged near-singular.
NEAR_SINGULAR_CONDITION = 1e4


@dataclass(frozen=True)
class Solution:
    """One solved pose, all in SI.

    Attributes
    ----------
    mechanism : the Mechanism solved.
    driver_angle_deg : driver angle of this pose, degrees CCW from +x.
    point_names : order of the rows below.
    positions, velocities, accelerations, jerks : (n, 2) arrays, m, m/s, m/s², m/s³.
    link_angle_deg : link -> direction from its first point to its second, (−180°, 180°].
    angular_velocity, angular_acceleration, angular_jerk : link -> rad/s, rad/s², rad/s³ (CCW positive).
    sliding_velocity, sliding_acceleration, sliding_jerk : slide -> m/s, m/s², m/s³ along its line,
        positive from the line's first point towards its second, relative to the guide.
    condition : condition figure of the constraint Jacobian at this pose.
    driver_length_m : a cylinder driver's length at this pose (m), None for a rotary driver; then
        ``driver_angle_deg`` is the direction of the cylinder's axis.
    warnings : plain sentences (dead point, toggle, bifurcation ...).

    The arrays are read-only and the dictionaries read-only mappings: a Solution is a value.
    """

    mechanism: Mechanism
    driver_angle_deg: float
    point_names: tuple
    positions: np.ndarray
    velocities: np.ndarray
    accelerations: np.ndarray
    link_angle_deg: dict
    angular_velocity: dict
    angular_acceleration: dict
    sliding_velocity: dict
    sliding_acceleration: dict
    jerks: np.ndarray
    angular_jerk: dict
    sliding_jerk: dict
    condition: float
    warnings: tuple = ()
    driver_length_m: float | None = None

    def __post_init__(self):
        frozen_fields(self)

    def _row(self, name):
        return self.point_names.index(name)

    def position(self, name) -> np.ndarray:
        """Point ``name``'s position (x, y), m."""
        return self.positions[self._row(name)]

    def velocity(self, name) -> np.ndarray:
        """Point ``name``'s velocity (x, y), m/s."""
        return self.velocities[self._row(name)]

    def acceleration(self, name) -> np.ndarray:
        """Point ``name``'s acceleration (x, y), m/s²."""
        return self.accelerations[self._row(name)]

    def jerk(self, name) -> np.ndarray:
        """Point ``name``'s jerk (x, y), m/s³."""
        return self.jerks[self._row(name)]


def _cross(a, b):
    return a[..., 0] * b[..., 1] - a[..., 1] * b[..., 0]


class DrivenSystem:
    """The constraint system with the driver row appended, over the unknowns only.

    Every method takes a leading batch shape: x (..., n, 2), theta (...)."""

    def __init__(self, system: ConstraintSystem):
        self.system = system
        self.columns = system.unknown_columns
        self.n = len(system.names)
        self.driver_columns = np.array([2 * system.driver_point, 2 * system.driver_point + 1])
        self.zeros = np.zeros(2 * self.n)  # fixed points neither move nor accelerate

    def full(self, q, base=None):
        """All point coordinates (..., n, 2): the unknowns q scattered over ``base``
        (flattened coordinates; the reference pose by default, so fixed points stay put)."""
        base = self.system.x0.reshape(-1) if base is None else base
        x = np.broadcast_to(base, q.shape[:-1] + (2 * self.n,)).copy()
        x[..., self.columns] = q
        return x.reshape(q.shape[:-1] + (self.n, 2))

    def _lever(self, x):
        return x[..., self.system.driver_point, :] - x[..., self.system.driver_pivot, :]

    def residual(self, x, theta):
        """The constraint values with the driver row (the driver's lever along the angle ``theta``) last."""
        w = self._lever(x)
        drive = np.cos(theta) * w[..., 1] - np.sin(theta) * w[..., 0]
        return np.concatenate([self.system.values(x), drive[..., None]], axis=-1)

    def jacobian(self, x, theta):
        """The residual's derivative with respect to the unknown coordinates."""
        jac = self.system.jacobian(x)
        row = np.zeros(x.shape[:-2] + (1, 2 * self.n))
        row[..., 0, self.driver_columns[0]] = -np.sin(theta)
        row[..., 0, self.driver_columns[1]] = np.cos(theta)
        return np.concatenate([jac, row], axis=-2)[..., self.columns]

    def rates(self, x, jac, theta, omega, alpha):
        """Velocities and accelerations (..., n, 2) of all points at pose x."""
        theta = np.asarray(theta, float)
        u = np.stack([np.cos(theta), np.sin(theta)], axis=-1)
        perp_u = np.stack([-u[..., 1], u[..., 0]], axis=-1)
        w = self._lever(x)
        rhs = np.zeros(jac.shape[:-1])
        rhs[..., -1] = -_cross(perp_u, w) * omega
        xdot = self.full(np.linalg.solve(jac, rhs[..., None])[..., 0], self.zeros)
        wdot = self._lever(xdot)
        driver_term = -_cross(u, w) * omega ** 2 + _cross(perp_u, w) * alpha + 2 * omega * _cross(perp_u, wdot)
        rhs = -np.concatenate([self.system.quadratic_term(xdot), driver_term[..., None]], axis=-1)
        xddot = self.full(np.linalg.solve(jac, rhs[..., None])[..., 0], self.zeros)
        return xdot, xddot

    def jerk(self, x, jac, xdot, xddot, theta, omega, alpha, alpha_dot=0.0):
        """Jerks (..., n, 2) of all points: the third solve, J·x⃛ = −(the rest of the third derivative).

        The driver row cross(u(θ), w) differentiated three times with u̇ = ω·u⊥, u̇⊥ = −ω·u gives
        (α̇ − ω³)·(u⊥ × w) − 3ωα·(u × w) + 3α·(u⊥ × ẇ) − 3ω²·(u × ẇ) + 3ω·(u⊥ × ẅ) besides u × w⃛."""
        theta = np.asarray(theta, float)
        u = np.stack([np.cos(theta), np.sin(theta)], axis=-1)
        perp_u = np.stack([-u[..., 1], u[..., 0]], axis=-1)
        w, wdot, wddot = self._lever(x), self._lever(xdot), self._lever(xddot)
        driver_term = ((alpha_dot - omega ** 3) * _cross(perp_u, w) - 3 * omega * alpha * _cross(u, w)
                       + 3 * alpha * _cross(perp_u, wdot) - 3 * omega ** 2 * _cross(u, wdot)
                       + 3 * omega * _cross(perp_u, wddot))
        rhs = -np.concatenate([self.system.cubic_term(xdot, xddot), driver_term[..., None]], axis=-1)
        return self.full(np.linalg.solve(jac, rhs[..., None])[..., 0], self.zeros)


def newton_tolerance(system: ConstraintSystem) -> float:
    """Residual (a length, m) below which a pose is converged: 1e-12 of the larger of the
    mechanism's size and its distance from the origin, so rounding never blocks convergence."""
    extent = np.ptp(system.x0, axis=0).max() if len(system.x0) else 0.0
    return 1e-12 * max(float(extent), float(np.abs(system.x0).max(initial=0.0)), 1e-3)


def newton(driven: DrivenSystem, q, theta, tolerance):
    """Newton-Raphson from q (..., k); None where any pose of the batch fails to converge."""
    x = driven.full(q)
    residual = driven.residual(x, theta)
    for _ in range(NEWTON_ITERATIONS):
        try:
            step = np.linalg.solve(driven.jacobian(x, theta), -residual[..., None])[..., 0]
        except np.linalg.LinAlgError:
            return None
        q = q + step
        x = driven.full(q)
        residual = driven.residual(x, theta)  # checked here, and the next step's right-hand side
        worst = np.max(np.abs(residual))
        if not np.isfinite(worst):
            return None
        if worst < tolerance:
            return q
    return None


def track(driven: DrivenSystem, q, theta0, span, direction, size):
    """Turn the driver from theta0 through ``span`` (rad, ≥ 0) in ``direction``.

    Returns (q, passed_singular) or None where a dead point stops the way."""
    tolerance = newton_tolerance(driven.system)
    done, step, theta, passed_singular = 0.0, MAX_STEP_RAD, theta0, False
    while done < span - 1e-15:
        h = min(step, span - done)
        x = driven.full(q)
        jac = driven.jacobian(x, theta)
        try:
            first, second = driven.rates(x, jac, theta, direction, 0.0)
        except np.linalg.LinAlgError:
            return None
        predicted = q + first.reshape(-1)[driven.columns] * h + 0.5 * second.reshape(-1)[driven.columns] * h * h
        corrected = newton(driven, predicted, theta + direction * h, tolerance)
        if corrected is None or np.max(np.abs(corrected - predicted)) > BRANCH_JUMP_RELATIVE * size:
            step = h / 4.0
            if step < MIN_STEP_RAD:
                return None
            continue
        if step < MAX_STEP_RAD and np.linalg.cond(driven.jacobian(driven.full(corrected), theta + direction * h)) > 1e8:
            passed_singular = True
        q, theta, done = corrected, theta + direction * h, done + h
        step = min(MAX_STEP_RAD, step * 2.0)
    return q, passed_singular


def _link_rates(mech: Mechanism, index, x, xdot, xddot):
    angle, omega, alpha = {}, {}, {}
    for name, pts in mech.links.items():
        i, j = index[pts[0]], index[pts[1]]
        r = x[j] - x[i]
        v = xdot[j] - xdot[i]
        a = xddot[j] - xddot[i]
        rr = r @ r
        angle[name] = math.degrees(math.atan2(r[1], r[0]))
        if angle[name] == -180.0:
            angle[name] = 180.0
        omega[name] = float((r[0] * v[1] - r[1] * v[0]) / rr)
        alpha[name] = float((r[0] * a[1] - r[1] * a[0]) / rr)
    return angle, omega, alpha


def _link_jerks(mech: Mechanism, index, x, xjerk, omega) -> dict:
    """α̇ of every link: with j = (α̇ − ω³)·r⊥ − 3ωα·r on a rigid link, r × j = (α̇ − ω³)·|r|²."""
    jerk = {}
    for name, pts in mech.links.items():
        i, j = index[pts[0]], index[pts[1]]
        r, rel = x[j] - x[i], xjerk[j] - xjerk[i]
        jerk[name] = float((r[0] * rel[1] - r[1] * rel[0]) / (r @ r) + omega[name] ** 3)
    return jerk


def _slide_jerks(mech: Mechanism, index, x, xjerk, omega, alpha, jerk, sliding_velocity) -> dict:
    """s⃛ of every slide: u·(j_D − j_Dg) + 3ṡω², j_Dg the jerk of the guide's point under D."""
    result = {}
    for slide in mech.slides.values():
        e, f, d = index[slide.line[0]], index[slide.line[1]], index[slide.point]
        u = (x[f] - x[e]) / np.linalg.norm(x[f] - x[e])
        r = x[d] - x[e]
        perp_r = np.array([-r[1], r[0]])
        w, al, aj = omega.get(slide.guide, 0.0), alpha.get(slide.guide, 0.0), jerk.get(slide.guide, 0.0)
        guide_j = xjerk[e] + (aj - w ** 3) * perp_r - 3.0 * w * al * r
        result[slide.name] = float(u @ (xjerk[d] - guide_j) + 3.0 * sliding_velocity[slide.name] * w * w)
    return result


def _slide_rates(mech: Mechanism, index, x, xdot, xddot, omega, alpha):
    velocity, acceleration = {}, {}
    for slide in mech.slides.values():
        e, f, d = index[slide.line[0]], index[slide.line[1]], index[slide.point]
        u = (x[f] - x[e]) / np.linalg.norm(x[f] - x[e])
        r = x[d] - x[e]
        perp_r = np.array([-r[1], r[0]])
        w = omega.get(slide.guide, 0.0)
        al = alpha.get(slide.guide, 0.0)
        guide_v = xdot[e] + w * perp_r
        guide_a = xddot[e] + al * perp_r - w * w * r
        velocity[slide.name] = float(u @ (xdot[d] - guide_v))
        acceleration[slide.name] = float(u @ (xddot[d] - guide_a))
    return velocity, acceleration


class _Way:
    """Checkpoints along one way (one turning sense) from the reference pose: the pose at every
    whole multiple of CHECKPOINT_RAD, each tracked from the one before and from nothing else.

    A pose asked for is tracked from the nearer checkpoint on either side, chosen by its span
    alone, so the answer does not depend on what was solved before; a dragged crank going back
    and forth by small turns costs one short track a frame from a checkpoint kept for it."""

    def __init__(self, driven, theta_ref, direction, size, q_reference):
        self.driven, self.theta_ref, self.direction, self.size = driven, theta_ref, direction, size
        self.start_span, start = 0.0, q_reference
        if np.linalg.cond(driven.jacobian(driven.full(q_reference), theta_ref)) > 1e12:
            start = self._step_off(q_reference)
        # Checkpoint index -> (q, passed a change point on the way) or None where a dead point stops the way.
        self.checkpoints = {0: (start, False)}

    def _step_off(self, q_ref):
        """A reference pose drawn exactly at a dead point has no tangent to follow: take a
        first pose a hair away by Newton alone, if the linkage can go this way at all (the
        first checkpoint, at ``start_span``); else the reference pose itself."""
        driven = self.driven
        tolerance = newton_tolerance(driven.system)
        # The branches open along the Jacobian's null direction, as the square root of the turn.
        null = np.linalg.svd(driven.jacobian(driven.full(q_ref), self.theta_ref))[2][-1]
        size = max(float(np.ptp(driven.system.x0, axis=0).max()), 1e-3)
        for nudge in (1e-8, 1e-6, 1e-4):
            for side in (1.0, -1.0):
                start = q_ref + side * math.sqrt(nudge) * size * null
                q = newton(driven, start, self.theta_ref + self.direction * nudge, tolerance)
                if q is not None:
                    self.start_span = nudge
                    return q
        return q_ref

    def _span_of(self, k: int) -> float:
        return self.start_span if k == 0 else k * CHECKPOINT_RAD

    def _track_from(self, k: int, span: float):
        """Track from checkpoint k (which exists) to ``span`` either way: (q, passed) or None."""
        q, passed = self.checkpoints[k]
        begin = self._span_of(k)
        sense = 1.0 if span >= begin else -1.0
        tracked = track(self.driven, q, self.theta_ref + self.direction * begin, abs(span - begin),
                         self.direction * sense, self.size)
        if tracked is None:
            return None
        return tracked[0], passed or tracked[1]

    def checkpoint(self, k: int):
        """Checkpoint k, tracked from checkpoint k − 1 (made first) and kept; None beyond a dead point."""
        for j in range(max(i for i in self.checkpoints if i <= k) + 1, k + 1):
            before = self.checkpoints[j - 1]
            self.checkpoints[j] = None if before is None else self._track_from(j - 1, self._span_of(j))
        return self.checkpoints[k]

    def reach(self, span: float):
        """(q, passed) at ``span`` along this way, or None where a dead point stops it first."""
        k = int(span // CHECKPOINT_RAD)
        below = self.checkpoint(k)
        if below is None:
            return None
        if span - self._span_of(k) > 0.5 * CHECKPOINT_RAD:
            above = self.checkpoint(k + 1)
            if above is not None and above[1] == below[1]:
                # Turning back from the checkpoint further on, with no change point between, stays on
                # the same branch; a track that meets one turning back is not used.
                q, _ = above
                tracked = track(self.driven, q, self.theta_ref + self.direction * self._span_of(k + 1),
                                 self._span_of(k + 1) - span, -self.direction, self.size)
                if tracked is not None and not tracked[1]:
                    return tracked[0], below[1]
        return self._track_from(k, span)


def solve_pose(mechanism: Mechanism, angle_deg=None, system: ConstraintSystem | None = None) -> Solution:
    """Solve without checking findings first (see :func:`kinematics.solve`)."""
    system = system or constraint_system(mechanism)
    driven = DrivenSystem(system)
    driver = mechanism.driver
    omega, alpha = driver.speed_rad_s, driver.angular_acceleration_rad_s2
    theta_ref = reference_driver_angle(system)
    size = mechanism.size * mechanism.metres_per_unit
    q = system.x0.reshape(-1)[driven.columns]
    warnings = []
    if angle_deg is None:
        theta = theta_ref
    else:
        theta = math.radians(float(angle_deg))
        turn = 1.0 if omega >= 0 else -1.0
        span = ((theta - theta_ref) * turn) % (2 * math.pi)
        if span > 2 * math.pi - 1e-12:
            span = 0.0
        ways = remembered(mechanism, "ways", dict)
        for sense, along in ((turn, span), (-turn, 2 * math.pi - span)):
            if along == 0.0:
                tracked = (q, False)
                break
            if sense not in ways:
                ways[sense] = _Way(driven, theta_ref, sense, size, q)
            tracked = ways[sense].reach(along)
            if tracked is not None:
                break
        if tracked is None:
            raise CannotAssemble(f"cannot assemble at driver angle {angle_text(float(angle_deg))}",
                                 f"driver angle {angle_text(float(angle_deg))}")
        q, passed = tracked
        if passed:
            warnings.append("the way from the reference pose passes a change point (bifurcation); "
                            "the branch whose velocity stays continuous was kept")
    x = driven.full(q)
    jac = driven.jacobian(x, theta)
    condition = float(np.linalg.cond(jac))
    if not np.isfinite(condition) or condition > 1e14:
        raise CannotAssemble(f"the linkage is at a dead point at driver angle {angle_text(math.degrees(theta))}: "
                             "velocities are not defined there", f"driver angle {angle_text(math.degrees(theta))}")
    xdot, xddot = driven.rates(x, jac, theta, omega, alpha)
    index = {n: i for i, n in enumerate(system.names)}
    angle, link_omega, link_alpha = _link_rates(mechanism, index, x, xdot, xddot)
    # The driver's own rates are given, not solved: report them as given, free of rounding.
    link_omega[driver.link], link_alpha[driver.link] = float(omega), float(alpha)
    slide_v, slide_a = _slide_rates(mechanism, index, x, xdot, xddot, link_omega, link_alpha)
    alpha_dot = driver.angular_jerk_rad_s3
    xjerk = driven.jerk(x, jac, xdot, xddot, theta, omega, alpha, alpha_dot)
    link_jerk = _link_jerks(mechanism, index, x, xjerk, link_omega)
    link_jerk[driver.link] = float(alpha_dot)
    slide_j = _slide_jerks(mechanism, index, x, xjerk, link_omega, link_alpha, link_jerk, slide_v)
    if condition > NEAR_SINGULAR_CONDITION:
        warnings.append(f"near a dead point of the driver: condition figure {condition:.3g}")
    warnings += pose_warnings(mechanism, decompose(mechanism), {n: tuple(x[i]) for i, n in enumerate(system.names)})
    degrees = math.degrees(theta)
    return Solution(mechanism=mechanism, driver_angle_deg=degrees if angle_deg is None else float(angle_deg),
                    point_names=system.names, positions=x, velocities=xdot, accelerations=xddot,
                    link_angle_deg=angle, angular_velocity=link_omega, angular_acceleration=link_alpha,
                    sliding_velocity=slide_v, sliding_acceleration=slide_a, condition=condition,
                    warnings=tuple(warnings), jerks=xjerk, angular_jerk=link_jerk, sliding_jerk=slide_j)
