"""The forces for people and for programs: the table of one pose, the drive and bearing summary
of a cycle, their JSON (SI, full precision) and the force columns of the cycle CSV.

Every text output says the forces are those of frictionless rigid joints.
"""

from __future__ import annotations

import math

import numpy as np

from ..dynamics.layout import layout
from ..dynamics.results import FRICTIONLESS, Forces, ForceSweep
from ..dynamics.summary import CylinderSummary, DriveSummary
from ..groups.vectors import NEGLIGIBLE
from ..model.units import angle_text
from . import cylinder_forces
from .text import direction_text, sense, turn


def pinned_to(mechanism, point: str, link: str) -> str:
    """What ``link`` is pinned to at ``point``, in words: "frame", "pin P" (an element carrying a
    mass, a load or three or more links), "block P" (the block of a slide) or the other link."""
    lay = layout(mechanism)
    if point in lay.fixed:
        return "frame"
    if point in lay.elements:
        return f"block {point}" if any(s.point == point for s in mechanism.slides.values()) else f"pin {point}"
    return next(other for other in mechanism.bodies_of(point) if other != link)


def _vector(v) -> list:
    return [float(v[0]), float(v[1])]


def forces_json(result: Forces) -> dict:
    """The forces of one pose with the keys of the command line's ``--json`` (SI, full precision).

    An inertia that is a pure couple (no force to offset) has ``offset`` null. A cylinder-driven
    design has ``drive_force_n`` (N, push positive) and ``driver_length_m`` instead of a torque."""
    document = {
        "kinepoly_forces": 1, "driver_angle_deg": float(result.driver_angle_deg),
        "units": {"force": "N", "torque": "N*m", "power": "W"},
        "driver_torque": float(result.drive_torque_n_m),
        "joints": {p: {link: _vector(f) for link, f in by_link.items()} for p, by_link in result.joints_n.items()},
        "slides": {s: {"normal_force": float(f.normal_n), "force": _vector(f.force_n)}
                   for s, f in result.slides.items()},
        "inertia": {link: {"force": _vector(i.force_n), "couple": float(i.couple_n_m),
                           "offset": float(i.offset_m) if math.isfinite(i.offset_m) else None}
                    for link, i in result.inertia.items()},
        "shaking_force": _vector(result.shaking_force_n), "shaking_moment": float(result.shaking_moment_n_m),
        "power_balance": {"drive_power": float(result.power_balance.drive_power_w),
                          "relative_difference": float(result.power_balance.relative_difference)},
        "warnings": list(result.warnings),
    }
    if result.drive_force_n is not None:
        del document["driver_torque"]
        document.update(cylinder_forces.pose_json(result))
    return document


def _size(v, scale: float) -> tuple[float, str]:
    """A force's size and its direction as the tables print it ("—" for a force at the rounding)."""
    return math.hypot(v[0], v[1]), direction_text(v[0], v[1], scale)


def shown_value(value: float, scale: float) -> float:
    """``value`` as a table shows it: 0 below :data:`NEGLIGIBLE` of the pose's largest value of its
    kind (``scale``), the rounding of the linear solve (a couple of 1e-33 N·m, a force of -0.00 N)."""
    return 0.0 if abs(value) <= NEGLIGIBLE * scale else float(value)


def _scales(result: Forces) -> tuple[float, float]:
    """(largest force in N, largest couple in N·m) of a pose, what its rounding is measured against."""
    forces = [math.hypot(*f) for by_link in result.joints_n.values() for f in by_link.values()]
    forces += [abs(s.normal_n) for s in result.slides.values()]
    if result.drive_force_n is not None:
        forces.append(abs(result.drive_force_n))
    couples = [abs(result.drive_torque_n_m), abs(result.shaking_moment_n_m)]
    couples += [abs(i.couple_n_m) for i in result.inertia.values()]
    return max(forces, default=0.0), max(couples)


