"""Plots drawn as Sheet primitives: axes with labels and units, ticks from the
1, 2, 5 × 10ⁿ series, a grid, curves, limit lines, marked abscissae and a
legend. Every backend replays them, so a PDF keeps them as vector paths.

>>> from kinematics.drawing.sheet import Recorder
>>> rec = Recorder()
>>> plot = Plot("Rocker", "driver angle θ [°]", "ω [rad/s]", (Curve("rocker", (0, 180, 360), (1.0, -2.0, 1.0)),))
>>> draw_plot(rec, (20, 20, 190, 100), plot)
>>> ticks(-2.0, 1.0, 5)
(-2.0, -1.0, 0.0, 1.0)
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..groups.scales import preferred_scale
from .annotate import outline_box, text_width
from .sheet import Line, Polyline, Recorder, Ref, Text
from .style import ANNOTATION, Pen

# Curves in colours that stay apart on screen and print; past the eighth they repeat dashed.
CURVE_COLOURS = ("#0b6e99", "#c0392b", "#1e8449", "#7d3c98", "#b9770e", "#1d2b3a", "#d35400", "#5d6d7e")
GRID = Pen("#d5d8dc", 0.18, "solid", "PLOT-GRID", "grid")
LIMIT = Pen("#c0392b", 0.5, "dashed", "PLOT-LIMITS", "limit")
MARK = Pen("#7a869a", 0.25, "dashdot", "PLOT-MARKS", "analysis angle")
TEXT, SMALL = 2.5, 1.8   # ISO 3098 heights for the title and for ticks, legend and labels
TICK = 1.2               # tick length outside the plot area, mm
LEGEND_LINE = 6.0        # length of the legend's sample of a curve, mm
TICK_SPACING_MM = 8.0    # ticks at least this far apart, so their labels stay apart
MARGIN_SHARE = 0.04      # room above and below the curves, so a limit line or a peak clears the frame


def curve_pen(index: int) -> Pen:
    """The pen of the ``index``-th curve of a plot."""
    dash = "solid" if index < len(CURVE_COLOURS) else "dashed"
    return Pen(CURVE_COLOURS[index % len(CURVE_COLOURS)], 0.35, dash, "PLOT-CURVES", "curve")


@dataclass(frozen=True)
class Curve:
    """One curve: ``y`` against ``x`` (same length, ordered as drawn); non-finite values break it."""

    label: str
    x: tuple
    y: tuple


@dataclass(frozen=True)
class Plot:
    """What one plot shows. ``marks``: (x, label) abscissae drawn as vertical lines (the
    analysis angles); ``limits``: (y, label) ordinates drawn as limit lines; ``x_range``
    fixes the abscissa's ends (the ticks then start at its lower end); ``polar`` draws a
    vector's tip (a force's x against its y) at one scale on both axes, both through the
    origin, with both zero lines."""

    title: str
    x_label: str
    y_label: str
    curves: tuple
    marks: tuple = ()
    limits: tuple = ()
    x_range: tuple | None = None
    polar: bool = False


def _decimals(step: float) -> int:
    return max(0, -math.floor(math.log10(step) + 1e-9))


def tick_label(value: float, step: float) -> str:
    """A tick value written to the step's precision ("0" never "-0")."""
    text = f"{value:.{_decimals(step)}f}"
    return "0" if float(text) == 0.0 else text


def ticks(low: float, high: float, most: int, inside: bool = False) -> tuple:
    """Round tick values for [low, high]: the step is the smallest 1, 2, 5 × 10ⁿ that
    needs at most ``most`` intervals; the ends are whole steps covering the range, or
    with ``inside`` the whole steps within it (the axis then ends at the range)."""
    step = preferred_scale(high - low, max(1, most))
    if inside:
        first, last = math.ceil(low / step - 1e-9), math.floor(high / step + 1e-9)
    else:
        first, last = math.floor(low / step + 1e-9), math.ceil(high / step - 1e-9)
    return tuple(round(k * step, _decimals(step) + 2) for k in range(first, last + 1))


