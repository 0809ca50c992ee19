"""Moving a joint: an edit that returns a new Mechanism the file format still accepts."""

from __future__ import annotations

import math
from dataclasses import replace

from ..errors import KinematicsError
from ..files.fileschema import MAX_COORDINATE
from ..model.mechanism import Mechanism


def move_point(mechanism: Mechanism, name: str, xy) -> Mechanism:
    """A new Mechanism with point ``name`` at ``xy`` (in ``length_unit``) in the
    reference pose; link shapes follow.

    >>> m = Mechanism(points={"A": (0, 0), "B": (1, 0)}, links={"bar": ("A", "B")})
    >>> move_point(m, "B", (2.0, 0.0)).points["B"]
    (2.0, 0.0)
    """
    points = dict(mechanism.points)
    if name not in points:
        raise KinematicsError(f'unknown point "{name}"', "points")
    x, y = (float(c) for c in xy)
    if not (math.isfinite(x) and math.isfinite(y)):
        raise KinematicsError(f"point {name} cannot go to ({x}, {y}): coordinates must be finite", f"points.{name}")
    if max(abs(x), abs(y)) > MAX_COORDINATE:
        raise KinematicsError(f"point {name} cannot go to ({x:.6g}, {y:.6g}): coordinates are limited to "
                              f"±{MAX_COORDINATE:g} length units (the file format's limit)", f"points.{name}")
    points[name] = (x, y)
    return replace(mechanism, points=points, warnings=())
