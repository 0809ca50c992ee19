"""The drive and the bearings over a cylinder's stroke at constant extension speed.

A cylinder's drive is its axial force F (push positive), so the summary gives the peak push and
the peak pull with the lengths where they occur, the work ∫F dL over the stroke (trapezoids
between the poses), the mean power (that work over the stroke's time ΔL/L̇) and the peak power
F·L̇. A cylinder does not turn: there is no flywheel or energy fluctuation of a turn. Joint and
shaking peaks are as for a turning driver, placed by length. Frictionless joints.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass
from types import MappingProxyType

import numpy as np

from ..errors import KinematicsError
from .results import ForceSweep


@dataclass(frozen=True)
class CylinderJoint:
    """One joint force over the stroke: peak magnitude (N) and the length there (m), mean and RMS magnitude (N)."""

    peak_n: float
    peak_length_m: float
    mean_n: float
    rms_n: float


@dataclass(frozen=True)
class CylinderSummary:
    """The drive and bearing figures of a stroke at constant speed (SI; see the module).

    ``peak_push_n`` is the largest push (≥ 0, 0 when the cylinder only pulls), ``peak_pull_n``
    the largest pull (≤ 0, 0 when it only pushes), each with the cylinder's length there."""

    speed_m_s: float
    peak_push_n: float
    peak_push_length_m: float
    peak_pull_n: float
    peak_pull_length_m: float
    work_j: float
    mean_power_w: float
    peak_power_w: float
    joints: Mapping
    peak_shaking_force_n: float
    peak_shaking_force_length_m: float
    peak_shaking_moment_n_m: float
    peak_shaking_moment_length_m: float


def cylinder_summary(result: ForceSweep) -> CylinderSummary:
    """The summary of a cylinder-driven design's forces swept over its stroke.

    Raises KinematicsError for a cylinder that does not extend at a constant speed other than 0."""
    driver = result.mechanism.driver
    speed = driver.linear_speed_m_s
    if driver.linear_acceleration_m_s2 != 0.0 or speed == 0.0:
        raise KinematicsError("the drive summary is for a cylinder extending at constant speed: set its "
                              "acceleration to 0 and its speed to a value other than 0", "driver")
    force = np.asarray(result.drive_force_n, float)
    length = np.asarray(result.driver_length_m, float)
    push, pull = int(np.argmax(force)), int(np.argmin(force))
    work = float(np.sum(0.5 * (force[1:] + force[:-1]) * np.diff(length)))
    duration = (length[-1] - length[0]) / speed
    power = force * speed
    peak_power = int(np.argmax(np.abs(power)))
    joints = {point: MappingProxyType({link: _joint(f, length) for link, f in by_link.items()})
              for point, by_link in result.joints_n.items()}
    shaking = np.hypot(result.shaking_force_n[:, 0], result.shaking_force_n[:, 1])
    k = int(np.argmax(shaking))
    m = int(np.argmax(np.abs(result.shaking_moment_n_m)))
    return CylinderSummary(
        speed_m_s=speed, peak_push_n=max(float(force[push]), 0.0), peak_push_length_m=float(length[push]),
        peak_pull_n=min(float(force[pull]), 0.0), peak_pull_length_m=float(length[pull]), work_j=work,
        mean_power_w=work / duration if duration > 0 else 0.0, peak_power_w=float(power[peak_power]),
        joints=MappingProxyType(joints), peak_shaking_force_n=float(shaking[k]),
        peak_shaking_force_length_m=float(length[k]),
        peak_shaking_moment_n_m=float(result.shaking_moment_n_m[m]), peak_shaking_moment_length_m=float(length[m]))


def _joint(force: np.ndarray, length: np.ndarray) -> CylinderJoint:
    size = np.hypot(force[:, 0], force[:, 1])
    k = int(np.argmax(size))
    return CylinderJoint(peak_n=float(size[k]), peak_length_m=float(length[k]), mean_n=float(size.mean()),
                         rms_n=float(np.sqrt(np.mean(size ** 2))))
