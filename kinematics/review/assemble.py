"""The design-review report's assembly: which pages, in which order, from which
core objects. Pure: it returns Sheets and an outline; ``app`` paints them.

The report is a sequence of sections, each made by one builder of
:data:`SECTION_BUILDERS`. That tuple is the one place a new kind of page plugs
in (see its comment).
"""

from __future__ import annotations

import datetime
from collections.abc import Callable

from ..drawing.pages import furnish, paper_size
from ..model.mechanism import Mechanism
from ..solver.mobility import require_ready
from .appendix import appendix_section
from .base import OutlineEntry, Progress, Report, Review, SectionBuilder, fingerprint
from .cycle import cycle_section
from .forces import forces_section
from .front import checks_section, cover_section
from .poses import poses_section

# The report's sections, in order; a builder returning None leaves its section out (the force pages
# of a file without mass data).
SECTION_BUILDERS = (
    SectionBuilder("cover", cover_section, 1.0),
    SectionBuilder("checks", checks_section, 2.0),
    SectionBuilder("analysis angles", poses_section, 3.0),
    SectionBuilder("cycle", cycle_section, 4.0),
    SectionBuilder("forces", forces_section, 3.0),
    SectionBuilder("appendix", appendix_section, 0.5),
)


def _parse_angles(mechanism: Mechanism, angles_deg) -> tuple:
    chosen = tuple(angles_deg) if angles_deg else tuple(mechanism.analysis_angles_deg)
    return tuple(float(a) for a in chosen) or (None,)


def build_report(mechanism: Mechanism, source: bytes, file_name: str = "", paper: str = "A4", steps: int = 3600,
                 angles_deg=None, date: str | None = None, progress: Callable | None = None,
                 sections: tuple = SECTION_BUILDERS) -> Report:
    """The design-review report of ``mechanism``.

    Parameters
    ----------
    mechanism : the design, as loaded from ``source`` (the file's bytes, for its fingerprint).
    file_name : as printed on every page.
    paper : ISO 216 size of every page ("A4", "A3").
    steps : poses of the cycle's sweep.
    angles_deg : analysis angles (default: the file's ``analysis_angles_deg``, else the reference pose).
    date : ISO 8601 (default today).
    progress : called with the fraction done (0 to 1); returning False stops the report.
    sections : the section builders, in order (default :data:`SECTION_BUILDERS`).

    Raises
    ------
    MechanismFindings
        for a design that cannot be analysed (no driver, mobility other than 1 ...).
    SweepCancelled
        when ``progress`` asked to stop.
    """
    paper_size(paper)
    require_ready(mechanism)
    review = Review(mechanism=mechanism, file_name=file_name, fingerprint=fingerprint(source), paper=paper,
                    steps=steps, angles_deg=_parse_angles(mechanism, angles_deg),
                    date=date or datetime.date.today().isoformat())
    whole = Progress(progress)
    total = sum(b.weight for b in sections)
    done, built = 0.0, []
    for builder in sections:
        share = whole.share(done / total, (done + builder.weight) / total)
        share.check(0.0)
        section = builder.build(review, share)
        share.check(1.0)
        done += builder.weight
        if section is not None:
            built.append(section)
    sheets, outline = [], []
    for section in built:
        first = len(sheets)
        outline.append(OutlineEntry(section.title, first,
                                    tuple(OutlineEntry(title, first + offset) for title, offset in section.entries)))
        sheets.extend(section.pages)
    header_right = f"{file_name + ' · ' if file_name else ''}SHA-256 {review.fingerprint}"
    footer_left = f"Kinepoly design review · {review.date}"
    furnished = tuple(furnish(sheet, review.title, header_right, footer_left, i + 1, len(sheets))
                      for i, sheet in enumerate(sheets))
    subject = (f"Design review of {file_name or review.title}: checks, constructions at the analysis angles, "
               f"the cycle in {steps:,} steps, {'the forces, ' if any(s.title == 'Forces' for s in built) else ''}"
               "the mechanism's data")
    return Report(title=f"{review.title}: design review", subject=subject, fingerprint=review.fingerprint,
                  sheets=furnished, outline=tuple(outline))
