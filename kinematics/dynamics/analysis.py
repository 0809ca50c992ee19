"""The forces of a pose or a cycle: both formulations over a batch of poses, and the results
read off them (joint forces by link, slides, inertia, shaking, what the frame receives)."""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache
from types import MappingProxyType

import numpy as np

from ..cycle.sweep import Sweep
from ..solver.solve import Solution
from .bodies import centres, cross, mass_model
from .motion import from_solution, from_sweep
from .newton_euler import solve_forces
from .power import power_balance_torque
from .results import Forces, ForceSweep, FrameLoads, LinkInertia, PowerBalance, SlideForce


def _xy(values: np.ndarray) -> np.ndarray:
    """Complex (N, k) as read-only (N, k, 2) floats, x and y (a view where it can be)."""
    pairs = np.ascontiguousarray(values, complex).view(float).reshape(values.shape + (2,))
    pairs.flags.writeable = False
    return pairs


def _real(values: np.ndarray) -> np.ndarray:
    values = np.array(values, float)
    values.flags.writeable = False
    return values


NO_FORCE_N = 1e-100


def _inertia(model, centre, motion):
    """Force −m·a_G, couple −I·α, offset I·|α|/(m·|a_G|) and the offset point G + r with
    r = (C/|F|²)·(F_y, −F_x) = −i·C·F/|F|² (complex), so that cross(r, F) = C; the offset is inf
    for a pure couple, whose offset point is the centre."""
    force = -model.mass * centre.acceleration
    couple = -model.inertia * motion.alpha
    size = np.abs(force)
    # A force below this (N) is none: the inertia is a pure couple, its offset infinite.
    moving = size > NO_FORCE_N
    offset = np.divide(np.abs(couple), size, out=np.where(couple == 0.0, 0.0, np.inf), where=moving)
    arm = np.divide(-1j * couple * force, size * size, out=np.zeros_like(force), where=moving)
    return force, couple, offset, centre.position + arm


@dataclass(frozen=True, eq=False)
class _Reading:
    """How the results are read off the unknowns, per layout: the reported joint forces (pair,
    sign), which pairs load each fixed pivot, which slides load the frame and with what sign."""

    reported: tuple
    pair_index: np.ndarray
    signs: np.ndarray
    pivots: tuple
    pivot_pairs: np.ndarray
    pivot_starts: np.ndarray
    guides: tuple
    guide_slides: np.ndarray
    guide_signs: np.ndarray
    received_points: np.ndarray


@lru_cache(maxsize=64)
def _reading(lay) -> _Reading:
    reported = tuple((point, link) for pair in lay.pairs for point, link, _ in pair.reported)
    pivots = tuple(dict.fromkeys(pair.frame for pair in lay.pairs if pair.frame is not None))
    # The pairs at the frame, grouped by pivot (the layout lists a point's pairs together).
    at_frame = [i for i, pair in enumerate(lay.pairs) if pair.frame is not None]
    starts = [k for k, i in enumerate(at_frame) if k == 0 or lay.pairs[at_frame[k - 1]].frame != lay.pairs[i].frame]
    # A block on a fixed guide presses on it with −N·n; a block pivoted on the frame with a moving
    # guide through it passes N·n to the frame.
    guides = [(s.name, i, -1.0 if s.guide is None else 1.0) for i, s in enumerate(lay.slides)
              if s.guide is None or s.point in lay.fixed]
    points = [lay.points.index(p) for p in pivots] + [lay.points.index(lay.slides[i].point) for _, i, _ in guides]
    return _Reading(reported=reported,
                    pair_index=np.array([i for i, pair in enumerate(lay.pairs) for _ in pair.reported], int),
                    signs=np.array([sign for pair in lay.pairs for _, _, sign in pair.reported]), pivots=pivots,
                    pivot_pairs=np.array(at_frame, int), pivot_starts=np.array(starts, int),
                    guides=tuple(name for name, _, _ in guides),
                    guide_slides=np.array([i for _, i, _ in guides], int),
                    guide_signs=np.array([sign for _, _, sign in guides]), received_points=np.array(points, int))


def _frame(model, motion, solved, reading: _Reading, torque):
    """What the frame receives (N, pivots + guides) complex, and its moment about the driver pivot,
    the drive's reaction −T included."""
    z = motion.positions
    through_guides = (solved.normals[:, reading.guide_slides] * solved.normal_directions[:, reading.guide_slides]
                      * reading.guide_signs)
    at_pivots = -np.add.reduceat(solved.pairs[:, reading.pivot_pairs], reading.pivot_starts, axis=1)
    received = np.concatenate([at_pivots, through_guides], axis=1)
    lever = np.take(z, reading.received_points, axis=1) - z[:, model.pivot, None]
    return received, cross(lever, received).sum(axis=1) - torque


def _shaking(model, centre, motion, force, couple):
    """Σ(−m·a) of every moving mass and its moment about the driver pivot less Σ I·α, from the
    links' inertia ``force`` and ``couple`` and the particles'."""
    origin = motion.positions[:, model.pivot, None]
    moment = cross(centre.position - origin, force).sum(axis=1) + couple.sum(axis=1)
    total = force.sum(axis=1)
    if len(model.particle_point):
        at = model.particle_point
        particle = -model.particle_mass * np.take(motion.accelerations, at, axis=1)
        total = total + particle.sum(axis=1)
        moment = moment + cross(np.take(motion.positions, at, axis=1) - origin, particle).sum(axis=1)
    return total, moment


