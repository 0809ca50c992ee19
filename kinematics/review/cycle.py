"""The report's cycle pages: plots against the driver angle of the output's
motion, the points' speeds and accelerations, every link's ω and α, the
transmission angle with its limit, then the peaks tables."""

from __future__ import annotations

from dataclasses import replace

import numpy as np

from ..cycle.measures import output_coordinate, transmission_angles, within_given_stroke
from ..cycle.peaks import DEAD_POINT_SHARE, peaks
from ..cycle.sweep import sweep
from ..drawing.pages import HEADING_TEXT, PITCH, Heading, Paragraph, Preformatted, body_box, paginate, paper_size
from ..drawing.plots import SMALL, Curve, Plot, draw_plot
from ..drawing.sheet import Recorder, Ref, Text
from ..drawing.style import ANNOTATION
from ..errors import KinematicsError, SweepCancelled
from ..reports.text import peaks_text
from .base import Progress, Review, Section

# A transmission angle kept within 40° to 140° (at most 50° from 90°) drives well.  # common practice
TRANSMISSION_LIMITS_DEG = (40.0, 140.0)
PLOT_GAP = 8.0  # mm between plots on a page
ANGLE = "driver angle θ [°]"


CYLINDER_LENGTH = "cylinder length L [mm]"


def x_label(result) -> str:
    """The cycle plots' abscissa: the driver angle, or a cylinder's length."""
    return ANGLE if result.driver_length_m is None else CYLINDER_LENGTH


def abscissa(result):
    """(driver angles as plotted, order of the poses, fixed x range): a full turn wrapped to
    [0°, 360°) and read from 0°, a rocking driver's range in increasing angle less its outer
    DEAD_POINT_SHARE at each end, where speeds grow without bound (as the peaks leave it out)."""
    if result.driver_length_m is not None:
        # A cylinder's stroke in mm; its ends are dead points only where the linkage's reach ends it.
        lengths = np.asarray(result.driver_length_m, dtype=float) * 1e3
        order = np.argsort(lengths, kind="stable")
        if not within_given_stroke(result):
            trim = max(1, int(DEAD_POINT_SHARE * len(lengths)))
            order = order[trim:-trim]
        return lengths[order], order, (float(lengths[order[0]]), float(lengths[order[-1]]))
    angles = np.asarray(result.driver_angle_deg, dtype=float)
    if result.full_turn:
        wrapped = np.mod(angles, 360.0)
        order = np.argsort(wrapped, kind="stable")
        return wrapped[order], order, (0.0, 360.0)
    trim = max(1, int(DEAD_POINT_SHARE * len(angles)))
    order = np.argsort(angles, kind="stable")[trim:-trim]
    return angles[order], order, None


def analysis_marks(review: Review, result) -> tuple:
    """The analysis angles as (driver angle in degrees, label) marks for the cycle plots (none
    over a cylinder's stroke)."""
    if result.driver_length_m is not None:
        return ()
    marks = []
    for angle in review.angles_deg:
        if angle is not None:
            marks.append((angle % 360.0 if result.full_turn else angle, f"{angle:g}°"))
    return tuple(marks)


def plot_page(review: Review, heading: str, plots: list, note: str) -> object:
    """One page: the heading and a note under it, then the plots stacked in the body."""
    x0, y0, x1, y1 = body_box(review.paper)
    rec = Recorder()
    rec.add(Text(position=(x0, y1 - PITCH * HEADING_TEXT), text=heading, height=HEADING_TEXT, pen=ANNOTATION,
                 ref=Ref("heading")))
    top = y1 - 2 * PITCH * HEADING_TEXT
    if note:
        rec.add(Text(position=(x0, top), text=note, height=SMALL, pen=ANNOTATION, ref=Ref("heading")))
        top -= 2 * PITCH * SMALL
    # One plot alone takes half the page, not all of it: a plot taller than wide reads poorly.
    height = (top - y0 - PLOT_GAP * (len(plots) - 1)) / max(2, len(plots))
    for i, plot in enumerate(plots):
        upper = top - i * (height + PLOT_GAP)
        draw_plot(rec, (x0, upper - height, x1, upper), plot)
    return rec.sheet(*paper_size(review.paper), title=review.title)


def _output_plots(mech, result, x, order, x_range, marks) -> list:
    found = output_coordinate(mech, result)
    if found is None:
        return []
    name, values, unit, rate, rate_of_rate = found
    is_link = "link" in mech.output
    units = ("°", "rad/s", "rad/s²") if is_link else ("mm", "m/s", "m/s²")
    words = (("angle", "ω", "α") if is_link else ("travel along its line", "velocity along its line",
                                                  "acceleration along its line"))
    series = (values, rate, rate_of_rate)
    return [Plot(f"Output {name}: {word}", ANGLE, f"{word} [{u}]", (Curve(name, x, np.asarray(v)[order]),),
                 marks, x_range=x_range)
            for word, u, v in zip(words, units, series, strict=True)]


