"""Units the window shows numbers in (the Solution itself is always SI).

>>> LENGTH_SYSTEMS["mm"].velocity(1.5)
1500.0
"""

from __future__ import annotations

from dataclasses import dataclass

from kinematics.model.units import METRES_PER_LENGTH_UNIT, rpm_from_rad_s


@dataclass(frozen=True)
class LengthSystem:
    """Velocities in ``unit``/s, accelerations in ``unit``/s² and jerks in ``unit``/s³."""

    unit: str

    @property
    def metres(self) -> float:
        return METRES_PER_LENGTH_UNIT[self.unit]

    def velocity(self, metres_per_second: float) -> float:
        return metres_per_second / self.metres

    def acceleration(self, metres_per_second2: float) -> float:
        return metres_per_second2 / self.metres

    @property
    def velocity_unit(self) -> str:
        return f"{self.unit}/s"

    @property
    def acceleration_unit(self) -> str:
        return f"{self.unit}/s²"

    @property
    def jerk_unit(self) -> str:
        return f"{self.unit}/s³"


LENGTH_SYSTEMS = {unit: LengthSystem(unit) for unit in ("mm", "m", "in")}
SPEED_UNITS = ("rad/s", "rpm")


def angular_speed(rad_s: float, unit: str) -> float:
    return rpm_from_rad_s(rad_s) if unit == "rpm" else rad_s


def sense(value: float, zero: str = "at rest") -> str:
    """The sense of an angular rate in words (CCW positive, the core's convention); ``zero``
    is said for none (a link at rest, or no angular acceleration)."""
    if value == 0.0:
        return zero
    return "CCW" if value > 0 else "CW"
