"""Kinepoly's computation core: mechanism files, the numeric solver, the
graphical construction of velocity and acceleration polygons, cycle sweeps.

Never imports Qt.
"""

import math

from .construction.components import RelativeComponent, acceleration_components
from .construction.construct import construct as _construct
from .cycle.sweep import Sweep, sweep, verify_sweep
from .dynamics import drive_summary, forces, sweep_forces
from .edits.moves import move_point
from .edits.naming import rename_link, rename_point, rename_slide
from .errors import (
    CannotAssemble,
    FileFormatError,
    ForcesUndetermined,
    KinematicsError,
    MechanismFindings,
    NoMassData,
    ParallelLines,
    StorageError,
    SweepCancelled,
)
from .files.fileformat import dumps, load_mechanism
from .groups.steps import Component, Construction, Polygon, Role, Step
from .instantaneous.centres import centres
from .model.mass import LinkMass, Load, MassData, PointMass
from .model.mechanism import Driver, Mechanism, Slide
from .reports.caution import CAUTION
from .solver.mobility import Finding, diagnose
from .solver.solve import Solution, solve_pose

# Beyond this the angle's fraction of a turn is lost to rounding.
MAX_ANGLE_DEG = 1e6


def solve(mechanism: Mechanism, angle_deg: float | None = None, length: float | None = None) -> Solution:
    """Position, velocity, acceleration and jerk of every point at driver angle
    ``angle_deg`` (degrees; None for the reference pose), or, for a cylinder driver, at
    cylinder length ``length`` (metres, SI like every result; None for the reference pose).

    Raises MechanismFindings if the mechanism cannot be analysed, and
    CannotAssemble if no pose exists at that angle.
    """
    from .solver.mobility import require_ready

    if angle_deg is not None and not (isinstance(angle_deg, (int, float)) and math.isfinite(angle_deg)
                                      and abs(angle_deg) <= MAX_ANGLE_DEG):
        raise KinematicsError(f"the driver angle must be a finite number of degrees within ±{MAX_ANGLE_DEG:g}, "
                              f"not {angle_deg!r}", "angle")
    if mechanism.driver is not None and mechanism.driver.is_actuator:
        from .groups.decompose import cylinder_group
        from .solver.cylinder import solve_length

        cylinder_group(mechanism)  # what the cylinder must be is said before any other finding
    require_ready(mechanism)
    if mechanism.driver.is_actuator:
        if angle_deg is not None:
            raise KinematicsError("a cylinder-driven design is solved at a cylinder length, not a driver angle",
                                  "angle")
        return solve_length(mechanism, length)
    if length is not None:
        raise KinematicsError("only a cylinder-driven design is solved at a length", "length")
    return solve_pose(mechanism, angle_deg)


def construct(solution: Solution, **options) -> Construction:
    """The velocity and acceleration polygons of a solved pose (see :mod:`kinematics.construction.construct`)."""
    return _construct(solution, **options)


__all__ = [
    "CAUTION", "CannotAssemble", "Component", "Construction", "Driver", "FileFormatError", "Finding",
    "ForcesUndetermined", "KinematicsError", "LinkMass", "Load", "MassData", "Mechanism", "MechanismFindings",
    "NoMassData", "ParallelLines", "PointMass", "Polygon", "RelativeComponent", "Role", "Slide", "Solution", "Step",
    "StorageError", "Sweep", "SweepCancelled", "acceleration_components", "centres", "construct", "diagnose",
    "drive_summary", "dumps", "forces", "load_mechanism", "move_point", "rename_link", "rename_point",
    "rename_slide", "solve", "sweep", "sweep_forces", "verify_sweep",
]
