"""Unit conversions. The file keeps its own units; everything computed is SI."""

import math

from ..errors import FileFormatError

METRES_PER_LENGTH_UNIT = {"mm": 1e-3, "m": 1.0, "in": 0.0254}
RAD_S_PER_SPEED_UNIT = {"rad/s": 1.0, "rpm": 2.0 * math.pi / 60.0}
RAD_S2_PER_ACCELERATION_UNIT = {"rad/s^2": 1.0}
# A cylinder driver's extending speed and acceleration.
M_S_PER_LINEAR_SPEED_UNIT = {"m/s": 1.0, "mm/s": 1e-3}
M_S2_PER_LINEAR_ACCELERATION_UNIT = {"m/s^2": 1.0, "mm/s^2": 1e-3}


def metres_per(length_unit: str) -> float:
    """Metres in one ``length_unit`` (``mm``, ``m`` or ``in``).

    >>> metres_per("mm")
    0.001
    """
    try:
        return METRES_PER_LENGTH_UNIT[length_unit]
    except KeyError:
        raise FileFormatError(
            f'unknown length unit "{length_unit}" (use mm, m or in)', "length_unit"
        ) from None


def rpm_from_rad_s(speed_rad_s: float) -> float:
    """A speed in rad/s as revolutions per minute."""
    return speed_rad_s * 60.0 / (2.0 * math.pi)

# Mass data (see kinematics.model.mass): the units a file may state, and their SI factors.
KG_PER_MASS_UNIT = {"kg": 1.0, "g": 1e-3}
KG_M2_PER_INERTIA_UNIT = {"kg*m^2": 1.0, "kg*mm^2": 1e-6, "g*mm^2": 1e-9}
N_PER_FORCE_UNIT = {"N": 1.0}
N_M_PER_TORQUE_UNIT = {"N*m": 1.0}
M_S2_PER_GRAVITY_UNIT = {"m/s^2": 1.0}


ANGLE_DECIMALS = 2  # a driver angle, wherever it is said: the window, the sheet, the report, the CLI


def angle_text(angle_deg: float) -> str:
    """A driver angle as every output says it (one rounding rule for one quantity).

    >>> angle_text(60.0249)
    '60.02°'
    """
    return f"{angle_deg:.{ANGLE_DECIMALS}f}°"
