"""The results band of a sheet: point, link and slide tables side by side
(wrapping to a further row of tables when the width runs out), then the
legend of the pens the polygons use."""

from __future__ import annotations

from .annotate import ROW, outline_box, text_width
from .sheet import Line, Recorder, Ref, Text
from .style import ANNOTATION, LEGEND, pen_for
from .symbols import Symbols
from .table import link_rows, point_rows, slide_rows

HEADING = "Results (SI; ω, α counter-clockwise positive)"


def _tables(solution) -> list:
    tables = [(("Point", "|v| m/s", "|a| m/s²"), point_rows(solution)),
              (("Link", "ω rad/s", "α rad/s²"), link_rows(solution))]
    if solution.sliding_velocity:
        tables.append((("Slide", "v m/s", "a m/s²"), slide_rows(solution)))
    return tables


def _column_widths(header, rows, size: Symbols) -> list:
    return [max(text_width(str(row[c]), size.text) for row in [header, *rows]) + 1.2 * size.text
            for c in range(len(header))]


def _placements(solution, width: float, size: Symbols) -> tuple:
    """[(header, rows, widths, x offset, top offset)] and the total height of the tables, mm."""
    pitch = ROW * size.text
    placed, x, top, row_height = [], 0.0, pitch, 0.0
    for header, rows in _tables(solution):
        widths = _column_widths(header, rows, size)
        if x > 0.0 and x + sum(widths) > width:
            x, top, row_height = 0.0, top + row_height + 0.5 * pitch, 0.0
        placed.append((header, rows, widths, x, top))
        x += sum(widths) + 1.5 * size.text
        row_height = max(row_height, pitch * (len(rows) + 1))
    return placed, top + row_height


def _legend_grid(construction, width: float, size: Symbols) -> tuple:
    """(entries, column width, columns, rows) of the legend across ``width`` mm."""
    used = {pen_for(step) for polygon in (construction.velocity, construction.acceleration) for step in polygon.steps}
    entries = [pen for pen in LEGEND if pen in used]
    sample = 6 * size.small_text
    column = sample + 2 * size.small_text + max((text_width(p.legend, size.small_text) for p in entries), default=0)
    columns = max(1, int(width // column))
    return entries, column, columns, -(-len(entries) // columns)


def results_height(construction, width: float, size: Symbols) -> float:
    """Height of the results band ``width`` mm wide: tables, then the legend."""
    tables = _placements(construction.solution, width, size)[1]
    return tables + 0.5 * size.text + _legend_grid(construction, width, size)[3] * ROW * size.small_text


def results_band(rec: Recorder, box, construction, size: Symbols) -> None:
    """Draw the results tables and the legend in ``box`` (x0, y0, x1, y1), from its top."""
    x0, y0, x1, y1 = box
    pitch = ROW * size.text
    ids = {"ref": Ref("results table")}
    rec.add(Text(position=(x0, y1 - 0.7 * pitch), text=HEADING, height=size.small_text, pen=ANNOTATION, **ids))
    placed, height = _placements(construction.solution, x1 - x0, size)
    for header, rows, widths, dx, dtop in placed:
        left, top = x0 + dx, y1 - dtop
        right = left + sum(widths)
        outline_box(rec, left, top - pitch * (len(rows) + 1), right, top, ANNOTATION, **ids)
        rec.add(Line(start=(left, top - pitch), end=(right, top - pitch), pen=ANNOTATION, **ids))
        for r, row in enumerate([header, *rows]):
            baseline = top - (r + 1) * pitch + 0.5 * (pitch - size.text)
            cell_left = left
            for c, cell in enumerate(row):
                # Names read from the left, numbers line up on the right.
                align, at = ("left", cell_left + 0.6 * size.text) if c == 0 else \
                    ("right", cell_left + widths[c] - 0.6 * size.text)
                rec.add(Text(position=(at, baseline), text=str(cell), height=size.text, pen=ANNOTATION,
                             align=align, **ids))
                cell_left += widths[c]
    _legend(rec, (x0, x1, y1 - height - 0.5 * size.text), construction, size)


def _legend(rec: Recorder, across, construction, size: Symbols) -> None:
    x0, x1, top = across
    entries, column, columns, _ = _legend_grid(construction, x1 - x0, size)
    pitch = ROW * size.small_text
    sample = 6 * size.small_text
    ids = {"ref": Ref("legend")}
    for i, pen in enumerate(entries):
        x = x0 + (i % columns) * column
        y = top - (i // columns + 0.5) * pitch
        rec.add(Line(start=(x, y), end=(x + sample, y), pen=pen, **ids))
        rec.add(Text(position=(x + sample + size.small_text, y), text=pen.legend, height=size.small_text,
                     pen=ANNOTATION, anchor="middle", **ids))
