"""What a sheet says besides the drawing: scale bars, the title block with
the caution."""

from __future__ import annotations

import math
import textwrap
from functools import lru_cache

from ..model.units import angle_text
from ..reports.caution import CAUTION
from .scaling import bar_value, plain
from .sheet import FRAME, Hatch, Line, Polyline, Recorder, Ref, Strokes, Text
from .style import ANNOTATION
from .symbols import Symbols

# Advance of one character over the capital height: measured with Qt 6.11 for
# DejaVu Sans, 0.70 for prose and 0.80 for digits; the larger keeps every
# estimated width (table columns, wrapping) from running short.
WIDTH_PER_HEIGHT = 0.8
ROW = 1.8  # row pitch over text height in tables and the title block
BAR_DIVISIONS = 4

def printed_unit(unit: str) -> str:
    """A unit as it is printed ("m/s²" for the engine's "m/s^2", "mm/s³" for "mm/s^3").

    >>> printed_unit("mm/s^2"), printed_unit("rad/s^2"), printed_unit("N")
    ('mm/s²', 'rad/s²', 'N')
    """
    return unit.replace("^2", "²").replace("^3", "³")


def text_width(text: str, height: float) -> float:
    """Estimated width in mm of ``text`` at capital height ``height``."""
    return len(text) * height * WIDTH_PER_HEIGHT


def outline_box(rec: Recorder, x0, y0, x1, y1, pen, **ids) -> None:
    """A rectangle as one closed outline."""
    rec.add(Polyline(points=((x0, y0), (x1, y0), (x1, y1), (x0, y1)), pen=pen, closed=True, **ids))


def scale_bar(rec: Recorder, at, mm_per_value: float, unit: str, longest: float, caption: str,
              size: Symbols, view: str) -> float:
    """A labelled scale bar with its left end at ``at``, the caption above it.

    Returns the value the whole bar stands for (in ``unit``).
    """
    primitives, value = _scale_bar(tuple(at), mm_per_value, unit, longest, caption, size, view)
    rec.primitives.extend(primitives)
    return value


@lru_cache(maxsize=64)
def _scale_bar(at, mm_per_value: float, unit: str, longest: float, caption: str, size: Symbols, view: str) -> tuple:
    """The primitives of a scale bar and its value: kept for the same arguments, as a window's bars
    stay put frame after frame."""
    value = bar_value(longest, mm_per_value)
    length = value * mm_per_value
    x, y = at
    thick = 0.5 * size.text
    ids = {"view": view, "ref": Ref("scale bar", view)}
    step = length / BAR_DIVISIONS
    strokes = [(x, y), (x + length, y), (x, y + thick), (x + length, y + thick)]  # its edges, then its ticks
    for i in range(BAR_DIVISIONS + 1):
        strokes += [(x + i * step, y), (x + i * step, y + thick)]
    out = [Strokes(points=tuple(strokes), pen=ANNOTATION, **ids)]
    for i in range(0, BAR_DIVISIONS, 2):
        corners = ((x + i * step, y), (x + (i + 1) * step, y), (x + (i + 1) * step, y + thick),
                   (x + i * step, y + thick))
        out.append(Hatch(points=corners, pen=ANNOTATION, **ids))
    below = y - 0.8 * size.text
    out.append(Text(position=(x, below), text="0", height=size.text, pen=ANNOTATION, align="centre", anchor="top",
                    **ids))
    out.append(Text(position=(x + length, below), text=f"{plain(value)} {printed_unit(unit)}", height=size.text,
                    pen=ANNOTATION, align="centre", anchor="top", **ids))
    out.append(Text(position=(x, y + thick + 0.8 * size.text), text=caption, height=size.text, pen=ANNOTATION,
                    align="left", anchor="baseline", **ids))
    return tuple(out), value


def scale_bar_height(size: Symbols) -> float:
    """Height a scale bar takes with its caption and labels, mm."""
    return 0.5 * size.text + 3.6 * size.text


def description(construction, scales: dict, file_name: str, date: str, dated: bool = True) -> list:
    """(label, text) lines naming the mechanism, the pose and the scales, and where it was issued
    from (file, date), unless not ``dated``: a title block gives those in its own fields."""
    solution = construction.solution
    mech = solution.mechanism
    driver = mech.driver
    rpm = driver.speed_rad_s * 60.0 / (2.0 * math.pi)
    driving = (f"{driver.link} about {driver.pivot} at {angle_text(solution.driver_angle_deg)}, "
               f"{rpm:.4g} rpm ({driver.speed_rad_s:.4g} rad/s), angular acceleration "
               f"{driver.angular_acceleration_rad_s2:.4g} rad/s²")
    scale_text = " · ".join(f"{name} {text}" for name, text in scales.items())
    lines = [("Title", mech.title or "(untitled mechanism)"), ("Driver", driving), ("Scales", scale_text)]
    lines.append(("Check", "polygons against the numeric solver: largest relative difference "
                  f"{construction.max_relative_difference:.1e} at {construction.where or '-'}"))
    if dated:
        parts = (f"file {file_name}" if file_name else "", f"date {date}", "Kinepoly")
        lines.append(("Issued", "  ·  ".join(part for part in parts if part)))
    return lines


def _fitted(text: str, width: float, height: float) -> str:
    """``text`` cut at a word, with an ellipsis, so it fits ``width`` mm."""
    return textwrap.shorten(text, width=max(10, int(width / (height * WIDTH_PER_HEIGHT))), placeholder=" …")


def caution_lines(width: float, height: float) -> list:
    """The safety caution wrapped at spaces to lines ``width`` mm long."""
    return textwrap.wrap(CAUTION, width=max(20, int(width / (height * WIDTH_PER_HEIGHT))))


