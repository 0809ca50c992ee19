"""The report's front: the cover (what was analysed, a small drawing, the caution)
and the checks page (the sentences ``kinepoly check`` prints)."""

from __future__ import annotations

import textwrap

from ..drawing.annotate import WIDTH_PER_HEIGHT, outline_box, scale_bar, scale_bar_height
from ..drawing.layout import space_view
from ..drawing.pages import (
    BODY_TEXT,
    HEADING_TEXT,
    PITCH,
    PROSE_WIDTH_PER_HEIGHT,
    Definitions,
    Heading,
    Paragraph,
    body_box,
    paginate,
    paper_size,
)
from ..drawing.sheet import FRAME, Recorder, Ref, Text
from ..drawing.space import draw_space
from ..drawing.style import ANNOTATION
from ..drawing.symbols import Symbols
from ..model.units import angle_text
from ..reports.caution import CAUTION
from ..reports.check_text import check_sentences
from ..reports.text import sense
from ..solver.solve import solve_pose
from .base import Progress, Review, Section

TITLE_TEXT = 7.0  # ISO 3098 capital height of the cover's title, mm

# The caution in full words, after the short form every output carries.
CAUTION_IN_WORDS = (
    "What this report is: the rigid-body kinematics of the linkage as drawn, with links taken as perfectly rigid, "
    "joints without clearance and the driver at the speed stated. Forces, where a report shows them, are "
    "frictionless. What it is not: there is no strength, stiffness, wear or fatigue check of any part. Before the "
    "design is built, a competent engineer checks these results; guarding and the machine's design follow the "
    "local codes and licensed practice."
)


def driver_words(mech) -> str:
    """The driver, its speed in the file's unit and in rad/s, and its angular acceleration."""
    d = mech.driver
    return (f"{d.link} about {d.pivot}, {d.speed_value:g} {d.speed_unit} ({d.speed_rad_s:.4g} rad/s, "
            f"{sense(d.speed_rad_s)}); angular acceleration {d.angular_acceleration_rad_s2:.4g} rad/s²")


def angle_words(review: Review) -> str:
    """The analysis angles in words ("30°, 150°"), or "the reference pose"."""
    angles = [a for a in review.angles_deg if a is not None]
    return ", ".join(f"{a:g}°" for a in angles) if angles else "the reference pose"


def _lines(text: str, width: float, height: float) -> list:
    return textwrap.wrap(text, width=max(20, int(width / (height * PROSE_WIDTH_PER_HEIGHT))), break_on_hyphens=False)


def _wrapped(rec: Recorder, text: str, x: float, y: float, width: float, height: float) -> float:
    """``text`` wrapped to ``width`` mm from baseline ``y`` down; returns the next baseline."""
    for line in _lines(text, width, height):
        rec.add(Text(position=(x, y), text=line, height=height, pen=ANNOTATION, ref=Ref("cover")))
        y -= PITCH * height
    return y


def cover_section(review: Review, progress: Progress) -> Section:
    """The cover: title, file and fingerprint, date, driver, a drawing of the linkage, the caution."""
    mech = review.mechanism
    x0, y0, x1, y1 = body_box(review.paper)
    width = x1 - x0
    rec = Recorder()
    y = y1 - TITLE_TEXT
    rec.add(Text(position=(x0, y), text="Design review", height=HEADING_TEXT, pen=ANNOTATION, ref=Ref("cover")))
    y -= 1.2 * TITLE_TEXT + PITCH * HEADING_TEXT
    for line in textwrap.wrap(review.title, width=max(10, int(width / (TITLE_TEXT * WIDTH_PER_HEIGHT)))):
        rec.add(Text(position=(x0, y), text=line, height=TITLE_TEXT, pen=ANNOTATION, ref=Ref("cover")))
        y -= 1.5 * TITLE_TEXT
    y -= 0.5 * TITLE_TEXT
    facts = (("File", review.file_name or "(not saved to a file)"),
             ("Fingerprint", f"SHA-256 of the file begins {review.fingerprint}"),
             ("Date", review.date), ("Driver", driver_words(mech)),
             ("Output", " ".join(f"{k} {v}" for k, v in mech.output.items()) if mech.output else "none named"),
             ("Analysis angles", angle_words(review)),
             ("Cycle", f"one driver turn (or its range) in {review.steps:,} poses"))
    label_width = 32.0
    for label, text in facts:
        rec.add(Text(position=(x0, y), text=label, height=BODY_TEXT, pen=ANNOTATION, ref=Ref("cover")))
        y = _wrapped(rec, text, x0 + label_width, y, width - label_width, BODY_TEXT) - 0.4 * PITCH * BODY_TEXT
    caution_lines = sum(len(_lines(text, width - 8, BODY_TEXT)) for text in (CAUTION, CAUTION_IN_WORDS))
    caution_top = y0 + PITCH * BODY_TEXT * (caution_lines + 1.5)
    size = Symbols()
    drawing_box = (x0 + 8, caution_top + 6 + scale_bar_height(size) + 6, x1 - 8, y - 8)
    solution = solve_pose(mech, None)
    if drawing_box[3] - drawing_box[1] > 30:
        view = space_view(solution, drawing_box)
        rec.add_view(view)
        draw_space(rec, solution, view, size)
        scale_bar(rec, (x0 + 8, caution_top + 6 + 1.2 * size.text), view.mm_per_unit / 1000.0, "mm", 50.0,
                  f"Space diagram {view.scale_text}, reference pose θ = {angle_text(solution.driver_angle_deg)}", size,
                  "space")
    outline_box(rec, x0, y0, x1, caution_top, FRAME, ref=Ref("caution"))
    y = _wrapped(rec, CAUTION, x0 + 4, caution_top - PITCH * BODY_TEXT, width - 8, BODY_TEXT)
    _wrapped(rec, CAUTION_IN_WORDS, x0 + 4, y - 0.5 * PITCH * BODY_TEXT, width - 8, BODY_TEXT)
    progress.check(1.0)
    return Section("Cover", (rec.sheet(*paper_size(review.paper), title=review.title),))


def _term(line: str) -> tuple:
    """("transmission angle coupler/rocker at B", "62.39° to …") from one check's sentence."""
    term, _, rest = line.partition(": ")
    return (term, rest) if rest else ("", line)


def checks_section(review: Review, progress: Progress) -> Section:
    """The checks as ``kinepoly check`` words them (one function makes both)."""
    checks = check_sentences(review.mechanism)
    blocks = [Heading("Checks"),
              Paragraph("The checks of this design, as kinepoly check reports them for the same file (the cycle's "
                        "checks from a sweep of 3,600 poses of one driver turn)."),
              Definitions(tuple(_term(line) for line in checks.lines))]
    return Section("Checks", tuple(paginate(blocks, review.paper, review.title)))
