"""Moving a joint: an edit that returns a new Mechanism the file format still accepts."""

from __future__ import annotations

import math
from dataclasses import replace

from ..errors import KinematicsError
from ..files.fileschema import MAX_COORDINATE
from ..model.mass import carried
from ..model.mechanism import Mechanism


def _carried_centres(mechanism: Mechanism, name: str, points: dict):
    """The mass data with the centre of mass of every link whose first two points include ``name``
    kept where it was relative to those two points (moved, turned and scaled with them), as a
    practitioner expects a link's centre to follow its shape; masses and inertias stay as stated."""
    data = mechanism.mass_data
    if data is None:
        return None
    masses = dict(data.masses)
    for link, entry in data.masses.items():
        first, second = mechanism.links[link][:2]
        if name not in (first, second):
            continue
        centre = carried(entry.centre, (mechanism.points[first], mechanism.points[second]),
                         (points[first], points[second]))
        if centre is None:
            continue  # no frame to carry it in (the loader refuses such a link; a drag may pass through one)
        if max(abs(centre[0]), abs(centre[1])) > MAX_COORDINATE:
            raise KinematicsError(f"moving point {name} would carry the centre of mass of link {link} to "
                                  f"({centre[0]:.6g}, {centre[1]:.6g}), beyond ±{MAX_COORDINATE:g} length units "
                                  "(the file format's limit)", f"points.{name}")
        masses[link] = replace(entry, centre=centre)
    return replace(data, masses=masses)


def move_point(mechanism: Mechanism, name: str, xy) -> Mechanism:
    """A new Mechanism with point ``name`` at ``xy`` (in ``length_unit``) in the
    reference pose; link shapes follow, and so do the centres of mass (kept where they were
    relative to their link's first two points; see :func:`_carried_centres`).

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
    return replace(mechanism, points=points, mass_data=_carried_centres(mechanism, name, points), warnings=())
