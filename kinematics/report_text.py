"""Readable tables for people: rounded, with units and senses in words."""

from __future__ import annotations

import math

from .construct import Construction
from .solve import Solution


def sense(value: float) -> str:
    """CCW, CW, or 'at rest' for an angular rate (CCW positive)."""
    if value > 0:
        return "CCW"
    return "CW" if value < 0 else "at rest"


def direction_deg(vx: float, vy: float) -> float:
    return math.degrees(math.atan2(vy, vx)) % 360.0


def solution_table(solution: Solution) -> str:
    mech = solution.mechanism
    lines = [f"{mech.title or 'Mechanism'} — driver {mech.driver.link} at {solution.driver_angle_deg:.2f}°, "
             f"{mech.driver.speed_rad_s:.4g} rad/s ({mech.driver.speed_value} {mech.driver.speed_unit})",
             "",
             f"{'point':<8}{'x [mm]':>10}{'y [mm]':>10}{'|v| [m/s]':>12}{'dir [°]':>9}"
             f"{'|a| [m/s²]':>13}{'dir [°]':>9}"]
    for i, name in enumerate(solution.point_names):
        (x, y), (vx, vy), (ax, ay) = solution.positions[i], solution.velocities[i], solution.accelerations[i]
        lines.append(f"{name:<8}{x * 1e3:>10.2f}{y * 1e3:>10.2f}{math.hypot(vx, vy):>12.4f}"
                     f"{direction_deg(vx, vy):>9.1f}{math.hypot(ax, ay):>13.4f}{direction_deg(ax, ay):>9.1f}")
    lines += ["", f"{'link':<12}{'angle [°]':>10}{'ω [rad/s]':>12}{'':>5}{'α [rad/s²]':>13}{'':>5}"]
    for link in mech.links:
        w, a = solution.angular_velocity[link], solution.angular_acceleration[link]
        lines.append(f"{link:<12}{solution.link_angle_deg[link]:>10.2f}{w:>12.4f} {sense(w):<4}{a:>13.4f} "
                     f"{sense(a):<4}")
    if mech.slides:
        lines += ["", f"{'slide':<12}{'point':<7}{'v slide [m/s]':>14}{'a slide [m/s²]':>16}"]
        for name, slide in mech.slides.items():
            lines.append(f"{name:<12}{slide.point:<7}{solution.sliding_velocity[name]:>14.4f}"
                         f"{solution.sliding_acceleration[name]:>16.4f}")
    for warning in solution.warnings:
        lines.append(f"warning: {warning}")
    return "\n".join(lines)


def construction_text(construction: Construction) -> str:
    lines = []
    for polygon in (construction.velocity, construction.acceleration):
        lines.append(f"{polygon.kind} polygon (scale {polygon.scale_per_mm:g} {polygon.unit.replace('^2', '²')} "
                     f"per mm, pole {polygon.pole_label})")
        for step in polygon.steps:
            flag = "  [FLAGGED]" if step.flagged else ""
            lines.append(f"  {step.id:>4}  {step.text}{flag}")
        lines.append("")
    lines.append(f"cross-check against the numeric solver: largest relative difference "
                 f"{construction.max_relative_difference:.2e} at {construction.where}")
    for warning in construction.warnings:
        lines.append(f"warning: {warning}")
    return "\n".join(lines)
