"""Pages of a bound document as Sheets: the body area every page shares, the
running header and footer, and text and tables laid out and broken over as
many pages as they need.

>>> sheets = paginate([Heading("Data"), Paragraph("One short paragraph.")], "A4")
>>> len(sheets), sheets[0].width
(1, 210.0)
"""

from __future__ import annotations

import textwrap
from dataclasses import dataclass, replace

from .annotate import text_width
from .layout import MARGIN, MARGIN_FILING, PAPER
from .sheet import Line, Recorder, Ref, Sheet, Text
from .style import ANNOTATION

BODY_TEXT, SMALL_TEXT, HEADING_TEXT = 2.5, 1.8, 3.5  # ISO 3098 capital heights, mm
MONO_TEXT = 1.8
# DejaVu Sans Mono advances 0.602 em a character, its capitals are 0.729 em tall.  # from memory
MONO_WIDTH_PER_HEIGHT = 0.602 / 0.729
PITCH = 1.7  # line pitch over capital height
SUBHEADING_TEXT = 3.0
# Prose wraps at the measured average advance of DejaVu Sans (0.70 of the capital height, see
# annotate.WIDTH_PER_HEIGHT) plus a little, so lines fill the body without running past it.
PROSE_WIDTH_PER_HEIGHT = 0.72
# The running header and footer sit in the frame margins, clear of a drawing sheet's frame.
RUNNING_TEXT = 1.8
BODY_TOP_GAP = 8.0  # from the top margin to the body, room for the header rule


@dataclass(frozen=True)
class Heading:
    """A heading; level 2 is a sub-heading, smaller."""

    text: str
    level: int = 1


@dataclass(frozen=True)
class Definitions:
    """(term, text) pairs: the term in a left column, the text wrapped beside it."""

    pairs: tuple
    term_width_mm: float = 48.0


@dataclass(frozen=True)
class Paragraph:
    """Prose wrapped at spaces to the body width."""

    text: str


@dataclass(frozen=True)
class Preformatted:
    """Lines laid out in character columns (a fixed-pitch face); a line too long for the
    page wraps, its continuation indented under the text it continues."""

    lines: tuple


@dataclass(frozen=True)
class Table:
    """Rows of cells under a header row; ``align`` gives each column "left" or "right".
    A table broken over pages repeats its header."""

    header: tuple
    rows: tuple
    align: tuple = ()


@dataclass(frozen=True)
class Gap:
    """Empty room of ``mm`` between two blocks of a report page."""

    mm: float = 3.0


def paper_size(paper: str) -> tuple:
    """(width, height) in mm of an ISO 216 paper size by name ("A0" to "A4"), portrait."""
    if paper not in PAPER:
        raise ValueError(f"paper {paper!r}: choose one of {', '.join(PAPER)}")
    return PAPER[paper]


def body_box(paper: str) -> tuple:
    """(x0, y0, x1, y1) of the body of a page, mm: inside the filing and frame margins, below
    the running header and above the footer."""
    width, height = paper_size(paper)
    return (MARGIN_FILING, MARGIN + 6.0, width - MARGIN, height - MARGIN - BODY_TOP_GAP)


def furnish(sheet: Sheet, header_left: str, header_right: str, footer_left: str, number: int, count: int) -> Sheet:
    """``sheet`` with the running header (title, fingerprint) and footer (``footer_left``,
    "page n of N") added in its margins."""
    width, height = sheet.width, sheet.height
    x0, x1 = MARGIN_FILING, width - MARGIN
    head, foot = height - 0.5 * MARGIN - 0.5 * RUNNING_TEXT, 0.5 * MARGIN - 0.5 * RUNNING_TEXT
    ids = {"ref": Ref("running header")}
    extra = (Text(position=(x0, head), text=header_left, height=RUNNING_TEXT, pen=ANNOTATION, **ids),
             Text(position=(x1, head), text=header_right, height=RUNNING_TEXT, pen=ANNOTATION, align="right", **ids),
             Text(position=(x0, foot), text=footer_left, height=RUNNING_TEXT, pen=ANNOTATION, **ids),
             Text(position=(x1, foot), text=f"page {number} of {count}", height=RUNNING_TEXT, pen=ANNOTATION,
                  align="right", **ids))
    return replace(sheet, primitives=sheet.primitives + extra)


