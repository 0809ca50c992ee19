"""The peaks of a cycle: largest speeds and accelerations and where they occur."""

from __future__ import annotations

from dataclasses import replace

import numpy as np

from .advantage import advantage_over_cycle
from .measures import DEAD_POINT_SHARE, dead_point_trim, output_motion, transmission_angles
from .sweep import Sweep


def _trimmed(result: Sweep, kept: slice) -> Sweep:
    def cut(mapping):
        return {k: v[kept] for k, v in mapping.items()}

    return replace(result, driver_angle_deg=result.driver_angle_deg[kept], positions=result.positions[kept],
                   velocities=result.velocities[kept], accelerations=result.accelerations[kept],
                   jerks=result.jerks[kept], angular_jerk=cut(result.angular_jerk),
                   sliding_jerk=cut(result.sliding_jerk),
                   link_angle_deg=cut(result.link_angle_deg), angular_velocity=cut(result.angular_velocity),
                   angular_acceleration=cut(result.angular_acceleration),
                   sliding_velocity=cut(result.sliding_velocity),
                   sliding_acceleration=cut(result.sliding_acceleration),
                   time_s=None if result.time_s is None else result.time_s[kept])


def _at(values, angles):
    i = int(np.argmax(values))
    return float(values[i]), float(angles[i])


def peaks(result: Sweep) -> dict:
    """Peaks table of a sweep, SI units, angles in degrees of driver angle.

    ``points``: name -> max |v| (m/s), max |a| (m/s²), max |j| (m/s³) and where; ``links``: max
    |ω|, |α|, |α̇|; ``slides``: max |sliding velocity|, |sliding acceleration|;
    ``transmission``: minimum angle and where; ``output``: limit positions,
    travel and time ratio; ``velocity_ratio``: the output's signed rate over the driver's speed,
    its extremes over the cycle; ``mechanical_advantage``: its least value and where, and the
    angles where the output locks (:func:`kinematics.cycle.advantage.advantage_over_cycle`).
    """
    mech = result.mechanism
    # Speeds grow without bound towards a dead point: a rocking driver's peaks leave out the
    # outer DEAD_POINT_SHARE of its range at each end, and say so.
    trim = dead_point_trim(len(result.driver_angle_deg), result.full_turn)
    kept = slice(trim, len(result.driver_angle_deg) - trim)
    angles = result.driver_angle_deg[kept]
    whole, result = result, _trimmed(result, kept)
    points = {}
    for i, name in enumerate(result.point_names):
        speed, at_v = _at(np.linalg.norm(result.velocities[:, i], axis=1), angles)
        accel, at_a = _at(np.linalg.norm(result.accelerations[:, i], axis=1), angles)
        jerk, at_j = _at(np.linalg.norm(result.jerks[:, i], axis=1), angles)
        points[name] = {"max_speed": speed, "at_deg": at_v, "max_acceleration": accel, "acceleration_at_deg": at_a,
                        "max_jerk": jerk, "jerk_at_deg": at_j}
    links = {}
    for link in mech.links:
        w, at_w = _at(np.abs(result.angular_velocity[link]), angles)
        a, at_a = _at(np.abs(result.angular_acceleration[link]), angles)
        j, at_j = _at(np.abs(result.angular_jerk[link]), angles)
        links[link] = {"max_angular_velocity": w, "at_deg": at_w, "max_angular_acceleration": a,
                       "acceleration_at_deg": at_a, "max_angular_jerk": j, "jerk_at_deg": at_j}
    slides = {}
    for slide in mech.slides:
        v, at_v = _at(np.abs(result.sliding_velocity[slide]), angles)
        a, at_a = _at(np.abs(result.sliding_acceleration[slide]), angles)
        slides[slide] = {"max_sliding_velocity": v, "at_deg": at_v, "max_sliding_acceleration": a,
                         "acceleration_at_deg": at_a}
    transmission = {}
    for key, mu in transmission_angles(mech, result).items():
        deviation, at = _at(np.abs(mu - 90.0), angles)
        transmission[key] = {"min_deg": float(mu.min()), "at_deg": float(angles[int(np.argmin(mu))]),
                             "max_deg": float(mu.max()), "largest_deviation_from_90_deg": deviation,
                             "deviation_at_deg": at}
    table = {"points": points, "links": links, "slides": slides, "transmission": transmission,
             "dead_point_share_left_out": DEAD_POINT_SHARE if trim else 0.0,
             "output": output_motion(mech, whole), "warnings": list(whole.warnings), "full_turn": result.full_turn,
             "range_deg": list(result.range_deg), "closes": result.closes}
    if mech.output is not None and mech.driver.speed_rad_s != 0.0:
        cycle = advantage_over_cycle(whole)
        ratio = cycle.velocity_ratio[kept]
        table["velocity_ratio"] = {"unit": cycle.unit, "min": float(ratio.min()), "max": float(ratio.max()),
                                   "min_at_deg": float(angles[int(np.argmin(ratio))]),
                                   "max_at_deg": float(angles[int(np.argmax(ratio))])}
        table["mechanical_advantage"] = cycle.as_dict()
    return table