def _value_range(plot: Plot, axis: str = "y") -> tuple:
    values = [np.asarray(getattr(c, axis), dtype=float) for c in plot.curves]
    values = [v[np.isfinite(v)] for v in values]
    origin = [np.zeros(1)] if plot.polar else []
    finite = np.concatenate(values + origin + [np.array([y for y, _ in plot.limits], dtype=float)])
    if finite.size == 0:
        return -1.0, 1.0
    low, high = float(finite.min()), float(finite.max())
    largest = max(abs(low), abs(high))
    if high - low <= 1e-9 * max(1.0, largest):
        # A constant (a crank's ω) or a quantity that is zero to rounding: show it mid-height.
        half = 0.1 * largest if largest > 1e-9 else 1.0
        return low - half, high + half
    room = MARGIN_SHARE * (high - low)
    # A quantity that is never negative (a size |v|, an angle) keeps its axis from zero up; a polar
    # plot has room around its origin, so that its zero lines clear the frame.
    bottom = low - room if low < 0.0 or plot.polar else max(0.0, low - room)
    return bottom, high + room


def _legend(rec: Recorder, plot: Plot, x0: float, x1: float, top: float, ids: dict) -> float:
    """Legend entries in rows from ``top`` downwards; returns the y under the last row."""
    entries = [(curve_pen(i), c.label) for i, c in enumerate(plot.curves)]
    entries += [(LIMIT, label) for _, label in plot.limits if label]
    if len(entries) <= 1 and not plot.limits:
        return top
    pitch = 1.9 * SMALL
    x, y = x0, top - SMALL
    for pen, label in entries:
        width = LEGEND_LINE + 1.5 + text_width(label, SMALL) + 4.0
        if x + width > x1 and x > x0:
            x, y = x0, y - pitch
        rec.add(Line(start=(x, y + 0.5 * SMALL), end=(x + LEGEND_LINE, y + 0.5 * SMALL), pen=pen, **ids))
        rec.add(Text(position=(x + LEGEND_LINE + 1.5, y), text=label, height=SMALL, pen=ANNOTATION, **ids))
        x += width
    return y - 0.9 * pitch


def _polylines(rec: Recorder, xs, ys, to_sheet, pen: Pen, ids: dict) -> None:
    """The curve as polylines, broken where a value is not finite."""
    xs, ys = np.asarray(xs, dtype=float), np.asarray(ys, dtype=float)
    good = np.isfinite(xs) & np.isfinite(ys)
    edges = np.flatnonzero(np.diff(np.concatenate(([0], good.astype(np.int8), [0]))))
    for begin, end in zip(edges[::2], edges[1::2], strict=True):
        if end - begin >= 2:
            sx, sy = to_sheet(xs[begin:end], ys[begin:end])
            rec.add(Polyline(points=tuple(zip(sx.tolist(), sy.tolist(), strict=True)), pen=pen, **ids))


