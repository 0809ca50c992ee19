"""Formulation (1): Newton-Euler, one linear system per pose, solved for all poses at once.

Every moving link balances forces and moments (about its first point), every pin or block
element balances forces, under the D'Alembert inertia forces −m·a and couples −I·α, gravity
and the loads. Unknowns: the joint force pairs, the slides' normal forces, the drive torque
(see :mod:`kinematics.forces.layout`). Joints are frictionless: a pin passes a force through
its centre, a slide a force along its guide's normal.

Moment rows are divided by the design's size L and the drive torque is solved as T/L, so all
coefficients are of order one and the condition figure means what it says.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..errors import ForcesUndetermined
from ..model.memo import remembered
from .bodies import Centres, MassModel, Motion, active, cross

# Condition figure above which a pose's joint forces are taken as not determined (the solver
# refuses a kinematic Jacobian past the same figure as a dead point).
UNDETERMINED_CONDITION = 1e14


@dataclass(frozen=True, eq=False)
class _Assembly:
    """What does not change from pose to pose: the matrix's constant entries, where the moment
    arms go, and incidence matrices taking applied forces and couples to rows."""

    template: np.ndarray
    arm_rows: np.ndarray
    arm_columns: np.ndarray
    arm_points: np.ndarray
    arm_origins: np.ndarray
    arm_signs: np.ndarray
    link_rows: tuple
    particle_rows: tuple
    force_rows: tuple
    torque_rows: np.ndarray
    couple_rows: np.ndarray


def _rows_of(lay, links: np.ndarray, elements: np.ndarray, length_m: float):
    """(x, y, moment) incidence matrices (count, rows) for items on links (index ≥ 0) or elements."""
    count = len(links)
    x, y, m = (np.zeros((count, lay.size)) for _ in range(3))
    for i, (k, e) in enumerate(zip(links, elements, strict=True)):
        if k >= 0:
            x[i, 3 * k], y[i, 3 * k + 1], m[i, 3 * k + 2] = 1.0, 1.0, 1.0 / length_m
        else:
            x[i, lay.element_row(e)], y[i, lay.element_row(e) + 1] = 1.0, 1.0
    return x, y, m


def _assembly(model: MassModel) -> _Assembly:
    lay = model.layout
    template = np.zeros((lay.size, lay.size))
    arms = []
    for pair in lay.pairs:
        for (kind, index), sign, point in pair.on:
            row = 3 * index if kind == "link" else lay.element_row(index)
            template[row, pair.column] = template[row + 1, pair.column + 1] = sign
            if kind == "link":
                arms.append((3 * index + 2, pair.column, lay.points.index(point), model.first[index], sign))
    template[3 * lay.driver + 2, lay.torque_column] = 1.0
    arms = np.array(arms, float).reshape(-1, 5)
    nl = len(lay.links)
    every = np.arange(nl)
    return _Assembly(
        template=template, arm_rows=arms[:, 0].astype(int), arm_columns=arms[:, 1].astype(int),
        arm_points=arms[:, 2].astype(int), arm_origins=arms[:, 3].astype(int), arm_signs=arms[:, 4],
        link_rows=_rows_of(lay, every, every, model.length_m),
        particle_rows=_rows_of(lay, model.particle_link, model.particle_element, model.length_m),
        force_rows=_rows_of(lay, model.force_link, model.force_element, model.length_m),
        torque_rows=_rows_of(lay, model.torque_link, model.torque_link, model.length_m)[2],
        couple_rows=_rows_of(lay, every, every, model.length_m)[2])


@dataclass(frozen=True)
class Solved:
    """Newton-Euler results over N poses: ``pairs`` (N, pairs, 2) the unknown force of each pair
    (see Layout), ``normals`` (N, slides) N, ``normal_directions`` (N, slides, 2) the guides' left
    normals, ``torque`` (N,) N·m, ``condition`` the largest condition figure met."""

    pairs: np.ndarray
    normals: np.ndarray
    normal_directions: np.ndarray
    torque: np.ndarray
    condition: float


def _applied(model: MassModel, motion: Motion, centres: Centres, rows: _Assembly) -> np.ndarray:
    """The known terms of every balance (N, rows): inertia, gravity and loads, moments about
    each link's first point divided by L."""
    x, acc = motion.positions, motion.accelerations
    origin = x[:, model.first]
    g = model.gravity
    link_force = model.mass[:, None] * (g - centres.acceleration)
    total = _spread(link_force, cross(centres.arm, link_force), rows.link_rows)
    total += (-model.inertia * motion.alpha) @ rows.couple_rows
    if len(model.particle_point):
        at = x[:, model.particle_point]
        force = model.particle_mass[:, None] * (g - acc[:, model.particle_point])
        lever = at - origin[:, np.maximum(model.particle_link, 0)]
        total += _spread(force, cross(lever, force), rows.particle_rows)
    if len(model.force_point):
        at = x[:, model.force_point]
        force = active(model.force_load, motion.angle_deg, model.sense)[..., None] * model.force_value
        lever = at - origin[:, np.maximum(model.force_link, 0)]
        total += _spread(force, cross(lever, force), rows.force_rows)
    if len(model.torque_link):
        total += (active(model.torque_load, motion.angle_deg, model.sense) * model.torque_value) @ rows.torque_rows
    return total


