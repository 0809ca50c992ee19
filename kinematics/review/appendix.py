"""The report's appendix: the mechanism's data as tables, in the file's units,
so the report stands alone."""

from __future__ import annotations

import math

from ..drawing.pages import Heading, Paragraph, Table, paginate
from ..model.mechanism import GROUND
from .base import Progress, Review, Section
from .front import angle_words, driver_words


def _number(value: float) -> str:
    return f"{float(value):.6g}"


def _lengths(mech, names) -> str:
    """Distances between each pair of a link's points, in the file's unit."""
    pairs = [(p, q) for i, p in enumerate(names) for q in names[i + 1:]]
    return ", ".join(f"{p}{q} {math.dist(mech.points[p], mech.points[q]):.6g}" for p, q in pairs)


def _shown(unit: str) -> str:
    """A file's unit as people write it: kg*mm^2 -> kg·mm², m/s^2 -> m/s²."""
    return unit.replace("*", "·").replace("^2", "²")


def _mass_blocks(data, unit: str) -> list:
    """Masses, point masses, loads and gravity as the file states them (units beside each value)."""
    blocks = [Heading("Masses and loads", 2)]
    if data.masses:
        blocks.append(Table(("link", "mass", f"centre [{unit}]", "inertia about the centre"),
                            tuple((m.link, f"{_number(m.mass_value)} {_shown(m.mass_unit)}",
                                   f"({_number(m.centre[0])}, {_number(m.centre[1])})",
                                   f"{_number(m.inertia_value)} {_shown(m.inertia_unit)}")
                                  for m in data.masses.values())))
    if data.point_masses:
        blocks.append(Table(("point", "mass"), tuple((m.point, f"{_number(m.value)} {_shown(m.unit)}")
                                                     for m in data.point_masses.values())))
    if data.loads:
        rows = []
        for load in data.loads.values():
            if load.force_value is not None:
                fx, fy = load.force_value
                what = f"force ({_number(fx)}, {_number(fy)}) {_shown(load.force_unit)}"
                where = f"point {load.point}" + (f" on {load.link}" if load.link else "")
            else:
                what, where = f"torque {_number(load.torque_value)} {_shown(load.torque_unit)}", f"link {load.link}"
            acting = (f"driver angle {_number(load.over_deg[0])}° to {_number(load.over_deg[1])}°"
                      if load.over_deg else "always")
            rows.append((load.name, what, where, acting))
        blocks.append(Table(("load", "what", "on", "acts"), tuple(rows)))
    gravity = (f"({_number(data.gravity_value[0])}, {_number(data.gravity_value[1])}) {_shown(data.gravity_unit)}"
               if data.gravity_value is not None else "none (a horizontal machine)")
    blocks.append(Paragraph(f"Gravity: {gravity}. Frictionless joints."))
    return blocks


def appendix_section(review: Review, progress: Progress) -> Section:
    """Points, links, slides, driver and output, analysis angles and notes."""
    mech = review.mechanism
    unit = mech.length_unit
    points = Table(("point", f"x [{unit}]", f"y [{unit}]", "fixed", "on bodies"),
                   tuple((name, _number(x), _number(y), "yes" if name in mech.ground else "",
                          ", ".join(b for b in mech.bodies_of(name) if b != GROUND))
                         for name, (x, y) in mech.points.items()),
                   ("left", "right", "right", "left", "left"))
    links = Table(("link", "points", f"distances [{unit}]"),
                  tuple((name, " ".join(names), _lengths(mech, names)) for name, names in mech.links.items()))
    blocks = [Heading("Appendix: the mechanism's data"),
              Paragraph(f"As the file {review.file_name or '(not saved)'} states it (fingerprint "
                        f"{review.fingerprint}), lengths in {unit}, the reference pose."),
              Heading("Points", 2), points, Heading("Links", 2), links]
    if mech.slides:
        blocks += [Heading("Slides", 2),
                   Table(("slide", "point", "guide", "line through"),
                         tuple((s.name, s.point, s.guide, " ".join(s.line)) for s in mech.slides.values()))]
    if mech.mass_data is not None:
        blocks += _mass_blocks(mech.mass_data, unit)
    output = " ".join(f"{k} {v}" for k, v in mech.output.items()) if mech.output else "none named"
    blocks += [Heading("Driver, output and analysis", 2),
               Table(("item", "value"), (("driver", driver_words(mech)), ("output", output),
                                         ("analysis angles", angle_words(review)),
                                         ("cycle", f"{review.steps:,} poses")))]
    if mech.notes:
        blocks += [Heading("Notes in the file", 2), Paragraph(mech.notes)]
    progress.check(1.0)
    return Section("Appendix: mechanism data", tuple(paginate(blocks, review.paper, review.title)))
