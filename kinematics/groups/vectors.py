"""The one rule for a vector's direction, and for when a vector is zero.

A vector whose size is at most NEGLIGIBLE times the pose's largest of its kind
is the solver's rounding, not a motion: it is zero and has no direction. The
printed tables, the construction's sentences and the window's table all ask
here.

>>> direction_deg(0.0, -2.0)
270.0
>>> direction_deg(1e-15, 0.0, scale=3.0) is None
True
"""

from __future__ import annotations

import math

__all__ = ["NEGLIGIBLE", "direction_deg", "negligible"]

# Below this fraction of the pose's largest value of its kind a number is the solver's rounding
# (its residuals are near 1e-13 relative), far below anything a drawing or a bearing cares
# about: it is shown as 0, so a crank at constant speed reads α 0, not 1.8e-13 CW.
NEGLIGIBLE = 1e-9


def negligible(value: float, scale: float) -> bool:
    """True when ``value`` is at most NEGLIGIBLE × ``scale`` in size (exactly 0 when ``scale`` is 0)."""
    return abs(value) <= NEGLIGIBLE * scale


def direction_deg(x: float, y: float, scale: float = 0.0) -> float | None:
    """Direction of the vector (x, y), degrees counter-clockwise from +x in [0, 360); None for a
    zero vector: one no larger than NEGLIGIBLE × ``scale`` (exactly zero when ``scale`` is 0)."""
    if negligible(math.hypot(x, y), scale):
        return None
    return math.degrees(math.atan2(y, x)) % 360.0
