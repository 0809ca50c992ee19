"""Reading and writing mechanism files (format version 1, JSON).

``load_mechanism`` accepts every well-formed file, unfinished designs
included, and refuses everything else with a :class:`FileFormatError` whose
``location`` names the place (``links.coupler[2]``, ``file.json line 4`` ...).
The format is described in ``docs/file-format.md`` and by the JSON Schema
``kinematics/schema/mechanism-1.schema.json``.
"""

from __future__ import annotations

import json
import math
import os
import re
import stat
from pathlib import Path

from .errors import FileFormatError
from .model import GROUND, MAX_COORDINATE, Driver, Mechanism, Slide
from .units import METRES_PER_LENGTH_UNIT, RAD_S2_PER_ACCELERATION_UNIT, RAD_S_PER_SPEED_UNIT

FORMAT_VERSION = 1
MAX_FILE_BYTES = 10 * 1024 * 1024
MAX_NESTING = 8
NAME_PATTERN = re.compile(r"[A-Za-z][A-Za-z0-9_]*")  # the whole name: use fullmatch
SCHEMA_PATH = Path(__file__).with_name("schema") / "mechanism-1.schema.json"
TOP_LEVEL_KEYS = (
    "kinepoly", "title", "notes", "length_unit", "points", "ground", "links",
    "slides", "driver", "output", "analysis_angles_deg",
)
# A point this close to its slide line (relative to the mechanism's size) is on it.
ON_LINE_RELATIVE = 1e-9
# Farther than this from its line (in mm) a slide point is refused, nearer it is moved.
SNAP_LIMIT_MM = 0.05


class _Duplicate(Exception):
    pass


def _pairs_without_repeats(pairs):
    seen = {}
    for key, value in pairs:
        if key in seen:
            raise _Duplicate(key)
        seen[key] = value
    return seen


def _refuse_constant(name):
    raise ValueError(f"{name} is not a number this format accepts")


# More digits than any double holds (1.8e308 has 309): a longer whole number is no coordinate, and
# Python refuses to convert one of over 4,300 digits with advice meant for programmers.
MAX_INTEGER_DIGITS = 400


class _LongInteger(Exception):
    pass


def _parse_integer(digits: str):
    if len(digits.lstrip("-")) > MAX_INTEGER_DIGITS:
        raise _LongInteger(digits)
    return int(digits)


def _line_column(text: str, index: int) -> str:
    line = text.count("\n", 0, index) + 1
    return f"line {line} column {index - (text.rfind(chr(10), 0, index) + 1) + 1}"


def parse_text(text: str, where: str) -> dict:
    """Parse JSON text strictly: no repeated keys, no NaN or Infinity, no endless whole numbers."""
    try:
        data = json.loads(text, object_pairs_hook=_pairs_without_repeats,
                          parse_constant=_refuse_constant, parse_int=_parse_integer)
    except _LongInteger as long:
        digits = long.args[0]
        place = f"{where} {_line_column(text, text.find(digits))}"
        raise FileFormatError(f"a whole number of {len(digits.lstrip('-'))} digits; numbers in this format have "
                              f"at most {MAX_INTEGER_DIGITS}", place) from None
    except _Duplicate as dup:
        raise FileFormatError(f'the key "{dup.args[0]}" appears twice in one object', where) from None
    except json.JSONDecodeError as err:
        raise FileFormatError(f"not valid JSON: {err.msg}", f"{where} line {err.lineno} column {err.colno}") from None
    except ValueError as err:
        raise FileFormatError(str(err), where) from None
    except RecursionError:
        raise FileFormatError("nested too deeply", where) from None
    if not isinstance(data, dict):
        raise FileFormatError("a mechanism file holds one JSON object", where)
    return data


# What a path that is no regular file is, in plain words (stat.S_IFMT of its mode).
_NOT_A_FILE = {stat.S_IFIFO: "a named pipe", stat.S_IFCHR: "a character device", stat.S_IFBLK: "a block device",
               stat.S_IFSOCK: "a socket"}


def not_a_regular_file(mode: int) -> str:
    """"" for a regular file's ``st_mode``, else why it is none, in words ("it is a named pipe ...")."""
    if stat.S_ISREG(mode):
        return ""
    if stat.S_ISDIR(mode):
        return "it is a folder, not a file"
    return f"it is {_NOT_A_FILE.get(stat.S_IFMT(mode), 'a special file')}, not a regular file"


