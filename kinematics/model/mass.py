"""Mass data and external loads of a design: immutable values in the file's units.

Link masses, point masses (a block, a piston, a tool, a counterweight), named loads
(a force at a point or a torque on a link, optionally over an interval of the driver's
turn) and gravity. Each value keeps its number and unit as stated; the ``*_kg``,
``*_kg_m2``, ``*_n``, ``*_n_m`` and ``*_m_s2`` properties give SI. No friction: the
forces computed from these are those of frictionless joints.

Every refusal is a :class:`~kinematics.errors.FileFormatError` naming its place
(``masses.coupler.inertia``, ``point_masses.D``, ``loads.cutting.point``, ``gravity``).
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass, field
from types import MappingProxyType

import numpy as np

from ..errors import FileFormatError
from .mechanism import GROUND
from .units import (
    KG_M2_PER_INERTIA_UNIT,
    KG_PER_MASS_UNIT,
    M_S2_PER_GRAVITY_UNIT,
    N_M_PER_TORQUE_UNIT,
    N_PER_FORCE_UNIT,
)


def _unit(unit: str, table: dict, what: str, where: str) -> float:
    if unit not in table:
        raise FileFormatError(f'unknown {what} unit "{unit}" (use {", ".join(table)})', where)
    return table[unit]


def _number(value, what: str, where: str) -> float:
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value):
        raise FileFormatError(f"{what} must be a finite number, not {value!r}", where)
    # A whole number stays one, so that a file saves as it was written.
    return value if isinstance(value, int) else float(value)


def _vector(value, what: str, where: str) -> tuple[float, float]:
    if not isinstance(value, (tuple, list)) or len(value) != 2:
        raise FileFormatError(f"{what} must be two finite numbers [x, y], not {value!r}", where)
    return (_number(value[0], what, where), _number(value[1], what, where))


def _not_negative(value, what: str, where: str) -> float:
    number = _number(value, what, where)
    if number < 0.0:
        raise FileFormatError(f"{what} cannot be negative ({number:g})", where)
    return number


@dataclass(frozen=True)
class LinkMass:
    """The mass of link ``link``: ``mass_value`` in ``mass_unit``; ``centre`` (x, y) in the
    mechanism's ``length_unit`` at the reference pose, fixed in the link; ``inertia_value``
    in ``inertia_unit``, the moment of inertia about that centre."""

    link: str
    mass_value: float
    centre: tuple
    inertia_value: float = 0.0
    mass_unit: str = "kg"
    inertia_unit: str = "kg*m^2"

    def __post_init__(self):
        where = f"masses.{self.link}"
        _unit(self.mass_unit, KG_PER_MASS_UNIT, "mass", f"{where}.mass")
        _unit(self.inertia_unit, KG_M2_PER_INERTIA_UNIT, "inertia", f"{where}.inertia")
        object.__setattr__(self, "mass_value", _not_negative(self.mass_value, "a mass", f"{where}.mass"))
        object.__setattr__(self, "inertia_value",
                           _not_negative(self.inertia_value, "a moment of inertia", f"{where}.inertia"))
        object.__setattr__(self, "centre", _vector(self.centre, "the centre of mass", f"{where}.centre"))

    @property
    def mass_kg(self) -> float:
        """The link's mass in kg."""
        return self.mass_value * KG_PER_MASS_UNIT[self.mass_unit]

    @property
    def inertia_kg_m2(self) -> float:
        """The moment of inertia about the centre of mass, kg·m²."""
        return self.inertia_value * KG_M2_PER_INERTIA_UNIT[self.inertia_unit]


@dataclass(frozen=True)
class PointMass:
    """A particle of ``value`` ``unit`` at point ``point``: the pin or block there when the
    point joins several bodies or carries a slide, otherwise lumped on the point's one link."""

    point: str
    value: float
    unit: str = "kg"

    def __post_init__(self):
        where = f"point_masses.{self.point}"
        _unit(self.unit, KG_PER_MASS_UNIT, "mass", where)
        object.__setattr__(self, "value", _not_negative(self.value, "a mass", where))

    @property
    def mass_kg(self) -> float:
        """The particle's mass in kg."""
        return self.value * KG_PER_MASS_UNIT[self.unit]


