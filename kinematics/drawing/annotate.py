"""What a sheet says besides the drawing: scale bars, the title block with
the caution."""

from __future__ import annotations

import math
import textwrap
from functools import lru_cache

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

UNITS_AS_PRINTED = {"m/s^2": "m/s²", "rad/s^2": "rad/s²"}


def printed_unit(unit: str) -> str:
    """A unit as it is printed ("m/s²" for the engine's "m/s^2")."""
    return UNITS_AS_PRINTED.get(unit, unit)


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


def description(construction, scales: dict, file_name: str, date: str) -> list:
    """(label, text) lines naming the mechanism, the pose and the scales."""
    solution = construction.solution
    mech = solution.mechanism
    driver = mech.driver
    rpm = driver.speed_rad_s * 60.0 / (2.0 * math.pi)
    driving = (f"{driver.link} about {driver.pivot} at {solution.driver_angle_deg:.2f}°, "
               f"{rpm:.4g} rpm ({driver.speed_rad_s:.4g} rad/s), angular acceleration "
               f"{driver.angular_acceleration_rad_s2:.4g} rad/s²")
    scale_text = " · ".join(f"{name} {text}" for name, text in scales.items())
    lines = [("Title", mech.title or "(untitled mechanism)"), ("Driver", driving), ("Scales", scale_text)]
    lines.append(("Check", "polygons against the numeric solver: largest relative difference "
                  f"{construction.max_relative_difference:.1e} at {construction.where or '-'}"))
    lines.append(("Issued", "  ·  ".join(part for part in (f"file {file_name}" if file_name else "", f"date {date}",
                                                             "Kinepoly") if part)))
    return lines


def _fitted(text: str, width: float, height: float) -> str:
    """``text`` cut at a word, with an ellipsis, so it fits ``width`` mm."""
    return textwrap.shorten(text, width=max(10, int(width / (height * WIDTH_PER_HEIGHT))), placeholder=" …")


def caution_lines(width: float, height: float) -> list:
    """The safety caution wrapped at spaces to lines ``width`` mm long."""
    return textwrap.wrap(CAUTION, width=max(20, int(width / (height * WIDTH_PER_HEIGHT))))


def title_block_height(lines: list, width: float, size: Symbols) -> float:
    """Height of the title block for these description ``lines`` at ``width`` mm."""
    caution = caution_lines(width - 2 * size.text, size.text)
    return ROW * size.text * (2.0 + 0.5 + (len(lines) - 1) + 0.5 + len(caution) + 0.6)


def title_block(rec: Recorder, box, lines: list, size: Symbols) -> None:
    """The title block in ``box``: the title large, then the description and the caution."""
    x0, y0, x1, y1 = box
    pitch = ROW * size.text
    pad = size.text
    ids = {"ref": Ref("title block")}
    outline_box(rec, x0, y0, x1, y1, FRAME, **ids)
    (_, title), *rest = lines
    y = y1 - 1.6 * pitch
    rec.add(Text(position=(x0 + pad, y), text=_fitted(title, x1 - x0 - 2 * pad, 2 * size.text), height=2 * size.text,
                 pen=ANNOTATION, **ids))
    y -= 0.4 * pitch
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