def _read_at_most(path: Path, limit: int) -> bytes:
    """The bytes of the regular file ``path``, refused once more than ``limit`` come in.

    Opened without blocking, so a named pipe is refused rather than waited on; the size the
    file claims is only a first check (a device or a /proc file claims 0 and never ends)."""
    where = str(path)
    handle = os.open(path, os.O_RDONLY | getattr(os, "O_NONBLOCK", 0) | getattr(os, "O_BINARY", 0))
    with open(handle, "rb", buffering=0, closefd=True) as stream:
        info = os.fstat(handle)
        _expect(not not_a_regular_file(info.st_mode), not_a_regular_file(info.st_mode), where)
        limit_mb = f"{limit / (1024 * 1024):.3g} MB"
        if info.st_size > limit:
            raise FileFormatError(f"the file is {info.st_size / 1e6:.1f} MB; mechanism files are at most {limit_mb}",
                                  where)
        chunks, total = [], 0
        while total <= limit:
            chunk = stream.read(limit + 1 - total)
            if not chunk:
                break
            chunks.append(chunk)
            total += len(chunk)
        if total > limit:
            raise FileFormatError(f"the file is larger than {limit_mb}; mechanism files are at most {limit_mb}",
                                  where)
        return b"".join(chunks)


def read_document(path) -> dict:
    """Read a mechanism file into a plain dict, refusing what is not JSON text in a regular file."""
    path = Path(path)
    where = str(path)
    try:
        raw = _read_at_most(path, MAX_FILE_BYTES)
    except IsADirectoryError:
        raise FileFormatError("it is a folder, not a file", where) from None
    except OSError as err:
        raise FileFormatError(f"cannot read the file: {err.strerror or err}", where) from None
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError as err:
        raise FileFormatError(f"not UTF-8 text (byte {err.start})", where) from None
    return parse_text(text.removeprefix("\ufeff"), where)


def _depth(value, level=0):
    if level > MAX_NESTING:
        return level
    if isinstance(value, dict):
        return max([_depth(v, level + 1) for v in value.values()], default=level + 1)
    if isinstance(value, list):
        return max([_depth(v, level + 1) for v in value], default=level + 1)
    return level


# A lone UTF-16 surrogate (JSON's "\\ud800" escape) decodes to a code point UTF-8 cannot encode:
# such a design would open but never save again.
_SURROGATE = re.compile("[\ud800-\udfff]")


def _surrogate_in(text: str) -> str:
    """"" or where in ``text`` its first lone surrogate is, in words (never the character itself)."""
    found = _SURROGATE.search(text)
    if found is None:
        return ""
    return (f"the text holds a lone UTF-16 surrogate (\\u{ord(found.group()):04x}) at character "
            f"{found.start() + 1}, which no UTF-8 file can hold")


def _refuse_lone_surrogates(value, where: str = ""):
    """Refuse text no file could store again, naming its JSON path (before any message could echo it)."""
    if isinstance(value, str):
        _expect(not _surrogate_in(value), _surrogate_in(value), where)
    elif isinstance(value, dict):
        for key, item in value.items():
            inner = f"{where}.{key}" if where else key
            if isinstance(key, str) and _surrogate_in(key):
                raise FileFormatError(_surrogate_in(key), f"{where} (a key)" if where else "(a top-level key)")
            _refuse_lone_surrogates(item, inner)
    elif isinstance(value, list):
        for i, item in enumerate(value):
            _refuse_lone_surrogates(item, f"{where}[{i}]")


# Rates beyond this magnitude are no machine (MAX_COORDINATE, the same for coordinates, lives with move_point).
MAX_RATE = 1e9


def _is_number(value, limit: float = math.inf) -> bool:
    if not isinstance(value, (int, float)) or isinstance(value, bool):
        return False
    try:
        return math.isfinite(float(value)) and abs(float(value)) <= limit
    except OverflowError:
        return False


def _expect(condition, message, location):
    if not condition:
        raise FileFormatError(message, location)


def _check_name(name, location, seen_folded: dict):
    _expect(isinstance(name, str) and NAME_PATTERN.fullmatch(name),
            f'"{name}" is not a valid name (a letter, then letters, digits or _)', location)
    _expect(name.lower() != GROUND, '"ground" is reserved', location)
    folded = name.lower()
    if folded in seen_folded:
        raise FileFormatError(f'name "{name}" clashes with "{seen_folded[folded]}" '
                              "(names must differ ignoring case)", location)
    seen_folded[folded] = name


