"""The Mechanism: an immutable value holding a design as its file states it.

The Mechanism keeps the file's own units and numbers (an unchanged file
saves identical); lengths are in ``length_unit``. Edits are functions that
return a new Mechanism.
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass, field
from functools import cached_property
from types import MappingProxyType
from typing import TYPE_CHECKING

from ..errors import FileFormatError
from .units import (
    M_S2_PER_LINEAR_ACCELERATION_UNIT,
    M_S_PER_LINEAR_SPEED_UNIT,
    RAD_S2_PER_ACCELERATION_UNIT,
    RAD_S_PER_SPEED_UNIT,
    metres_per,
)

if TYPE_CHECKING:
    from .mass import MassData

GROUND = "ground"
# A point this close to its slide line, relative to the larger of the mechanism's size and the
# line's length, is on it: the one tolerance of loading a file and of editing a design.
ON_LINE_RELATIVE = 1e-9


@dataclass(frozen=True)
class Slide:
    """Point ``point`` stays on the line through ``line`` (two points fixed in
    body ``guide``, which is ``"ground"`` or a link name)."""

    name: str
    point: str
    guide: str
    line: tuple[str, str]


def cylinder_words(slide: str) -> str:
    """The cylinder of slide ``slide`` in words: its name alone where that already says cylinder.

    >>> cylinder_words("lift"), cylinder_words("cylinder"), cylinder_words("main cylinder")
    ('cylinder lift', 'cylinder', 'main cylinder')
    """
    return slide if "cylinder" in slide.lower() else f"cylinder {slide}"


@dataclass(frozen=True)
class Driver:
    """A link pivoted on ground at ``pivot``, turning at a given speed (``kind`` "rotary"), or a
    cylinder (``kind`` "actuator"): the slide ``slide`` whose guide is the barrel ``link`` pivoted on
    ground at ``pivot`` (its line's first point), extending at ``linear_speed`` with
    ``linear_acceleration``, its length (pivot to the slide's point) within ``stroke_min`` and
    ``stroke_max`` (``length_unit``; None where the file gives no limit).

    ``speed`` and ``angular_acceleration`` keep the file's value and unit; ``angular_jerk_rad_s3``, the
    rate of change of the angular acceleration, is zero for a drive at constant angular acceleration
    (no file key gives it yet).
    """

    link: str
    pivot: str
    speed_value: float
    speed_unit: str = "rpm"
    angular_acceleration_value: float = 0.0
    angular_acceleration_unit: str = "rad/s^2"
    kind: str = "rotary"
    angular_jerk_rad_s3: float = 0.0
    slide: str | None = None
    linear_speed_value: float = 0.0
    linear_speed_unit: str = "m/s"
    linear_acceleration_value: float = 0.0
    linear_acceleration_unit: str = "m/s^2"
    stroke_min: float | None = None
    stroke_max: float | None = None

    def __post_init__(self):
        low, high = self.stroke_min, self.stroke_max
        if low is not None and high is not None and not low < high:
            raise FileFormatError(f"the stroke's min {low:g} must be below its max {high:g}", "driver.stroke",
                                  "geometry")

    @property
    def is_actuator(self) -> bool:
        """True for a cylinder driver (``kind`` "actuator")."""
        return self.kind == "actuator"

    @property
    def cylinder_words(self) -> str:
        """A cylinder driver in words (:func:`cylinder_words` of its slide)."""
        return cylinder_words(self.slide)

    @property
    def linear_speed_m_s(self) -> float:
        """A cylinder's extension speed L̇, m/s (negative retracts)."""
        return float(self.linear_speed_value) * M_S_PER_LINEAR_SPEED_UNIT[self.linear_speed_unit]

    @property
    def linear_acceleration_m_s2(self) -> float:
        """A cylinder's extension acceleration L̈, m/s²."""
        return float(self.linear_acceleration_value) * M_S2_PER_LINEAR_ACCELERATION_UNIT[
            self.linear_acceleration_unit]

    @property
    def speed_rad_s(self) -> float:
        """The driver's speed in rad/s (counter-clockwise positive)."""
        return float(self.speed_value) * RAD_S_PER_SPEED_UNIT[self.speed_unit]

    @property
    def angular_acceleration_rad_s2(self) -> float:
        """The driver's angular acceleration in rad/s²."""
        return float(self.angular_acceleration_value) * RAD_S2_PER_ACCELERATION_UNIT[
            self.angular_acceleration_unit
        ]


def _frozen(mapping) -> Mapping:
    return MappingProxyType(dict(mapping))


@dataclass(frozen=True)
class Mechanism:
    """A planar linkage in its reference pose.

    Attributes
    ----------
    points : mapping name -> (x, y) in ``length_unit``, y up.
    ground : names of fixed points.
    links : mapping link name -> tuple of point names (a rigid body).
    slides : mapping slide name -> :class:`Slide`.
    driver : :class:`Driver` or None for an unfinished design.
    output : ``{"link": name}`` or ``{"point": name}`` or None.
    extensions : top-level ``x-`` keys of the file, kept unread.
    warnings : what loading had to say (a point moved onto its slide line ...).
    mass_data : :class:`~kinematics.model.mass.MassData` (masses, loads, gravity) or None
        for a design with no mass data; checked against the design when made.
    """

    points: Mapping[str, tuple]
    links: Mapping[str, tuple]
    ground: tuple = ()
    slides: Mapping[str, Slide] = field(default_factory=dict)
    driver: Driver | None = None
    output: Mapping | None = None
    analysis_angles_deg: tuple = ()
    title: str = ""
    notes: str = ""
    length_unit: str = "mm"
    extensions: Mapping = field(default_factory=dict)
    warnings: tuple = ()
    mass_data: MassData | None = None

    def __post_init__(self):
        object.__setattr__(self, "points", _frozen({k: tuple(v) for k, v in self.points.items()}))
        object.__setattr__(self, "links", _frozen({k: tuple(v) for k, v in self.links.items()}))
        object.__setattr__(self, "slides", _frozen(self.slides))
        object.__setattr__(self, "extensions", _frozen(self.extensions))
        object.__setattr__(self, "ground", tuple(self.ground))
        object.__setattr__(self, "analysis_angles_deg", tuple(self.analysis_angles_deg))
        if self.output is not None:
            object.__setattr__(self, "output", _frozen(self.output))
        if self.mass_data is not None:
            self.mass_data.check(self)

    @property
    def metres_per_unit(self) -> float:
        """Metres per unit of the file's lengths."""
        return metres_per(self.length_unit)

    def position_m(self, name: str) -> tuple[float, float]:
        """Point ``name`` of the reference pose, in metres."""
        x, y = self.points[name]
        k = self.metres_per_unit
        return (float(x) * k, float(y) * k)

    def bodies_of(self, point: str) -> list[str]:
        """Bodies (``"ground"`` first, then links in file order) that hold ``point``."""
        return list(self._bodies.get(point, ()))

    @cached_property
    def _bodies(self) -> dict:
        # Worked out once (the mechanism is immutable): diagnose, decompose and drawing each ask per point.
        bodies = {p: [GROUND] for p in self.ground}
        for name, pts in self.links.items():
            for p in dict.fromkeys(pts):
                bodies.setdefault(p, []).append(name)
        return bodies

    def body_points(self, body: str) -> tuple:
        """The points of ``body``: the fixed points for ``ground``, else the link's points."""
        return self.ground if body == GROUND else self.links[body]

    @cached_property
    def size(self) -> float:
        """Diagonal of the bounding box of all points, in ``length_unit``."""
        if not self.points:
            return 0.0
        xs = [float(p[0]) for p in self.points.values()]
        ys = [float(p[1]) for p in self.points.values()]
        return math.hypot(max(xs) - min(xs), max(ys) - min(ys))


def slide_offset(mechanism: Mechanism, slide: Slide) -> tuple[float, tuple[float, float]]:
    """(signed distance in ``length_unit`` of the slide's point from its line, the foot of the
    perpendicular on the line); the distance is 0.0, and the foot the point itself, when the
    point is on the line within :data:`ON_LINE_RELATIVE` or the line has no length.

    >>> m = Mechanism(points={"E": (0, 0), "F": (10, 0), "D": (4, 0.5)}, links={})
    >>> slide_offset(m, Slide("s", "D", "ground", ("E", "F")))
    (-0.5, (4.0, 0.0))
    """
    (ex, ey), (fx, fy) = (mechanism.points[p] for p in slide.line)
    px, py = mechanism.points[slide.point]
    dx, dy = fx - ex, fy - ey
    length = math.hypot(dx, dy)
    off = ((px - ex) * dy - (py - ey) * dx) / length if length else 0.0
    if abs(off) <= ON_LINE_RELATIVE * max(mechanism.size, length):
        return 0.0, (px, py)
    return off, (px - off * dy / length, py + off * dx / length)