def iso_fields(date: str, sheet: str, document_type: str, file_name: str) -> tuple:
    """The title block's data fields after ISO 7200: two rows of (caption, value, share of the
    row's width). What Kinepoly knows is filled in (the date of issue, the sheet as n/m, the
    document type, the design's file); what the design file does not hold (the legal owner, the
    drawing number, the revision, who created and who approved it, the document's status) is left
    blank for the user to fill in."""
    return ((("legal owner", "", 1.3), ("drawing number", "", 1.1), ("revision", "", 0.7),
             ("date of issue", date, 1.0), ("sheet", sheet, 0.6)),
            (("created by", "", 0.85), ("approved by", "", 0.85), ("document type", document_type, 1.2),
             ("document status", "", 1.1), ("file", file_name, 2.6)))


TITLE_SHARE = 0.3  # the title's cell, a share of the block's width; the data fields take the rest
FIELD_ROW = 1.5  # a data field's height, in rows: its caption over its value
CAPTION_SHARE = 0.85  # a data field's caption, a share of the small text's height
TITLE_ROWS = 2.0  # the title's band without data fields, in rows


def _band_rows(fields: tuple) -> float:
    return max(TITLE_ROWS, FIELD_ROW * len(fields))


def title_block_height(lines: list, width: float, size: Symbols, fields: tuple = ()) -> float:
    """Height of the title block for these description ``lines`` and data ``fields`` at ``width`` mm."""
    caution = caution_lines(width - 2 * size.text, size.text)
    return ROW * size.text * (_band_rows(fields) + 0.5 + (len(lines) - 1) + 0.5 + len(caution) + 0.6)


def _fields(rec: Recorder, x0: float, x1: float, top: float, fields: tuple, size: Symbols, ids: dict) -> None:
    """The data fields as ruled cells from ``x0`` to ``x1`` under ``top``, each caption small over
    its value (a blank cell keeps its caption, to be filled in)."""
    pitch = ROW * size.text
    y = top
    for n, row in enumerate(fields):
        bottom = y - FIELD_ROW * pitch
        total = sum(share for _, _, share in row)
        left = x0
        for caption, value, share in row:
            width = (x1 - x0) * share / total
            rec.add(Line(start=(left, y), end=(left, bottom), pen=ANNOTATION, **ids))
            rec.add(Text(position=(left + 0.4 * size.text, y - 0.5 * pitch), text=caption,
                         height=CAPTION_SHARE * size.small_text, pen=ANNOTATION, **ids))
            if value:
                rec.add(Text(position=(left + 0.4 * size.text, bottom + 0.2 * pitch),
                             text=_fitted(value, width - 0.8 * size.text, size.small_text), height=size.small_text,
                             pen=ANNOTATION, **ids))
            left += width
        if n < len(fields) - 1:
            rec.add(Line(start=(x0, bottom), end=(x1, bottom), pen=ANNOTATION, **ids))
        y = bottom


def title_block(rec: Recorder, box, lines: list, size: Symbols, fields: tuple = ()) -> None:
    """The title block in ``box``: the title large (on two lines where it is long) beside the data
    ``fields`` (:func:`iso_fields`) in ruled cells, then the description and the caution."""
    x0, y0, x1, y1 = box
    pitch = ROW * size.text
    pad = size.text
    ids = {"ref": Ref("title block")}
    outline_box(rec, x0, y0, x1, y1, FRAME, **ids)
    (_, title), *rest = lines
    band = _band_rows(fields) * pitch
    title_right = x0 + TITLE_SHARE * (x1 - x0) if fields else x1
    # Large on one line where it fits, else smaller on two or three (cut short only beyond them).
    width = title_right - x0 - 2 * pad
    # ISO 3098 heights: 5, 3.5 and 2.5 mm at the sheet's 2.5 mm text.
    for big, most in ((2.0 * size.text, 1), (1.4 * size.text, 2), (1.0 * size.text, 3)):
        wrapped = textwrap.wrap(title, width=max(10, int(width / (big * WIDTH_PER_HEIGHT)))) or [""]
        if len(wrapped) <= most:
            break
    if len(wrapped) > most:
        wrapped = [*wrapped[:most - 1], _fitted(" ".join(wrapped[most - 1:]), width, big)]
    first = y1 - 0.5 * band + 0.5 * (len(wrapped) - 1) * 1.15 * big - 0.5 * big
    for i, line in enumerate(wrapped):
        rec.add(Text(position=(x0 + pad, first - i * 1.15 * big), text=line, height=big, pen=ANNOTATION, **ids))
    if fields:
        _fields(rec, title_right, x1, y1, fields, size, ids)
    y = y1 - band
    rec.add(Line(start=(x0, y), end=(x1, y), pen=ANNOTATION, **ids))
    y -= 0.5 * pitch
    for label, text in rest:
        y -= pitch
        rec.add(Text(position=(x0 + pad, y), text=f"{label}:", height=size.small_text, pen=ANNOTATION, **ids))
        fitted = _fitted(text, x1 - x0 - 2 * pad - 9 * size.small_text, size.text)
        rec.add(Text(position=(x0 + pad + 9 * size.small_text, y), text=fitted, height=size.text, pen=ANNOTATION,
                     **ids))
    y -= 0.5 * pitch
    rec.add(Line(start=(x0, y), end=(x1, y), pen=ANNOTATION, **ids))
    for line in caution_lines(x1 - x0 - 2 * pad, size.text):
        y -= pitch
        rec.add(Text(position=(x0 + pad, y), text=line, height=size.text, pen=ANNOTATION, **ids))
