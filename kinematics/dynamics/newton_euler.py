"""Formulation (1): Newton-Euler, one linear system per pose, solved for all poses at once.

Every moving link balances forces and moments (about its first point), every pin or block
element balances forces, under the D'Alembert inertia forces −m·a and couples −I·α, gravity
and the loads. Unknowns: the joint force pairs, the slides' normal forces, the drive torque
(see :mod:`kinematics.dynamics.layout`). Joints are frictionless: a pin passes a force through
its centre, a slide a force along its guide's normal.

The drive unknown is the torque T on the driver link for a rotary driver; for a cylinder it is
the axial force F along the cylinder's line (push positive): +F·u on the rod's end, −F·u on the
barrel, u the unit vector from the barrel's pivot to the rod's end.

Moment rows are divided by the design's size L and a drive torque is solved as T/L, so all
coefficients are of order one (a cylinder's F enters through u, of order one already).
The system is solved block by block (:mod:`.blocks`).
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache

import numpy as np

from ..errors import ForcesUndetermined
from ..model.memo import remembered
from .blocks import plan, solve
from .bodies import Centres, MassModel, Motion, active, cross


@dataclass(frozen=True, eq=False)
class _Assembly:
    """What does not change from pose to pose: where the moment arms of the joint forces go, the
    slides' entries, the block plan, and the rows each applied force goes to."""

    arm_points: np.ndarray
    arm_origins: np.ndarray
    arm_signs: np.ndarray
    slide_entries: tuple
    blocks: tuple
    applied_points: np.ndarray
    applied_origins: np.ndarray
    applied_rows: tuple
    drive_entry: tuple | None


def _incidence(lay, links, elements) -> tuple:
    """Per item on a link (index ≥ 0) or an element: its (x, y, moment) rows, moment −1 on an element."""
    return tuple((3 * k, 3 * k + 1, 3 * k + 2) if k >= 0 else (lay.element_row(e), lay.element_row(e) + 1, -1)
                 for k, e in zip(links, elements, strict=True))


def _slide_entries(lay, first) -> tuple:
    """Per slide: (column, point, line ends, rows, the guide's first point or −1); ``rows`` lists
    (row, which): 0/1 the normal's x/y on the block, 3/4 minus them on the guide, 2 the guide's
    moment."""
    entries = []
    for slide in lay.slides:
        rows = []
        if slide.element is not None:
            row = lay.element_row(slide.element)
            rows += [(row, 0), (row + 1, 1)]
        if slide.guide is not None:
            rows += [(3 * slide.guide, 3), (3 * slide.guide + 1, 4), (3 * slide.guide + 2, 2)]
        entries.append((slide.column, lay.points.index(slide.point), lay.points.index(slide.line[0]),
                        lay.points.index(slide.line[1]), tuple(rows),
                        int(first[slide.guide]) if slide.guide is not None else -1))
    return tuple(entries)


def _cylinder_entry(lay, slides: tuple, cylinder: str | None):
    """The cylinder's drive column with the rows of its slide (block and barrel), as a slide entry
    whose direction is the axis instead of the normal; None for a rotary driver."""
    if cylinder is None:
        return None
    k = next(i for i, s in enumerate(lay.slides) if s.name == cylinder)
    return (lay.torque_column, *slides[k][1:])


def _assembly(model: MassModel) -> _Assembly:
    """The assembly of ``model``, from a cache keyed by what it depends on (names and indices,
    no numbers), so a drag, which makes a new Mechanism every frame, plans the blocks once."""
    return _assembled(model.layout, tuple(model.first), tuple(model.particle_point), tuple(model.particle_link),
                      tuple(model.particle_element), tuple(model.force_point), tuple(model.force_link),
                      tuple(model.force_element), tuple(model.torque_link), model.cylinder)


@lru_cache(maxsize=64)
def _assembled(lay, first, particle_point, particle_link, particle_element, force_point, force_link, force_element,
               torque_link, cylinder) -> _Assembly:
    first = np.array(first, int)
    constant = np.zeros((lay.size, lay.size))
    arms = []
    for pair in lay.pairs:
        for (kind, index), sign, point in pair.on:
            row = 3 * index if kind == "link" else lay.element_row(index)
            constant[row, pair.column] = constant[row + 1, pair.column + 1] = sign
            if kind == "link" and lay.points.index(point) != first[index]:
                # (A force at the link's first point has no moment about it: no entry.)
                arms.append((3 * index + 2, pair.column, lay.points.index(point), first[index], sign))
    arms = np.array(arms, float).reshape(-1, 5)
    arm_rows, arm_columns = arms[:, 0].astype(int), arms[:, 1].astype(int)
    slides = _slide_entries(lay, first)
    drive = _cylinder_entry(lay, slides, cylinder)
    if drive is None:
        constant[3 * lay.driver + 2, lay.torque_column] = 1.0
    # The varying entries, in the order _varying gives their values (the cylinder's after the slides').
    varying = slides if drive is None else (*slides, drive)
    rows = list(arm_rows) * 2 + [r for entry in varying for r, _ in entry[4]]
    columns = list(arm_columns) + [c + 1 for c in arm_columns] + [entry[0] for entry in varying for _ in entry[4]]
    fixed_row = np.ones(lay.size, bool)
    fixed_row[2:3 * len(lay.links):3] = False
    pair_column = np.zeros(lay.size, bool)
    for pair in lay.pairs:
        pair_column[pair.column:pair.column + 2] = True
    blocks = plan(constant, np.array(rows, int), np.array(columns, int), fixed_row, pair_column)
    # Applied forces other than the links' own: particles, then point loads.
    on_links = np.array((*particle_link, *force_link), int)
    on_elements = np.array((*particle_element, *force_element), int)
    return _Assembly(
        arm_points=arms[:, 2].astype(int), arm_origins=arms[:, 3].astype(int), arm_signs=arms[:, 4],
        slide_entries=slides, blocks=blocks,
        applied_points=np.array((*particle_point, *force_point), int),
        applied_origins=first[np.maximum(np.array((*particle_link, *force_link), int), 0)],
        applied_rows=_incidence(lay, on_links, on_elements), drive_entry=drive)


