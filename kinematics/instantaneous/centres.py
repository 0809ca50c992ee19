"""Every instantaneous centre of a pose and the velocities they give: the entry point of the layer."""


from __future__ import annotations

from types import MappingProxyType

from ..construction.construct import construct
from ..errors import KinematicsError
from ..solver.solve import Solution
from .kennedy import Centres, find_centres
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


__all__ = ["centres"]
