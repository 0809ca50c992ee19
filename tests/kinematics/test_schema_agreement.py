"""The schema is the one structural truth of a file: the loader and the shipped JSON Schema agree.

The reference is the schema read by the `jsonschema` library (Draft202012Validator), not the
validator the loader uses: whatever it refuses the loader refuses, and whatever the loader refuses of
a document it accepts is a check no schema can make (FileFormatError.kind "reference" or
"geometry"), never a structural one. The one exception is named: JSON Schema counts 1.0 as the
integer 1, so ``"kinepoly": 1.0`` is refused by the version table (kind "version"). Each document is
held to the schema of the version it states (format 1 or format 2, with mass data and loads).

Profile "ci": 2,000 mutated documents of either format, derandomised; KINEPOLY_FULL=1: ten times as many."""

import copy
import json
import random
from dataclasses import replace

import jsonschema
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import kinematics
from kinematics.files.fileschema import FORMAT_VERSION, SCHEMA_FILES, schema
from kinematics.model import units
from kinematics.model.mass import Load
from tests import CASE_FACTOR
from tests.designs import (
    BOTTLE_PUSHER,
    CARTON_PUSHER,
    CLAW_FEED,
    GATE_LIFTER,
    SAMPLE_FILES,
    SWING_LEVER,
    TRIAD_PRESS,
    TRIPLE_ROCKER,
    UNFINISHED,
    block_on_rotating_guide,
    four_bar,
    slider_crank,
    slotted_lever,
)
from tests.masses import steel


def _inlined(node, root):
    """The schema with each local $ref replaced by what it names: the same rules, read twice as fast by
    jsonschema, whose reference lookups dominate a check."""
    if isinstance(node, dict):
        if "$ref" in node:
            return _inlined(root["$defs"][node["$ref"].removeprefix("#/$defs/")], root)
        return {k: _inlined(v, root) for k, v in node.items() if k != "$defs"}
    if isinstance(node, list):
        return [_inlined(v, root) for v in node]
    return node


REFERENCES = {version: jsonschema.Draft202012Validator(_inlined(schema(version), schema(version)))
              for version in SCHEMA_FILES}
NOT_STRUCTURAL = ("reference", "geometry")


def reference(doc):
    """The reference validator of the version ``doc`` states (format 1's for anything else, which it refuses)."""
    version = doc.get("kinepoly")
    return REFERENCES.get(version, REFERENCES[1]) if isinstance(version, (int, float)) else REFERENCES[1]


def with_mass_data(doc, point_masses=(), loads=(), gravity=None):
    """The format-2 document of ``doc`` with every link of steel bars, point masses, loads and gravity."""
    mechanism = steel(kinematics.load_mechanism(copy.deepcopy(doc)), dict(point_masses), loads, gravity)
    data = mechanism.mass_data
    # One inertia in a CAD program's unit, as files from one will state it.
    first = next(iter(data.masses.values()))
    masses = {**data.masses, first.link: replace(first, inertia_value=first.inertia_kg_m2 * 1e9,
                                                 inertia_unit="g*mm^2")}
    return json.loads(kinematics.dumps(replace(mechanism, mass_data=replace(data, masses=masses))))


FORMAT_2 = [
    with_mass_data(slider_crank(50, 180, 20, 30), {"D": 1.5},
                   [Load("cutting", point="D", force_value=(-1200, 0), over_deg=(200, 320)),
                    Load("brake", link="rod", torque_value=-2.5)], gravity=(0, -9.80665)),
    with_mass_data(CLAW_FEED, {"P": 0.2}, [Load("pad", point="P", link="coupler", force_value=(0, -40))]),
    with_mass_data(four_bar(40, 120, 100, 140, 30, coupler_point=(50, 30)), (),
                   [Load("spring", link="rocker", torque_value=1.5, over_deg=(-30, 90))], gravity=(0, -9.81)),
    with_mass_data(slotted_lever(40, 90, 30, offset=10)),
]
DOCUMENTS = [json.loads(p.read_text()) for p in SAMPLE_FILES] + [
    CLAW_FEED, UNFINISHED, GATE_LIFTER, CARTON_PUSHER, BOTTLE_PUSHER, SWING_LEVER, TRIPLE_ROCKER, TRIAD_PRESS,
    four_bar(40, 120, 100, 140, 30, coupler_point=(50, 30)), slider_crank(50, 180, 20, 30),
    slotted_lever(40, 90, 30, offset=10), block_on_rotating_guide(40),
] + FORMAT_2
TEXTS = [json.dumps(doc) for doc in DOCUMENTS]
CASES = 2000 * CASE_FACTOR  # about 5 s here, half of it the reference schema's checks


