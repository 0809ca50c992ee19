"""The cycle sweep: every pose of one driver turn at once, in closed form.

The dyad decomposition gives each group's position (circle-circle and
circle-line intersections) and its velocity and acceleration (the polygon
relations); all of it is numpy over the angles, no loop per angle. The
numeric solver checks the result in :func:`verify_sweep`, a separate call.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..errors import CannotAssemble, KinematicsError, ParallelLines, SweepCancelled
from ..groups.base import Frame
from ..groups.decompose import decompose
from ..model.mechanism import Mechanism
from ..model.memo import frozen_fields
from ..solver.constraints import constraint_system, reference_driver_angle
from ..solver.mobility import require_ready
from ..solver.solve import DrivenSystem, newton, newton_tolerance, track

# About 100 bytes a pose per point: a million poses of a six-bar take about 1 GB.
MAX_STEPS = 1_000_000
# Dead points are looked for among at least this many poses of a turn ...
PROBE_STEPS = 3600
# ... and located to this fraction of a degree.
DEAD_POINT_RESOLUTION_DEG = 1e-9
EDGE_BATCH = 64  # angles placed together while closing in on a dead point
# A swept range stops this far short of a dead point, where velocities grow without bound.
DEAD_POINT_MARGIN_DEG = 1e-6


@dataclass(frozen=True)
class Sweep:
    """One driver turn (or its assemblable range), SI units.

    Attributes
    ----------
    driver_angle_deg : (N,) driver angles in the order swept.
    point_names : order of the point axis below.
    positions, velocities, accelerations, jerks : (N, n, 2) arrays, m, m/s, m/s², m/s³.
    link_angle_deg, angular_velocity, angular_acceleration, angular_jerk : link -> (N,) arrays
        (°, rad/s, rad/s², rad/s³).
    sliding_velocity, sliding_acceleration, sliding_jerk : slide -> (N,) arrays (m/s, m/s², m/s³).
    full_turn : the driver turns fully; otherwise ``range_deg`` gives its dead points.
    closes : one turn brings the linkage back to its first pose.
    time_s : (N,) time from the first pose at constant speed, or None when the driver accelerates.
    driver_length_m : (N,) a cylinder driver's lengths (m), the swept parameter, or None for a rotary
        driver; ``driver_angle_deg`` is then the direction of the cylinder's axis.

    The arrays are read-only and the dictionaries read-only mappings: a Sweep is a value.
    """

    mechanism: Mechanism
    driver_angle_deg: np.ndarray
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
    full_turn: bool
    range_deg: tuple
    closes: bool
    time_s: np.ndarray | None
    warnings: tuple = ()
    driver_length_m: np.ndarray | None = None

    def __post_init__(self):
        frozen_fields(self)


def _place(mech, decomposition, angles_rad) -> Frame:
    """Positions at every angle; poses that cannot assemble are marked ``invalid``."""
    frame = Frame.start(mech, angles_rad, strict=False)
    for group in decomposition.chain:
        group.position(frame)
    return frame


def _move(frame: Frame, decomposition) -> Frame:
    """Velocities, accelerations and jerks of a placed frame, group after group."""
    for group in decomposition.chain:
        group.velocity(frame)
    for group in decomposition.chain:
        group.acceleration(frame)
    for group in decomposition.chain:
        group.jerk(frame)
    return frame


def _assemblable(mech, decomposition, angles_rad):
    return ~_place(mech, decomposition, angles_rad).invalid


def _edge(mech, decomposition, good, bad):
    """The dead point between an assemblable angle and a failing one, to DEAD_POINT_RESOLUTION_DEG:
    EDGE_BATCH angles between them are placed at once, and the interval shrinks to the first step
    that fails (from a probe's 0.1° to 1e-9° in five batches instead of twenty-seven halvings)."""
    while abs(bad - good) > math.radians(DEAD_POINT_RESOLUTION_DEG):
        trial = np.linspace(good, bad, EDGE_BATCH + 2)
        ok = _assemblable(mech, decomposition, trial[1:-1])
        first_bad = int(np.argmin(ok)) + 1 if not ok.all() else EDGE_BATCH + 1
        good, bad = float(trial[first_bad - 1]), float(trial[first_bad])
    return good


def reference_angle_deg(mech: Mechanism) -> float:
    """The driver angle of the reference pose, degrees (the solver's own definition)."""
    return math.degrees(reference_driver_angle(constraint_system(mech)))


def driver_range(mech: Mechanism, decomposition=None, probe_steps=None, ok=None):
    """(full_turn, (low_deg, high_deg)): the dead points around the reference pose
    (low < θ_ref < high), or the full turn from θ_ref. ``ok`` may give the
    assemblable mask of ``probe_steps`` equal CCW steps from θ_ref."""
    decomposition = decomposition or decompose(mech)
    probe_steps = probe_steps or PROBE_STEPS
    theta_ref = math.radians(reference_angle_deg(mech))
    offsets = np.linspace(0.0, 2 * math.pi, probe_steps, endpoint=False)
    if ok is None:
        ok = _assemblable(mech, decomposition, theta_ref + offsets)
    if ok.all():
        return True, (math.degrees(theta_ref), math.degrees(theta_ref) + 360.0)
    if not ok[0]:
        raise CannotAssemble("the linkage cannot assemble in its own reference pose", "reference pose")
    failing = np.flatnonzero(~ok)
    first_bad, last_bad = int(failing[0]), int(failing[-1])  # nearest failing probes CCW and CW of the reference
    high = _edge(mech, decomposition, theta_ref + offsets[first_bad - 1], theta_ref + offsets[first_bad])
    # The reference pose itself may be the dead point (the last probe before it fails).
    good_low = theta_ref + (offsets[last_bad + 1] - 2 * math.pi if last_bad + 1 < probe_steps else 0.0)
    low = _edge(mech, decomposition, good_low, theta_ref + offsets[last_bad] - 2 * math.pi)
    return False, (math.degrees(low), math.degrees(high))


# A group whose nearness peaks above this between probes is examined for a change point.
CHANGE_POINT_SUSPECT = 0.999
# A group whose refined nearness reaches 1 within this is passing straight: a change point.
CHANGE_POINT_TOUCH = 1e-10
# The search's fixed budget: at most this many suspect peaks a group (the nearest to straight) ...
CHANGE_POINT_SUSPECTS = 16
# ... each bracket sampled at this many angles a round, all brackets of all groups placed at once ...
CHANGE_POINT_BATCH = 16
# ... for this many rounds: a bracket of two probe steps shrinks (BATCH + 1) / 2 = 8.5 times a round,
# from 0.2° to about 1e-10°, where a dyad 1e-10 of straight is told from one passing straight.
CHANGE_POINT_ROUNDS = 10


def _suspects(nearness, inside) -> np.ndarray:
    """Indices of the probes where ``nearness`` peaks above the suspect level, nearest first, at most
    CHANGE_POINT_SUSPECTS of them (a plateau near straight would otherwise make every probe one)."""
    peaks = np.flatnonzero(inside & (nearness >= np.roll(nearness, 1)) & (nearness >= np.roll(nearness, -1))
                           & (nearness > CHANGE_POINT_SUSPECT))
    return peaks[np.argsort(-nearness[peaks], kind="stable")[:CHANGE_POINT_SUSPECTS]]


def change_points(mech: Mechanism, decomposition, angles_deg: np.ndarray, probe: Frame) -> list:
    """(group name, driver angle °) where a dyad passes straight inside the assemblable range.

    There its two closed-form branches meet: the motion may go on along either, and the
    construction lines are parallel. ``probe`` is the placement at the equally spaced
    ``angles_deg``; each suspect peak of its nearness is bracketed by its neighbours and the
    brackets are narrowed together, CHANGE_POINT_ROUNDS placements in all whatever the design."""
    ok = ~np.asarray(probe.invalid, dtype=bool)
    # A pose next to one that cannot assemble is at the end of the range: a dead point, not a change point.
    inside = ok & np.roll(ok, 1) & np.roll(ok, -1)
    step = abs(angles_deg[1] - angles_deg[0])
    names, centres = [], []
    for name, nearness in probe.nearness.items():
        for k in _suspects(np.nan_to_num(np.asarray(nearness, float), nan=0.0), inside):
            names.append(name)
            centres.append(angles_deg[k])
    if not names:
        return []
    centres = np.array(centres)
    low, high = centres - step, centres + step
    fractions = np.linspace(0.0, 1.0, CHANGE_POINT_BATCH + 2)
    rows = np.arange(len(names))
    for _ in range(CHANGE_POINT_ROUNDS):
        trial = low[:, None] + (high - low)[:, None] * fractions  # (suspects, BATCH + 2)
        frame = _place(mech, decomposition, np.radians(trial.ravel()))
        near = np.stack([np.asarray(frame.nearness[name], float).reshape(trial.shape)[i]
                         for i, name in enumerate(names)])
        near = np.where(np.isfinite(near) & ~frame.invalid.reshape(trial.shape), near, -1.0)
        best = np.argmax(near, axis=1)
        best_near = near[rows, best]
        best_angle = trial[rows, best]
        low = trial[rows, np.maximum(best - 1, 0)]
        high = trial[rows, np.minimum(best + 1, CHANGE_POINT_BATCH + 1)]
    return [(name, float(angle)) for name, angle, value in zip(names, best_angle, best_near, strict=True)
            if value >= 1.0 - CHANGE_POINT_TOUCH]


# A sweep with a progress callback reports after every chunk of this many poses.
PROGRESS_CHUNK = 10_000


def _columns(mech: Mechanism, frame: Frame) -> dict:
    """The frame's results as arrays over the angles: (N, n, 2) for points, (N,) for the rest."""
    names = tuple(mech.points)
    count = len(np.atleast_1d(frame.pos[names[0]]))

    def stack(values):
        # A (N, n) complex array viewed as (N, n, 2) floats: x and y without a copy.
        return np.stack([values[n] for n in names], axis=1).view(np.float64).reshape(count, len(names), 2)

    columns = {"positions": stack(frame.pos), "velocities": stack(frame.vel), "accelerations": stack(frame.acc),
               "jerks": stack(frame.jerk)}
    for link, pts in mech.links.items():
        columns[("angle", link)] = np.degrees(np.angle(frame.pos[pts[1]] - frame.pos[pts[0]]))
        columns[("omega", link)] = np.asarray(frame.omega[link], float)
        columns[("alpha", link)] = np.asarray(frame.alpha[link], float)
        columns[("jerk", link)] = np.asarray(frame.angular_jerk[link], float)
    for slide in mech.slides:
        columns[("slide_v", slide)] = np.asarray(frame.sliding_velocity[slide], float)
        columns[("slide_a", slide)] = np.asarray(frame.sliding_acceleration[slide], float)
        columns[("slide_j", slide)] = np.asarray(frame.sliding_jerk[slide], float)
    return columns


def sweep(mechanism: Mechanism, steps: int = 360, progress=None) -> Sweep:
    """Solve ``steps`` equal steps of the driver turn in closed form.

    A full turn runs over [θ_ref, θ_ref + 360°) in the driver's sense, end
    excluded; a driver that cannot turn fully sweeps its assemblable range
    between its dead points, ends included (less a hair, see
    ``DEAD_POINT_MARGIN_DEG``).

    ``progress``, if given, is called with the fraction done after every
    ``PROGRESS_CHUNK`` poses; returning False stops the sweep with
    :class:`SweepCancelled`.
    """
    if not (isinstance(steps, int) and not isinstance(steps, bool) and 2 <= steps <= MAX_STEPS):
        raise KinematicsError(f"a sweep takes a whole number of steps from 2 to {MAX_STEPS:,}, not {steps!r}",
                              "steps")
    require_ready(mechanism)
    decomposition = decompose(mechanism)
    if not decomposition.all_dyads:
        raise KinematicsError("the linkage has a group that is no dyad; sweep it pose by pose with solve()",
                              next(g.name for g in decomposition.groups if not g.is_dyad))
    if mechanism.driver.is_actuator:
        return _stroke_sweep(mechanism, decomposition, steps)
    omega = mechanism.driver.speed_rad_s
    sense = 1.0 if omega >= 0 else -1.0
    start = reference_angle_deg(mechanism)
    chunk = PROGRESS_CHUNK if progress is not None else steps
    angles = start + sense * np.arange(steps) * 360.0 / steps
    # One probe of at least PROBE_STEPS poses a turn finds the dead points and the change points;
    # a sweep that fine, going in one piece, is its own probe.
    own_probe = chunk >= steps >= PROBE_STEPS
    probe_angles = angles if own_probe else start + sense * np.arange(PROBE_STEPS) * 360.0 / PROBE_STEPS
    probe = _place(mechanism, decomposition, np.radians(probe_angles))
    ccw_mask = ~probe.invalid if sense > 0 else np.roll(~probe.invalid[::-1], 1)
    full, (low, high) = driver_range(mechanism, decomposition, len(probe_angles), ccw_mask)
    passed = change_points(mechanism, decomposition, probe_angles, probe)
    if passed:
        name, where = passed[0]
        raise ParallelLines(f"the {name} passes straight (a change point) at driver angle {where % 360:.3f}°: "
                            "the linkage may go on along either branch there and the construction lines are "
                            "parallel; a sweep through it is not made (solve pose by pose instead)",
                            f"driver angle {where % 360:.3f}°")
    frame = probe if own_probe and full else None
    warnings = []
    if not full:
        margin = DEAD_POINT_MARGIN_DEG
        angles = np.linspace(low + margin, high - margin, steps)
        if sense < 0:
            angles = angles[::-1]
        warnings.append(f"the driver cannot turn fully: it rocks between its dead points {low:.2f}° and {high:.2f}°")
    parts = []
    for begin in range(0, steps, chunk):
        part = frame if frame is not None else _place(mechanism, decomposition, np.radians(angles[begin:begin + chunk]))
        if np.any(part.invalid):
            raise CannotAssemble("the linkage cannot assemble at some swept angles between probed ones",
                                 f"driver angle {angles[begin]:.3f}°")
        parts.append(_columns(mechanism, _move(part, decomposition)))
        if progress is not None and progress(min(begin + chunk, steps) / steps) is False:
            raise SweepCancelled("the sweep was cancelled", f"driver angle {angles[begin]:.3f}°")
    columns = parts[0] if len(parts) == 1 else {k: np.concatenate([p[k] for p in parts]) for k in parts[0]}
    time_s = None
    if mechanism.driver.angular_acceleration_rad_s2 == 0.0 and omega != 0.0:
        time_s = np.radians(np.abs(angles - angles[0])) / abs(omega)
    # Every group's closed form is a single-valued function of the driver angle on its branch,
    # so a full turn of a dyad chain brings the linkage back to its first pose.
    return Sweep(mechanism=mechanism, driver_angle_deg=angles, point_names=tuple(mechanism.points),
                 **_motion(mechanism, columns),
                 full_turn=full, range_deg=(low, high), closes=full, time_s=time_s, warnings=tuple(warnings))


def _motion(mechanism: Mechanism, columns: dict) -> dict:
    """The Sweep's motion fields (points, links, slides) from the swept ``columns`` of :func:`_columns`."""
    links, slides = mechanism.links, mechanism.slides
    return dict(positions=columns["positions"], velocities=columns["velocities"],
                accelerations=columns["accelerations"], jerks=columns["jerks"],
                link_angle_deg={k: columns[("angle", k)] for k in links},
                angular_velocity={k: columns[("omega", k)] for k in links},
                angular_acceleration={k: columns[("alpha", k)] for k in links},
                angular_jerk={k: columns[("jerk", k)] for k in links},
                sliding_velocity={k: columns[("slide_v", k)] for k in slides},
                sliding_acceleration={k: columns[("slide_a", k)] for k in slides},
                sliding_jerk={k: columns[("slide_j", k)] for k in slides})


def _stroke_sweep(mechanism: Mechanism, decomposition, steps: int) -> Sweep:
    """The cycle over the cylinder's stroke (see :mod:`kinematics.cycle.stroke`)."""
    from .stroke import stroke_frame

    lengths, frame, warnings = stroke_frame(mechanism, decomposition, steps)
    columns = _columns(mechanism, _move(frame, decomposition))
    head = decomposition.driver
    axis = frame.pos[head.roles["B"]] - frame.pos[head.roles["C"]]
    driver = mechanism.driver
    time_s = None
    if driver.linear_acceleration_m_s2 == 0.0 and driver.linear_speed_m_s != 0.0:
        time_s = np.abs(lengths - lengths[0]) / abs(driver.linear_speed_m_s)
    return Sweep(mechanism=mechanism, driver_angle_deg=np.degrees(np.angle(axis)), point_names=tuple(mechanism.points),
                 **_motion(mechanism, columns),
                 full_turn=False, range_deg=(float(lengths.min()), float(lengths.max())), closes=False, time_s=time_s,
                 warnings=tuple(warnings), driver_length_m=lengths)


def verify_sweep(result: Sweep, branch_step_deg: float = 10.0) -> dict:
    """Check a sweep against the numeric solver.

    Newton-Raphson refines every swept pose; the branch is confirmed
    independently by solving, from the reference pose by continuation, every
    pose ``branch_step_deg`` apart (a cylinder's stroke: a 36th of it at a time).
    Returns the largest differences relative to the largest value of each quantity: ``position``, ``velocity``,
    ``acceleration``, ``jerk``, and ``branch`` (position at the continuation poses).
    """
    mech = result.mechanism
    system = constraint_system(mech)
    driver = mech.driver
    if result.driver_length_m is not None:
        # A cylinder: the solver's parameter is the length, its rates L̇ and L̈ (L⃛ = 0).
        from ..solver.cylinder import LengthDrivenSystem, reference_length_m

        driven = LengthDrivenSystem(system, mech)
        omega, alpha, rate3 = driver.linear_speed_m_s, driver.linear_acceleration_m_s2, 0.0
        theta = np.asarray(result.driver_length_m, float)
        start = reference_length_m(mech)
        stride = max(1, int(round(len(theta) / 36)))
    else:
        driven = DrivenSystem(system)
        omega, alpha, rate3 = driver.speed_rad_s, driver.angular_acceleration_rad_s2, driver.angular_jerk_rad_s3
        theta = np.radians(result.driver_angle_deg)
        start = math.radians(reference_angle_deg(mech))
        step = abs(result.driver_angle_deg[1] - result.driver_angle_deg[0])
        stride = max(1, int(round(branch_step_deg / step)))
    tolerance = newton_tolerance(system)
    index = [result.point_names.index(n) for n in system.names]
    closed = result.positions[:, index]
    q = newton(driven, closed.reshape(len(theta), -1)[:, driven.columns], theta, tolerance)
    if q is None:
        raise CannotAssemble("the numeric solver does not converge from every swept pose", "sweep")
    x = driven.full(q)
    jac = driven.jacobian(x, theta)
    xdot, xddot = driven.rates(x, jac, theta, omega, alpha)
    xjerk = driven.jerk(x, jac, xdot, xddot, theta, omega, alpha, rate3)
    size = mech.size * mech.metres_per_unit
    worst = {}
    for key, numeric, swept in (("position", x, closed), ("velocity", xdot, result.velocities[:, index]),
                                ("acceleration", xddot, result.accelerations[:, index]),
                                ("jerk", xjerk, result.jerks[:, index])):
        worst[key] = float(np.abs(numeric - swept).max() / (np.abs(swept).max() or 1.0))
    # The branch, independently: continuation walks from the reference pose at a coarse step,
    # one each way (a ranged sweep reaches both of its dead points from the reference pose).
    offsets = theta - start
    worst["branch"] = 0.0
    for direction in (1.0, -1.0):
        ahead = np.flatnonzero(offsets * direction > -1e-12)
        ahead = ahead[np.argsort(np.abs(offsets[ahead]))][::stride]
        q_walk, reached = system.x0.reshape(-1)[driven.columns], 0.0
        for k in ahead:
            tracked = track(driven, q_walk, theta[k] - offsets[k] + direction * reached,
                             abs(offsets[k]) - reached, direction, size)
            if tracked is None:
                where = (f"driver angle {result.driver_angle_deg[k]:.3f}°" if result.driver_length_m is None
                         else f"cylinder length {theta[k] * 1000:.3f} mm")
                raise CannotAssemble("continuation from the reference pose stops at a dead point", where)
            q_walk, reached = tracked[0], abs(offsets[k])
            walked = driven.full(q_walk)
            worst["branch"] = max(worst["branch"], float(np.abs(walked - closed[k]).max() / size))
    return worst


def sweep_csv(result: Sweep, extra: tuple = ((), ())) -> str:
    """One row per swept pose, SI units in the headers, numbers at full double precision;
    ``extra`` (headers, columns) adds columns after the kinematic ones (the forces')."""
    mech = result.mechanism
    header = ["driver_angle_deg"] if result.driver_length_m is None else ["driver.length [m]"]
    columns = [result.driver_angle_deg if result.driver_length_m is None else result.driver_length_m]
    for i, name in enumerate(result.point_names):
        for quantity, unit, values in (("", "m", result.positions), ("v", "m/s", result.velocities),
                                       ("a", "m/s^2", result.accelerations), ("j", "m/s^3", result.jerks)):
            for axis, k in (("x", 0), ("y", 1)):
                header.append(f"{name}.{quantity}{axis} [{unit}]")
                columns.append(values[:, i, k])
    for link in mech.links:
        header += [f"{link}.omega [rad/s]", f"{link}.alpha [rad/s^2]", f"{link}.jerk [rad/s^3]"]
        columns += [result.angular_velocity[link], result.angular_acceleration[link], result.angular_jerk[link]]
    for slide in mech.slides:
        header += [f"{slide}.sliding_velocity [m/s]", f"{slide}.sliding_acceleration [m/s^2]"]
        columns += [result.sliding_velocity[slide], result.sliding_acceleration[slide]]
    header += list(extra[0])
    columns += list(extra[1])
    table = np.column_stack(columns)
    rows = [",".join(header)] + [",".join(repr(float(v)) for v in row) for row in table]
    return "\n".join(rows) + "\n"
