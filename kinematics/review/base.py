"""The parts a design-review report is made of: what it is made from (Review),
its sections, its outline and the progress share each builder reports in."""

from __future__ import annotations

import hashlib
from collections.abc import Callable
from dataclasses import dataclass

from ..errors import SweepCancelled
from ..model.mechanism import Mechanism

FINGERPRINT_HEX = 10  # 40 bits of SHA-256: two revisions of one design will not share it by chance


def fingerprint(source: bytes) -> str:
    """The first hex digits of the SHA-256 of the design file's bytes."""
    return hashlib.sha256(source).hexdigest()[:FINGERPRINT_HEX]


@dataclass(frozen=True)
class Review:
    """What a report is made of. ``angles_deg``: the analysis angles (None for the
    reference pose); ``steps``: poses in the cycle's sweep."""

    mechanism: Mechanism
    file_name: str
    fingerprint: str
    paper: str
    steps: int
    angles_deg: tuple
    date: str

    @property
    def title(self) -> str:
        """The design's title, else its file name."""
        return self.mechanism.title or self.file_name or "Untitled mechanism"


@dataclass(frozen=True)
class Section:
    """Pages under one outline entry; ``entries`` are (title, page offset in the section)
    sub-entries (an analysis angle, a plot page)."""

    title: str
    pages: tuple
    entries: tuple = ()


@dataclass(frozen=True)
class OutlineEntry:
    """One bookmark of the report's outline: its title, its page, and the entries under it."""

    title: str
    page: int  # 0-based page index in the report
    children: tuple = ()


@dataclass(frozen=True)
class Report:
    """The assembled report: its pages as recorded sheets, the outline, and the PDF's title and subject."""

    title: str
    subject: str
    fingerprint: str
    sheets: tuple
    outline: tuple


class Progress:
    """A builder's share [begin, end] of the whole report's progress callback.
    Calling it with the fraction of its own work done returns False once the
    user asked to stop; :meth:`check` raises :class:`SweepCancelled` then."""

    def __init__(self, callback: Callable | None, begin: float = 0.0, end: float = 1.0):
        self.callback, self.begin, self.end = callback, begin, end

    def __call__(self, fraction: float) -> bool:
        """Report ``fraction`` (0 to 1) of this share done; False once the user asked to stop."""
        if self.callback is None:
            return True
        return self.callback(self.begin + fraction * (self.end - self.begin)) is not False

    def check(self, fraction: float) -> None:
        """Report ``fraction`` done, and raise :class:`~kinematics.errors.SweepCancelled` if the user asked to stop."""
        if not self(fraction):
            raise SweepCancelled("the review report was cancelled", "report")

    def share(self, begin: float, end: float) -> Progress:
        """The part [begin, end] of this share, for a piece of the work."""
        span = self.end - self.begin
        return Progress(self.callback, self.begin + begin * span, self.begin + end * span)


@dataclass(frozen=True)
class SectionBuilder:
    """``build(review, progress)`` returns a :class:`Section`, or None to leave it out;
    ``weight`` is its share of the progress bar."""

    name: str
    build: Callable
    weight: float