def verdict(doc):
    """(the reference schema accepts doc, the loader's refusal or None)."""
    accepted = reference(doc).is_valid(doc)
    try:
        kinematics.load_mechanism(doc)
    except kinematics.FileFormatError as err:
        return accepted, err
    return accepted, None


def assert_agree(doc):
    accepted, refusal = verdict(doc)
    if refusal is None:
        assert accepted, "the loader took a document the schema refuses"
    elif accepted:
        assert refusal.kind in NOT_STRUCTURAL or (refusal.kind == "version" and isinstance(doc["kinepoly"], float)), \
            f"a structural refusal of a schema-valid document: [{refusal.kind}] {refusal}"
    else:
        assert refusal.kind in ("structure", "version"), f"[{refusal.kind}] {refusal}"
    if refusal is not None:
        assert refusal.detail and isinstance(refusal.location, str)


# Each kind of document on which the hand-written loader and the schema used to disagree, and what
# both say now: None (loads), or the loader's refusal.
DISAGREEMENTS = [
    ("driver null: an unfinished design", lambda d: d.update(driver=None), None),
    ("output null: nothing chosen yet", lambda d: d.update(output=None), None),
    ("version written with a fraction", lambda d: d.update(kinepoly=1.0),
     ("version", "kinepoly: write the format version as the whole number 1, not 1.0")),
    ("a coordinate beyond 1e9", lambda d: d["points"]["B"].__setitem__(0, 2e9),
     ("structure", "points.B: a coordinate is beyond ±1e+09 length units")),
    ("a whole-number coordinate beyond any float", lambda d: d["points"]["B"].__setitem__(0, -10 ** 400),
     ("structure", "points.B: a coordinate is beyond ±1e+09 length units")),
    ("a speed beyond 1e9", lambda d: d["driver"]["speed"].update(value=1e10),
     ("structure", "driver.speed.value: value is beyond ±1e+09")),
    ("nesting nine levels deep under an x- key", lambda d: d.update({"x-a": {"b": [[[[[[[]]]]]]]}}),
     ("structure", "x-a.b[0][0][0][0][0][0]: nested deeper than the format allows (8 levels)")),
    ("names differing only in case", lambda d: d["links"].update(a=["O2", "B"]),
     ("reference", 'links.a: name "a" clashes with "A" (names must differ ignoring case)')),
    ("a name ending in a newline (Python's $ matches before it)", lambda d: d["points"].update({"C\n": [1, 2]}),
     ("structure", 'points.C\n: "C\n" is not a valid name (a letter, then letters, digits or _)')),
    ("a speed unit the schema lists (it stood beside a $ref, which draft-7 validators ignore)",
     lambda d: d["driver"]["speed"].update(unit="Hz"),
     ("structure", 'driver.speed.unit: unknown unit "Hz" (use rad/s or rpm)')),
    ("a guide that is neither ground nor a name", lambda d: d.update(
        slides={"s": {"point": "B", "guide": "Ground", "line": ["O2", "O4"]}}),
     ("structure", 'slides.s.guide: unknown guide "Ground" (use "ground" or a link name)')),
    ("the version true (equal to 1 in Python)", lambda d: d.update(kinepoly=True),
     ("version", "kinepoly: kinepoly must be the format version, a whole number")),
    ("a link whose first two points coincide", lambda d: d["points"].update(B=list(d["points"]["A"])),
     ("geometry", "links.coupler: its first two points A and B are both at (34.641, 20); they give the link its "
                  "length and angle, so they must differ")),
    ("a driver pivot off ground", lambda d: d["driver"].update(pivot="A"),
     ("reference", "driver.pivot: the driver pivot A must be a ground point")),
]


@pytest.mark.parametrize("edit, expected", [case[1:] for case in DISAGREEMENTS], ids=[c[0] for c in DISAGREEMENTS])
def test_former_disagreements_are_settled(edit, expected):
    doc = four_bar(40, 120, 100, 140, 30)
    edit(doc)
    accepted, refusal = verdict(doc)
    assert (None if refusal is None else (refusal.kind, str(refusal))) == expected
    assert accepted == (expected is None or expected[0] in NOT_STRUCTURAL or isinstance(doc["kinepoly"], float)), \
        "the reference schema's verdict"
    assert_agree(doc)


