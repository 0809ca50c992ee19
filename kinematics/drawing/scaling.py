"""Drawing scales: ISO 5455 ratios for the space diagram, round 1, 2, 5 × 10ⁿ
values for the polygons and for scale bars."""

from __future__ import annotations

import math
from fractions import Fraction

MANTISSAS = (1, 2, 5)


def _candidates(near: float) -> list:
    exponent = math.floor(math.log10(near))
    return [mantissa * Fraction(10) ** power for power in (exponent - 1, exponent, exponent + 1)
            for mantissa in MANTISSAS]


def _series_below(limit: float) -> Fraction:
    """The largest value 1, 2 or 5 × 10ⁿ not above ``limit`` (> 0), exact."""
    # A hair of tolerance so an exact fit (limit 0.5 from 1/2.0) is not lost to rounding.
    return max(c for c in _candidates(limit) if c <= limit * (1 + 1e-12))


def iso5455_ratio(largest: float) -> Fraction:
    """The largest ISO 5455 scale (paper length / true length) not above ``largest``.

    ISO 5455 recommends 1:1, reductions 1:2, 1:5, 1:10, 1:20 ..., enlargements
    2:1, 5:1, 10:1 ..., the series extended by powers of ten.

    >>> iso5455_ratio(0.37)
    Fraction(1, 5)
    >>> iso5455_ratio(3.0)
    Fraction(2, 1)
    """
    if not math.isfinite(largest) or largest <= 0.0:
        raise ValueError(f"no drawing scale fits a factor of {largest}")
    return _series_below(largest)


def ratio_text(ratio: Fraction) -> str:
    """The scale as written on a drawing: "1:5", "1:1", "2:1"."""
    if ratio >= 1:
        return f"{ratio.numerator // ratio.denominator}:1" if ratio.denominator == 1 else f"{float(ratio):g}:1"
    inverse = 1 / ratio
    return f"1:{inverse.numerator}" if inverse.denominator == 1 else f"1:{float(inverse):g}"


def polygon_scale(needed_per_mm: float) -> float:
    """The smallest round scale 1, 2, 5 × 10ⁿ (units per mm of paper) not below ``needed_per_mm``."""
    if not math.isfinite(needed_per_mm) or needed_per_mm <= 0.0:
        return 1.0
    return float(min(c for c in _candidates(needed_per_mm) if c >= needed_per_mm * (1 - 1e-12)))


def bar_value(longest_mm: float, mm_per_value: float) -> float:
    """The largest round value (1, 2, 5 × 10ⁿ) whose bar is at most ``longest_mm`` long."""
    return float(_series_below(longest_mm / mm_per_value))


def plain(value: float) -> str:
    """A number as a drawing writes it: no exponent, no trailing zeros."""
    text = f"{value:.10f}".rstrip("0").rstrip(".")
    return text or "0"
