"""A cylinder's drive in the forces' tables: its axial force (push positive) where a turning
driver has its torque, placed by the cylinder's length in mm for people, SI in JSON."""

from __future__ import annotations

from ..dynamics.cylinder_summary import CylinderSummary
from ..dynamics.results import FRICTIONLESS, Forces, ForceSweep


def push_or_pull(force_n: float) -> str:
    """"push", "pull" or "no force" for a cylinder's axial force (push positive)."""
    if force_n > 0:
        return "push"
    return "pull" if force_n < 0 else "no force"


def pose_heading(result: Forces) -> str:
    """The first line of one pose's table: the cylinder, its length and its speed."""
    mech, driver = result.mechanism, result.mechanism.driver
    return (f"{mech.title or 'Mechanism'} — forces with cylinder {driver.slide} at length "
            f"{result.driver_length_m * 1000:.2f} mm, extending at {driver.linear_speed_value:g} "
            f"{driver.linear_speed_unit}; {FRICTIONLESS}")


def drive_line(result: Forces, shown: float) -> str:
    """The drive's line of one pose's table (``shown``: the force as the table rounds it)."""
    return (f"drive force of {result.mechanism.driver.cylinder_words}: {shown:.4g} N {push_or_pull(shown)} "
            f"(along its axis, push positive)")


def balance_line(result: Forces) -> str:
    """The power balance's line of one pose's table."""
    balance = result.power_balance
    return (f"power balance: drive power F·L̇ {balance.drive_power_w:.4g} W; drive force by virtual work "
            f"{balance.drive_force_n:.4g} N, relative difference {balance.relative_difference:.1e}")


def pose_json(result: Forces) -> dict:
    """The keys a cylinder's pose adds to or changes in the forces' JSON (SI)."""
    return {"units": {"force": "N", "torque": "N*m", "power": "W", "length": "m"},
            "driver_length_m": float(result.driver_length_m), "drive_force_n": float(result.drive_force_n),
            "power_balance": {"drive_power": float(result.power_balance.drive_power_w),
                              "drive_force_n": float(result.power_balance.drive_force_n),
                              "relative_difference": float(result.power_balance.relative_difference)}}


def summary_json(summary: CylinderSummary, result: ForceSweep) -> dict:
    """The drive and bearing summary of a stroke (SI, full precision; lengths in m)."""
    return {
        "kinepoly_drive": 1, "units": {"force": "N", "power": "W", "energy": "J", "length": "m", "speed": "m/s",
                                       "torque": "N*m"},
        "steps": len(result.driver_length_m), "speed": summary.speed_m_s,
        "peak_push_n": summary.peak_push_n, "peak_push_length_m": summary.peak_push_length_m,
        "peak_pull_n": summary.peak_pull_n, "peak_pull_length_m": summary.peak_pull_length_m,
        "work": summary.work_j, "mean_power": summary.mean_power_w, "peak_power": summary.peak_power_w,
        "joints": {p: {link: {"peak": j.peak_n, "peak_length_m": j.peak_length_m, "mean": j.mean_n, "rms": j.rms_n}
                       for link, j in by_link.items()} for p, by_link in summary.joints.items()},
        "peak_shaking_force": summary.peak_shaking_force_n,
        "peak_shaking_force_length_m": summary.peak_shaking_force_length_m,
        "peak_shaking_moment": summary.peak_shaking_moment_n_m,
        "peak_shaking_moment_length_m": summary.peak_shaking_moment_length_m,
        "power_balance": {"max_relative_difference": result.max_relative_difference},
        "warnings": list(result.warnings),
    }


def summary_text(summary: CylinderSummary, result: ForceSweep, pinned_to) -> str:
    """The drive and bearing summary of a stroke for people (``pinned_to`` names what a link is
    pinned to at a joint)."""
    mech, driver = result.mechanism, result.mechanism.driver
    lengths = result.driver_length_m

    def mm(length_m: float) -> str:
        return f"{length_m * 1000:.1f}"

    push = (f"{summary.peak_push_n:.4g} N at length {mm(summary.peak_push_length_m)} mm" if summary.peak_push_n
            else "none (the cylinder only pulls)")
    pull = (f"{summary.peak_pull_n:.4g} N at length {mm(summary.peak_pull_length_m)} mm" if summary.peak_pull_n
            else "none (the cylinder only pushes)")
    lines = [f"{mech.title or 'Mechanism'} — drive and bearings over the stroke of cylinder {driver.slide}, "
             f"{mm(lengths[0])} to {mm(lengths[-1])} mm at {driver.linear_speed_value:g} {driver.linear_speed_unit}, "
             f"{len(lengths)} poses; {FRICTIONLESS}",
             "",
             f"peak push           {push}",
             f"peak pull           {pull}",
             f"work over stroke    {summary.work_j:.4g} J",
             f"mean drive power    {summary.mean_power_w:.4g} W",
             f"peak drive power    {summary.peak_power_w:.4g} W",
             "", f"{'joint':<8}{'on link':<12}{'from':<12}{'peak [N]':>11}{'at [mm]':>9}{'mean [N]':>11}"
                 f"{'RMS [N]':>11}"]
    for point, by_link in summary.joints.items():
        for link, j in by_link.items():
            lines.append(f"{point:<8}{link:<12}{pinned_to(mech, point, link):<12}{j.peak_n:>11.2f}"
                         f"{mm(j.peak_length_m):>9}{j.mean_n:>11.2f}{j.rms_n:>11.2f}")
    lines += ["", f"peak shaking force {summary.peak_shaking_force_n:.4g} N at length "
              f"{mm(summary.peak_shaking_force_length_m)} mm, peak shaking moment "
              f"{summary.peak_shaking_moment_n_m:.4g} N·m at length {mm(summary.peak_shaking_moment_length_m)} mm",
              f"power balance over the stroke: largest relative difference {result.max_relative_difference:.1e}"]
    lines += [f"warning: {w}" for w in result.warnings]
    return "\n".join(lines)
