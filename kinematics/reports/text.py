"""Readable tables for people: rounded, with units and senses in words."""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..construction.components import acceleration_components
from ..groups.steps import ROUNDING_FLOOR, Construction, agreement
from ..groups.vectors import direction_deg, negligible
from ..model.units import angle_text
from ..solver.solve import Solution


def sense(value: float) -> str:
    """CCW, CW, or 'at rest' for an angular rate (CCW positive)."""
    if value > 0:
        return "CCW"
    return "CW" if value < 0 else "at rest"


def turn(angle_deg: float, digits: int) -> float:
    """An angle in [0°, 360°) as it will print to ``digits`` decimals (359.99999° prints as 0.00°)."""
    return round(angle_deg, digits) % 360.0


def direction_text(x: float, y: float, scale: float) -> str:
    """A vector's direction as the tables print it (one decimal), "—" for a zero vector."""
    direction = direction_deg(x, y, scale)
    return "—" if direction is None else f"{turn(direction, 1):.1f}"


def solution_table(solution: Solution) -> str:
    """The solved pose for people: each point's position (mm), speed and acceleration with their
    directions, each link's angle, ω and α with their senses, the slides' rates, and the warnings."""
    mech = solution.mechanism
    driver = mech.driver
    if solution.driver_length_m is None:
        driven = (f"driver {driver.link} at {angle_text(solution.driver_angle_deg)}, {driver.speed_rad_s:.4g} rad/s "
                  f"({driver.speed_value} {driver.speed_unit})")
    else:
        driven = (f"{driver.cylinder_words} at length {solution.driver_length_m * 1000:.2f} mm, extending at "
                  f"{driver.linear_speed_m_s:.4g} m/s ({driver.linear_speed_value} {driver.linear_speed_unit})")
    lines = [f"{mech.title or 'Mechanism'} — {driven}",
             "",
             f"{'point':<8}{'x [mm]':>10}{'y [mm]':>10}{'|v| [m/s]':>12}{'dir [°]':>9}"
             f"{'|a| [m/s²]':>13}{'dir [°]':>9}"]
    # A vector at the solver's rounding (see kinematics.groups.vectors) has no direction.
    largest_v = max((math.hypot(*v) for v in solution.velocities.tolist()), default=0.0)
    largest_a = max((math.hypot(*a) for a in solution.accelerations.tolist()), default=0.0)
    for i, name in enumerate(solution.point_names):
        (x, y), (vx, vy), (ax, ay) = solution.positions[i], solution.velocities[i], solution.accelerations[i]
        lines.append(f"{name:<8}{x * 1e3:>10.2f}{y * 1e3:>10.2f}{math.hypot(vx, vy):>12.4f}"
                     f"{direction_text(vx, vy, largest_v):>9}{math.hypot(ax, ay):>13.4f}"
                     f"{direction_text(ax, ay, largest_a):>9}")
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
    """Both polygons' construction steps in words, in order, with their scales and the cross-check."""
    lines = []
    for polygon in (construction.velocity, construction.acceleration):
        lines.append(f"{polygon.kind} polygon (scale {polygon.scale_per_mm:g} {polygon.unit.replace('^2', '²')} "
                     f"per mm, pole {polygon.pole_label})")
        for step in polygon.steps:
            flag = "  [FLAGGED]" if step.flagged else ""
            lines.append(f"  {step.id:>4}  {step.text}{flag}")
        lines.append("")
    components = acceleration_components(construction)
    if components:
        lines.append(f"{'acceleration components':<40}{'|a| [m/s²]':>12}{'dir [°]':>9}")
        # A component at the solver's rounding (see kinematics.groups.vectors) is 0 and has no direction.
        largest = max((math.hypot(*a) for a in construction.solution.accelerations.tolist()), default=0.0)
        for c in components:
            lines.append(f"  {c.title:<38}{0.0 if negligible(c.magnitude, largest) else c.magnitude:>12.4f}"
                         f"{direction_text(*c.vector, largest):>9}")
        lines.append("")
    lines.append(f"cross-check against the numeric solver: {agreement(construction.max_relative_difference, 2)}"
                 f"{'' if construction.max_relative_difference < ROUNDING_FLOOR else f' at {construction.where}'}")
    for warning in construction.warnings:
        lines.append(f"warning: {warning}")
    return "\n".join(lines)


def advantage_sentence(advantage: dict) -> str:
    """The least mechanical advantage of the output and where it locks, from
    :meth:`kinematics.cycle.advantage.CycleAdvantage.as_dict`."""
    locks = ", ".join(f"{turn(a, 2):.2f}°" for a in advantage["locks_at_deg"])
    return (f"mechanical advantage of {advantage['output']}: least {advantage['least_advantage']:.4g} "
            f"{advantage['advantage_unit']} at driver angle {turn(advantage['least_at_deg'], 2):.2f}°; "
            + (f"the output locks (toggle, infinite advantage) at {locks}" if locks else
               "the output never locks in the cycle"))


