"""The design-review report: one document with the checks, the construction at
the analysis angles, the cycle and the mechanism's data, assembled as Sheets
from the core's objects (the front end paints and binds them)."""

from .assemble import SECTION_BUILDERS, build_report
from .base import OutlineEntry, Progress, Report, Review, Section, SectionBuilder, fingerprint

__all__ = ["SECTION_BUILDERS", "OutlineEntry", "Progress", "Report", "Review", "Section", "SectionBuilder",
           "build_report", "fingerprint"]
