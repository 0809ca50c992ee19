"""What a DXF drawing office expects besides the geometry: a layer per pen with
its colour (ACI and true colour), ISO 128 line weight and line type, and text
styles whose TrueType fonts hold every character the drawing writes.

A CAD program that shows only the 255 AutoCAD Color Index colours gets the
nearest of them; one that reads true colour gets the pen's own. Line types
are defined once for a 1 mm line, as ISO 128 states its patterns (in
multiples of the line width); each entity's line type scale is its pen's
width, so a 0.25 mm construction line has 3 mm dashes and 0.75 mm gaps.
"""

from __future__ import annotations

from ezdxf.colors import aci2rgb

from .sheet import DASHES

# The plain shape font CAD programs default to lacks ′, ₁, ², ω and α; DejaVu (Debian fonts-dejavu-core)
# has all of them and ships on every Linux desktop.
FONT_FILE = "DejaVuSans.ttf"
MONO_FONT_FILE = "DejaVuSansMono.ttf"
# LibreCAD (2.2) reads no TrueType font: it sets a style's text in the LFF font of the style's *name*,
# and in its "standard" font, which has no ′ or ₁, when there is none. Naming the style after its
# ISO 3098-like technical lettering, which has every character the drawing writes, keeps the text
# whole there; every other CAD program takes the style's TrueType font.
TEXT_STYLE = "OpenGostTypeA-Regular"
MONO_STYLE = "KINEPOLY-MONO"

# Names CAD programs know for these patterns (so one that maps line types by name shows them too),
# with the ISO 128 type each stands for.  # common practice
LINETYPES = {
    "dashed": ("DASHED", "ISO 128 type 02 dashed line (construction lines), for a 1 mm line"),
    "dashdot": ("CENTER", "ISO 128 type 04 long dash dotted line (centre lines), for a 1 mm line"),
    "dotted": ("DOT", "ISO 128 type 07 dotted line (paths of points), for a 1 mm line"),
}
CONTINUOUS = "Continuous"

# ACI 1-255: 0 is BYBLOCK, 256 BYLAYER.
_ACI = {index: aci2rgb(index) for index in range(1, 256)}


def rgb_of(colour: str) -> tuple:
    """(r, g, b) of a "#rrggbb" colour."""
    return tuple(int(colour[i:i + 2], 16) for i in (1, 3, 5))


def nearest_aci(colour: str) -> int:
    """The AutoCAD Color Index colour nearest ``colour`` ("#rrggbb"), by squared RGB distance."""
    r, g, b = rgb_of(colour)
    return min(_ACI, key=lambda i: (_ACI[i][0] - r) ** 2 + (_ACI[i][1] - g) ** 2 + (_ACI[i][2] - b) ** 2)


def add_linetypes(doc) -> None:
    """Every ISO 128 line type of the pens, whether or not this drawing uses it (a CAD user
    drawing on finds centre lines ready)."""
    for dash, (name, description) in LINETYPES.items():
        if name not in doc.linetypes:
            lengths = DASHES[dash]
            # DXF pattern: total length, then dashes positive and gaps negative (the sheet's short
            # dots kept as short dashes, so every output draws the same pattern).
            pattern = [sum(lengths)] + [-v if i % 2 else v for i, v in enumerate(lengths)]
            doc.linetypes.add(name, pattern=pattern, description=description)


def linetype(pen) -> str:
    """The name of the line type of ``pen``'s layer (see :func:`add_linetypes`)."""
    return LINETYPES[pen.dash][0] if pen.dash in DASHES else CONTINUOUS


def linetype_scale(pen) -> float:
    """An entity's line type scale: ISO 128 patterns grow with the line's width."""
    return pen.weight_mm if pen.dash in DASHES else 1.0


def layer(doc, pen) -> str:
    """The layer of ``pen`` (created the first time): its colour, weight, line type and legend."""
    if pen.layer not in doc.layers:
        entry = doc.layers.add(pen.layer)
        entry.color = nearest_aci(pen.colour)
        entry.rgb = rgb_of(pen.colour)
        entry.dxf.lineweight = round(pen.weight_mm * 100)  # DXF line weights are in 1/100 mm
        entry.dxf.linetype = linetype(pen)
        entry.description = pen.legend
    return pen.layer


def add_text_styles(doc) -> None:
    """The proportional and the fixed-pitch TrueType text styles; the proportional one is current."""
    for name, font in ((TEXT_STYLE, FONT_FILE), (MONO_STYLE, MONO_FONT_FILE)):
        if name not in doc.styles:
            doc.styles.add(name, font=font)
    doc.header["$TEXTSTYLE"] = TEXT_STYLE