def _result(cls, mechanism, motion, pick, **extra):
    """Both formulations over the motion's poses, each value taken through ``pick`` (the one pose,
    or all of them)."""
    model = mass_model(mechanism)
    data = mechanism.mass_data
    lay = model.layout
    centre = centres(model, motion)
    solved = solve_forces(model, motion, centre)
    balance_drive, scale = power_balance_torque(model, motion, centre)
    driver = mechanism.driver
    cylinder = driver.is_actuator
    # A cylinder's drive is its axial force; it puts no couple on any link.
    torque = _real(np.zeros_like(solved.drive) if cylinder else solved.drive)
    speed = driver.linear_speed_m_s if cylinder else driver.speed_rad_s
    reading = _reading(lay)
    joint = _xy(solved.pairs[:, reading.pair_index] * reading.signs)
    joints = {}
    for j, (point, link) in enumerate(reading.reported):
        joints.setdefault(point, {})[link] = pick(joint[:, j])
    push = _xy(solved.normals * solved.normal_directions)
    normals = _real(solved.normals)
    slides = {s.name: SlideForce(normal_n=pick(normals[:, i]), force_n=pick(push[:, i]))
              for i, s in enumerate(lay.slides)}
    force, couple, offset, offset_point = _inertia(model, centre, motion)
    shaking_force, shaking_moment = _shaking(model, centre, motion, force, couple)
    force, couple, offset = _xy(force), _real(couple), _real(offset)
    where, centre_xy = _xy(offset_point), _xy(centre.position)
    index = {k: i for i, k in enumerate(lay.links)}
    inertia = {name: LinkInertia(centre_m=pick(centre_xy[:, k]), force_n=pick(force[:, k]),
                                 couple_n_m=pick(couple[:, k]), offset_m=pick(offset[:, k]),
                                 offset_point_m=pick(where[:, k]))
               for name, k in ((n, index[n]) for n in data.masses)}
    particles = _xy(-np.stack([m.mass_kg * motion.accelerations[:, lay.points.index(p)]
                               for p, m in data.point_masses.items()], axis=1)) if data.point_masses else None
    received, frame_moment = _frame(model, motion, solved, reading, torque)
    pivots, guides = reading.pivots, reading.guides
    received_xy = _xy(received)
    size = np.maximum(np.maximum(np.abs(solved.drive), np.abs(balance_drive)), scale)
    difference = np.divide(np.abs(solved.drive - balance_drive), size, out=np.zeros_like(size), where=size > 0)
    frame = FrameLoads(
        pivots_n=MappingProxyType({p: pick(received_xy[:, i]) for i, p in enumerate(pivots)}),
        guides_n=MappingProxyType({g: pick(received_xy[:, len(pivots) + i]) for i, g in enumerate(guides)}),
        drive_reaction_n_m=pick(_real(-torque)), force_n=pick(_xy(received.sum(axis=1))),
        moment_n_m=pick(_real(frame_moment)))
    return cls(
        mechanism=mechanism, driver_angle_deg=pick(_real(motion.angle_deg)), drive_torque_n_m=pick(torque),
        joints_n=MappingProxyType({p: MappingProxyType(by_link) for p, by_link in joints.items()}),
        slides=MappingProxyType(slides), inertia=MappingProxyType(inertia),
        particle_inertia_n=MappingProxyType({p: pick(particles[:, i]) for i, p in enumerate(data.point_masses)}),
        shaking_force_n=pick(_xy(shaking_force)), shaking_moment_n_m=pick(_real(shaking_moment)), frame=frame,
        power_balance=PowerBalance(
            drive_torque_n_m=pick(_real(np.zeros_like(balance_drive) if cylinder else balance_drive)),
            drive_power_w=pick(_real(solved.drive * speed)), relative_difference=pick(_real(difference)),
            drive_force_n=pick(_real(balance_drive)) if cylinder else None),
        drive_force_n=pick(_real(solved.drive)) if cylinder else None,
        driver_length_m=pick(_real(motion.length_m)) if cylinder else None,
        **extra)


def _one(array: np.ndarray):
    """The single pose of a batch of one: a float, or a read-only (2,) view."""
    return float(array[0]) if array.ndim == 1 else array[0]


def forces(solution: Solution) -> Forces:
    """The forces of one solved pose (frictionless joints), SI.

    Raises NoMassData for a design with no mass data, ForcesUndetermined where statics does
    not fix the joint forces."""
    return _result(Forces, solution.mechanism, from_solution(solution), _one, warnings=tuple(solution.warnings))


def sweep_forces(result: Sweep) -> ForceSweep:
    """The forces over a swept cycle, every pose at once (batched linear solves, no loop per
    angle), with the power-balance check at every pose. Frictionless joints.

    Raises NoMassData for a design with no mass data, ForcesUndetermined where statics does
    not fix the joint forces."""
    mech = result.mechanism
    return _result(ForceSweep, mech, from_sweep(result), lambda a: a, warnings=tuple(result.warnings),
                   full_turn=bool(result.full_turn), speed_rad_s=mech.driver.speed_rad_s)
