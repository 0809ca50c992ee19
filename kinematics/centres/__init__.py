"""Instantaneous centres by Kennedy's theorem: every centre of a pose, the velocities they give
(a third formulation beside the polygon and the solver), and the mechanical advantage.

See :mod:`kinematics.centres.kennedy` for the bodies and the order the centres are found in,
:mod:`kinematics.centres.velocities` for the velocities, :mod:`kinematics.centres.advantage`
for the output against the driver.
"""

from __future__ import annotations

from types import MappingProxyType

from ..construction.construct import construct
from ..errors import KinematicsError
from ..solver.solve import Solution
from .advantage import Advantage, advantage
from .kennedy import Centre, Centres, body_names, describe, find_centres, pair_name
from .lines import Place
from .velocities import crosscheck, motions, point_ratios


def centres(solution: Solution, construction=None) -> Centres:
    """Every instantaneous centre of ``solution``, and the velocities found from them.

    ``construction`` (the pose's :func:`kinematics.construct`) is made here when not given; it
    is used only for the cross-check. A pose whose polygon cannot be built (parallel lines
    at a dead point of a group) is checked against the solver alone, and says so.
    """
    finder = find_centres(solution)
    known = motions(finder)
    mech = solution.mechanism
    omega_ratios = {link: known[link].omega for link in mech.links if link in known}
    ratios = point_ratios(finder, known)
    warnings = list(finder.warnings)
    missing = [link for link in mech.links if link not in known]
    if missing:
        warnings.append(f"the centres do not reach {', '.join(missing)}: no velocity from them")
    images = None
    try:
        built = construction if construction is not None else construct(solution)
        images = {name: complex(*xy) for name, xy in built.velocity.images.items()}
    except KinematicsError as err:
        warnings.append(f"checked against the solver only: the velocity polygon could not be built ({err})")
    worst, where = crosscheck(solution, ratios, omega_ratios, images)
    return Centres(solution=solution, bodies=finder.bodies, centres=MappingProxyType(dict(finder.found)),
                   steps=tuple(finder.steps), angular_velocity_ratio=MappingProxyType(omega_ratios),
                   velocity_ratio=MappingProxyType({k: (z.real, z.imag) for k, z in ratios.items()}),
                   max_relative_difference=worst, where=where, warnings=tuple(warnings))


__all__ = ["Advantage", "Centre", "Centres", "Place", "advantage", "body_names", "centres", "describe", "pair_name"]
