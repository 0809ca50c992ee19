"""The graphical construction of the velocity and acceleration polygons.

From a solved pose (the space diagram), each polygon is built the way a
draftsman builds it: lay the known vectors, draw the lines whose direction is
known, intersect; images of further points by similarity. Each group of the
decomposition works out its own motion and lays its own steps
(``Group.velocity_steps``, ``Group.acceleration_steps``); here they are put in
order as :class:`Step` records with shapely geometry in polygon units (m/s or
m/s², pole at the origin), which the window, the printer and the DXF writer draw.
The numeric solver's values are used only for the cross-check.
"""

from __future__ import annotations

import math

import numpy as np

from ..errors import KinematicsError
from ..groups.base import Frame
from ..groups.decompose import decompose
from ..groups.steps import Construction, PolygonBuilder, Role
from ..solver.solve import Solution


def _crosscheck(solution: Solution, velocity_images: dict, acceleration_images: dict):
    worst, where = 0.0, ""
    row = {name: i for i, name in enumerate(solution.point_names)}
    for kind, images, values in (("velocity", velocity_images, solution.velocities),
                                 ("acceleration", acceleration_images, solution.accelerations)):
        reference = max((abs(z) for z in images.values()), default=0.0)
        if reference == 0.0:
            continue
        solver = values.tolist()
        for name, z in images.items():
            difference = abs(complex(z) - complex(*solver[row[name]])) / reference
            if difference > worst or not where:
                worst, where = difference, f"{name} ({kind})"
    return worst, where


# The construction and the solver agree to this in a well-posed design (relative to the polygon).
CROSS_CHECK_LIMIT = 1e-9
# A design farther than this many times its own size from the origin loses digits to its offset ...
FAR_FROM_ORIGIN = 1e3
# ... and a pose whose constraint Jacobian's condition figure is above this loses them to the pose.
ILL_CONDITIONED = 1e6


def _crosscheck_warning(solution: Solution, worst: float, where: str) -> str:
    """Why the cross-check figure is above CROSS_CHECK_LIMIT, in words ("" when it is not).

    Both formulations work in coordinates from the origin, whose rounding is about 1e-16 of the
    distance from the origin; the solver's velocities carry that rounding times the condition figure."""
    if not worst > CROSS_CHECK_LIMIT:
        return ""
    mech = solution.mechanism
    unit = mech.length_unit
    far = max(math.hypot(x, y) for x, y in mech.points.values())
    ratio = far / mech.size if mech.size > 0 else math.inf
    reasons = []
    if ratio > FAR_FROM_ORIGIN:
        reasons.append(f"the design lies {far:.3g} {unit} from the origin, {ratio:.3g} times its own size "
                       f"({mech.size:.3g} {unit}), so its coordinates keep about {math.log10(ratio):.0f} fewer "
                       "digits of its lengths (move it nearer the origin)")
    if solution.condition > ILL_CONDITIONED:
        reasons.append(f"the constraint Jacobian's condition figure here is {solution.condition:.3g} (the pose is "
                       "near a dead point or a toggle, where small rounding gives large differences)")
    if not reasons:
        reasons.append(f"neither the conditioning (condition figure {solution.condition:.3g}) nor the distance from "
                       f"the origin ({ratio:.3g} times the design's size) explains it")
    return (f"cross-check: the polygons differ from the numeric solver by {worst:.2e} (relative) at {where}, above "
            f"the {CROSS_CHECK_LIMIT:g} a well-posed design agrees to: " + "; and ".join(reasons))


def construct(solution: Solution, box_mm: float = 120.0, velocity_scale: float | None = None,
              acceleration_scale: float | None = None) -> Construction:
    """Build both polygons of ``solution`` by graphical construction.

    Parameters
    ----------
    box_mm : size of the square box each polygon should fit when drawn.
    velocity_scale, acceleration_scale : fixed scales (m/s or m/s² per mm), or None to choose.
    """
    for name, value, allow_none in (("box_mm", box_mm, False), ("velocity_scale", velocity_scale, True),
                                    ("acceleration_scale", acceleration_scale, True)):
        if value is None and allow_none:
            continue
        if not (isinstance(value, (int, float)) and math.isfinite(value) and value > 0):
            raise KinematicsError(f"{name} must be a positive number, not {value!r}", name)
    mech = solution.mechanism
    decomposition = decompose(mech)
    frame = Frame.start(mech, math.radians(solution.driver_angle_deg), solution=solution,
                        driver_length_m=solution.driver_length_m)
    decomposition.driver.position(frame)  # the driver's given placement, which its images are made from
    for i, name in enumerate(solution.point_names):  # the solver's space diagram, exactly
        frame.pos[name] = np.complex128(complex(*solution.positions[i]))
    ground = frozenset(mech.ground)
    vb, ab = PolygonBuilder("velocity", "m/s", ground), PolygonBuilder("acceleration", "m/s^2", ground)
    placed_v, placed_a = set(mech.ground), set(mech.ground)
    vb.add(Role.IMAGE, None, "o", (0j,), "v = 0 for every fixed point",
           "o: the pole; every fixed point has its velocity image here", points=tuple(mech.ground))
    ab.add(Role.IMAGE, None, "o′", (0j,), "a = 0 for every fixed point",
           "o′: the pole; every fixed point has its acceleration image here", points=tuple(mech.ground))
    warnings = list(solution.warnings)
    for group in decomposition.chain:
        if group.construction_warning:
            warnings.append(group.construction_warning)
        group.velocity_steps(vb, frame, placed_v)
    for group in decomposition.chain:
        group.acceleration_steps(ab, frame, placed_a)
    velocity_images = {n: frame.vel[n] for n in mech.points if n in frame.vel}
    acceleration_images = {n: frame.acc[n] for n in mech.points if n in frame.acc}
    worst, where = _crosscheck(solution, velocity_images, acceleration_images)
    if _crosscheck_warning(solution, worst, where):
        warnings.append(_crosscheck_warning(solution, worst, where))
    velocity = vb.finish(velocity_images, box_mm, velocity_scale)
    acceleration = ab.finish(acceleration_images, box_mm, acceleration_scale)
    for step in velocity.steps + acceleration.steps:
        if step.flagged:
            warnings.append(f"{step.polygon} polygon, step {step.id} ({step.label}): construction lines meet at "
                            f"{step.angle_between_deg:.3g}°, condition figure {step.condition:.3g}")
    return Construction(solution=solution, decomposition=decomposition, velocity=velocity,
                        acceleration=acceleration, max_relative_difference=worst, where=where,
                        warnings=tuple(warnings))
