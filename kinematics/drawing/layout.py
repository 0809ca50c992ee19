"""Composing a construction into a Sheet: the printed sheet (ISO 216 paper,
frame, three views at their own scales, results, title block) and the
true-size model drawing the DXF writer replays."""

from __future__ import annotations

import datetime
import math
from dataclasses import dataclass

from ..instantaneous.centres import centres
from .annotate import (
    caution_lines,
    description,
    iso_fields,
    outline_box,
    printed_unit,
    scale_bar,
    scale_bar_height,
    text_width,
    title_block,
    title_block_height,
)
from .centre_places import bounds_with_centres, centre_places
from .centres_overlay import draw_centres
from .forces import force_pen
from .polygons import draw_polygon, polygon_bounds
from .results import results_band, results_height
from .scaling import bar_value, iso5455_ratio, plain, polygon_scale, ratio_text
from .sheet import FRAME, Note, Recorder, Ref, Sheet, View
from .space import draw_space, positions
from .style import ANNOTATION, pen_for
from .symbols import Symbols

# ISO 216 A series, portrait width × height in mm.
PAPER = {"A0": (841.0, 1189.0), "A1": (594.0, 841.0), "A2": (420.0, 594.0), "A3": (297.0, 420.0),
         "A4": (210.0, 297.0)}
# Frame margins: 20 mm on the filing (left) edge, 10 mm elsewhere (ISO 5457).  # from memory
MARGIN_FILING, MARGIN = 20.0, 10.0
# Room round a view's drawing for labels and pivot marks, and between views, mm on paper.
VIEW_PAD, GAP = 7.0, 4.0
# A true-size drawing's coordinates to this many significant digits: the file's own numbers (see View.place).
TRUE_SIZE_DIGITS = 15
NAMES = {"space": "Space diagram", "velocity": "Velocity polygon", "acceleration": "Acceleration polygon",
         "force": "Force polygon"}


@dataclass(frozen=True)
class _Fit:
    mm_per_unit: float
    scale_text: str
    bounds: tuple


def _space_bounds(solution, places=()) -> tuple:
    """The pose's points, and the centres drawn on the view (``places``) when they are shown."""
    if places:
        return bounds_with_centres(solution, places)
    xs, ys = zip(*positions(solution).values(), strict=True)
    return (min(xs), min(ys), max(xs), max(ys))


def _fit_space(solution, width: float, height: float, places=()) -> _Fit:
    x0, y0, x1, y1 = _space_bounds(solution, places)
    limits = [room / (1000.0 * extent) for room, extent in ((width, x1 - x0), (height, y1 - y0)) if extent > 0]
    ratio = iso5455_ratio(min(limits)) if limits else iso5455_ratio(1.0)
    return _Fit(1000.0 * float(ratio), ratio_text(ratio), (x0, y0, x1, y1))


def _polygon_fit(polygon, scale: float) -> _Fit:
    return _Fit(1.0 / scale, f"1 mm = {plain(scale)} {printed_unit(polygon.unit)}", polygon_bounds(polygon))


def _fit_polygon(polygon, width: float, height: float) -> _Fit:
    """A polygon in a ``width`` × ``height`` mm box: at its construction's scale
    (``polygon.scale_per_mm``, the scale the window shows and the DXF draws) when it
    fits there, else at the finest round scale that fits."""
    x0, y0, x1, y1 = polygon_bounds(polygon)
    needed = max((x1 - x0) / width, (y1 - y0) / height)
    chosen = polygon.scale_per_mm
    return _polygon_fit(polygon, chosen if chosen >= needed * (1 - 1e-12) else polygon_scale(needed))


def _centred_view(name, fit: _Fit, box, unit) -> View:
    bx0, by0, bx1, by1 = box
    x0, y0, x1, y1 = fit.bounds
    origin = (0.5 * (bx0 + bx1) - 0.5 * (x0 + x1) * fit.mm_per_unit,
              0.5 * (by0 + by1) - 0.5 * (y0 + y1) * fit.mm_per_unit)
    return View(name=name, box=box, origin=origin, mm_per_unit=fit.mm_per_unit, unit=unit, scale_text=fit.scale_text)


def _arrangements(area) -> list:
    """Ways to share ``area`` among the three views: the space diagram above
    the two polygons, three columns, or the space diagram beside the polygons
    stacked, each with a few shares for the space diagram."""
    x0, y0, x1, y1 = area
    w, h, g = x1 - x0, y1 - y0, GAP / 2
    out = []
    for share in (0.35, 0.5, 0.65):
        cut_y, cut_x = y1 - share * h, x0 + share * w
        out.append({"space": (x0, cut_y + g, x1, y1), "velocity": (x0, y0, x0 + 0.5 * w - g, cut_y - g),
                    "acceleration": (x0 + 0.5 * w + g, y0, x1, cut_y - g)})
        third = x0 + 0.5 * (1 + share) * w  # the polygons share what the space diagram leaves
        out.append({"space": (x0, y0, cut_x - g, y1), "velocity": (cut_x + g, y0, third - g, y1),
                    "acceleration": (third + g, y0, x1, y1)})
        out.append({"space": (x0, y0, cut_x - g, y1), "velocity": (cut_x + g, y0 + 0.5 * h + g, x1, y1),
                    "acceleration": (cut_x + g, y0, x1, y0 + 0.5 * h - g)})
    return out


