"""The mass-data keys of format 2 (``masses``, ``point_masses``, ``loads``, ``gravity``) as a
:class:`~kinematics.model.mass.MassData`, and back.

The schema has checked the structure when these run; what is left is refused by the MassData
itself (unknown links or points, a load on the frame, a point mass on a fixed point ...).
"""

from __future__ import annotations

from ..model.mass import LinkMass, Load, MassData, PointMass
from .masswords import MASS_SECTIONS


def mass_data_from_document(doc: dict) -> MassData | None:
    """The MassData of a parsed, structurally checked document; None when it has none of the keys."""
    if not any(key in doc for key in MASS_SECTIONS):
        return None
    masses = {}
    for link, spec in doc.get("masses", {}).items():
        inertia = spec.get("inertia", {"value": 0.0, "unit": "kg*m^2"})
        masses[link] = LinkMass(link, spec["mass"]["value"], tuple(spec["centre"]), inertia["value"],
                                mass_unit=spec["mass"]["unit"], inertia_unit=inertia["unit"])
    point_masses = {p: PointMass(p, spec["value"], spec["unit"]) for p, spec in doc.get("point_masses", {}).items()}
    loads = {name: _load(name, spec) for name, spec in doc.get("loads", {}).items()}
    gravity = doc.get("gravity")
    return MassData(masses=masses, point_masses=point_masses, loads=loads,
                    gravity_value=None if gravity is None else tuple(gravity["value"]),
                    gravity_unit="m/s^2" if gravity is None else gravity["unit"])


def _load(name: str, spec: dict) -> Load:
    interval = spec.get("over_deg")
    over = None if interval is None else tuple(interval)
    if "force" in spec:
        return Load(name, point=spec["point"], force_value=tuple(spec["force"]["value"]),
                    force_unit=spec["force"]["unit"], link=spec.get("link"), over_deg=over)
    return Load(name, link=spec["link"], torque_value=spec["torque"]["value"], torque_unit=spec["torque"]["unit"],
                over_deg=over)


def mass_data_document(data: MassData) -> dict:
    """The format-2 keys of ``data``, in the canonical order; a family with no entries is left out."""
    doc = {}
    if data.masses:
        doc["masses"] = {link: _link_mass(m) for link, m in data.masses.items()}
    if data.point_masses:
        doc["point_masses"] = {p: {"value": m.value, "unit": m.unit} for p, m in data.point_masses.items()}
    if data.loads:
        doc["loads"] = {name: _load_document(load) for name, load in data.loads.items()}
    if data.gravity_value is not None:
        doc["gravity"] = {"value": list(data.gravity_value), "unit": data.gravity_unit}
    return doc


def _link_mass(m: LinkMass) -> dict:
    entry = {"mass": {"value": m.mass_value, "unit": m.mass_unit}, "centre": list(m.centre)}
    if m.inertia_value != 0 or m.inertia_unit != "kg*m^2":  # left out, an inertia is 0 kg*m^2
        entry["inertia"] = {"value": m.inertia_value, "unit": m.inertia_unit}
    return entry


def _load_document(load: Load) -> dict:
    if load.force_value is not None:
        entry = {"point": load.point}
        if load.link is not None:
            entry["link"] = load.link
        entry["force"] = {"value": list(load.force_value), "unit": load.force_unit}
    else:
        entry = {"link": load.link, "torque": {"value": load.torque_value, "unit": load.torque_unit}}
    if load.over_deg is not None:
        entry["over_deg"] = list(load.over_deg)
    return entry