def test_what_a_save_writes_is_what_the_schema_takes():
    """A design without mass data is written as format 1, one with it as format 2, each as it was read."""
    for doc in DOCUMENTS:
        written = json.loads(kinematics.dumps(kinematics.load_mechanism(copy.deepcopy(doc))))
        REFERENCES[written["kinepoly"]].validate(written)
        assert written["kinepoly"] == doc["kinepoly"] == (2 if any(k in doc for k in MASS_KEYS) else 1)
        again = kinematics.dumps(kinematics.load_mechanism(copy.deepcopy(written)))
        assert again == json.dumps(written, indent=2, ensure_ascii=False) + "\n", "a second save changes nothing"


MASS_KEYS = ("masses", "point_masses", "loads", "gravity")


@pytest.mark.parametrize("version", sorted(SCHEMA_FILES))
def test_schema_table_and_unit_tables_agree(version):
    assert sorted(SCHEMA_FILES) == list(range(1, FORMAT_VERSION + 1)), "versions numbered from 1 without gaps"
    top, defs = schema(version)["properties"], schema(version).get("$defs", {})
    # Format 2 chooses the driver's form by its kind: the rotary driver is one of its definitions.
    driver = (top["driver"] if "properties" in top["driver"] else defs["rotary_driver"])["properties"]
    assert top["length_unit"]["enum"] == list(units.METRES_PER_LENGTH_UNIT)
    assert driver["speed"]["allOf"][1]["properties"]["unit"]["enum"] == list(units.RAD_S_PER_SPEED_UNIT)
    assert (driver["angular_acceleration"]["allOf"][1]["properties"]["unit"]["enum"]
            == list(units.RAD_S2_PER_ACCELERATION_UNIT))
    if "actuator_driver" in defs:
        cylinder = defs["actuator_driver"]["properties"]
        assert cylinder["speed"]["allOf"][1]["properties"]["unit"]["enum"] == list(units.M_S_PER_LINEAR_SPEED_UNIT)
        assert (cylinder["acceleration"]["allOf"][1]["properties"]["unit"]["enum"]
                == list(units.M_S2_PER_LINEAR_ACCELERATION_UNIT))


def test_format_2_units_are_the_unit_tables():
    top, defs = schema(2)["properties"], schema(2)["$defs"]
    assert defs["mass"]["properties"]["unit"]["enum"] == list(units.KG_PER_MASS_UNIT)
    inertia = top["masses"]["additionalProperties"]["properties"]["inertia"]["properties"]["unit"]
    assert inertia["enum"] == list(units.KG_M2_PER_INERTIA_UNIT)
    load = top["loads"]["additionalProperties"]["allOf"][0]["properties"]
    assert load["force"]["properties"]["unit"]["enum"] == list(units.N_PER_FORCE_UNIT)
    assert load["torque"]["properties"]["unit"]["enum"] == list(units.N_M_PER_TORQUE_UNIT)
    assert top["gravity"]["properties"]["unit"]["enum"] == list(units.M_S2_PER_GRAVITY_UNIT)


def test_format_2_is_format_1_with_the_mass_keys():
    """Everything but the version number, the mass data and the cylinder driver is format 1's, rule for
    rule; format 2's rotary driver is format 1's driver with its kind given as "rotary"."""
    one, two = copy.deepcopy(schema(1)), copy.deepcopy(schema(2))
    assert two["properties"].pop("kinepoly") == {"type": "integer", "const": 2}
    for key in MASS_KEYS:
        two["properties"].pop(key)
    for key in ("bounded", "magnitude", "vector", "position", "mass", "actuator_driver", "stroke_length"):
        two["$defs"].pop(key)
    rotary = two["$defs"].pop("rotary_driver")
    first = one["properties"].pop("driver")
    two["properties"].pop("driver")
    assert rotary["required"] == first["required"] and rotary["properties"].keys() == first["properties"].keys()
    assert all(rotary["properties"][k] == v for k, v in first["properties"].items() if k != "kind")
    assert {k: v for k, v in two["properties"].items()} == {k: v for k, v in one["properties"].items()
                                                            if k != "kinepoly"}
    assert two["$defs"] == one["$defs"]
    assert {k: v for k, v in two.items() if k not in ("properties", "$defs", "$id", "title", "$comment")} \
        == {k: v for k, v in one.items() if k not in ("properties", "$defs", "$id", "title", "$comment")}


