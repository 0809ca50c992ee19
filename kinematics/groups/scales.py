"""Drawing scales from the preferred series 1, 2, 5 × 10ⁿ."""

import math

PREFERRED = (1.0, 2.0, 5.0)


def preferred_scale(extent: float, box_mm: float) -> float:
    """The smallest 1, 2, 5 × 10ⁿ units per mm that fits ``extent`` units in ``box_mm``.

    >>> preferred_scale(3.7, 100.0)   # 3.7 m/s in a 100 mm box
    0.05
    """
    if not math.isfinite(extent) or extent <= 0.0:
        return 1.0
    needed = extent / box_mm
    exponent = math.floor(math.log10(needed))
    for power in (exponent, exponent + 1):
        for mantissa in PREFERRED:
            value = mantissa * 10.0 ** power
            if value >= needed * (1 - 1e-12):
                return float(f"{value:.12g}")
    return float(f"{10.0 ** (exponent + 1):.12g}")