class _Pages:
    """The pages being filled, top down; ``room(h)`` starts a new page when ``h`` mm do not fit."""

    def __init__(self, paper: str, title: str):
        self.paper, self.title = paper, title
        self.x0, self.y0, self.x1, self.y1 = body_box(paper)
        self.sheets, self.rec, self.y = [], None, self.y1
        self._new()

    def _new(self):
        if self.rec is not None:
            self.sheets.append(self.rec.sheet(*paper_size(self.paper), title=self.title))
        self.rec, self.y = Recorder(), self.y1

    def room(self, needed: float) -> bool:
        """Make room for ``needed`` mm; True when that took a new page."""
        if self.y - needed < self.y0 and self.y < self.y1:
            self._new()
            return True
        return False

    def line(self, text: str, height: float, x: float | None = None, mono: bool = False, align: str = "left"):
        self.room(PITCH * height)
        self.y -= PITCH * height
        self.rec.add(Text(position=(self.x0 if x is None else x, self.y), text=text, height=height,
                          pen=ANNOTATION, mono=mono, align=align, ref=Ref("text")))

    def finish(self) -> list:
        if self.rec.primitives or not self.sheets:
            self._new()
        return self.sheets


def _prose(text: str, width: float) -> list:
    # Never broken at a hyphen: "Gruebler-Kutzbach" stays one word.
    return textwrap.wrap(text, width=max(10, int(width / (BODY_TEXT * PROSE_WIDTH_PER_HEIGHT))),
                         break_on_hyphens=False) or [""]


def _wrap_preformatted(line: str, columns: int) -> list:
    indent = len(line) - len(line.lstrip()) + 2
    return textwrap.wrap(line, width=columns, subsequent_indent=" " * min(indent, columns // 3),
                         drop_whitespace=False, replace_whitespace=False) or [""]


def _table(pages: _Pages, table: Table) -> None:
    columns = len(table.header)
    align = table.align or ("left",) * columns
    widths = [max(text_width(str(row[c]), BODY_TEXT * 0.8) for row in (table.header, *table.rows)) + 4.0
              for c in range(columns)]
    share = min(1.0, (pages.x1 - pages.x0) / sum(widths))
    lefts = [pages.x0 + sum(widths[:c]) * share for c in range(columns)]
    height = 0.8 * BODY_TEXT

    def row(cells, header=False):
        pages.room(PITCH * height)
        pages.y -= PITCH * height
        for c, cell in enumerate(cells):
            x = lefts[c] if align[c] == "left" else lefts[c] + widths[c] * share - 4.0
            pages.rec.add(Text(position=(x, pages.y), text=str(cell), height=height, pen=ANNOTATION, align=align[c],
                               ref=Ref("table header" if header else "table")))
        if header:
            rule = pages.y - 0.5 * height
            pages.rec.add(Line(start=(pages.x0, rule), end=(lefts[-1] + widths[-1] * share, rule), pen=ANNOTATION,
                               ref=Ref("table header")))
            pages.y -= 0.4 * height

    row(table.header, header=True)
    for cells in table.rows:
        if pages.room(PITCH * height):
            row(table.header, header=True)
        row(cells)


def paginate(blocks, paper: str, title: str = "") -> list:
    """The ``blocks`` (Heading, Paragraph, Definitions, Preformatted, Table, Gap) laid out over pages of
    ``paper``; returns the Sheets, without running header and footer (see :func:`furnish`)."""
    pages = _Pages(paper, title)
    width = pages.x1 - pages.x0
    for block in blocks:
        if isinstance(block, Heading):
            height = HEADING_TEXT if block.level == 1 else SUBHEADING_TEXT
            pages.room(PITCH * height + 4 * PITCH * BODY_TEXT)  # never a heading alone at a page's foot
            if pages.y < pages.y1:
                pages.y -= 0.6 * PITCH * height
            pages.line(block.text, height)
            pages.y -= 0.3 * PITCH * BODY_TEXT
        elif isinstance(block, Paragraph):
            for text in _prose(block.text, width):
                pages.line(text, BODY_TEXT)
            pages.y -= 0.5 * PITCH * BODY_TEXT
        elif isinstance(block, Definitions):
            for term, text in block.pairs:
                lines = _prose(text, width - block.term_width_mm)
                pages.room(PITCH * BODY_TEXT * min(len(lines), 3))
                pages.line(term, BODY_TEXT)
                if len(term) * BODY_TEXT * PROSE_WIDTH_PER_HEIGHT < block.term_width_mm - 2.0:
                    pages.y += PITCH * BODY_TEXT  # the text starts beside a short term, under a long one
                for line in lines:
                    pages.line(line, BODY_TEXT, x=pages.x0 + block.term_width_mm)
                pages.y -= 0.4 * PITCH * BODY_TEXT
        elif isinstance(block, Preformatted):
            columns = int(width / (MONO_TEXT * MONO_WIDTH_PER_HEIGHT))
            for line in block.lines:
                for text in _wrap_preformatted(line.rstrip(), columns):
                    pages.line(text, MONO_TEXT, mono=True)
        elif isinstance(block, Table):
            _table(pages, block)
            pages.y -= 0.6 * PITCH * BODY_TEXT
        elif isinstance(block, Gap):
            pages.y -= block.mm
        else:
            raise TypeError(f"no way to lay out {type(block).__name__}")
    return pages.finish()