@dataclass(frozen=True)
class Solved:
    """Newton-Euler results over N poses: ``pairs`` (N, pairs) complex, the unknown force of each
    pair (see Layout); ``normals`` (N, slides) N; ``normal_directions`` (N, slides) complex, the
    guides' left normals; ``drive`` (N,): the drive torque (N·m) of a rotary driver, or a
    cylinder's axial force (N, push positive)."""

    pairs: np.ndarray
    normals: np.ndarray
    normal_directions: np.ndarray
    drive: np.ndarray


def _right_side(model: MassModel, motion: Motion, centres: Centres, rows: _Assembly) -> np.ndarray:
    """The right-hand side of every balance (N, rows): minus the known inertia, gravity and load
    terms, moments about each link's first point divided by L. The links' own terms go straight
    to their rows; the particles' and loads' are taken from theirs."""
    z, g = motion.positions, model.gravity
    count, nl = len(z), len(model.layout.links)
    total = np.zeros((count, model.layout.size))
    own = model.mass * (centres.acceleration - g)
    total[:, 0:3 * nl:3], total[:, 1:3 * nl:3] = own.real, own.imag
    total[:, 2:3 * nl:3] = (cross(centres.arm, own) + model.inertia * motion.alpha) / model.length_m
    forces = []
    if len(model.particle_point):
        forces.append(model.particle_mass * (g - np.take(motion.accelerations, model.particle_point, axis=1)))
    if len(model.force_point):
        forces.append(active(model.force_load, motion.angle_deg, model.sense) * model.force_value)
    if forces:
        force = np.concatenate(forces, axis=1) if len(forces) > 1 else forces[0]
        moment = cross(np.take(z, rows.applied_points, axis=1) - np.take(z, rows.applied_origins, axis=1),
                       force) / model.length_m
        # Few items (a handful of particles and loads), each onto its own rows; several may share one.
        for i, (x, y, m) in enumerate(rows.applied_rows):
            total[:, x] -= force[:, i].real
            total[:, y] -= force[:, i].imag
            if m >= 0:
                total[:, m] -= moment[:, i]
    if len(model.torque_link):
        acting = active(model.torque_load, motion.angle_deg, model.sense) * model.torque_value / model.length_m
        for i, link in enumerate(model.torque_link):
            total[:, 3 * link + 2] -= acting[:, i]
    return total


def _varying(model: MassModel, rows: _Assembly, z: np.ndarray):
    """The values (N, entries) of the entries that vary with the pose, and the slides' left
    normals (N, slides) complex."""
    length = model.length_m
    lever = (np.take(z, rows.arm_points, axis=1) - np.take(z, rows.arm_origins, axis=1)) * (rows.arm_signs / length)
    values = [-lever.imag, lever.real]
    normals = np.zeros((len(z), len(rows.slide_entries)), complex)
    for i, (_, point, start, end, where, guide_origin) in enumerate(rows.slide_entries):
        line = z[:, end] - z[:, start]
        normal = 1j * line / np.abs(line)
        normals[:, i] = normal
        parts = {0: normal.real, 1: normal.imag, 3: -normal.real, 4: -normal.imag}
        if guide_origin >= 0:
            parts[2] = -cross((z[:, point] - z[:, guide_origin]) / length, normal)
        values += [parts[which][:, None] for _, which in where]
    if rows.drive_entry is not None:
        _, point, start, _, where, guide_origin = rows.drive_entry
        axis = z[:, point] - z[:, start]
        axis = axis / np.abs(axis)
        parts = {0: axis.real, 1: axis.imag, 3: -axis.real, 4: -axis.imag,
                 2: -cross((z[:, point] - z[:, guide_origin]) / length, axis)}
        values += [parts[which][:, None] for _, which in where]
    return np.concatenate(values, axis=1), normals


def solve_forces(model: MassModel, motion: Motion, centres: Centres) -> Solved:
    """Build and solve the N systems at once, block after block.

    Raises ForcesUndetermined where a pose's system is singular (statics does not fix the
    joint forces there)."""
    rows = remembered(model, "assembly", lambda: _assembly(model))
    lay = model.layout
    values, normals = _varying(model, rows, motion.positions)
    unknowns, singular = solve(rows.blocks, values, _right_side(model, motion, centres, rows))
    if singular is not None:
        raise ForcesUndetermined("the joint forces are not determined by statics here: a redundant constraint "
                                 "or a locked pose; no least-squares guess is made",
                                 motion.where(singular))
    # The pairs' columns come first, x then y of each: read them as complex numbers.
    return Solved(pairs=np.ascontiguousarray(unknowns[:, :2 * len(lay.pairs)]).view(complex),
                  normals=unknowns[:, [s.column for s in lay.slides]], normal_directions=normals,
                  drive=unknowns[:, lay.torque_column] * (1.0 if model.cylinder else model.length_m))