@dataclass(frozen=True)
class Placing:
    """How a cycle's tables place a value: by driver angle, or by a cylinder's length.

    Attributes
    ----------
    suffix : the end of the table's keys ("deg" or "length_m").
    unit : the unit people read ("°" or "mm").
    """

    suffix: str
    unit: str

    def text(self, value: float, digits: int = 1) -> str:
        """``value`` (degrees, or metres of length) as people read it, with ``digits`` decimals."""
        if self.suffix == "length_m":
            return f"{value * 1000:.{digits}f}"
        return f"{turn(value, digits):.{digits}f}"

    def at(self, value: float, digits: int = 1) -> str:
        """"at 47.4°" or "at length 580.0 mm"."""
        if self.suffix == "length_m":
            return f"at length {self.text(value, digits)} mm"
        return f"at {self.text(value, digits)}°"


def placing(table: dict) -> Placing:
    """The placing of a peaks or checks table (its ``parameter``)."""
    return Placing("length_m", "mm") if table.get("parameter") == "length" else Placing("deg", "°")


def peaks_text(table: dict) -> str:
    """The peaks table of :func:`kinematics.cycle.peaks.peaks`, for people."""
    place = placing(table)
    at, key = f"at [{place.unit}]", f"at_{place.suffix}"
    accel_key = f"acceleration_{key}"
    lines = [f"{'point':<8}{'max |v| [m/s]':>15}{at:>9}{'max |a| [m/s²]':>16}{at:>9}"]
    for name, p in table["points"].items():
        lines.append(f"{name:<8}{p['max_speed']:>15.4f}{place.text(p[key]):>9}{p['max_acceleration']:>16.4f}"
                     f"{place.text(p[accel_key]):>9}")
    lines += ["", f"{'link':<12}{'max |ω| [rad/s]':>17}{at:>9}{'max |α| [rad/s²]':>18}{at:>9}"]
    for name, p in table["links"].items():
        lines.append(f"{name:<12}{p['max_angular_velocity']:>17.4f}{place.text(p[key]):>9}"
                     f"{p['max_angular_acceleration']:>18.4f}{place.text(p[accel_key]):>9}")
    if table["slides"]:
        lines += ["", f"{'slide':<12}{'max |v| [m/s]':>15}{at:>9}{'max |a| [m/s²]':>16}{at:>9}"]
        for name, p in table["slides"].items():
            lines.append(f"{name:<12}{p['max_sliding_velocity']:>15.4f}{place.text(p[key]):>9}"
                         f"{p['max_sliding_acceleration']:>16.4f}{place.text(p[accel_key]):>9}")
    for name, t in table["transmission"].items():
        lines.append(f"transmission angle {name}: minimum {t['min_deg']:.2f}° {place.at(t[key])}, "
                     f"largest deviation from 90° {t['largest_deviation_from_90_deg']:.2f}°")
    out = table.get("output")
    if out:
        reversals = ", ".join(place.text(a, 2) + place.unit.replace("mm", " mm")
                              for a in out[f"rate_reversals_{place.suffix}"]) or "none (it moves one way)"
        lines.append(f"output {out['output']}: travel {out['travel']:.4g} {out['unit']}; limit positions at "
                     + reversals)
        if "time_ratio" in out:
            lines.append(f"time ratio {out['time_ratio']:.4f} (slow stroke: {out['slow_stroke']})")
    ratio = table.get("velocity_ratio")
    if ratio:
        lines.append(f"velocity ratio (output over driver speed) {ratio['min']:.4g} to {ratio['max']:.4g} "
                     f"{ratio['unit']}")
    if table.get("mechanical_advantage"):
        lines.append(advantage_sentence(table["mechanical_advantage"]))
    if "stroke_m" in table:
        low, high = table["stroke_m"]
        trimmed = table["dead_point_share_left_out"]
        lines.append(f"the cylinder strokes from {low * 1000:.1f} to {high * 1000:.1f} mm" + (
            f"; the peaks leave out {100 * trimmed:g} % of that range at each end, where the linkage's reach ends "
            "the stroke and speeds grow without bound" if trimmed else ""))
    elif not table["full_turn"]:
        low, high = table["range_deg"]
        lines.append(f"the driver rocks between its dead points {low:.3f}° and {high:.3f}°; the peaks leave out "
                     f"{100 * table['dead_point_share_left_out']:g} % of that range at each end, where speeds grow "
                     "without bound")
    return "\n".join(lines)
