"""Qt renderings of the shared visual language in :mod:`kinematics.drawing.style`:
pens, fonts sized by their capitals, for the window's scenes and the printer.
"""

from __future__ import annotations

from functools import cache

from PySide6.QtCore import Qt
from PySide6.QtGui import QColor, QFont, QFontMetricsF, QPen

from kinematics.drawing.style import Pen

# Screen pixels per drawing millimetre of line weight at 96 dpi; pens are cosmetic so
# a line keeps its weight at any zoom (a 0.5 mm pen draws about 2 px wide).
PIXELS_PER_WEIGHT_MM = 96.0 / 25.4
DASHES = {"solid": Qt.PenStyle.SolidLine, "dashed": Qt.PenStyle.DashLine, "dotted": Qt.PenStyle.DotLine,
          "dashdot": Qt.PenStyle.DashDotLine}
FONT_FAMILY = "DejaVu Sans"  # Debian fonts-dejavu-core: has ω α ° ² ′ and subscripts
MONO_FAMILY = "DejaVu Sans Mono"  # the same package's fixed-pitch face, for text in character columns
LABEL_PIXELS = 13


def qpen(pen: Pen, scale: float = 1.0) -> QPen:
    """A cosmetic QPen for a style Pen; ``scale`` thickens it (highlighting)."""
    result = QPen(QColor(pen.colour))
    result.setCosmetic(True)
    result.setWidthF(max(1.0, pen.weight_mm * PIXELS_PER_WEIGHT_MM * scale))
    result.setStyle(DASHES[pen.dash])
    result.setCapStyle(Qt.PenCapStyle.FlatCap)
    return result


def label_font(pixels: int = LABEL_PIXELS, bold: bool = False) -> QFont:
    font = QFont(FONT_FAMILY)
    font.setPixelSize(pixels)
    font.setBold(bold)
    return font


@cache
def _capital_ratio(family: str) -> float:
    probe = QFont(family)
    probe.setPixelSize(1000)
    # A font without a cap-height entry reports 0; 0.73 em is typical of sans faces.  # common practice
    return QFontMetricsF(probe).capHeight() / 1000.0 or 0.73


@cache
def font_for_capitals(pixels: int, family: str = FONT_FAMILY) -> tuple:
    """A font of ``family`` whose capitals are ``pixels`` device pixels tall, and its metrics (the
    sheet gives text heights as capital heights, ISO 3098 h)."""
    font = QFont(family)
    font.setPixelSize(max(1, round(pixels / _capital_ratio(family))))
    return font, QFontMetricsF(font)
