"""The report's analysis angles: at each, the construction sheet exactly as
``kinepoly print`` draws it, then its steps in words with the cross-check; an
angle where the linkage cannot assemble gets a page that says so."""

from __future__ import annotations

from .. import construct, solve
from ..drawing.layout import draw_sheet
from ..drawing.pages import Heading, Paragraph, Preformatted, paginate
from ..errors import CannotAssemble, ParallelLines
from ..model.units import angle_text
from ..reports.text import construction_text
from .base import Progress, Review, Section


def angle_title(angle_deg, solution=None) -> str:
    """The outline's words for an analysis angle (None: the reference pose)."""
    if angle_deg is None:
        return "reference pose" if solution is None else f"reference pose, θ = {angle_text(solution.driver_angle_deg)}"
    return f"θ = {angle_deg:g}°"


def poses_section(review: Review, progress: Progress) -> Section:
    """One sheet and its steps per analysis angle, outline entries per angle."""
    pages, entries = [], []
    count = len(review.angles_deg)
    for i, angle in enumerate(review.angles_deg):
        offset = len(pages)
        try:
            construction = construct(solve(review.mechanism, angle))
        except (CannotAssemble, ParallelLines) as err:
            name = angle_title(angle)
            pages += paginate([Heading(f"Driver angle {name}: no construction"),
                               Paragraph(f"The linkage has no construction at this driver angle: {err.detail}."),
                               Paragraph("The other analysis angles and the cycle are reported as usual; the checks "
                                         "page gives the driver's range and its dead points.")],
                              review.paper, review.title)
        else:
            name = angle_title(angle, construction.solution)
            # A page of the report (its running header numbers the pages): no sheet number of its own.
            pages.append(draw_sheet(construction, paper=review.paper, file_name=review.file_name, date=review.date,
                                    sheet=""))
            pages += paginate([Heading(f"Construction at {name}: the steps in words"),
                               Preformatted(tuple(construction_text(construction).splitlines()))],
                              review.paper, review.title)
        entries.append((name, offset))
        progress.check((i + 1) / count)
    return Section("Construction at the analysis angles", tuple(pages), tuple(entries))
