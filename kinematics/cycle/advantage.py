"""The output against the driver over the cycle, from a sweep (vectorised over its arrays).

The velocity ratio and mechanical advantage are those of :mod:`kinematics.instantaneous.advantage`
at one pose, in its units; the output's rate is the one the check report uses (an output point's
rate along its fixed slide, or along its path's principal direction), signed, so that a toggle of
the output (its rate through zero: the advantage infinite, the output locks against a load) shows
as a change of sign between two swept poses.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..errors import KinematicsError
from ..instantaneous.advantage import LOCKED
from .measures import clear_of_dead_points, output_coordinate, rate_zeros
from .sweep import Sweep


@dataclass(frozen=True)
class CycleAdvantage:
    """Velocity ratio (``unit``) and mechanical advantage (``advantage_unit``, inf where the output
    locks) at every swept driver angle. ``least_advantage`` is the least |advantage| and
    ``least_at_deg`` where (a rocking driver's samples next to its dead points left out, as the
    peaks do: the advantage falls to zero there); ``locks_at_deg`` where the output locks."""

    output: str
    unit: str
    advantage_unit: str
    driver_angle_deg: np.ndarray
    velocity_ratio: np.ndarray
    mechanical_advantage: np.ndarray
    least_advantage: float
    least_at_deg: float
    locks_at_deg: tuple

    def as_dict(self) -> dict:
        """The summary in SI for JSON (the arrays are left to the CSV)."""
        return {"output": self.output, "unit": self.unit, "advantage_unit": self.advantage_unit,
                "least_advantage": self.least_advantage, "least_at_deg": self.least_at_deg,
                "locks_at_deg": list(self.locks_at_deg)}


def advantage_over_cycle(result: Sweep) -> CycleAdvantage:
    """The output's velocity ratio and mechanical advantage over the sweep."""
    mech = result.mechanism
    found = output_coordinate(mech, result)
    if found is None:
        raise KinematicsError("the file names no output: no velocity ratio or mechanical advantage", "output")
    omega = mech.driver.speed_rad_s
    if omega == 0.0:
        raise KinematicsError("the driver's speed is zero: the sweep's rates give no velocity ratio",
                              "driver.speed")
    name, _, unit, rate, _ = found
    angular = unit == "°"
    scale = 1.0 if angular else mech.size * mech.metres_per_unit
    ratio = np.asarray(rate, float) / omega
    # Rounding leaves a toggle pose a rate of a few ulps: the same threshold as at one pose.
    ratio = np.where(np.abs(ratio) <= LOCKED * scale, 0.0, ratio)
    with np.errstate(divide="ignore"):
        advantage = np.where(ratio == 0.0, np.inf, 1.0 / np.where(ratio == 0.0, 1.0, ratio))
    angles = result.driver_angle_deg
    clear = np.flatnonzero(clear_of_dead_points(result))
    least = int(clear[np.argmax(np.abs(ratio[clear]))])
    _, locks = rate_zeros(angles, ratio, result.full_turn)
    return CycleAdvantage(output=name, unit="rad/rad" if angular else "m/rad",
                          advantage_unit="N·m/N·m" if angular else "N/(N·m)", driver_angle_deg=angles,
                          velocity_ratio=ratio, mechanical_advantage=advantage,
                          least_advantage=float(abs(advantage[least])), least_at_deg=float(angles[least]),
                          locks_at_deg=tuple(a % 360.0 for a in locks))
