"""The loader's words for a schema refusal in the mass-data keys of format 2 (``masses``,
``point_masses``, ``loads``, ``gravity``): what :mod:`kinematics.files.fileschema` says at the
place the schema names (``masses.rod.inertia.value: a moment of inertia cannot be negative``).
A missing or unknown key and a bad name are worded there, as in every section."""

from __future__ import annotations

import json
import re

MASS_SECTIONS = ("masses", "point_masses", "loads", "gravity")
FRAME_WORDS = "the frame does not move: masses and loads go on moving links"
# What a unit list is a list of, by the quantity's key.
_UNIT_OF = {"mass": "mass", "inertia": "inertia", "force": "force", "torque": "torque", "gravity": "acceleration",
            "point_masses": "mass"}
_MASS = '{"value": mass, "unit": "kg" or "g"}'
_WHOLE = {
    "masses": 'masses must be an object of link name: {"mass": ..., "centre": [x, y], "inertia": ...}',
    "point_masses": f"point_masses must be an object of point name: {_MASS}",
    "loads": 'loads must be an object of load name: {"point": ..., "force": ...} or {"link": ..., "torque": ...}',
    "gravity": 'gravity is {"value": [x, y], "unit": "m/s^2"}',
}
_ENTRY = {
    "masses": 'a link\'s mass is {"mass": ..., "centre": [x, y], "inertia": ...}',
    "point_masses": f"a point mass is {_MASS}",
    "loads": ('a load is a force at a point ({"point": ..., "force": ...}, optionally on the one "link" named) '
              'or a torque on a link ({"link": ..., "torque": ...}), not both'),
}
_QUANTITY = {
    "mass": _MASS, "inertia": '{"value": inertia, "unit": "kg*m^2", "kg*mm^2" or "g*mm^2"}',
    "force": '{"value": [x, y], "unit": "N"}', "torque": '{"value": torque, "unit": "N*m"}',
}


def listed(options) -> str:
    """``a or b``, ``a, b or c``: a list of choices in words."""
    return " or ".join(options) if len(options) < 3 else ", ".join(options[:-1]) + " or " + options[-1]


def _shown(value) -> str:
    return f'"{value}"' if isinstance(value, str) else json.dumps(value, ensure_ascii=False)


def names_the_frame(section: str, where: str, value) -> bool:
    """Whether a refused name is the frame's where a moving link is wanted (a mass or a load on it)."""
    on_link = (section == "masses" and where.count(".") == 1) or (section == "loads" and where.endswith(".link"))
    return on_link and isinstance(value, str) and value.lower() == "ground"


def mass_words(err, section: str, where: str) -> tuple[str, str]:
    """(message, location) of a schema refusal at ``where`` in mass-data ``section``."""
    rule, value, definition = err.rule, err.value, err.definition or {}
    keys = re.sub(r"\[\d+\]", "", where).split(".")  # the object keys, list indices left out
    if where == section:
        return _WHOLE[section], where
    if len(keys) == 2 and section != "gravity":
        return _ENTRY[section], where
    if rule == "oneOf":
        return _ENTRY["loads"], where
    quantity = keys[2] if section in ("masses", "loads") else section
    if rule == "enum":
        return f"unknown {_UNIT_OF[quantity]} unit {_shown(value)} (use {listed(definition['enum'])})", where
    if quantity == "over_deg":
        return "over_deg must be two finite angles [start, end] in degrees", where.split("[")[0]
    if rule == "minimum" and definition.get("minimum") == 0:
        what = "a moment of inertia" if quantity == "inertia" else "a mass"
        return f"{what} cannot be negative ({value:g})", where
    if rule in ("minimum", "maximum"):
        return f"a number beyond ±{definition['maximum']:g}", where
    if quantity == "centre":
        return "the centre of mass is [x, y] with two finite numbers", where.split("[")[0]
    if quantity in ("point", "link"):
        return f"{quantity} must be a {quantity} name", where
    if keys[-1] == "value" and quantity in ("force", "gravity"):
        return "value is [x, y] with two finite numbers", where.split("[")[0]
    if keys[-1] == "value":
        return "value must be a finite number", where
    return f"{quantity} is {_QUANTITY.get(quantity, _WHOLE['gravity'])}", where
