"""Reading and writing mechanism files (format versions 1 and 2, JSON).

``load_mechanism`` accepts every well-formed file, unfinished designs
included, and refuses everything else with a :class:`FileFormatError` whose
``location`` names the place (``links.coupler[2]``, ``file.json line 4`` ...).
The format is described in ``docs/file-format.md``; its structure is the JSON
Schema of the file's version (:mod:`kinematics.files.fileschema`), and what a schema
cannot say is checked here: names that exist and differ ignoring case, a driver
pivot on ground, the reference pose (points on their slide lines ...).

A save writes format 1 for a design without mass data or a cylinder driver (a format-1 file saves
as it was) and format 2, with ``masses``, ``point_masses``, ``loads`` and ``gravity`` or the cylinder
driver (``"kind": "actuator"``), for one with them.
"""

from __future__ import annotations

import json
import math
import os
import re
import stat
from collections import deque
from dataclasses import replace
from pathlib import Path

from ..errors import FileFormatError
from ..model.limits import beyond_limits
from ..model.mechanism import GROUND, Driver, Mechanism, Slide, slide_offset
from ..model.units import METRES_PER_LENGTH_UNIT
from .cylinderformat import cylinder_document, cylinder_from_document
from .fileschema import check_structure, format_version, written_version
from .massformat import mass_data_document, mass_data_from_document

MAX_FILE_BYTES = 10 * 1024 * 1024
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


def _json_refusal(text: str, where: str, err: json.JSONDecodeError) -> FileFormatError:
    """Words for text that is not JSON. Parsing that stopped at the very end, or in a string still open
    there (a string cannot hold a raw line break, so only the end can leave it open), met no wrong
    character: the text ends too soon, and the place given is where it ends."""
    end = len(text.rstrip())
    if not end:
        return FileFormatError("the file is empty", where, "text")
    if err.pos >= end or err.msg.startswith("Unterminated string"):
        return FileFormatError(f"the file ends early, before its JSON is complete (was it cut short?): {err.msg}",
                               f"{where} {_line_column(text, end)}", "text")
    return FileFormatError(f"not valid JSON: {err.msg}", f"{where} line {err.lineno} column {err.colno}", "text")


def parse_text(text: str, where: str) -> dict:
    """Parse JSON text strictly: no repeated keys, no NaN or Infinity, no endless whole numbers."""
    try:
        data = json.loads(text, object_pairs_hook=_pairs_without_repeats,
                          parse_constant=_refuse_constant, parse_int=_parse_integer)
    except _LongInteger as long:
        digits = long.args[0]
        place = f"{where} {_line_column(text, text.find(digits))}"
        raise FileFormatError(f"a whole number of {len(digits.lstrip('-'))} digits; numbers in this format have "
                              f"at most {MAX_INTEGER_DIGITS}", place, "text") from None
    except _Duplicate as dup:
        raise FileFormatError(f'the key "{dup.args[0]}" appears twice in one object', where, "text") from None
    except json.JSONDecodeError as err:
        raise _json_refusal(text, where, err) from None
    except ValueError as err:
        raise FileFormatError(str(err), where, "text") from None
    except RecursionError:
        raise FileFormatError("nested too deeply", where, "text") from None
    if not isinstance(data, dict):
        raise FileFormatError("a mechanism file holds one JSON object", where, "text")
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
        if not_a_regular_file(info.st_mode):
            raise FileFormatError(not_a_regular_file(info.st_mode), where, "text")
        limit_mb = f"{limit / (1024 * 1024):.3g} MB"
        if info.st_size > limit:
            raise FileFormatError(f"the file is {info.st_size / 1e6:.1f} MB; mechanism files are at most {limit_mb}",
                                  where, "text")
        chunks, total = [], 0
        while total <= limit:
            chunk = stream.read(limit + 1 - total)
            if not chunk:
                break
            chunks.append(chunk)
            total += len(chunk)
        if total > limit:
            raise FileFormatError(f"the file is larger than {limit_mb}; mechanism files are at most {limit_mb}",
                                  where, "text")
        return b"".join(chunks)


def read_document(path) -> dict:
    """Read a mechanism file into a plain dict, refusing what is not JSON text in a regular file."""
    path = Path(path)
    where = str(path)
    try:
        raw = _read_at_most(path, MAX_FILE_BYTES)
    except IsADirectoryError:
        raise FileFormatError("it is a folder, not a file", where, "text") from None
    except OSError as err:
        raise FileFormatError(f"cannot read the file: {err.strerror or err}", where, "text") from None
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError as err:
        raise FileFormatError(f"not UTF-8 text (byte {err.start})", where, "text") from None
    return parse_text(text.removeprefix("\ufeff"), where)


_JSON_SPELLING = {"nan": "NaN", "inf": "Infinity", "-inf": "-Infinity"}


