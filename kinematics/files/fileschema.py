"""The structure of mechanism files, as the shipped JSON Schemas state it.

Each format version has its schema in ``schema/`` (:data:`SCHEMA_FILES`); the document's
``kinepoly`` number chooses one. A schema is compiled once, on first use, with
``fastjsonschema``, and a refusal is put in the loader's words at the place it names
(``links.rod: a link needs at least two points``). Everything a schema cannot say (names
that exist, points on their lines) is checked by :mod:`kinematics.files.fileformat`.
"""

from __future__ import annotations

import copy
import json
import re
from functools import cache
from pathlib import Path

from ..errors import FileFormatError
from .masswords import FRAME_WORDS, MASS_SECTIONS, listed, mass_words, names_the_frame

SCHEMA_FOLDER = Path(__file__).with_name("schema")
# One line per format version, numbered from 1 without gaps; a newer number than the last is refused.
SCHEMA_FILES = {1: "mechanism-1.schema.json", 2: "mechanism-2.schema.json"}
# The newest version this Kinepoly reads. A save writes the lowest version that holds the design
# (:func:`written_version`): a design without mass data stays format 1.
FORMAT_VERSION = max(SCHEMA_FILES)
SCHEMA_PATH = SCHEMA_FOLDER / SCHEMA_FILES[FORMAT_VERSION]
# The top-level keys each version after the first brings (a file of an older version naming one is told so).
ADDED_KEYS = {2: ("masses", "point_masses", "loads", "gravity")}
# A cylinder driver (driver kind "actuator") is format 2 as well.


@cache
def schema(version: int) -> dict:
    """The JSON Schema of format ``version`` (a key of :data:`SCHEMA_FILES`)."""
    return json.loads((SCHEMA_FOLDER / SCHEMA_FILES[version]).read_text(encoding="utf-8"))


_NAME = schema(FORMAT_VERSION)["$defs"]["name"]
# The bounds of a coordinate (length units) and of a driver's rates (their units): the schema's, which the
# window's fields and edits keep to, so no edit makes a design the format refuses.
MAX_COORDINATE = schema(FORMAT_VERSION)["$defs"]["coordinate"]["maximum"]
MAX_RATE = schema(FORMAT_VERSION)["$defs"]["quantity"]["properties"]["value"]["maximum"]
# The one name rule: the schema's. Both patterns are anchored; search or fullmatch alike.
NAME_PATTERN = re.compile(_NAME["pattern"])
RESERVED_NAME = re.compile(_NAME["not"]["pattern"])
NAME_RULE = "a letter, then letters, digits or _"


def written_version(mechanism) -> int:
    """The format version a save of ``mechanism`` writes: 2 with mass data, loads or a cylinder driver,
    else 1.

    >>> from kinematics.model.mechanism import Mechanism
    >>> written_version(Mechanism(points={"A": (0, 0), "B": (1, 0)}, links={"bar": ("A", "B")}))
    1
    """
    cylinder = mechanism.driver is not None and mechanism.driver.is_actuator
    return 2 if mechanism.mass_data is not None or cylinder else 1


def name_problem(name) -> str | None:
    """Why ``name`` cannot name a point, link or slide (None when it can)."""
    if not isinstance(name, str):
        return f"{_shown(name)} is not a name (a name is text: {NAME_RULE})"
    if not NAME_PATTERN.search(name):
        return f'"{name}" is not a valid name ({NAME_RULE})'
    if RESERVED_NAME.search(name):
        return '"ground" is reserved'
    return None


def format_version(doc: dict) -> int:
    """The document's format version, which chooses its schema; refused unless this Kinepoly reads it.

    JSON Schema counts ``1.0`` as the integer 1, so it is refused here, where the number is read
    before any schema applies (``kind="version"``).
    """
    if "kinepoly" not in doc:
        raise FileFormatError('missing "kinepoly": this is not a Kinepoly mechanism file', "kinepoly", "version")
    version = doc["kinepoly"]
    if isinstance(version, float) and version.is_integer() and version >= 1:
        raise FileFormatError(f"write the format version as the whole number {int(version)}, not {version!r}",
                              "kinepoly", "version")
    if not isinstance(version, int) or isinstance(version, bool) or version < 1:
        raise FileFormatError("kinepoly must be the format version, a whole number", "kinepoly", "version")
    if version not in SCHEMA_FILES:
        raise FileFormatError(f"this file is format version {version}; this Kinepoly reads versions 1 to "
                              f"{FORMAT_VERSION} (a newer Kinepoly wrote it)", "kinepoly", "version")
    return version


@cache
def _validator(version: int):
    import fastjsonschema  # on first load only: starting Kinepoly does not pay for it

    # use_default=False: validating never writes a schema's defaults into the document. The compiler
    # resolves the $refs of the dict it is given in place, so it gets its own copy of the schema.
    return fastjsonschema.compile(copy.deepcopy(schema(version)), use_default=False)