def _read_points(doc, names):
    points = doc["points"]
    _expect(isinstance(points, dict), "points must be an object of name: [x, y]", "points")
    for name, xy in points.items():
        _check_name(name, f"points.{name}", names)
        _expect(isinstance(xy, list) and len(xy) == 2 and all(_is_number(c) for c in xy),
                "a point is [x, y] with two finite numbers", f"points.{name}")
        _expect(all(_is_number(c, MAX_COORDINATE) for c in xy),
                f"a coordinate is beyond ±{MAX_COORDINATE:g} length units", f"points.{name}")
    return points


def _read_ground(doc, points):
    ground = doc.get("ground", [])
    _expect(isinstance(ground, list), "ground must be a list of point names", "ground")
    for i, name in enumerate(ground):
        _expect(isinstance(name, str) and name in points, f'unknown point "{name}"', f"ground[{i}]")
        _expect(ground.index(name) == i, f'point "{name}" is listed twice', f"ground[{i}]")
    return ground


def _read_links(doc, points, names):
    links = doc["links"]
    _expect(isinstance(links, dict), "links must be an object of name: [point names]", "links")
    for name, pts in links.items():
        where = f"links.{name}"
        _check_name(name, where, names)
        _expect(isinstance(pts, list), "a link is a list of point names", where)
        for i, p in enumerate(pts):
            _expect(isinstance(p, str) and p in points, f'unknown point "{p}"', f"{where}[{i}]")
            _expect(pts.index(p) == i, f'point "{p}" is listed twice', f"{where}[{i}]")
        _expect(len(pts) >= 2, "a link needs at least two points", where)
        x, y = points[pts[0]]
        _expect((x, y) != tuple(points[pts[1]]),
                f"its first two points {pts[0]} and {pts[1]} are both at ({x:g}, {y:g}); they give the link its "
                "length and angle, so they must differ", where)
    return links


def _read_slides(doc, points, ground, links, names):
    slides = doc.get("slides", {})
    _expect(isinstance(slides, dict), "slides must be an object of name: {point, guide, line}", "slides")
    result = {}
    for name, spec in slides.items():
        where = f"slides.{name}"
        _check_name(name, where, names)
        _expect(isinstance(spec, dict), "a slide is {\"point\": ..., \"guide\": ..., \"line\": [E, F]}", where)
        for key in spec:
            _expect(key in ("point", "guide", "line"), f'unknown key "{key}"', f"{where}.{key}")
        for key in ("point", "guide", "line"):
            _expect(key in spec, f'missing "{key}"', where)
        point, guide, line = spec["point"], spec["guide"], spec["line"]
        _expect(isinstance(point, str) and point in points, f'unknown point "{point}"', f"{where}.point")
        _expect(isinstance(guide, str) and (guide == GROUND or guide in links),
                f'unknown guide "{guide}" (use "ground" or a link name)', f"{where}.guide")
        _expect(isinstance(line, list) and len(line) == 2, "line is [E, F], two point names", f"{where}.line")
        guide_points = ground if guide == GROUND else links[guide]
        for i, p in enumerate(line):
            _expect(isinstance(p, str) and p in points, f'unknown point "{p}"', f"{where}.line[{i}]")
            _expect(p in guide_points, f'point {p} is not fixed in the guide {guide}', f"{where}.line[{i}]")
        _expect(point not in guide_points, f"point {point} belongs to the guide {guide} itself", f"{where}.point")
        e, f = line
        _expect(tuple(points[e]) != tuple(points[f]), f"guide line {e}-{f} has zero length", where)
        result[name] = Slide(name=name, point=point, guide=guide, line=(e, f))
    return result


def _quantity(spec, units, where, default_unit):
    _expect(isinstance(spec, dict) and "value" in spec, '{"value": number, "unit": ...} expected', where)
    for key in spec:
        _expect(key in ("value", "unit"), f'unknown key "{key}"', f"{where}.{key}")
    _expect(_is_number(spec["value"]), "value must be a finite number", f"{where}.value")
    _expect(_is_number(spec["value"], MAX_RATE), f"value is beyond ±{MAX_RATE:g}", f"{where}.value")
    unit = spec.get("unit", default_unit)
    _expect(isinstance(unit, str) and unit in units, f'unknown unit "{unit}" (use {" or ".join(units)})',
            f"{where}.unit")
    return spec["value"], unit