def _fit_view(construction, name: str, box, size: Symbols, places=()) -> View:
    """The view ``name`` fitted and centred in ``box``, room kept for its scale bar at the bottom."""
    bx0, by0, bx1, by1 = box
    inner = (bx0 + VIEW_PAD, by0 + scale_bar_height(size) + VIEW_PAD, bx1 - VIEW_PAD, by1 - VIEW_PAD)
    width, height = max(inner[2] - inner[0], 1.0), max(inner[3] - inner[1], 1.0)
    if name == "space":
        fit, unit = _fit_space(construction.solution, width, height, places), "m"
    else:
        polygon = getattr(construction, name)
        fit, unit = _fit_polygon(polygon, width, height), polygon.unit
    return _centred_view(name, fit, inner, unit)


def _best_views(construction, area, size: Symbols, places=()) -> dict:
    """The arrangement whose views come out largest (product of their drawn
    sizes), among those whose boxes are wide enough for their scale captions."""
    def score(views):
        return math.prod(_extent_mm(construction, v, places) for v in views.values())

    def captions_fit(views):
        return all(text_width(_caption(v), size.text) + 2 * size.text <= v.box[2] - v.box[0] + 2 * VIEW_PAD
                   for v in views.values())

    candidates = [{name: _fit_view(construction, name, box, size, places) for name, box in boxes.items()}
                  for boxes in _arrangements(area)]
    return max([views for views in candidates if captions_fit(views)] or candidates, key=score)


def _caption(view: View) -> str:
    return f"{NAMES[view.name]} {view.scale_text}"


def _extent_mm(construction, view: View, places=()) -> float:
    """Diagonal of a view's drawing on paper, mm (at least 1 so a point-like polygon scores)."""
    if view.name == "space":
        x0, y0, x1, y1 = _space_bounds(construction.solution, places)
    else:
        x0, y0, x1, y1 = polygon_bounds(getattr(construction, view.name))
    return max(1.0, math.hypot(x1 - x0, y1 - y0) * view.mm_per_unit)


def _draw_view(rec: Recorder, construction, view: View, size: Symbols, centres=None) -> None:
    """Draw one fitted view and its scale bar under it (with ``centres`` over the space diagram)."""
    rec.add_view(view)
    if view.name == "space":
        draw_space(rec, construction.solution, view, size)
        if centres is not None:
            draw_centres(rec, centres, view, size)
        per_value, bar_unit = view.mm_per_unit / 1000.0, "mm"  # the bar reads true millimetres
    else:
        draw_polygon(rec, getattr(construction, view.name), construction.solution, view, size)
        per_value, bar_unit = view.mm_per_unit, view.unit
    bx0, by0, bx1, _ = view.box
    left, bottom = bx0 - VIEW_PAD, by0 - VIEW_PAD - scale_bar_height(size)
    scale_bar(rec, (left + size.text, bottom + 1.2 * size.text), per_value, bar_unit,
              min(60.0, 0.6 * (bx1 - bx0 + 2 * VIEW_PAD)), _caption(view), size, view.name)


def _scales(views: dict) -> dict:
    return {NAMES[n].split()[0].lower(): v.scale_text for n, v in views.items()}


