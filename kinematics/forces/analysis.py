"""The forces of a pose or a cycle: both formulations over a batch of poses, and the results
read off them (joint forces by link, slides, inertia, shaking, what the frame receives)."""

from __future__ import annotations

from types import MappingProxyType

import numpy as np

from ..cycle.sweep import Sweep
from ..solver.solve import Solution
from .bodies import Centres, MassModel, Motion, centres, cross, mass_model
from .motion import from_solution, from_sweep
from .newton_euler import Solved, solve_forces
from .power import power_balance_torque
from .results import Forces, ForceSweep, FrameLoads, LinkInertia, PowerBalance, SlideForce, fixed


def _inertia(model: MassModel, centre: Centres, motion: Motion, names) -> dict:
    force = -model.mass[:, None] * centre.acceleration
    couple = -model.inertia * motion.alpha
    squared = np.einsum("nki,nki->nk", force, force)
    moving = squared > 0.0
    scale = np.divide(couple, squared, out=np.zeros_like(couple), where=moving)
    arm = scale[..., None] * np.stack([force[..., 1], -force[..., 0]], axis=-1)
    offset = np.where(moving, np.sqrt(np.divide(couple ** 2, squared, out=np.zeros_like(couple), where=moving)),
                      np.where(couple == 0.0, 0.0, np.inf))
    index = {k: i for i, k in enumerate(model.layout.links)}
    return {name: LinkInertia(centre_m=centre.position[:, index[name]], force_n=force[:, index[name]],
                              couple_n_m=couple[:, index[name]], offset_m=offset[:, index[name]],
                              offset_point_m=centre.position[:, index[name]] + arm[:, index[name]])
            for name in names}


def _frame(model: MassModel, motion: Motion, solved: Solved) -> FrameLoads:
    lay = model.layout
    x = motion.positions
    pivots, guides = {}, {}
    for i, pair in enumerate(lay.pairs):
        if pair.frame is not None:
            pivots[pair.frame] = pivots.get(pair.frame, 0.0) - solved.pairs[:, i]
    for i, slide in enumerate(lay.slides):
        push = solved.normals[:, i, None] * solved.normal_directions[:, i]
        if slide.guide is None:
            guides[slide.name] = -push
        elif slide.point in lay.fixed:
            guides[slide.name] = push  # a block pivoted on the frame, the moving guide sliding through it
    origin = x[:, model.pivot]
    total = sum(pivots.values()) + sum(guides.values(), np.zeros_like(origin))
    moment = -solved.torque
    for point, received in pivots.items():
        moment = moment + cross(x[:, lay.points.index(point)] - origin, received)
    for name, received in guides.items():
        point = next(s.point for s in lay.slides if s.name == name)
        moment = moment + cross(x[:, lay.points.index(point)] - origin, received)
    return FrameLoads(pivots_n=pivots, guides_n=guides, drive_reaction_n_m=-solved.torque, force_n=total,
                      moment_n_m=moment)


def _shaking(model: MassModel, centre: Centres, motion: Motion):
    origin = motion.positions[:, model.pivot]
    force = -model.mass[:, None] * centre.acceleration
    moment = cross(centre.position - origin[:, None], force).sum(axis=1) - (model.inertia * motion.alpha).sum(axis=1)
    total = force.sum(axis=1)
    if len(model.particle_point):
        at = model.particle_point
        particle = -model.particle_mass[:, None] * motion.accelerations[:, at]
        total = total + particle.sum(axis=1)
        moment = moment + cross(motion.positions[:, at] - origin[:, None], particle).sum(axis=1)
    return total, moment


def _fields(mechanism, motion: Motion, check_every_pose: bool) -> dict:
    """Everything, as arrays over the batch."""
    model = mass_model(mechanism)
    centre = centres(model, motion)
    solved = solve_forces(model, motion, centre, check_every_pose)
    balance_torque, scale = power_balance_torque(model, motion, centre)
    lay = model.layout
    joints = {}
    for i, pair in enumerate(lay.pairs):
        for point, link, sign in pair.reported:
            joints.setdefault(point, {})[link] = sign * solved.pairs[:, i]
    slides = {s.name: SlideForce(normal_n=solved.normals[:, i],
                                 force_n=solved.normals[:, i, None] * solved.normal_directions[:, i])
              for i, s in enumerate(lay.slides)}
    size = np.maximum(np.maximum(np.abs(solved.torque), np.abs(balance_torque)), scale)
    difference = np.divide(np.abs(solved.torque - balance_torque), size, out=np.zeros_like(size), where=size > 0)
    shaking_force, shaking_moment = _shaking(model, centre, motion)
    particles = {p: -m.mass_kg * motion.accelerations[:, lay.points.index(p)]
                 for p, m in mechanism.mass_data.point_masses.items()}
    return dict(driver_angle_deg=motion.angle_deg, drive_torque_n_m=solved.torque, joints_n=joints, slides=slides,
                inertia=_inertia(model, centre, motion, mechanism.mass_data.masses), particle_inertia_n=particles,
                shaking_force_n=shaking_force, shaking_moment_n_m=shaking_moment,
                frame=_frame(model, motion, solved),
                power_balance=PowerBalance(drive_torque_n_m=balance_torque,
                                           drive_power_w=solved.torque * mechanism.driver.speed_rad_s,
                                           relative_difference=difference),
                condition=solved.condition)


def _select(value, pick):
    """Each array of a result taken through ``pick`` (one pose, or all), made read-only."""
    if isinstance(value, (LinkInertia, SlideForce, FrameLoads, PowerBalance)):
        return type(value)(**{k: _select(v, pick) for k, v in vars(value).items()})
    if isinstance(value, dict):
        return MappingProxyType({k: _select(v, pick) for k, v in value.items()})
    return fixed(pick(np.asarray(value)))


def forces(solution: Solution) -> Forces:
    """The forces of one solved pose (frictionless joints), SI.

    Raises NoMassData for a design with no mass data, ForcesUndetermined where statics does
    not fix the joint forces."""
    mech = solution.mechanism
    fields = _fields(mech, from_solution(solution), check_every_pose=True)
    values = {k: _select(v, lambda a: a[0]) if k not in ("condition",) else v for k, v in fields.items()}
    values["driver_angle_deg"] = float(solution.driver_angle_deg)
    return Forces(mechanism=mech, warnings=tuple(solution.warnings), **values)


def sweep_forces(result: Sweep) -> ForceSweep:
    """The forces over a swept cycle, every pose at once (batched linear solves, no loop per
    angle), with the power-balance check at every pose. Frictionless joints.

    Raises NoMassData for a design with no mass data, ForcesUndetermined where statics does
    not fix the joint forces."""
    mech = result.mechanism
    fields = _fields(mech, from_sweep(result), check_every_pose=False)
    values = {k: _select(v, lambda a: a) if k != "condition" else v for k, v in fields.items()}
    return ForceSweep(mechanism=mech, warnings=tuple(result.warnings), full_turn=bool(result.full_turn),
                      speed_rad_s=mech.driver.speed_rad_s, **values)
