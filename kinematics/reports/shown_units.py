"""The construction's sentences in the units a person chose: the core writes its step sentences in
SI (m, m/s, m/s², m/s³, rad/s); a window that shows lengths in mm or inches and speeds in rpm
restates each such quantity in those units, to the same four significant figures. Machine-readable
output stays SI; this is for what people read.

>>> in_units("velocity of A: ω·r = 31.42 rad/s × 0.05 m = 1.571 m/s", "mm", "rpm")
'velocity of A: ω·r = 300 rpm × 50 mm = 1571 mm/s'
>>> in_units("a = 2.369 m/s², α = 3.15 rad/s²", "in")
'a = 93.27 in/s², α = 3.15 rad/s²'
"""

from __future__ import annotations

import math
import re

from ..model.units import METRES_PER_LENGTH_UNIT, rpm_from_rad_s

# A number (as the sentences print it) and an SI unit after one space; "mm", "rad/s²" and "N·m"
# are not matched: only m, m/s, m/s², m/s³ and rad/s standing alone.
_QUANTITY = re.compile(r"(?<![\w.])(-?\d+(?:\.\d+)?(?:e[+-]?\d+)?) (m/s³|m/s²|m/s|m|rad/s)(?![\w²³/·^])")


def _number(value: float) -> str:
    """Four significant figures, as the step sentences give them."""
    return f"{value:.4g}" if math.isfinite(value) else str(value)


def in_units(text: str, length_unit: str = "m", speed_unit: str = "rad/s") -> str:
    """``text`` with its SI lengths, velocities, accelerations and jerks in ``length_unit`` (mm, m or
    in; per second, per second squared or cubed) and its angular speeds in ``speed_unit`` (rad/s or
    rpm). Other numbers and units (N, N·m, rad/s², degrees) stay as written."""
    per_metre = 1.0 / METRES_PER_LENGTH_UNIT[length_unit]
    if per_metre == 1.0 and speed_unit == "rad/s":
        return text

    def restate(match: re.Match) -> str:
        value, unit = float(match.group(1)), match.group(2)
        if unit == "rad/s":
            return match.group(0) if speed_unit == "rad/s" else f"{_number(rpm_from_rad_s(value))} rpm"
        if per_metre == 1.0:
            return match.group(0)
        return f"{_number(value * per_metre)} {length_unit}{unit[1:]}"

    return _QUANTITY.sub(restate, text)
