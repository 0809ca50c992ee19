"""The drive and the bearings over a cycle at constant speed (common practice).

It works out:

- mean torque T_m = (1/2π)∮T dθ, the mean of the equally spaced poses of the turn; RMS torque;
  peak torque (the largest |T|, with its sign) and its angle; mean and peak power T·ω;
- the turning-moment diagram's energy fluctuation ΔE = max − min of ∫(T − T_m) dθ (trapezoids
  between the poses, closed over the turn), and the flywheel moment of inertia
  I = ΔE / (C_s·ω²) for a coefficient of speed fluctuation C_s = (ω_max − ω_min)/ω;
- for every joint force, its peak magnitude and angle, the mean and RMS magnitude;
- the peak shaking force (magnitude) and moment (largest |M|, with its sign), with their angles.

Forces of frictionless rigid joints: no strength or fatigue check.
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass
from types import MappingProxyType

import numpy as np

from ..errors import KinematicsError
from .cylinder_summary import CylinderSummary, cylinder_summary

__all__ = ["CylinderSummary", "DriveSummary", "JointSummary", "drive_summary", "energy_fluctuation"]
from .results import ForceSweep

DEFAULT_FLUCTUATION = 0.02


@dataclass(frozen=True)
class JointSummary:
    """One joint force over the cycle: peak magnitude and its driver angle, mean and RMS magnitude (N)."""

    peak_n: float
    peak_angle_deg: float
    mean_n: float
    rms_n: float


@dataclass(frozen=True)
class DriveSummary:
    """The drive and bearing figures of a cycle at constant speed (SI; see the module)."""

    fluctuation: float
    speed_rad_s: float
    peak_torque_n_m: float
    peak_torque_angle_deg: float
    mean_torque_n_m: float
    rms_torque_n_m: float
    mean_power_w: float
    peak_power_w: float
    energy_fluctuation_j: float
    flywheel_inertia_kg_m2: float
    joints: Mapping
    peak_shaking_force_n: float
    peak_shaking_force_angle_deg: float
    peak_shaking_moment_n_m: float
    peak_shaking_moment_angle_deg: float


def _peak(values: np.ndarray, angles: np.ndarray):
    """(value at the largest |value|, its angle)."""
    k = int(np.argmax(np.abs(values)))
    return float(values[k]), float(angles[k])


def energy_fluctuation(torque_n_m: np.ndarray, step_rad: float) -> float:
    """ΔE (J) of a turning-moment diagram sampled at equal steps over one whole turn."""
    torque = np.asarray(torque_n_m, float)
    excess = 0.5 * (torque + np.roll(torque, -1)) - torque.mean()
    energy = np.concatenate([[0.0], np.cumsum(excess * step_rad)])
    return float(energy.max() - energy.min())


def drive_summary(result: ForceSweep, fluctuation: float = DEFAULT_FLUCTUATION) -> DriveSummary | CylinderSummary:
    """The drive and bearing summary of a cycle swept over a whole turn at constant speed, or of a
    cylinder's stroke at constant extension speed (a :class:`CylinderSummary`).

    ``fluctuation`` is the coefficient of speed fluctuation C_s allowed (default 0.02; a cylinder
    has no flywheel and does not use it)."""
    if isinstance(fluctuation, bool) or not isinstance(fluctuation, (int, float)) \
            or not math.isfinite(fluctuation) or fluctuation <= 0:
        raise KinematicsError(f"the coefficient of speed fluctuation must be a positive number, not {fluctuation!r}",
                              "fluctuation")
    driver = result.mechanism.driver
    if driver.is_actuator:
        return cylinder_summary(result)
    if driver.angular_acceleration_rad_s2 != 0.0 or driver.speed_rad_s == 0.0:
        raise KinematicsError("the drive summary is for a driver turning at constant speed: set its angular "
                              "acceleration to 0 and its speed to a value other than 0", "driver")
    if not result.full_turn:
        raise KinematicsError("the drive summary needs a driver that turns fully; this one rocks between its "
                              "dead points", "driver")
    angles = result.driver_angle_deg
    torque = result.drive_torque_n_m
    omega = driver.speed_rad_s
    delta_e = energy_fluctuation(torque, 2 * math.pi / len(torque))
    peak_t, peak_t_angle = _peak(torque, angles)
    joints = {}
    for point, by_link in result.joints_n.items():
        joints[point] = MappingProxyType({link: _joint(force, angles) for link, force in by_link.items()})
    shaking = np.hypot(result.shaking_force_n[:, 0], result.shaking_force_n[:, 1])
    k = int(np.argmax(shaking))
    peak_m, peak_m_angle = _peak(result.shaking_moment_n_m, angles)
    return DriveSummary(
        fluctuation=float(fluctuation), speed_rad_s=omega, peak_torque_n_m=peak_t,
        peak_torque_angle_deg=peak_t_angle, mean_torque_n_m=float(torque.mean()),
        rms_torque_n_m=float(np.sqrt(np.mean(torque ** 2))), mean_power_w=float(torque.mean() * omega),
        peak_power_w=peak_t * omega, energy_fluctuation_j=delta_e,
        flywheel_inertia_kg_m2=delta_e / (fluctuation * omega ** 2), joints=MappingProxyType(joints),
        peak_shaking_force_n=float(shaking[k]), peak_shaking_force_angle_deg=float(angles[k]),
        peak_shaking_moment_n_m=peak_m, peak_shaking_moment_angle_deg=peak_m_angle)


def _joint(force: np.ndarray, angles: np.ndarray) -> JointSummary:
    size = np.hypot(force[:, 0], force[:, 1])
    k = int(np.argmax(size))
    return JointSummary(peak_n=float(size[k]), peak_angle_deg=float(angles[k]), mean_n=float(size.mean()),
                        rms_n=float(np.sqrt(np.mean(size ** 2))))
