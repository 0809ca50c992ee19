"""The printed force polygon: a sheet of its own (ISO 216 paper, frame, title block), the polygon
at a round scale in N per mm with its scale bar and legend, and the forces it finds in a table.

Every number is the force polygon's own (:class:`kinematics.forcepolygon.ForcePolygon`); the
sheet lays them out.
"""

from __future__ import annotations

import datetime

from .annotate import (
    ROW,
    description,
    iso_fields,
    outline_box,
    scale_bar,
    scale_bar_height,
    text_width,
    title_block,
    title_block_height,
)
from .forces import FORCE_LEGEND, force_pen
from .layout import GAP, MARGIN, MARGIN_FILING, PAPER, VIEW_PAD
from .polygons import draw_polygon, polygon_bounds
from .scaling import plain, polygon_scale
from .sheet import FRAME, Line, Recorder, Ref, Sheet, Text, View
from .style import ANNOTATION
from .symbols import Symbols

TITLE = "Force polygon"
HEADING = "Forces found by the polygon (N, N·m; F(a→b) is the force of a on b; couples counter-clockwise positive)"


def force_rows(made) -> list:
    """(what, |F| N, Fx N, Fy N) per joint force, guide force and the drive torque (a cylinder's
    force along its axis), as printed."""
    rows = []
    for point, by_link in made.joints_n.items():
        for link, (fx, fy) in by_link.items():
            rows.append((f"on {link} at {point}", f"{(fx * fx + fy * fy) ** 0.5:.4g}", f"{fx:.4g}", f"{fy:.4g}"))
    rows += [(f"guide force of slide {name} (along its left normal)", f"{abs(n):.4g}", "", f"{n:.4g}")
             for name, n in made.normals_n.items()]
    if made.drive_force_n is not None:
        rows.append(("cylinder force along its axis (push +), N", f"{made.drive_force_n:.4g}", "", ""))
    else:
        rows.append(("drive torque T on the driver, N·m", f"{made.drive_torque_n_m:.4g}", "", ""))
    return rows


def _table_height(made, size: Symbols) -> float:
    return ROW * size.text * (len(force_rows(made)) + 2)


def _legend_height(size: Symbols) -> float:
    return ROW * size.small_text * 2


def _table(rec: Recorder, box, made, size: Symbols) -> None:
    """The forces table in ``box`` from its top: what, |F|, Fx, Fy."""
    x0, _, x1, top = box
    pitch = ROW * size.text
    ids = {"ref": Ref("results table")}
    rec.add(Text((x0, top - 0.7 * pitch), HEADING, size.small_text, ANNOTATION, **ids))
    rows = [("Force", "|F|", "Fx", "Fy"), *force_rows(made)]
    first = max(text_width(r[0], size.text) for r in rows) + 1.2 * size.text
    number = max(text_width(c, size.text) for r in rows for c in r[1:]) + 1.2 * size.text
    right = min(x1, x0 + first + 3 * number)
    table_top = top - pitch
    outline_box(rec, x0, table_top - pitch * len(rows), right, table_top, ANNOTATION, **ids)
    rec.add(Line((x0, table_top - pitch), (right, table_top - pitch), ANNOTATION, **ids))
    for r, row in enumerate(rows):
        baseline = table_top - (r + 1) * pitch + 0.5 * (pitch - size.text)
        rec.add(Text((x0 + 0.6 * size.text, baseline), row[0], size.text, ANNOTATION, **ids))
        for c, cell in enumerate(row[1:]):
            rec.add(Text((x0 + first + (c + 1) * number - 0.6 * size.text, baseline), cell, size.text, ANNOTATION,
                         align="right", **ids))


