"""The report's force pages, for a design with mass data: the drive torque's turning-moment
diagram with its mean, the joint force magnitudes and the shaking force over the cycle, the
drive and flywheel summary with the bearing table, and the polar diagram of the most loaded
pin (its force's tip over the cycle, in the frame's axes). Frictionless rigid joints."""

from __future__ import annotations

import numpy as np

from ..cycle.sweep import sweep
from ..drawing.pages import Heading, Paragraph, Preformatted, paginate
from ..drawing.plots import Curve, Plot
from ..dynamics import DEFAULT_FLUCTUATION, FRICTIONLESS, drive_summary, sweep_forces
from ..errors import KinematicsError, SweepCancelled
from ..reports.caution import CAUTION
from ..reports.forces_tables import pinned_to, shown_value, summary_text
from .base import Progress, Review, Section
from .cycle import abscissa, analysis_marks, plot_page, x_label


def _joint_curves(result, x, order) -> tuple:
    """One magnitude curve per joint force, a pin joining two links directly once (its two forces are
    equal and opposite)."""
    curves, seen = [], set()
    mech = result.mechanism
    for point, by_link in result.joints_n.items():
        for link, force in by_link.items():
            other = pinned_to(mech, point, link)
            if (point, other) in seen:
                continue
            seen.add((point, link))
            curves.append(Curve(f"{point} {link}–{other}", x, np.hypot(force[order, 0], force[order, 1])))
    return tuple(curves)


def most_loaded(result) -> tuple:
    """(point, link, peak force N) of the joint force with the largest magnitude over the cycle."""
    peaks = ((float(np.max(np.hypot(f[:, 0], f[:, 1]))), point, link)
             for point, by_link in result.joints_n.items() for link, f in by_link.items())
    peak, point, link = max(peaks)
    return point, link, peak


def _plots(review: Review, result) -> tuple:
    x, order, x_range = abscissa(result)
    marks = analysis_marks(review, result)
    along = x_label(result)
    if result.drive_force_n is not None:
        # A cylinder drives by its axial force over a stroke: no turn to take a mean over.
        turning = Plot(f"Cylinder force of {review.mechanism.driver.slide} over its stroke (push positive)", along,
                       "F [N]", (Curve("cylinder force", x, result.drive_force_n[order]),), marks, x_range=x_range)
    else:
        torque = result.drive_torque_n_m[order]
        mean = shown_value(float(np.mean(result.drive_torque_n_m)), float(np.max(np.abs(result.drive_torque_n_m))))
        driver = review.mechanism.driver.link
        turning = Plot(f"Turning-moment diagram: drive torque on {driver} (CCW positive)", along, "T [N·m]",
                       (Curve("drive torque", x, torque),), marks, ((mean, f"mean {mean:.4g} N·m"),), x_range=x_range)
    joints = Plot("Joint force magnitudes (on the link named first, from the body named second)", along, "|F| [N]",
                  _joint_curves(result, x, order), marks, x_range=x_range)
    shaking = Plot("Shaking force (the sum of the inertia forces)", along, "|F| [N]",
                   (Curve("shaking force", x, np.hypot(*result.shaking_force_n[order].T)),), marks, x_range=x_range)
    point, link, peak = most_loaded(result)
    force = result.joints_n[point][link]
    polar = Plot(f"Polar diagram of the force on {link} at {point} from {pinned_to(result.mechanism, point, link)} "
                 f"(peak {peak:.4g} N), frame axes", "Fx [N]", "Fy [N]",
                 (Curve(f"{point} on {link}", *_tip_path(force, order, result.full_turn)),), polar=True)
    return (turning, joints, shaking), polar


def _tip_path(force, order, closed: bool) -> tuple:
    """(x, y) of a force's tip over the cycle, closed back to its start over a whole turn only."""
    ends = np.append(order, order[0]) if closed else order
    return force[ends, 0], force[ends, 1]


def forces_section(review: Review, progress: Progress) -> Section | None:
    """The force pages, or None for a design without mass data; a page saying why when the
    forces cannot be had (statics does not determine them, the cycle does not sweep)."""
    mech = review.mechanism
    if mech.mass_data is None or mech.mass_data.is_empty:
        return None
    try:
        result = sweep_forces(sweep(mech, review.steps, progress=progress.share(0.0, 0.6)))
    except SweepCancelled:
        raise
    except KinematicsError as err:
        pages = paginate([Heading("Forces"), Paragraph(f"The forces were not computed: {err}.")], review.paper,
                         review.title)
        return Section("Forces", tuple(pages))
    progress.check(0.8)
    note = f"{FRICTIONLESS[0].upper()}{FRICTIONLESS[1:]}, at the driver's constant speed."
    curves, polar = _plots(review, result)
    cylinder = result.drive_force_n is not None
    heading = "Cylinder force and joint forces over the stroke" if cylinder else \
        "Drive torque and joint forces over the cycle"
    pages = [plot_page(review, heading, list(curves), note)]
    entries = [("Cylinder force and joint forces" if cylinder else "Turning-moment diagram and joint forces", 0)]
    try:
        words = summary_text(drive_summary(result, DEFAULT_FLUCTUATION), result)
    except KinematicsError as err:
        words = f"No drive summary: {err}."
    title = "Drive and bearings" if cylinder else "Drive, flywheel and bearings"
    entries.append((title, len(pages)))
    explained = ("As kinepoly forces --cycle prints them: the cylinder's peak push and pull and the lengths where "
                 "they occur, the work ∫F dL over the stroke and the mean and peak power F·L̇.") if cylinder else (
        f"As kinepoly forces --cycle prints them, for a coefficient of speed fluctuation "
        f"C_s = {DEFAULT_FLUCTUATION:g}: mean and RMS drive torque over the turn, the energy "
        "fluctuation ΔE of the turning-moment diagram (largest less smallest of "
        "∫(T − T_mean) dθ) and the flywheel I = ΔE/(C_s·ω²).")
    pages += paginate([Heading(title), Paragraph(explained),
                       Preformatted(tuple(words.splitlines())), Paragraph(CAUTION)], review.paper, review.title)
    entries.append(("Polar diagram of the most loaded pin", len(pages)))
    pages.append(plot_page(review, "Polar diagram of the most loaded pin", [polar],
                           "The tip of the force vector over " + ("the stroke" if cylinder else "one turn")
                           + "; the origin is the pin's centre."))
    progress.check(1.0)
    return Section("Forces", tuple(pages), tuple(entries))