@dataclass(frozen=True)
class Load:
    """A named external load on the moving parts, its reaction outside the mechanism.

    Either a force ``force_value`` (x, y) in ``force_unit`` at ``point`` (on the pin or
    block there, or on the one ``link`` named), or a torque ``torque_value`` in
    ``torque_unit`` (counter-clockwise positive) on ``link``. ``over_deg`` (start, end),
    if given, makes it act only while the driver angle lies in that interval, taken the
    way the driver turns (a working stroke); None acts at every angle.
    """

    name: str
    point: str | None = None
    force_value: tuple | None = None
    force_unit: str = "N"
    link: str | None = None
    torque_value: float | None = None
    torque_unit: str = "N*m"
    over_deg: tuple | None = None

    def __post_init__(self):
        where = f"loads.{self.name}"
        if (self.force_value is None) == (self.torque_value is None):
            raise FileFormatError("a load is either a force at a point or a torque on a link: give one of "
                                  "force and torque", where)
        if self.force_value is not None:
            if self.point is None:
                raise FileFormatError("a force needs the point it acts at", f"{where}.point")
            _unit(self.force_unit, N_PER_FORCE_UNIT, "force", f"{where}.force")
            object.__setattr__(self, "force_value", _vector(self.force_value, "a force", f"{where}.force"))
        else:
            if self.link is None:
                raise FileFormatError("a torque needs the link it acts on", f"{where}.link")
            if self.point is not None:
                raise FileFormatError("a torque acts on a link, not at a point: leave the point out", f"{where}.point")
            _unit(self.torque_unit, N_M_PER_TORQUE_UNIT, "torque", f"{where}.torque")
            object.__setattr__(self, "torque_value", _number(self.torque_value, "a torque", f"{where}.torque"))
        if self.over_deg is not None:
            object.__setattr__(self, "over_deg", self._interval(f"{where}.over_deg"))

    def _interval(self, where: str) -> tuple[float, float]:
        value = self.over_deg
        if not isinstance(value, (tuple, list)) or len(value) != 2:
            raise FileFormatError(f"over_deg must be two finite angles [start, end] in degrees, not {value!r}", where)
        start, end = (_number(v, "over_deg", where) for v in value)
        if math.isclose(math.remainder(end - start, 360.0), 0.0, abs_tol=1e-9):
            raise FileFormatError(f"over_deg [{start:g}, {end:g}] starts and ends at the same angle; leave "
                                  "over_deg out for a load that acts at every angle", where, "geometry")
        return (start, end)

    @property
    def force_n(self) -> np.ndarray | None:
        """The force (x, y) in N, or None for a torque."""
        if self.force_value is None:
            return None
        return np.array(self.force_value) * N_PER_FORCE_UNIT[self.force_unit]

    @property
    def torque_n_m(self) -> float | None:
        """The torque in N·m (counter-clockwise positive), or None for a force."""
        return None if self.torque_value is None else self.torque_value * N_M_PER_TORQUE_UNIT[self.torque_unit]

    def active(self, driver_angle_deg, turning_sense: float = 1.0):
        """Whether the load acts at each driver angle (degrees, scalar or array), the
        interval taken from its start the way the driver turns (``turning_sense`` ±1),
        ends included."""
        angles = np.asarray(driver_angle_deg, float)
        if self.over_deg is None:
            return np.ones(angles.shape, bool)
        start, end = self.over_deg
        sense = 1.0 if turning_sense >= 0 else -1.0
        span = ((end - start) * sense) % 360.0
        return ((angles - start) * sense) % 360.0 <= span + 1e-9


def _frozen(mapping) -> Mapping:
    return MappingProxyType(dict(mapping))