def _read_driver(doc, ground, links):
    spec = doc.get("driver")
    if spec is None:
        return None
    _expect(isinstance(spec, dict), "driver must be an object", "driver")
    kind = spec.get("kind", "rotary")
    _expect(kind == "rotary", f'driver kind "{kind}" is not supported by this version (rotary only)', "driver.kind")
    for key in spec:
        _expect(key in ("kind", "link", "pivot", "speed", "angular_acceleration"), f'unknown key "{key}"',
                f"driver.{key}")
    for key in ("link", "pivot", "speed"):
        _expect(key in spec, f'missing "{key}"', "driver")
    link, pivot = spec["link"], spec["pivot"]
    _expect(isinstance(link, str) and link in links, f'unknown link "{link}"', "driver.link")
    _expect(isinstance(pivot, str) and pivot in links[link], f'"{pivot}" is not a point of link {link}', "driver.pivot")
    _expect(pivot in ground, f"the driver pivot {pivot} must be a ground point", "driver.pivot")
    speed, speed_unit = _quantity(spec["speed"], tuple(RAD_S_PER_SPEED_UNIT), "driver.speed", "rpm")
    accel, accel_unit = _quantity(spec.get("angular_acceleration", {"value": 0, "unit": "rad/s^2"}),
                                  tuple(RAD_S2_PER_ACCELERATION_UNIT),
                                  "driver.angular_acceleration", "rad/s^2")
    return Driver(link=link, pivot=pivot, speed_value=speed, speed_unit=speed_unit,
                  angular_acceleration_value=accel, angular_acceleration_unit=accel_unit)


def _read_output(doc, points, links):
    spec = doc.get("output")
    if spec is None:
        return None
    _expect(isinstance(spec, dict) and len(spec) == 1 and next(iter(spec)) in ("link", "point"),
            'output is {"link": name} or {"point": name}', "output")
    kind, name = next(iter(spec.items()))
    known = links if kind == "link" else points
    _expect(isinstance(name, str) and name in known, f'unknown {kind} "{name}"', f"output.{kind}")
    return {kind: name}


def _snap_slide_points(points, slides, length_unit, size):
    """Move slide points that lie a hair off their lines onto them; refuse the rest."""
    warnings = []
    mm_per_unit = METRES_PER_LENGTH_UNIT[length_unit] * 1000.0
    for slide in slides.values():
        (ex, ey), (fx, fy) = points[slide.line[0]], points[slide.line[1]]
        dx, dy = fx - ex, fy - ey
        length = math.hypot(dx, dy)
        px, py = points[slide.point]
        off = ((px - ex) * dy - (py - ey) * dx) / length
        if abs(off) <= ON_LINE_RELATIVE * max(size, length):
            continue
        off_mm = abs(off) * mm_per_unit
        where = f"slides.{slide.name}"
        if off_mm > SNAP_LIMIT_MM:
            raise FileFormatError(
                f"point {slide.point} is {off_mm:.3g} mm off the line {slide.line[0]}-{slide.line[1]} "
                "in the reference pose",
                where)
        points[slide.point] = [px - off * dy / length, py + off * dx / length]
        warnings.append(f"{where}: point {slide.point} was {off_mm:.3g} mm off the line "
                        f"{slide.line[0]}-{slide.line[1]} and was moved onto it")
    return warnings


