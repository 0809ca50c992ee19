"""The force polygon of one pose, built the way a draftsman builds it, and its cross-check.

From the kinematic :class:`~kinematics.groups.steps.Construction` and the mass data: the known
loads (:mod:`.inertia`), then the groups from the last back to the driver, each laying its own
steps (``Group.force_steps``) on one force polygon in N (pole at the origin, the scale from the
1, 2, 5 series in N per mm), in the same form as the kinematic polygons. Labels follow one
notation, ``F(a→b)`` the force of a on b (see :mod:`kinematics.groups.force_steps`).

The numeric forces (:func:`kinematics.dynamics.forces`) are read by the cross-check and by a
group that is no dyad (marked numeric), never by the construction of a dyad.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from types import MappingProxyType

from ..dynamics import Forces, forces
from ..dynamics.layout import layout
from ..errors import KinematicsError, NoMassData
from ..groups.force_steps import ForceState
from ..groups.steps import Construction, Polygon, PolygonBuilder, Role
from .inertia import known_loads


@dataclass(frozen=True)
class ForcePolygon:
    """The force construction of one pose.

    Attributes
    ----------
    polygon : the force polygon (kind "force", unit "N", ``scale_per_mm`` N per mm).
    centre_images : the image steps g′ of the centres of mass, on the acceleration polygon.
    angular_accelerations : link -> α (rad/s²) as read off the acceleration polygon.
    joints_n : point -> link -> (x, y) N, the force on the link at the point from what it is pinned
        to there (the convention of :class:`~kinematics.dynamics.Forces`).
    normals_n : slide -> N along the guide line's left normal, on the block.
    drive_torque_n_m : the drive's couple on the driver link, counter-clockwise positive.
    drive_force_n : a cylinder driver's force along its axis, push positive (None for a rotary driver).
    max_relative_difference, where : the cross-check against the numeric forces.
    """

    construction: Construction
    polygon: Polygon
    centre_images: tuple
    angular_accelerations: MappingProxyType
    joints_n: MappingProxyType
    normals_n: MappingProxyType
    drive_torque_n_m: float
    max_relative_difference: float
    where: str
    warnings: tuple = ()
    drive_force_n: float | None = None


def _owned(decomposition, mech) -> dict:
    """Group name -> the points it places (those of its links not known before it)."""
    known, owned = set(mech.ground), {}
    for group in decomposition.chain:
        points = {p for link in group.links for p in mech.links[link]} - known
        owned[group.name] = points
        known |= points
    return owned


def force_polygon(construction: Construction, numeric: Forces | None = None, box_mm: float = 120.0,
                  scale: float | None = None) -> ForcePolygon:
    """Build the force polygon of ``construction``'s pose and cross-check it against ``numeric``
    (the numeric forces of the same pose; computed when None).

    Raises NoMassData for a design with no mass data, ParallelLines where a group's closing
    lines are parallel, ForcesUndetermined where statics does not fix the forces."""
    if not (isinstance(box_mm, (int, float)) and math.isfinite(box_mm) and box_mm > 0):
        raise KinematicsError(f"box_mm must be a positive number, not {box_mm!r}", "box_mm")
    if scale is not None and not (isinstance(scale, (int, float)) and math.isfinite(scale) and scale > 0):
        raise KinematicsError(f"the force scale must be a positive number of N per mm, not {scale!r}", "scale")
    solution = construction.solution
    mech = solution.mechanism
    if mech.mass_data is None or mech.mass_data.is_empty:
        raise NoMassData("the design has no mass data: give link masses, point masses or loads to draw the force "
                         "polygon from", "masses")
    if numeric is None:
        numeric = forces(solution)
    decomposition = construction.decomposition
    pos = {name: complex(*solution.positions[i]) for i, name in enumerate(solution.point_names)}
    acc = {name: complex(*xy) for name, xy in construction.acceleration.images.items()}
    state = ForceState(mech=mech, pos=pos, elements=frozenset(layout(mech).elements),
                       owned=_owned(decomposition, mech),
                       numeric=None if decomposition.all_dyads else numeric)
    centre_steps, alphas = known_loads(construction, state, acc)
    builder = PolygonBuilder("force", "N", frozenset(mech.ground))
    builder.add(Role.IMAGE, None, "o", (0j,), "", "o: the pole of the force polygon; each group's polygon starts here")
    for group in reversed(decomposition.chain):
        group.force_steps(builder, state)
    vertices = [complex(*xy) for step in builder.steps if step is not None for xy in step.coords]
    polygon = builder.finish({}, box_mm, scale, also=tuple(vertices))
    joints = MappingProxyType({p: MappingProxyType({k: (f.real, f.imag) for k, f in by.items()})
                               for p, by in state.joints.items()})
    warnings = [g.construction_warning.replace("polygon points", "forces").replace("numeric solver", "numeric forces")
                for g in decomposition.groups if not g.is_dyad]
    warnings += [f"force polygon, step {s.id} ({s.label}): the closing lines meet at {s.angle_between_deg:.3g}°, "
                 f"condition figure {s.condition:.3g}" for s in polygon.steps if s.flagged]
    made = ForcePolygon(construction=construction, polygon=polygon, centre_images=centre_steps,
                        angular_accelerations=MappingProxyType({k: a for k, (a, _) in alphas.items()}),
                        joints_n=joints, normals_n=MappingProxyType(dict(state.normals)),
                        drive_torque_n_m=float(state.torque_n_m), max_relative_difference=0.0, where="",
                        warnings=tuple(warnings), drive_force_n=state.drive_force_n)
    worst, where = crosscheck(made, numeric)
    return replace(made, max_relative_difference=worst, where=where)


def crosscheck(made: ForcePolygon, numeric: Forces) -> tuple:
    """The largest difference of the construction from ``numeric``, relative to the largest joint
    force of the construction (the drive torque's to that force times the design's size), and
    where: every joint force, every guide force and the drive torque."""
    mech = made.construction.solution.mechanism
    mine = {(p, k): complex(*f) for p, by in made.joints_n.items() for k, f in by.items()}
    reference = max([abs(f) for f in mine.values()] + [abs(n) for n in made.normals_n.values()] + [1e-300])
    worst, where = 0.0, ""
    for point, by_link in numeric.joints_n.items():
        for link, force in by_link.items():
            found = mine.get((point, link))
            if found is None:
                return math.inf, f"{point} on {link} (not constructed)"
            difference = abs(found - complex(*force)) / reference
            if difference > worst or not where:
                worst, where = difference, f"the force on {link} at {point}"
    for name, slide in numeric.slides.items():
        difference = abs(made.normals_n.get(name, math.inf) - float(slide.normal_n)) / reference
        if difference > worst:
            worst, where = difference, f"the guide force of slide {name}"
    size = max(abs(made.drive_torque_n_m), reference * mech.size * mech.metres_per_unit)
    difference = abs(made.drive_torque_n_m - float(numeric.drive_torque_n_m)) / size
    if difference > worst:
        worst, where = difference, "the drive torque"
    if numeric.drive_force_n is not None:
        difference = abs((made.drive_force_n if made.drive_force_n is not None else math.inf)
                         - float(numeric.drive_force_n)) / reference
        if difference > worst:
            worst, where = difference, "the cylinder's force"
    return float(worst), where