def _point_plots(mech, result, x, order, x_range, marks) -> list:
    moving = [(i, n) for i, n in enumerate(result.point_names) if n not in mech.ground]
    speed = tuple(Curve(n, x, np.linalg.norm(result.velocities[order, i], axis=1)) for i, n in moving)
    accel = tuple(Curve(n, x, np.linalg.norm(result.accelerations[order, i], axis=1)) for i, n in moving)
    return [Plot("Speed of each moving point", ANGLE, "|v| [m/s]", speed, marks, x_range=x_range),
            Plot("Acceleration of each moving point", ANGLE, "|a| [m/s²]", accel, marks, x_range=x_range)]


def _link_plots(mech, result, x, order, x_range, marks) -> list:
    omega = tuple(Curve(k, x, result.angular_velocity[k][order]) for k in mech.links)
    alpha = tuple(Curve(k, x, result.angular_acceleration[k][order]) for k in mech.links)
    return [Plot("Angular velocity of each link (CCW positive)", ANGLE, "ω [rad/s]", omega, marks, x_range=x_range),
            Plot("Angular acceleration of each link (CCW positive)", ANGLE, "α [rad/s²]", alpha, marks,
                 x_range=x_range)]


def _transmission_and_slides(mech, result, x, order, x_range, marks) -> list:
    plots = []
    angles = transmission_angles(mech, result)
    if angles:
        low, high = TRANSMISSION_LIMITS_DEG
        plots.append(Plot("Transmission angle of each pin-pin-pin group", ANGLE, "μ [°]",
                          tuple(Curve(k, x, v[order]) for k, v in angles.items()), marks,
                          ((low, f"limits {low:g}° and {high:g}°"), (high, "")), x_range=x_range))
    if mech.slides:
        plots.append(Plot("Sliding velocity of each slide", ANGLE, "v slide [m/s]",
                          tuple(Curve(k, x, result.sliding_velocity[k][order]) for k in mech.slides), marks,
                          x_range=x_range))
        plots.append(Plot("Sliding acceleration of each slide", ANGLE, "a slide [m/s²]",
                          tuple(Curve(k, x, result.sliding_acceleration[k][order]) for k in mech.slides), marks,
                          x_range=x_range))
    return plots


def cycle_section(review: Review, progress: Progress) -> Section:
    """The cycle's plot pages and peaks tables, or a page saying why it was not swept."""
    mech = review.mechanism
    try:
        result = sweep(mech, review.steps, progress=progress.share(0.0, 0.6))
    except SweepCancelled:
        raise
    except KinematicsError as err:
        pages = paginate([Heading("The cycle"), Paragraph(f"The cycle was not swept: {err}.")],
                         review.paper, review.title)
        return Section("Cycle", tuple(pages))
    x, order, x_range = abscissa(result)
    marks = analysis_marks(review, result)
    stroke = None if result.driver_length_m is None else (float(np.min(result.driver_length_m)) * 1e3,
                                                            float(np.max(result.driver_length_m)) * 1e3)
    note = f"Over the stroke of cylinder {mech.driver.slide}, {stroke[0]:.1f} to {stroke[1]:.1f} mm." if stroke \
        else "" if result.full_turn else (
        f"The driver rocks between its dead points {result.range_deg[0]:.2f}° and {result.range_deg[1]:.2f}°; "
        f"the outer {100 * DEAD_POINT_SHARE:g} % of that range at each end is left out, where speeds grow "
        "without bound.")
    pages, entries = [], []
    groups = (("Output motion", _output_plots), ("Points: speed and acceleration", _point_plots),
              ("Links: angular velocity and acceleration", _link_plots),
              ("Transmission angle and slides", _transmission_and_slides))
    for i, (heading, make) in enumerate(groups):
        plots = [replace(p, x_label=x_label(result)) for p in make(mech, result, x, order, x_range, marks)]
        if make is _transmission_and_slides:  # name only what the page holds
            kinds = [kind for kind, word in (("Transmission angle", "Transmission"), ("slides", "Sliding"))
                     if any(p.title.startswith(word) for p in plots)]
            heading = " and ".join(kinds).capitalize()
        for start in range(0, len(plots), 3):
            entries.append((heading, len(pages)) if start == 0 else (f"{heading} (continued)", len(pages)))
            pages.append(plot_page(review, heading, plots[start:start + 3], note))
        progress.check(0.6 + 0.3 * (i + 1) / len(groups))
    if stroke:
        rocking = f" {note}"
    else:
        rocking = "" if result.full_turn else (f" The driver rocks between its dead points "
                                               f"{result.range_deg[0]:.2f}° and {result.range_deg[1]:.2f}°.")
    entries.append(("Peaks", len(pages)))
    pages += paginate([Heading("Peaks of the cycle"),
                       Paragraph(f"The largest values over the cycle in {review.steps:,} poses and the driver angles "
                                 f"where they occur, as kinepoly sweep --peaks prints them.{rocking}"),
                       Preformatted(tuple(peaks_text(peaks(result)).splitlines()))], review.paper, review.title)
    return Section("Cycle", tuple(pages), tuple(entries))