def check_json_data(doc) -> None:
    """Refuse a document given as Python objects unless it holds only what JSON text can (text
    keys; objects, arrays, text, finite numbers, true, false, null), naming the first place that
    does not. A schema speaks of JSON values only, so this comes before it (``kind="text"``)."""
    queue, seen = deque([(doc, "")]), set()
    while queue:
        value, where = queue.popleft()
        if isinstance(value, (dict, list)):
            if id(value) in seen:
                continue  # shared, or a loop: looked at once; the schema's nesting limit refuses a loop
            seen.add(id(value))
            for key, item in (value.items() if isinstance(value, dict) else enumerate(value)):
                if isinstance(value, dict) and not isinstance(key, str):
                    raise FileFormatError(f"the key {key!r} is not text", where, "text")
                queue.append((item, f"{where}[{key}]" if isinstance(value, list) else
                              f"{where}.{key}" if where else key))
        elif isinstance(value, float) and not math.isfinite(value):
            raise FileFormatError(f"{_JSON_SPELLING[repr(value)]} is not a number this format accepts", where, "text")
        elif value is not None and not isinstance(value, (str, int, float)):
            raise FileFormatError(f"a Python {type(value).__name__} is not JSON data", where, "text")


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
        if _surrogate_in(value):
            raise FileFormatError(_surrogate_in(value), where, "text")
    elif isinstance(value, dict):
        for key, item in value.items():
            if isinstance(key, str) and _surrogate_in(key):
                raise FileFormatError(_surrogate_in(key), f"{where} (a key)" if where else "(a top-level key)",
                                      "text")
            _refuse_lone_surrogates(item, f"{where}.{key}" if where else key)
    elif isinstance(value, list):
        for i, item in enumerate(value):
            _refuse_lone_surrogates(item, f"{where}[{i}]")


def _refuse(message: str, location: str, kind: str = "reference"):
    raise FileFormatError(message, location, kind)


def _check_names_differ(doc):
    """Points, links and slides share one set of names that differ ignoring case (image labels are
    lower-case point names)."""
    seen = {}
    for section in ("points", "links", "slides"):
        for name in doc.get(section, {}):
            folded = name.lower()
            if folded in seen:
                _refuse(f'name "{name}" clashes with "{seen[folded]}" (names must differ ignoring case)',
                        f"{section}.{name}")
            seen[folded] = name


def _check_point_names(names, points, where):
    for i, name in enumerate(names):
        if name not in points:
            _refuse(f'unknown point "{name}"', f"{where}[{i}]")


def _check_links(links, points):
    for name, members in links.items():
        _check_point_names(members, points, f"links.{name}")
        first, second = members[:2]
        if points[first] == points[second]:
            x, y = points[first]
            _refuse(f"its first two points {first} and {second} are both at ({x:g}, {y:g}); they give the link its "
                    "length and angle, so they must differ",
                    f"links.{name}", "geometry")


def _read_slides(doc, points, ground, links):
    result = {}
    for name, spec in doc.get("slides", {}).items():
        where = f"slides.{name}"
        point, guide, (e, f) = spec["point"], spec["guide"], spec["line"]
        if point not in points:
            _refuse(f'unknown point "{point}"', f"{where}.point")
        if guide != GROUND and guide not in links:
            _refuse(f'unknown guide "{guide}" (use "ground" or a link name)', f"{where}.guide")
        guide_points = ground if guide == GROUND else links[guide]
        _check_point_names(spec["line"], points, f"{where}.line")
        for i, p in enumerate(spec["line"]):
            if p not in guide_points:
                _refuse(f"point {p} is not fixed in the guide {guide}", f"{where}.line[{i}]")
        if point in guide_points:
            _refuse(f"point {point} belongs to the guide {guide} itself", f"{where}.point")
        if points[e] == points[f]:
            _refuse(f"guide line {e}-{f} has zero length", where, "geometry")
        result[name] = Slide(name=name, point=point, guide=guide, line=(e, f))
    return result


def _read_driver(spec, ground, links, slides):
    if spec is None:
        return None
    if spec.get("kind") == "actuator":
        return cylinder_from_document(spec, slides)
    link, pivot = spec["link"], spec["pivot"]
    if link not in links:
        _refuse(f'unknown link "{link}"', "driver.link")
    if pivot not in links[link]:
        _refuse(f'"{pivot}" is not a point of link {link}', "driver.pivot")
    if pivot not in ground:
        _refuse(f"the driver pivot {pivot} must be a ground point", "driver.pivot")
    speed = spec["speed"]
    accel = spec.get("angular_acceleration", {})
    return Driver(link=link, pivot=pivot, speed_value=speed["value"], speed_unit=speed.get("unit", "rpm"),
                  angular_acceleration_value=accel.get("value", 0),
                  angular_acceleration_unit=accel.get("unit", "rad/s^2"))


