"""The preferred series 1, 2, 5 × 10ⁿ: the one rule by which drawing scales,
polygon scales, scale bars and the window's grid step are rounded.

>>> series_at_least(0.037), series_at_most(37)
(0.05, 20.0)
>>> preferred_scale(3.7, 100.0)   # 3.7 m/s in a 100 mm box
0.05
"""

from __future__ import annotations

import math

MANTISSAS = (1, 2, 5)
# A hair of tolerance so an exact fit (0.5 from 1 / 2.0) is not lost to rounding.
FIT = 1e-12


def series_term(value: float, at_least: bool) -> tuple:
    """(mantissa, power of ten) of the term of the series nearest ``value`` (> 0) from above
    (``at_least``) or from below, so a caller can make it exact (a Fraction) or a float."""
    if not math.isfinite(value) or value <= 0.0:
        raise ValueError(f"no value of the series 1, 2, 5 × 10ⁿ stands for {value}")
    exponent = math.floor(math.log10(value))
    terms = [(m, p) for p in (exponent - 1, exponent, exponent + 1) for m in MANTISSAS]
    if at_least:
        return next(t for t in terms if _float(t) >= value * (1 - FIT))
    return next(t for t in reversed(terms) if _float(t) <= value * (1 + FIT))


def _float(term: tuple) -> float:
    # The double nearest m × 10ⁿ, as the literal "me n" reads (5 * 10.0 ** -2 is not quite 0.05).
    return float(f"{term[0]}e{term[1]}")


def series_at_least(value: float) -> float:
    """The smallest 1, 2 or 5 × 10ⁿ not below ``value`` (> 0)."""
    return _float(series_term(value, True))


def series_at_most(value: float) -> float:
    """The largest 1, 2 or 5 × 10ⁿ not above ``value`` (> 0)."""
    return _float(series_term(value, False))


def preferred_scale(extent: float, box_mm: float) -> float:
    """The smallest 1, 2, 5 × 10ⁿ units per mm that fits ``extent`` units in ``box_mm``
    (1.0 for no extent)."""
    if not math.isfinite(extent) or extent <= 0.0:
        return 1.0
    return series_at_least(extent / box_mm)