def forces_table(result: Forces) -> str:
    """The forces of one pose for people: N and N·m, directions in degrees from +x counter-clockwise."""
    mech = result.mechanism
    force_scale, couple_scale = _scales(result)
    torque = shown_value(result.drive_torque_n_m, couple_scale)
    cylinder = result.drive_force_n is not None
    if cylinder:
        heading = cylinder_forces.pose_heading(result)
        drive = cylinder_forces.drive_line(result, shown_value(result.drive_force_n, force_scale))
    else:
        heading = (f"{mech.title or 'Mechanism'} — forces with driver {mech.driver.link} at "
                   f"{angle_text(result.driver_angle_deg)}, {mech.driver.speed_value} {mech.driver.speed_unit}; "
                   f"{FRICTIONLESS}")
        drive = f"drive torque on {mech.driver.link}: {torque:.4g} N·m {sense(torque)}"
    lines = [heading, "", drive, "",
             f"{'joint':<8}{'on link':<12}{'from':<12}{'Fx [N]':>11}{'Fy [N]':>11}{'|F| [N]':>11}{'dir [°]':>9}"]
    for point, by_link in result.joints_n.items():
        for link, f in by_link.items():
            size, angle = _size(f, force_scale)
            fx, fy = (shown_value(c, force_scale) for c in f)
            lines.append(f"{point:<8}{link:<12}{pinned_to(mech, point, link):<12}{fx:>11.2f}{fy:>11.2f}"
                         f"{size:>11.2f}{angle:>9}")
    if result.slides:
        lines += ["", f"{'slide':<12}{'block':<8}{'normal [N]':>12}{'Fx [N]':>11}{'Fy [N]':>11}"]
        for name, s in result.slides.items():
            normal, fx, fy = (shown_value(c, force_scale) for c in (s.normal_n, *s.force_n))
            lines.append(f"{name:<12}{mech.slides[name].point:<8}{normal:>12.2f}{fx:>11.2f}{fy:>11.2f}")
        lines.append("(normal: on the block, along the guide line's left normal)")
    if result.inertia:
        lines += ["", f"{'inertia of':<12}{'|F| [N]':>11}{'dir [°]':>9}{'couple [N·m]':>14}{'offset [mm]':>13}"]
        for link, i in result.inertia.items():
            size, angle = _size(i.force_n, force_scale)
            offset = f"{i.offset_m * 1e3:>13.2f}" if math.isfinite(i.offset_m) else f"{'(couple)':>13}"
            couple = shown_value(i.couple_n_m, couple_scale)
            lines.append(f"{link:<12}{size:>11.2f}{angle:>9}{couple:>14.4g}{offset}")
    shaking, angle = _size(result.shaking_force_n, force_scale)
    at = "" if angle == "—" else f" at {angle}°"
    lines += ["", f"shaking force {shaking:.2f} N{at}, shaking moment "
              f"{shown_value(result.shaking_moment_n_m, couple_scale):.4g} N·m about {mech.driver.pivot}"]
    balance = result.power_balance
    lines.append(cylinder_forces.balance_line(result) if cylinder else
                 f"power balance: drive power {balance.drive_power_w:.4g} W; drive torque by virtual work "
                 f"{balance.drive_torque_n_m:.4g} N·m, relative difference {balance.relative_difference:.1e}")
    lines += [f"warning: {w}" for w in result.warnings]
    return "\n".join(lines)


def summary_json(summary: DriveSummary | CylinderSummary, result: ForceSweep) -> dict:
    """The drive and bearing summary of a cycle, or of a cylinder's stroke (SI, full precision)."""
    if isinstance(summary, CylinderSummary):
        return cylinder_forces.summary_json(summary, result)
    return {
        "kinepoly_drive": 1, "units": {"force": "N", "torque": "N*m", "power": "W", "energy": "J",
                                       "inertia": "kg*m^2", "angle": "deg", "speed": "rad/s"},
        "steps": len(result.driver_angle_deg), "speed": summary.speed_rad_s, "fluctuation": summary.fluctuation,
        "peak_torque": summary.peak_torque_n_m, "peak_torque_angle_deg": summary.peak_torque_angle_deg,
        "mean_torque": summary.mean_torque_n_m, "rms_torque": summary.rms_torque_n_m,
        "mean_power": summary.mean_power_w, "peak_power": summary.peak_power_w,
        "energy_fluctuation": summary.energy_fluctuation_j, "flywheel_inertia": summary.flywheel_inertia_kg_m2,
        "joints": {p: {link: {"peak": j.peak_n, "peak_angle_deg": j.peak_angle_deg, "mean": j.mean_n, "rms": j.rms_n}
                       for link, j in by_link.items()} for p, by_link in summary.joints.items()},
        "peak_shaking_force": summary.peak_shaking_force_n,
        "peak_shaking_force_angle_deg": summary.peak_shaking_force_angle_deg,
        "peak_shaking_moment": summary.peak_shaking_moment_n_m,
        "peak_shaking_moment_angle_deg": summary.peak_shaking_moment_angle_deg,
        "power_balance": {"max_relative_difference": result.max_relative_difference},
        "warnings": list(result.warnings),
    }