def _read_output(spec, points, links):
    if spec is None:
        return None
    ((kind, name),) = spec.items()
    if name not in (links if kind == "link" else points):
        _refuse(f'unknown {kind} "{name}"', f"output.{kind}")
    return {kind: name}


def _snap_slide_points(mechanism: Mechanism) -> Mechanism:
    """Move slide points that lie a hair off their lines onto them, saying so; refuse the rest."""
    warnings = []
    mm_per_unit = METRES_PER_LENGTH_UNIT[mechanism.length_unit] * 1000.0
    for slide in mechanism.slides.values():
        off, foot = slide_offset(mechanism, slide)
        if not off:
            continue
        off_mm = abs(off) * mm_per_unit
        where = f"slides.{slide.name}"
        line = f"{slide.line[0]}-{slide.line[1]}"
        if off_mm > SNAP_LIMIT_MM:
            _refuse(f"point {slide.point} is {off_mm:.3g} mm off the line {line} in the reference pose", where,
                    "geometry")
        mechanism = replace(mechanism, points={**mechanism.points, slide.point: foot})
        warnings.append(f"{where}: point {slide.point} was {off_mm:.3g} mm off the line {line} and was moved onto it")
    return replace(mechanism, warnings=tuple(warnings))


def mechanism_from_document(doc: dict, where: str = "") -> Mechanism:
    """Check a parsed document and build the Mechanism (see module doc)."""
    if not isinstance(doc, dict):
        _refuse("a mechanism file holds one JSON object", where, "structure")
    _refuse_lone_surrogates(doc)
    check_structure(doc, format_version(doc))
    # Before any check that grows with the design, so that a huge one is refused at once.
    place, why = beyond_limits(len(doc["points"]), len(doc["links"]), len(doc.get("slides", {})))
    if why:
        _refuse(why, place, "size")
    _check_names_differ(doc)
    points = {k: tuple(v) for k, v in doc["points"].items()}
    ground = doc.get("ground", [])
    _check_point_names(ground, points, "ground")
    links = doc["links"]
    _check_links(links, points)
    slides = _read_slides(doc, points, ground, links)
    mechanism = Mechanism(
        points=points, ground=ground, links=links, slides=slides,
        driver=_read_driver(doc.get("driver"), ground, links, slides),
        output=_read_output(doc.get("output"), points, links),
        analysis_angles_deg=doc.get("analysis_angles_deg", ()), title=doc.get("title", ""),
        notes=doc.get("notes", ""), length_unit=doc.get("length_unit", "mm"),
        extensions={k: v for k, v in doc.items() if k.startswith("x-")},
        mass_data=mass_data_from_document(doc),
    )
    return _snap_slide_points(mechanism)


def load_mechanism(source) -> Mechanism:
    """Load a mechanism from a file path or an already parsed dict.

    Raises
    ------
    FileFormatError
        for anything not well-formed, with ``location`` naming the place and ``kind``
        the rule it breaks.
    """
    if isinstance(source, dict):
        check_json_data(source)
        return mechanism_from_document(source, "document")
    if not isinstance(source, (str, os.PathLike)):
        raise FileFormatError(f"give a file path or a parsed mechanism document, not {type(source).__name__}",
                              kind="text")
    doc = read_document(source)
    try:
        return mechanism_from_document(doc, str(source))
    except FileFormatError as err:
        where = f"{os.fspath(source)}: {err.location}" if err.location else os.fspath(source)
        raise FileFormatError(err.detail, where, err.kind) from None


def document_from_mechanism(mechanism: Mechanism) -> dict:
    """The JSON document of a Mechanism, in the canonical key order."""
    doc = {"kinepoly": written_version(mechanism)}
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
    if d is not None and d.is_actuator:
        doc["driver"] = cylinder_document(d)
    elif d is not None:
        doc["driver"] = {"link": d.link, "pivot": d.pivot,
                         "speed": {"value": d.speed_value, "unit": d.speed_unit},
                         "angular_acceleration": {"value": d.angular_acceleration_value,
                                                  "unit": d.angular_acceleration_unit}}
    if mechanism.output is not None:
        doc["output"] = dict(mechanism.output)
    if mechanism.analysis_angles_deg:
        doc["analysis_angles_deg"] = list(mechanism.analysis_angles_deg)
    if mechanism.mass_data is not None:
        doc.update(mass_data_document(mechanism.mass_data))
    doc.update(mechanism.extensions)
    return doc


def dumps(mechanism: Mechanism) -> str:
    """The file text of a Mechanism. Refuses data JSON cannot store (NaN under an ``x-`` key)."""
    try:
        return json.dumps(document_from_mechanism(mechanism), indent=2, ensure_ascii=False, allow_nan=False) + "\n"
    except ValueError as err:
        raise FileFormatError(f"the design holds a number a file cannot store: {err}", "extensions", "text") from None
