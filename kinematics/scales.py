"""The preferred series 1, 2, 5 × 10ⁿ: the one rule by which drawing scales,
polygon scales, scale bars and the window's grid step are rounded.

>>> series_at_least(0.037), series_at_most(37)
(Fraction(1, 20), Fraction(20, 1))
>>> preferred_scale(3.7, 100.0)   # 3.7 m/s in a 100 mm box
0.05
"""

from __future__ import annotations

import math
from fractions import Fraction

MANTISSAS = (1, 2, 5)
# A hair of tolerance so an exact fit (0.5 from 1 / 2.0) is not lost to rounding.
FIT = 1e-12


def _candidates(near: float) -> list:
    exponent = math.floor(math.log10(near))
    return [mantissa * Fraction(10) ** power for power in (exponent - 1, exponent, exponent + 1)
            for mantissa in MANTISSAS]


def _check(value: float) -> None:
    if not math.isfinite(value) or value <= 0.0:
        raise ValueError(f"no value of the series 1, 2, 5 × 10ⁿ stands for {value}")


def series_at_least(value: float) -> Fraction:
    """The smallest 1, 2 or 5 × 10ⁿ not below ``value`` (> 0), exact."""
    _check(value)
    return min(c for c in _candidates(value) if c >= value * (1 - FIT))


def series_at_most(value: float) -> Fraction:
    """The largest 1, 2 or 5 × 10ⁿ not above ``value`` (> 0), exact."""
    _check(value)
    return max(c for c in _candidates(value) if c <= value * (1 + FIT))


def preferred_scale(extent: float, box_mm: float) -> float:
    """The smallest 1, 2, 5 × 10ⁿ units per mm that fits ``extent`` units in ``box_mm``
    (1.0 for no extent)."""
    if not math.isfinite(extent) or extent <= 0.0:
        return 1.0
    return float(series_at_least(extent / box_mm))