def draw_plot(rec: Recorder, box, plot: Plot, view: str = "plot") -> None:
    """Record ``plot`` in ``box`` (x0, y0, x1, y1, sheet mm): title, legend and the
    y label above the plot area, tick labels left of it and under it, the x label
    under those."""
    x0, y0, x1, y1 = box
    ids = {"view": view, "ref": Ref("plot", plot.title)}
    rec.add(Text(position=(x0, y1), text=plot.title, height=TEXT, pen=ANNOTATION, anchor="top", **ids))
    top = _legend(rec, plot, x0, x1, y1 - 2.2 * TEXT, ids)
    low_y, high_y = _value_range(plot)
    height_guess = max(top - y0 - 5 * SMALL, 10.0)
    y_ticks = ticks(low_y, high_y, max(2, int(height_guess / TICK_SPACING_MM)))
    y_step = y_ticks[1] - y_ticks[0]
    y_labels = [tick_label(v, y_step) for v in y_ticks]
    left = x0 + max(text_width(t, SMALL) for t in y_labels) + TICK + 1.5
    area_top, area_bottom = top - 2.2 * SMALL, y0 + 4.6 * SMALL
    right = x1 - 0.5 * text_width(tick_label(0, 1), SMALL) - 2.0
    if plot.x_range is not None:
        low_x, high_x = plot.x_range
    elif plot.polar:
        low_x, high_x = _value_range(plot, "x")
    else:
        xs = np.concatenate([np.asarray(c.x, dtype=float) for c in plot.curves])
        low_x, high_x = float(np.nanmin(xs)), float(np.nanmax(xs))
    fixed = plot.x_range is not None
    x_ticks = ticks(low_x, high_x, max(2, int((right - left) / TICK_SPACING_MM)), inside=fixed)
    x_step = x_ticks[1] - x_ticks[0]
    xa, xb = (low_x, high_x) if fixed else (x_ticks[0], x_ticks[-1])
    ya, yb = y_ticks[0], y_ticks[-1]
    if plot.polar:  # one scale: the area shrinks along the axis that needs fewer units per mm
        per_mm = max((xb - xa) / (right - left), (yb - ya) / (area_top - area_bottom))
        middle_x, middle_y = 0.5 * (left + right), 0.5 * (area_top + area_bottom)
        left, right = middle_x - 0.5 * (xb - xa) / per_mm, middle_x + 0.5 * (xb - xa) / per_mm
        area_bottom, area_top = middle_y - 0.5 * (yb - ya) / per_mm, middle_y + 0.5 * (yb - ya) / per_mm
        # Ticks again for the area as it now is, within the same ends, so that their labels stay apart.
        x_ticks = ticks(xa, xb, max(2, int((right - left) / TICK_SPACING_MM)), inside=True)
        y_ticks = ticks(ya, yb, max(2, int((area_top - area_bottom) / TICK_SPACING_MM)), inside=True)
        x_step, y_step = x_ticks[1] - x_ticks[0], y_ticks[1] - y_ticks[0]
        y_labels = [tick_label(v, y_step) for v in y_ticks]
    rec.add(Text(position=(x0, area_top + 1.2 * SMALL), text=plot.y_label, height=SMALL, pen=ANNOTATION, **ids))

    def to_sheet(x, y):
        return (left + (x - xa) * (right - left) / (xb - xa),
                area_bottom + (y - ya) * (area_top - area_bottom) / (yb - ya))

    for v, label in zip(y_ticks, y_labels, strict=True):
        _, y = to_sheet(xa, v)
        rec.add(Line(start=(left, y), end=(right, y), pen=GRID, **ids))
        rec.add(Line(start=(left - TICK, y), end=(left, y), pen=ANNOTATION, **ids))
        rec.add(Text(position=(left - TICK - 1.0, y), text=label, height=SMALL, pen=ANNOTATION, align="right",
                     anchor="middle", **ids))
    for v in x_ticks:
        x, _ = to_sheet(v, ya)
        rec.add(Line(start=(x, area_bottom), end=(x, area_top), pen=GRID, **ids))
        rec.add(Line(start=(x, area_bottom - TICK), end=(x, area_bottom), pen=ANNOTATION, **ids))
        rec.add(Text(position=(x, area_bottom - TICK - 1.0), text=tick_label(v, x_step), height=SMALL,
                     pen=ANNOTATION, align="centre", anchor="top", **ids))
    label_y = area_bottom - TICK - 3.2 * SMALL if plot.polar else y0  # under the ticks of an area that shrank
    rec.add(Text(position=(0.5 * (left + right), label_y), text=plot.x_label, height=SMALL, pen=ANNOTATION,
                 align="centre", **ids))
    if ya < 0.0 < yb:  # the zero line, heavier than the grid, so signs read at a glance
        _, y = to_sheet(xa, 0.0)
        rec.add(Line(start=(left, y), end=(right, y), pen=ANNOTATION, **ids))
    if plot.polar and xa < 0.0 < xb:
        x, _ = to_sheet(0.0, ya)
        rec.add(Line(start=(x, area_bottom), end=(x, area_top), pen=ANNOTATION, **ids))
    for value, label in plot.marks:
        if xa <= value <= xb:
            x, _ = to_sheet(value, ya)
            rec.add(Line(start=(x, area_bottom), end=(x, area_top), pen=MARK, **ids))
            rec.add(Text(position=(x + 0.6, area_top - 0.6), text=label, height=SMALL, pen=ANNOTATION,
                         anchor="top", **ids))
    for value, _ in plot.limits:
        _, y = to_sheet(xa, value)
        rec.add(Line(start=(left, y), end=(right, y), pen=LIMIT, **ids))
    for i, curve in enumerate(plot.curves):
        _polylines(rec, curve.x, curve.y, to_sheet, curve_pen(i), ids)
    outline_box(rec, left, area_bottom, right, area_top, ANNOTATION, **ids)