def _legend(rec: Recorder, box, made, size: Symbols) -> None:
    """The pens the polygon uses, in one or two rows across ``box`` from its top."""
    x0, _, x1, top = box
    used = {force_pen(step) for step in made.polygon.steps}
    entries = [pen for pen in FORCE_LEGEND if pen in used]
    sample = 6 * size.small_text
    column = sample + 2 * size.small_text + max((text_width(p.legend, size.small_text) for p in entries), default=0)
    columns = max(1, int((x1 - x0) // column))
    pitch = ROW * size.small_text
    ids = {"ref": Ref("legend")}
    for i, pen in enumerate(entries):
        x = x0 + (i % columns) * column
        y = top - (i // columns + 0.5) * pitch
        rec.add(Line((x, y), (x + sample, y), pen, **ids))
        rec.add(Text((x + sample + size.small_text, y), pen.legend, size.small_text, ANNOTATION, anchor="middle",
                     **ids))


def force_view(made, box, size: Symbols) -> View:
    """The force polygon fitted in ``box`` (sheet mm) at the smallest round N per mm, centred,
    room kept under it for its scale bar."""
    bx0, by0, bx1, by1 = box
    # A force's label is long ("F(crank→rod)"): room beside the drawing for the longest.
    side = min(0.2 * (bx1 - bx0), max([VIEW_PAD] + [text_width(s.label, size.text) for s in made.polygon.steps]))
    inner = (bx0 + side, by0 + scale_bar_height(size) + VIEW_PAD, bx1 - side, by1 - VIEW_PAD)
    x0, y0, x1, y1 = polygon_bounds(made.polygon)
    scale = polygon_scale(max((x1 - x0) / max(inner[2] - inner[0], 1.0), (y1 - y0) / max(inner[3] - inner[1], 1.0)))
    origin = (0.5 * (inner[0] + inner[2] - (x0 + x1) / scale), 0.5 * (inner[1] + inner[3] - (y0 + y1) / scale))
    return View("force", inner, origin, 1.0 / scale, "N", f"{plain(scale)} N per mm")


def draw_force_view(rec: Recorder, made, view: View, size: Symbols, bar_at, bar_longest: float) -> None:
    """The force polygon in ``view`` and its scale bar from ``bar_at``, its scale stated beside it."""
    rec.add_view(view)
    draw_polygon(rec, made.polygon, made.construction.solution, view, size, pen_of=force_pen, stack_labels=True)
    scale_bar(rec, bar_at, view.mm_per_unit, "N", bar_longest, f"{TITLE} {view.scale_text}", size, "force")


def draw_force_sheet(made, paper: str = "A4", landscape: bool = False, file_name: str = "",
                     date: str | None = None, sheet: str = "1/1") -> Sheet:
    """The sheet of the force polygon ``made``; ``sheet`` is the title block's sheet field, "n/m".

    Returns
    -------
    Sheet
        Sheet millimetres, y up, origin at the paper's lower-left corner; the view "force".

    Raises
    ------
    ValueError
        for a paper size not in :data:`~kinematics.drawing.layout.PAPER`.
    """
    if paper not in PAPER:
        raise ValueError(f"paper {paper!r}: choose one of {', '.join(PAPER)}")
    width, height = PAPER[paper]
    if landscape:
        width, height = height, width
    size = Symbols()
    rec = Recorder()
    frame = (MARGIN_FILING, MARGIN, width - MARGIN, height - MARGIN)
    outline_box(rec, *frame, FRAME, ref=Ref("frame"))
    date = date or datetime.date.today().isoformat()
    lines = description(made.construction, {}, file_name, date, dated=False)
    fields = iso_fields(date, sheet, "force polygon", file_name)
    block = title_block_height(lines, frame[2] - frame[0], size, fields)
    table_top = frame[1] + block + GAP + _table_height(made, size)
    legend_top = table_top + GAP + _legend_height(size)
    view = force_view(made, (frame[0] + GAP, legend_top + GAP, frame[2] - GAP, frame[3] - GAP), size)
    bx0, by0, bx1, _ = view.box
    draw_force_view(rec, made, view, size, (bx0 - VIEW_PAD + size.text, by0 - VIEW_PAD - scale_bar_height(size)
                                            + 1.2 * size.text), min(60.0, 0.6 * (bx1 - bx0 + 2 * VIEW_PAD)))
    _legend(rec, (frame[0] + GAP, 0.0, frame[2] - GAP, legend_top), made, size)
    _table(rec, (frame[0] + GAP, 0.0, frame[2] - GAP, table_top), made, size)
    check = ("Check", f"against the numeric forces: largest relative difference {made.max_relative_difference:.1e}"
             f" at {made.where or '-'}")
    lines = [(label, f"force {view.scale_text}") if label == "Scales" else check if label == "Check" else (label, text)
             for label, text in lines]
    title_block(rec, (frame[0], frame[1], frame[2], frame[1] + block), lines, size, fields)
    return rec.sheet(width, height, title=f"{made.construction.solution.mechanism.title} — {TITLE}".strip(" —"))
