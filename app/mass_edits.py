"""Edits of a design's masses and loads, as new Mechanisms (no Qt).

Each function returns the edited Mechanism or raises the core's
:class:`~kinematics.errors.FileFormatError`, whose ``location`` names the place
(``masses.rod.inertia``, ``loads.pressing.point``) the window shows beside the field.
A design left with no mass entry, point mass, load or gravity gets ``mass_data=None``,
so that it saves as format 1, as it was before.
"""

from __future__ import annotations

from dataclasses import replace

from kinematics import FileFormatError, LinkMass, Load, MassData, Mechanism, PointMass
from kinematics.model.mechanism import GROUND

STANDARD_GRAVITY_M_S2 = (0.0, -9.80665)  # ISO 80000-3 standard acceleration of gravity, straight down


def _with(mechanism: Mechanism, **changes) -> Mechanism:
    data = mechanism.mass_data or MassData()
    data = replace(data, **changes)
    if not (data.masses or data.point_masses or data.loads or data.gravity_value is not None):
        data = None
    return replace(mechanism, mass_data=data, warnings=())


def centroid(mechanism: Mechanism, link: str) -> tuple:
    """The mean of the link's points in the reference pose (file units): where a new mass entry's
    centre starts, for the designer to move."""
    points = [mechanism.points[p] for p in dict.fromkeys(mechanism.links[link])]
    return (sum(p[0] for p in points) / len(points), sum(p[1] for p in points) / len(points))


def moving_links(mechanism: Mechanism) -> list:
    return [name for name in mechanism.links if name != GROUND]


def moving_points(mechanism: Mechanism) -> list:
    return [p for p in mechanism.points if p not in mechanism.ground]


def with_link_mass(mechanism: Mechanism, link: str, entry: LinkMass | None) -> Mechanism:
    """``link`` given mass ``entry`` (None: massless, the entry removed)."""
    masses = dict((mechanism.mass_data or MassData()).masses)
    if entry is None:
        masses.pop(link, None)
    else:
        masses[link] = entry
    return _with(mechanism, masses=masses)


def with_point_mass(mechanism: Mechanism, point: str, entry: PointMass | None) -> Mechanism:
    """``point`` given the particle ``entry`` (None: removed)."""
    point_masses = dict((mechanism.mass_data or MassData()).point_masses)
    if entry is None:
        point_masses.pop(point, None)
    else:
        point_masses[point] = entry
    return _with(mechanism, point_masses=point_masses)


def with_load(mechanism: Mechanism, name: str, load: Load | None) -> Mechanism:
    """The load filed as ``name`` replaced by ``load`` (renamed in place when its name differs;
    appended when ``name`` is new; removed when ``load`` is None)."""
    before = (mechanism.mass_data or MassData()).loads
    if load is not None and load.name != name and load.name in before:
        raise FileFormatError(f'another load is already named "{load.name}"', f"loads.{name}", "reference")
    loads = {}
    for key, existing in before.items():
        if key == name:
            if load is not None:
                loads[load.name] = load
        else:
            loads[key] = existing
    if load is not None and name not in loads and load.name not in loads:
        loads[load.name] = load
    return _with(mechanism, loads=loads)


def with_gravity(mechanism: Mechanism, value_m_s2: tuple | None) -> Mechanism:
    """Gravity ``value_m_s2`` (x, y) in the drawing's axes, or None (a machine in a horizontal plane)."""
    return _with(mechanism, gravity_value=None if value_m_s2 is None else tuple(value_m_s2), gravity_unit="m/s^2")


def new_load_name(mechanism: Mechanism, stem: str) -> str:
    """``stem``, or ``stem 2``, ``stem 3`` ...: a name no load of the design has."""
    taken = set((mechanism.mass_data or MassData()).loads)
    if stem not in taken:
        return stem
    return next(f"{stem} {n}" for n in range(2, len(taken) + 3) if f"{stem} {n}" not in taken)