def _spread(force, moment, rows) -> np.ndarray:
    x, y, m = rows
    return force[..., 0] @ x + force[..., 1] @ y + moment @ m


def solve_forces(model: MassModel, motion: Motion, centres: Centres, check_every_pose: bool = True) -> Solved:
    """Build and solve the N systems at once.

    Raises ForcesUndetermined where a pose's system is singular (statics does not fix the
    joint forces). ``check_every_pose`` False checks the condition at the first pose only and
    the finiteness of every result (a sweep's poses keep clear of dead points)."""
    rows = remembered(model, "assembly", lambda: _assembly(model))
    lay = model.layout
    x = motion.positions
    count = len(x)
    length = model.length_m
    matrix = np.broadcast_to(rows.template, (count,) + rows.template.shape).copy()
    lever = (x[:, rows.arm_points] - x[:, rows.arm_origins]) / length
    matrix[:, rows.arm_rows, rows.arm_columns] = -rows.arm_signs * lever[..., 1]
    matrix[:, rows.arm_rows, rows.arm_columns + 1] = rows.arm_signs * lever[..., 0]
    directions = np.zeros((count, len(lay.slides), 2))
    for i, slide in enumerate(lay.slides):
        e, f, p = (lay.points.index(name) for name in (*slide.line, slide.point))
        line = x[:, f] - x[:, e]
        normal = np.stack([-line[:, 1], line[:, 0]], axis=1) / np.linalg.norm(line, axis=1)[:, None]
        directions[:, i] = normal
        if slide.element is not None:
            row = lay.element_row(slide.element)
            matrix[:, row, slide.column], matrix[:, row + 1, slide.column] = normal[:, 0], normal[:, 1]
        if slide.guide is not None:
            g = 3 * slide.guide
            matrix[:, g, slide.column], matrix[:, g + 1, slide.column] = -normal[:, 0], -normal[:, 1]
            guide_arm = (x[:, p] - x[:, model.first[slide.guide]]) / length
            matrix[:, g + 2, slide.column] = -cross(guide_arm, normal)
    figures = np.linalg.cond(matrix if check_every_pose else matrix[:1])
    figures = np.where(np.isfinite(figures), figures, np.inf)
    worst = int(np.argmax(figures))
    if figures[worst] > UNDETERMINED_CONDITION:
        raise ForcesUndetermined(_undetermined(figures[worst]), f"driver angle {motion.angle_deg[worst]:.3f}°")
    try:
        unknowns = np.linalg.solve(matrix, -_applied(model, motion, centres, rows)[..., None])[..., 0]
    except np.linalg.LinAlgError:
        unknowns = np.full((count, lay.size), np.inf)
    finite = np.isfinite(unknowns).all(axis=1)
    if not finite.all():
        worst = int(np.argmin(finite))
        raise ForcesUndetermined(_undetermined(np.inf), f"driver angle {motion.angle_deg[worst]:.3f}°")
    columns = np.array([p.column for p in lay.pairs], int)
    pairs = np.stack([unknowns[:, columns], unknowns[:, columns + 1]], axis=-1)
    normals = unknowns[:, [s.column for s in lay.slides]]
    return Solved(pairs=pairs, normals=normals, normal_directions=directions,
                  torque=unknowns[:, lay.torque_column] * length, condition=float(figures.max()))


def _undetermined(condition: float) -> str:
    return (f"the joint forces are not determined by statics here (condition figure {condition:.3g}): a redundant "
            "constraint or a locked pose; no least-squares guess is made")
