"""Drawing scales: ISO 5455 ratios for the space diagram, round 1, 2, 5 × 10ⁿ
values for the polygons and for scale bars."""

from __future__ import annotations

import math
from fractions import Fraction

from ..groups.scales import series_at_least, series_at_most, series_term


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
    mantissa, power = series_term(largest, at_least=False)
    return Fraction(mantissa) * Fraction(10) ** power


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
    return series_at_least(needed_per_mm)


def bar_value(longest_mm: float, mm_per_value: float) -> float:
    """The largest round value (1, 2, 5 × 10ⁿ) whose bar is at most ``longest_mm`` long."""
    return series_at_most(longest_mm / mm_per_value)


def plain(value: float) -> str:
    """A number as a drawing writes it: no exponent, no trailing zeros."""
    text = f"{value:.10f}".rstrip("0").rstrip(".")
    return text or "0"