def mechanism_from_document(doc: dict, where: str = "") -> Mechanism:
    """Check a parsed document and build the Mechanism (see module doc)."""
    _expect(isinstance(doc, dict), "a mechanism file holds one JSON object", where)
    for key, value in doc.items():
        _expect(_depth(value, 1) <= MAX_NESTING, f"nested deeper than the format allows ({MAX_NESTING} levels)",
                str(key))
    _refuse_lone_surrogates(doc)
    _expect("kinepoly" in doc, 'missing "kinepoly": this is not a Kinepoly mechanism file', "kinepoly")
    version = doc["kinepoly"]
    _expect(isinstance(version, int) and not isinstance(version, bool) and version >= 1,
            "kinepoly must be the format version, a whole number", "kinepoly")
    _expect(version <= FORMAT_VERSION,
            f"this file is format version {version}; this Kinepoly reads version {FORMAT_VERSION} "
            "(a newer Kinepoly wrote it)", "kinepoly")
    extensions = {}
    for key in doc:
        if key.startswith("x-"):
            extensions[key] = doc[key]
        else:
            _expect(key in TOP_LEVEL_KEYS, f'unknown key "{key}" (own additions start with "x-")', key)
    for key in ("points", "links"):
        _expect(key in doc, f'missing "{key}"', key)
    for key in ("title", "notes"):
        _expect(isinstance(doc.get(key, ""), str), f"{key} must be text", key)
    length_unit = doc.get("length_unit", "mm")
    _expect(isinstance(length_unit, str) and length_unit in METRES_PER_LENGTH_UNIT,
            f'unknown length unit "{length_unit}" (use mm, m or in)',
            "length_unit")
    names: dict = {}
    points = {k: list(v) for k, v in _read_points(doc, names).items()}
    ground = _read_ground(doc, points)
    links = _read_links(doc, points, names)
    slides = _read_slides(doc, points, ground, links, names)
    driver = _read_driver(doc, ground, links)
    output = _read_output(doc, points, links)
    angles = doc.get("analysis_angles_deg", [])
    _expect(isinstance(angles, list) and all(_is_number(a) for a in angles),
            "analysis_angles_deg is a list of finite numbers", "analysis_angles_deg")
    size = Mechanism(points=points, links={}).size
    warnings = _snap_slide_points(points, slides, length_unit, size)
    return Mechanism(
        points={k: tuple(v) for k, v in points.items()}, ground=tuple(ground),
        links={k: tuple(v) for k, v in links.items()}, slides=slides, driver=driver, output=output,
        analysis_angles_deg=tuple(angles), title=doc.get("title", ""), notes=doc.get("notes", ""),
        length_unit=length_unit, extensions=extensions, warnings=tuple(warnings),
    )


def load_mechanism(source) -> Mechanism:
    """Load a mechanism from a file path or an already parsed dict.

    Raises
    ------
    FileFormatError
        for anything not well-formed, with ``location`` naming the place.
    """
    if isinstance(source, dict):
        return mechanism_from_document(source, "document")
    if not isinstance(source, (str, os.PathLike)):
        raise FileFormatError(f"give a file path or a parsed mechanism document, not {type(source).__name__}")
    doc = read_document(source)
    try:
        return mechanism_from_document(doc, str(source))
    except FileFormatError as err:
        where = f"{os.fspath(source)}: {err.location}" if err.location else os.fspath(source)
        raise FileFormatError(err.detail, where) from None


def document_from_mechanism(mechanism: Mechanism) -> dict:
    """The JSON document of a Mechanism, in the canonical key order."""
    doc = {"kinepoly": FORMAT_VERSION}
    if mechanism.title:
        doc["title"] = mechanism.title
    if mechanism.notes:
        doc["notes"] = mechanism.notes
    doc["length_unit"] = mechanism.length_unit
    doc["points"] = {k: list(v) for k, v in mechanism.points.items()}
    if mechanism.ground:
        doc["ground"] = list(mechanism.ground)
    doc["links"] = {k: list(v) for k, v in mechanism.links.items()}
    if mechanism.slides:
        doc["slides"] = {s.name: {"point": s.point, "guide": s.guide, "line": list(s.line)}
                         for s in mechanism.slides.values()}
    d = mechanism.driver
    if d is not None:
        doc["driver"] = {"link": d.link, "pivot": d.pivot,
                         "speed": {"value": d.speed_value, "unit": d.speed_unit},
                         "angular_acceleration": {"value": d.angular_acceleration_value,
                                                  "unit": d.angular_acceleration_unit}}
    if mechanism.output is not None:
        doc["output"] = dict(mechanism.output)
    if mechanism.analysis_angles_deg:
        doc["analysis_angles_deg"] = list(mechanism.analysis_angles_deg)
    doc.update(mechanism.extensions)
    return doc


def dumps(mechanism: Mechanism) -> str:
    """The file text of a Mechanism. Refuses data JSON cannot store (NaN under an ``x-`` key)."""
    try:
        return json.dumps(document_from_mechanism(mechanism), indent=2, ensure_ascii=False, allow_nan=False) + "\n"
    except ValueError as err:
        raise FileFormatError(f"the design holds a number a file cannot store: {err}", "extensions") from None