@dataclass(frozen=True)
class MassData:
    """What the forces need beyond the kinematics: masses, loads and gravity.

    Attributes
    ----------
    masses : link name -> :class:`LinkMass`; a link without an entry is massless.
    point_masses : point name -> :class:`PointMass`.
    loads : load name -> :class:`Load`.
    gravity_value : (x, y) in ``gravity_unit`` in the drawing's axes, or None (none: a
        machine moving in a horizontal plane).
    """

    masses: Mapping[str, LinkMass] = field(default_factory=dict)
    point_masses: Mapping[str, PointMass] = field(default_factory=dict)
    loads: Mapping[str, Load] = field(default_factory=dict)
    gravity_value: tuple | None = None
    gravity_unit: str = "m/s^2"

    def __post_init__(self):
        object.__setattr__(self, "masses", _frozen(self.masses))
        object.__setattr__(self, "point_masses", _frozen(self.point_masses))
        object.__setattr__(self, "loads", _frozen(self.loads))
        for family, entries, own in (("masses", self.masses, "link"), ("point_masses", self.point_masses, "point"),
                                     ("loads", self.loads, "name")):
            for key, entry in entries.items():
                if getattr(entry, own) != key:
                    raise FileFormatError(f'the entry is filed as "{key}" but names {own} "{getattr(entry, own)}"',
                                          f"{family}.{key}")
        if self.gravity_value is not None:
            _unit(self.gravity_unit, M_S2_PER_GRAVITY_UNIT, "acceleration", "gravity")
            object.__setattr__(self, "gravity_value", _vector(self.gravity_value, "gravity", "gravity"))

    @property
    def gravity_m_s2(self) -> np.ndarray:
        """Gravity in m/s² (zero when there is none)."""
        if self.gravity_value is None:
            return np.zeros(2)
        return np.array(self.gravity_value) * M_S2_PER_GRAVITY_UNIT[self.gravity_unit]

    @property
    def is_empty(self) -> bool:
        """No mass and no load at all: there is nothing to compute forces from."""
        return not (any(m.mass_kg > 0 or m.inertia_kg_m2 > 0 for m in self.masses.values())
                    or any(p.mass_kg > 0 for p in self.point_masses.values()) or self.loads)

    def check(self, mechanism) -> None:
        """Refuse (``kind="reference"``) what does not fit ``mechanism``: an unknown link or point, a load on the
        frame, a point mass on a fixed point, a load's link that does not hold its point."""
        for link in self.masses:
            _moving_link(mechanism, link, f"masses.{link}")
        for point in self.point_masses:
            _known_point(mechanism, point, f"point_masses.{point}")
            if point in mechanism.ground:
                raise FileFormatError(f"point {point} is fixed: a mass there is part of the frame and takes "
                                      "no part in the motion", f"point_masses.{point}", "reference")
        for load in self.loads.values():
            where = f"loads.{load.name}"
            if load.link is not None:
                _moving_link(mechanism, load.link, f"{where}.link")
            if load.point is None:
                continue
            _known_point(mechanism, load.point, f"{where}.point")
            if load.link is not None and load.point not in mechanism.links[load.link]:
                raise FileFormatError(f"link {load.link} does not hold point {load.point}", f"{where}.link",
                                      "reference")
            if load.link is None and load.point in mechanism.ground:
                raise FileFormatError(f"point {load.point} is fixed: a force there acts on the frame; name the "
                                      "link it acts on", f"{where}.point", "reference")


def _known_point(mechanism, point: str, where: str) -> None:
    if point not in mechanism.points:
        raise FileFormatError(f'unknown point "{point}"', where, "reference")


def _moving_link(mechanism, link: str, where: str) -> None:
    if link == GROUND:
        raise FileFormatError("the frame does not move: masses and loads go on moving links", where, "reference")
    if link not in mechanism.links:
        raise FileFormatError(f'unknown link "{link}"', where, "reference")


def carried(point: tuple, before: tuple, after: tuple) -> tuple | None:
    """``point`` (x, y) fixed to the segment ``before`` = (a, b) as it is carried to ``after`` =
    (a2, b2): moved, turned and scaled with it (a similarity); None when either segment has no length.

    >>> carried((1.0, 1.0), ((0.0, 0.0), (1.0, 0.0)), ((0.0, 0.0), (0.0, 2.0)))
    (-2.0, 2.0)
    """
    (a, b), (a2, b2) = ((complex(*p), complex(*q)) for p, q in (before, after))
    if a == b or a2 == b2:
        return None
    moved = a2 + (complex(*point) - a) * (b2 - a2) / (b - a)
    return (moved.real, moved.imag)


def mass_centres(mechanism, xy: Mapping) -> dict:
    """Where each link's centre of mass is with the points at ``xy`` (name -> (x, y) in metres, a
    pose): the centre stated in the reference pose carried with the link's first two points, as
    the force analysis carries it. Links without a mass entry, or whose first two points meet, are
    left out. Metres, like ``xy``."""
    data = mechanism.mass_data
    if data is None:
        return {}
    k = mechanism.metres_per_unit
    found = {}
    for link, entry in data.masses.items():
        first, second = mechanism.links[link][:2]
        if first not in xy or second not in xy:
            continue
        at = carried((entry.centre[0] * k, entry.centre[1] * k),
                     (mechanism.position_m(first), mechanism.position_m(second)), (xy[first], xy[second]))
        if at is not None:
            found[link] = at
    return found