def check_structure(doc: dict, version: int) -> None:
    """Refuse ``doc`` unless it has the structure of format ``version`` (``kind="structure"``)."""
    from fastjsonschema import JsonSchemaValueException

    driver = doc.get("driver")
    if version < 2 and isinstance(driver, dict) and driver.get("kind") == "actuator":
        # Said before the rotary driver's missing keys, which a cylinder never has.
        raise FileFormatError('a cylinder driver ("kind": "actuator") needs format version 2 or later: write '
                              '"kinepoly": 2', "driver.kind", "structure")
    try:
        _validator(version)(doc)
    except JsonSchemaValueException as err:
        raise FileFormatError(*_in_words(err, schema(version)), "structure") from None
    except RecursionError:
        # Lists nested hundreds deep under a key whose items must be unique: compared recursively.
        raise FileFormatError("nested too deeply", "", "structure") from None


def _shown(value) -> str:
    """A value as a message quotes it: text in quotes as it is, anything else as JSON."""
    return f'"{value}"' if isinstance(value, str) else json.dumps(value, ensure_ascii=False)


def _nesting_levels(root: dict) -> int:
    """How deep the schema lets a document nest: the document itself, and the chain of ``x-`` values."""
    node, levels = root["patternProperties"]["^x-"], 1
    while "items" in (node := root["$defs"][node["$ref"].rsplit("/", 1)[1]]):
        levels, node = levels + 1, node["items"]
    return levels


def _in_words(err, root: dict) -> tuple[str, str]:
    """(message, location) of a fastjsonschema refusal, worded as the loader words it."""
    where = err.name.removeprefix("data").removeprefix(".")
    section = re.split(r"[.\[]", where, maxsplit=1)[0]
    rule, value, definition = err.rule, err.value, err.definition or {}
    below = f"{where}." if where else ""
    if rule == "propertyNames":
        key = next(k for k in value if name_problem(k))
        return (FRAME_WORDS if names_the_frame(section, below + key, key) else name_problem(key)), below + key
    if rule == "required":
        missing = next(k for k in err.rule_definition if k not in value)
        return f'missing "{missing}"', where or missing
    if rule == "additionalProperties":
        known, patterns = definition.get("properties", {}), definition.get("patternProperties", {})
        key = next(k for k in value if k not in known and not any(re.search(p, k) for p in patterns))
        newer = next((v for v, keys in ADDED_KEYS.items() if not where and key in keys), None)
        if newer is not None:
            return (f'"{key}" needs format version {newer} or later: write "kinepoly": {newer} '
                    f"(this file says {value.get('kinepoly')})"), key
        return f'unknown key "{key}"' + ("" if where else ' (own additions start with "x-")'), below + key
    if rule == "uniqueItems":
        seen = []
        for i, item in enumerate(value):
            if item in seen:
                return f"point {_shown(item)} is listed twice", f"{where}[{i}]"
            seen.append(item)
    if definition.get("pattern") == NAME_PATTERN.pattern:
        return (FRAME_WORDS if names_the_frame(section, where, value) else name_problem(value)), where
    if section.startswith("x-"):
        return f"nested deeper than the format allows ({_nesting_levels(root)} levels)", where
    return _section_words(err, section, where)


def _section_words(err, section: str, where: str) -> tuple[str, str]:
    """(message, location) of a refusal that only the place it is at can put in words."""
    rule, value, definition = err.rule, err.value, err.definition or {}
    json_type = definition.get("type")
    if not where:
        return "a mechanism file holds one JSON object", where
    if section in ("title", "notes"):
        return f"{section} must be text", where
    if section == "length_unit":
        return f"unknown length unit {_shown(value)} (use {listed(definition['enum'])})", where
    if section == "points":
        if where == "points":
            return "points must be an object of name: [x, y]", where
        point = where.rsplit("[", 1)[0] if json_type == "number" else where
        if rule in ("minimum", "maximum"):
            return f"a coordinate is beyond ±{definition['maximum']:g} length units", point
        return "a point is [x, y] with two finite numbers", point
    if section == "ground":
        return "ground must be a list of point names", where
    if section == "links":
        if where == "links":
            return "links must be an object of name: [point names]", where
        if rule == "minItems":
            return "a link needs at least two points", where
        return "a link is a list of point names", where
    if section == "slides":
        if where == "slides":
            return "slides must be an object of name: {point, guide, line}", where
        if rule == "anyOf":
            return f'unknown guide {_shown(value)} (use "ground" or a link name)', where
        if json_type == "array":
            return "line is [E, F], two point names", where
        return 'a slide is {"point": ..., "guide": ..., "line": [E, F]}', where
    if section == "driver":
        if where == "driver":
            return "driver must be an object", where
        if rule == "const":
            return f'unknown driver kind {_shown(value)} (use "rotary" or "actuator")', where
        if where.startswith("driver.stroke"):
            if json_type == "object":
                return 'stroke is {"min": length, "max": length}', where
            return f"a stroke length is a positive number of length units, at most {definition['maximum']:g}", where
        if rule == "enum":
            return f"unknown unit {_shown(value)} (use {listed(definition['enum'])})", where
        if json_type == "number":
            if rule in ("minimum", "maximum"):
                return f"value is beyond ±{definition['maximum']:g}", where
            return "value must be a finite number", where
        return '{"value": number, "unit": ...} expected', where
    if section == "output":
        return 'output is {"link": name} or {"point": name}', where
    if section in MASS_SECTIONS:
        return mass_words(err, section, where)
    if section == "analysis_angles_deg":
        return "analysis_angles_deg is a list of finite numbers", section
    # A key no message is written for yet: the validator's own words.
    return err.message.removeprefix(err.name).strip(), where
