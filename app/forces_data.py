"""The forces the window shows, asked of the core and its refusals turned into words (no Qt).

One pose: :func:`pose_forces` (on every drag frame, well under a millisecond). The cycle:
:func:`cycle_forces`, run on the sweep's worker thread beside the sweep itself
(:mod:`app.document`). Nothing here computes a force: every number is the core's
(:func:`kinematics.forces`, :func:`kinematics.sweep_forces`, :func:`kinematics.drive_summary`).
"""

from __future__ import annotations

from dataclasses import dataclass

import kinematics
from kinematics import KinematicsError, NoMassData
from kinematics.dynamics import DEFAULT_FLUCTUATION, DriveSummary, ForceSweep

NO_MASS_DATA = ("No forces: the design has no masses and no loads. Enter a link's mass or a load in the "
                "Masses and loads tab.")
NO_CYCLE_FORCES = "No forces over the cycle: the design is unfinished or its driver cannot be swept."


def pose_forces(solution) -> tuple:
    """``(Forces, "")`` of a solved pose, or ``(None, why)``: no mass data, undetermined joint forces."""
    if solution.mechanism.mass_data is None or solution.mechanism.mass_data.is_empty:
        return None, NO_MASS_DATA
    try:
        return kinematics.forces(solution), ""
    except NoMassData:
        return None, NO_MASS_DATA
    except KinematicsError as error:
        return None, f"No forces at this pose: {error}"


def pose_force_polygon(construction, forces) -> tuple:
    """``(ForcePolygon, words)`` of a constructed pose (``words`` the drive torque and the
    cross-check), or ``(None, why)``: no construction, no mass data, parallel closing lines,
    undetermined forces. ``forces`` are the pose's numeric forces (None: the force polygon
    makes them for its cross-check)."""
    if construction is None:
        return None, "No force polygon: the design is not analysed at this pose."
    from kinematics.forcepolygon import force_polygon

    try:
        made = force_polygon(construction, forces)
    except NoMassData:
        return None, "No force polygon: " + NO_MASS_DATA.removeprefix("No forces: ")
    except KinematicsError as error:
        return None, f"No force polygon at this pose: {error}"
    drive = (f"cylinder force F = {made.drive_force_n:.4g} N (push positive)" if made.drive_force_n is not None
             else f"drive torque T = {made.drive_torque_n_m:.4g} N·m (counter-clockwise positive)")
    return made, f"{drive}; against the numeric forces {made.max_relative_difference:.1e}"


@dataclass(frozen=True)
class CycleForces:
    """The forces over the document's sweep: ``sweep_forces`` (a ForceSweep or None), its drive
    ``summary`` at ``fluctuation`` (None where the driver rocks or accelerates), and in words why
    either is missing (``problem`` for the forces, ``summary_problem`` for the summary)."""

    sweep_forces: ForceSweep | None = None
    summary: DriveSummary | None = None
    problem: str = NO_CYCLE_FORCES
    summary_problem: str = ""
    fluctuation: float = DEFAULT_FLUCTUATION


def cycle_forces(sweep, fluctuation: float = DEFAULT_FLUCTUATION) -> CycleForces:
    """The forces and the drive summary of ``sweep`` (a :class:`kinematics.Sweep` or None)."""
    if sweep is None:
        return CycleForces(fluctuation=fluctuation)
    data = sweep.mechanism.mass_data
    if data is None or data.is_empty:
        return CycleForces(problem=NO_MASS_DATA, fluctuation=fluctuation)
    try:
        result = kinematics.sweep_forces(sweep)
    except NoMassData:
        return CycleForces(problem=NO_MASS_DATA, fluctuation=fluctuation)
    except KinematicsError as error:
        return CycleForces(problem=f"No forces over the cycle: {error}", fluctuation=fluctuation)
    return with_summary(CycleForces(sweep_forces=result, problem="", fluctuation=fluctuation), fluctuation)


def with_summary(found: CycleForces, fluctuation: float) -> CycleForces:
    """``found`` with its drive summary made again for another coefficient of speed fluctuation."""
    if found.sweep_forces is None:
        return CycleForces(problem=found.problem, fluctuation=fluctuation)
    try:
        summary, problem = kinematics.drive_summary(found.sweep_forces, fluctuation), ""
    except KinematicsError as error:
        summary, problem = None, f"No drive summary: {error}"
    return CycleForces(sweep_forces=found.sweep_forces, summary=summary, problem="", summary_problem=problem,
                       fluctuation=fluctuation)