# What a mutation puts in a document: values of every JSON type, the numbers at and past the limits,
# names that are reserved, twins in case, or end in a newline.
LIMITS = [1e9, -1e9, 1e9 + 1, -1e10, 10 ** 400, 1e308, 2 ** 53, -0.0, 0, 1, 2, 1.0, 0.5, True, False, None]
WORDS = ["", "ground", "Ground", "A", "a", "O2", "crank", "rpm", "rad/s", "rotary", "B\n", "x-y", "é", "1",
         "kg", "g", "g*mm^2", "kg*m^2", "N", "N*m", "m/s^2", "lb"]
KEYS = WORDS + ["x-note", "kind", "unit", "value", "point", "link", "GROUND", "_", "a.b", "c[0]",
                "mass", "centre", "inertia", "force", "torque", "over_deg", *MASS_KEYS]
ACTIONS = ["delete", "retype", "null", "limit", "float", "twin", "deep", "rename", "repeat", "refer", "coincide"]


def _json_value(rnd, depth=0):
    """A JSON value of any type, at most three levels deep."""
    kind = rnd.randrange(4 if depth < 2 else 2)
    if kind == 0:
        return rnd.choice(LIMITS)
    if kind == 1:
        return rnd.choice(WORDS) if rnd.random() < 0.7 else rnd.uniform(-1e3, 1e3)
    if kind == 2:
        return [_json_value(rnd, depth + 1) for _ in range(rnd.randrange(4))]
    return {rnd.choice(KEYS): _json_value(rnd, depth + 1) for _ in range(rnd.randrange(4))}


def _nested(depth, leaf):
    for level in range(depth):
        leaf = [leaf] if level % 2 else {"k": leaf}
    return leaf


def _places(value, parent=None, key=None):
    """(parent, key) of every value in the document below its top."""
    if parent is not None:
        yield parent, key
    items = value.items() if isinstance(value, dict) else enumerate(value) if isinstance(value, list) else ()
    for k, item in items:
        yield from _places(item, value, k)


def _mutate(rnd, doc):
    parent, key = rnd.choice(list(_places(doc)))
    value = parent[key]
    sections = [s for s in ("points", "links", "slides") if isinstance(doc.get(s), dict)]
    names = [n for section in sections for n in doc[section]]
    action = rnd.choice(ACTIONS)
    if action == "delete":
        del parent[key]
    elif action == "retype":
        parent[key] = _json_value(rnd)
    elif action == "null":
        parent[key] = None
    elif action == "limit":
        parent[key] = rnd.choice(LIMITS)
    elif action == "float" and isinstance(value, int) and not isinstance(value, bool):
        parent[key] = float(value)
    elif action == "twin" and names:
        name, section = rnd.choice(names), rnd.choice(sections)
        source = next(doc[s][name] for s in sections if name in doc[s])
        doc[section][rnd.choice([name.lower(), name.upper(), name.swapcase()])] = copy.deepcopy(source)
    elif action == "deep":
        doc[rnd.choice(["x-deep", "x-a.b"])] = _nested(rnd.randrange(11), rnd.choice(LIMITS + WORDS))
    elif action == "rename" and isinstance(parent, dict):
        parent[rnd.choice(KEYS + names)] = parent.pop(key)
    elif action == "repeat" and isinstance(parent, list):
        parent.append(copy.deepcopy(value))
    elif action == "refer" and isinstance(value, str) and names:
        parent[key] = rnd.choice([*names, "nowhere", "ground"])
    elif action == "coincide" and isinstance(parent, list) and sections and sections[0] == "points" and names:
        parent[key] = copy.deepcopy(rnd.choice(list(doc["points"].values())))


@st.composite
def mutated_documents(draw):
    # The choices come from a random source seeded by one drawn number: drawing each of them from
    # hypothesis would cost more than checking the document does (a failure still shows the document).
    rnd = random.Random(draw(st.integers(0, 2 ** 32 - 1)))
    doc = json.loads(rnd.choice(TEXTS))  # a fresh copy, faster than deepcopy
    for _ in range(rnd.randint(1, 3)):
        if not doc:
            break
        _mutate(rnd, doc)
    return doc


@settings(max_examples=CASES)
@given(doc=mutated_documents())
def test_the_loader_and_the_schema_agree_on_mutated_documents(doc):
    assert_agree(doc)