def summary_text(summary: DriveSummary | CylinderSummary, result: ForceSweep) -> str:
    """The drive and bearing summary for people."""
    if isinstance(summary, CylinderSummary):
        return cylinder_forces.summary_text(summary, result, pinned_to)
    mech = result.mechanism
    rpm = summary.speed_rad_s * 60 / (2 * math.pi)
    # A mean of a periodic torque with no loads is 0 to rounding (1e-16 N·m): shown as 0.
    mean_torque = shown_value(summary.mean_torque_n_m, abs(summary.peak_torque_n_m))
    mean_power = shown_value(summary.mean_power_w, abs(summary.peak_power_w))
    lines = [f"{mech.title or 'Mechanism'} — drive and bearings over one turn of {mech.driver.link} at "
             f"{rpm:.4g} rpm ({summary.speed_rad_s:.4g} rad/s), {len(result.driver_angle_deg)} poses; {FRICTIONLESS}",
             "",
             f"peak drive torque   {summary.peak_torque_n_m:.4g} N·m at {turn(summary.peak_torque_angle_deg, 1):.1f}°",
             f"mean drive torque   {mean_torque:.4g} N·m",
             f"RMS drive torque    {summary.rms_torque_n_m:.4g} N·m",
             f"mean drive power    {mean_power:.4g} W",
             f"peak drive power    {summary.peak_power_w:.4g} W",
             f"energy fluctuation  ΔE = {summary.energy_fluctuation_j:.4g} J",
             f"flywheel            I = ΔE/(C_s·ω²) = {summary.flywheel_inertia_kg_m2:.4g} kg·m² for "
             f"C_s = {summary.fluctuation:g}",
             "", f"{'joint':<8}{'on link':<12}{'from':<12}{'peak [N]':>11}{'at [°]':>8}{'mean [N]':>11}{'RMS [N]':>11}"]
    for point, by_link in summary.joints.items():
        for link, j in by_link.items():
            lines.append(f"{point:<8}{link:<12}{pinned_to(mech, point, link):<12}{j.peak_n:>11.2f}"
                         f"{turn(j.peak_angle_deg, 1):>8.1f}{j.mean_n:>11.2f}{j.rms_n:>11.2f}")
    lines += ["", f"peak shaking force {summary.peak_shaking_force_n:.4g} N at "
              f"{turn(summary.peak_shaking_force_angle_deg, 1):.1f}°, peak shaking moment "
              f"{summary.peak_shaking_moment_n_m:.4g} N·m at {turn(summary.peak_shaking_moment_angle_deg, 1):.1f}°",
              f"power balance over the cycle: largest relative difference {result.max_relative_difference:.1e}"]
    lines += [f"warning: {w}" for w in result.warnings]
    return "\n".join(lines)


def force_columns(result: ForceSweep) -> tuple[list, list]:
    """(headers, columns) the cycle CSV gains with ``--forces``: the drive torque, every joint force
    on every link (x, y, magnitude), every slide's normal force, the shaking force and moment."""
    if result.drive_force_n is not None:
        header, columns = ["driver.force [N]"], [result.drive_force_n]
    else:
        header, columns = ["driver.torque [N*m]"], [result.drive_torque_n_m]
    for point, by_link in result.joints_n.items():
        for link, f in by_link.items():
            header += [f"{point}.{link}.Fx [N]", f"{point}.{link}.Fy [N]", f"{point}.{link}.F [N]"]
            columns += [f[:, 0], f[:, 1], np.hypot(f[:, 0], f[:, 1])]
    for name, s in result.slides.items():
        header.append(f"{name}.normal [N]")
        columns.append(s.normal_n)
    header += ["shaking.Fx [N]", "shaking.Fy [N]", "shaking.M [N*m]"]
    columns += [result.shaking_force_n[:, 0], result.shaking_force_n[:, 1], result.shaking_moment_n_m]
    return header, columns
