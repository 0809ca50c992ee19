"""The results table as CSV, for a spreadsheet: every point's velocity and acceleration, every
link's ω and α, every slide's sliding rates and each acceleration component, in SI at full
precision (repr of each double), whatever units the window shows; units are in the headings."""

from __future__ import annotations

import csv
import io
import math

from kinematics import acceleration_components
from kinematics.files.storage import write_atomically

HEADINGS = ("row", "vx [m/s]", "vy [m/s]", "|v| [m/s]", "ax [m/s^2]", "ay [m/s^2]", "|a| [m/s^2]",
            "omega [rad/s]", "alpha [rad/s^2]", "sliding velocity [m/s]", "sliding acceleration [m/s^2]")


def _row(title: str, **cells) -> list:
    """One line: ``title`` then the cells named by HEADINGS' keys, empty where a row has none."""
    keys = ("vx", "vy", "v", "ax", "ay", "a", "omega", "alpha", "slide_v", "slide_a")
    return [title] + [repr(float(cells[k])) if k in cells else "" for k in keys]


def results_csv(solution, construction) -> str:
    """The table of ``solution`` (and the components of ``construction``, when there is one)."""
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow(HEADINGS)
    mech = solution.mechanism
    for name in mech.points:
        (vx, vy), (ax, ay) = solution.velocity(name).tolist(), solution.acceleration(name).tolist()
        writer.writerow(_row(f"point {name}", vx=vx, vy=vy, v=math.hypot(vx, vy), ax=ax, ay=ay,
                             a=math.hypot(ax, ay)))
    for name in mech.links:
        writer.writerow(_row(f"link {name}", omega=solution.angular_velocity[name],
                             alpha=solution.angular_acceleration[name]))
    for name in mech.slides:
        writer.writerow(_row(f"slide {name}", slide_v=solution.sliding_velocity[name],
                             slide_a=solution.sliding_acceleration[name]))
    for component in acceleration_components(construction) if construction is not None else ():
        ax, ay = component.vector
        writer.writerow(_row(component.title, ax=ax, ay=ay, a=math.hypot(ax, ay)))
    return out.getvalue()


def export_table(window, path) -> bool:
    """Write the window's pose as CSV to ``path`` (whole or not at all); False when there is none."""
    doc = window.document
    if doc.solution is None:
        window.say(f"no results to export yet: {doc.analysis.problem}")
        return False
    try:
        write_atomically(path, results_csv(doc.solution, doc.construction))
    except OSError as error:
        window.show_error("Cannot export the table", f"{path}:\n{error}")
        return False
    window.say(f"results table written to {path}")
    return True
