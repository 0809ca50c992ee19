"""The status line's words: the cross-check figure, the warnings, or what
stops analysis."""

from __future__ import annotations

from kinematics.groups.steps import ROUNDING_FLOOR, agreement
from kinematics.model.units import angle_text


def status_text(analysis, note: str = "") -> str:
    """One line for the window's status bar, ``note`` first (the latest drag or turn message)."""
    parts = [note] if note else []
    construction = analysis.construction
    if construction is None:
        if analysis.findings:
            parts.append("not ready to analyse — " + "; ".join(str(f) for f in analysis.findings))
        elif analysis.problem:
            parts.append(f"cannot analyse: {analysis.problem}")
        return " · ".join(parts)
    difference = construction.max_relative_difference
    where = "" if difference < ROUNDING_FLOOR else f", at {construction.where or 'no moving point'}"
    solution = construction.solution
    if solution.driver_length_m is None:
        pose = f"driver at {angle_text(solution.driver_angle_deg)}"
    else:
        # To 0.01 mm, as the length control, the sheet and the CLI say a cylinder's length.
        pose = f"{solution.mechanism.driver.cylinder_words} at length {solution.driver_length_m * 1000:.2f} mm"
    parts.append(f"{pose} · cross-check against the numeric solver: {agreement(difference)}{where}")
    parts += [f"warning: {w}" for w in construction.warnings]
    parts += [f"note: {f}" for f in analysis.held]
    return " · ".join(parts)