def draw_sheet(construction, paper: str = "A4", landscape: bool = False, file_name: str = "",
               date: str | None = None, with_centres: bool = False, sheet: str = "1/1") -> Sheet:
    """The printed sheet of a construction.

    Parameters
    ----------
    construction : :class:`kinematics.Construction` to draw.
    paper : ISO 216 size, a key of :data:`PAPER`.
    landscape : turn the paper to landscape.
    file_name, date : for the title block (date defaults to today, ISO 8601).
    with_centres : draw the instantaneous centres over the space diagram
        (:mod:`kinematics.drawing.centres_overlay`), the view grown to take in the near ones.
    sheet : the title block's sheet field, "n/m" ("" leaves it blank).

    Returns
    -------
    Sheet
        Sheet millimetres, y up, origin at the paper's lower-left corner; the
        views "space", "velocity" and "acceleration" with their placements.

    Raises
    ------
    ValueError
        for a paper size not in :data:`PAPER`.
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
    # The scales are not known before the views are fitted; the block's height does not depend on them.
    fields = iso_fields(date, sheet, "construction", file_name)
    block_height = title_block_height(description(construction, {}, file_name, date, dated=False),
                                      frame[2] - frame[0], size, fields)
    table_top = frame[1] + block_height + GAP + results_height(construction, frame[2] - frame[0] - 2 * GAP, size)
    area = (frame[0] + GAP, table_top + GAP, frame[2] - GAP, frame[3] - GAP)
    found = centres(construction.solution, construction) if with_centres else None
    views = _best_views(construction, area, size, centre_places(found) if found is not None else ())
    for view in views.values():
        _draw_view(rec, construction, view, size, found)
    results_band(rec, (frame[0] + GAP, frame[1] + block_height + GAP, frame[2] - GAP, table_top),
                  construction, size)
    lines = description(construction, _scales(views), file_name, date, dated=False)
    title_block(rec, (frame[0], frame[1], frame[2], frame[1] + block_height), lines, size, fields)
    return rec.sheet(width, height, title=construction.solution.mechanism.title)


def draw_model(construction, file_name: str = "", date: str | None = None, with_centres: bool = False,
               forces=None) -> Sheet:
    """The model drawing for CAD.

    The space diagram at true size in millimetres (sheet mm = model mm, the
    mechanism's origin kept), the two polygons to its right at their
    construction's scales (those the window shows), scale bars under each
    stating them, and a note (title, driver, scales, caution) below. The
    polygons' symbols keep their paper size (they are drawn at a paper scale);
    the space diagram's grow with a big machine.

    Parameters
    ----------
    construction : :class:`kinematics.Construction` to draw.
    file_name, date : for the note (date defaults to today, ISO 8601).
    with_centres : draw the instantaneous centres over the space diagram, on their own layer.
    forces : a :class:`kinematics.forcepolygon.ForcePolygon` of the same pose, drawn to the
        right of the polygons (view "force", its scale in N per mm, on its own pens' layers).

    Returns
    -------
    Sheet
        With no paper (width and height 0) and the three views.
    """
    solution = construction.solution
    found = centres(solution, construction) if with_centres else None
    places = centre_places(found) if found is not None else ()
    x0, y0, x1, y1 = (1000.0 * v for v in _space_bounds(solution, places))
    extent = max(x1 - x0, y1 - y0)
    # Symbols grow with a big machine so a plotted drawing keeps readable text.
    size = Symbols().scaled(max(1.0, bar_value(extent / 150.0, 1.0)) if extent > 0 else 1.0)
    pad = 3 * size.text
    paper = Symbols()
    rec = Recorder()
    space = View("space", (x0, y0, x1, y1), (0.0, 0.0), 1000.0, "m", "1:1", significant=TRUE_SIZE_DIGITS)
    views = {"space": space}
    rec.add_view(space)
    draw_space(rec, solution, space, size)
    if found is not None:
        draw_centres(rec, found, space, size, places)
    left = max(x1, x0 + 20 * size.text, x0 + text_width(_caption(space), size.text)) + 2 * pad
    drawn = [("velocity", construction.velocity, pen_for), ("acceleration", construction.acceleration, pen_for)]
    if forces is not None:
        drawn.append(("force", forces.polygon, force_pen))
    for name, polygon, pen_of in drawn:
        fit = _polygon_fit(polygon, polygon.scale_per_mm)
        if name == "force":
            fit = _Fit(fit.mm_per_unit, f"{plain(polygon.scale_per_mm)} N per mm", fit.bounds)
        px0, py0, px1, py1 = fit.bounds
        origin = (left - px0 * fit.mm_per_unit, y0 - py0 * fit.mm_per_unit)
        box = (left, y0, left + (px1 - px0) * fit.mm_per_unit, y0 + (py1 - py0) * fit.mm_per_unit)
        views[name] = View(name, box, origin, fit.mm_per_unit, polygon.unit, fit.scale_text)
        rec.add_view(views[name])
        draw_polygon(rec, polygon, solution, views[name], paper, pen_of=pen_of, stack_labels=name == "force")
        # The next view starts clear of this one's scale bar and caption too, which a small polygon
        # (drawn at its paper scale beside a big machine) is narrower than.
        caption = text_width(_caption(views[name]), paper.text)
        left = max(box[2], left + 20 * paper.text, left + caption) + 2 * pad
    bar_y = y0 - 2 * pad - scale_bar_height(size)
    for name, view in views.items():
        per_value, unit, bar_size = (1.0, "mm", size) if name == "space" else (view.mm_per_unit, view.unit, paper)
        scale_bar(rec, (view.box[0], bar_y), per_value, unit,
                  max(20 * bar_size.text, 0.5 * (view.box[2] - view.box[0])), _caption(view), bar_size, name)
    lines = description(construction, _scales(views), file_name, date or datetime.date.today().isoformat())
    texts = [f"{label}: {text}" for label, text in lines] + caution_lines(left - x0, size.text)
    rec.add(Note(position=(x0, bar_y - 2 * pad), lines=tuple(texts), height=size.text, pitch=1.8 * size.text,
                 pen=ANNOTATION, ref=Ref("note")))
    return rec.sheet(0.0, 0.0, title=solution.mechanism.title)


def space_view(solution, box, name: str = "space") -> View:
    """The space diagram of ``solution`` fitted in ``box`` (x0, y0, x1, y1, sheet mm) at the
    largest ISO 5455 scale and centred there, as the printed sheet fits its own."""
    fit = _fit_space(solution, box[2] - box[0], box[3] - box[1])
    return _centred_view(name, fit, box, "m")
