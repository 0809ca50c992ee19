"""DXF export: the model drawing (space diagram at true size in millimetres,
both polygons beside it at round scales) replayed into an ezdxf document.

One layer per pen of :mod:`kinematics.drawing.style`, with the pen's colour
(nearest ACI and true colour), ISO 128 weight and line type
(:mod:`kinematics.drawing.dxf_styles`); entities take everything BYLAYER so a
CAD user can restyle a role at once. Text is set in a TrueType style that has
every character the drawing writes. Units are millimetres ($INSUNITS 4, metric
$MEASUREMENT); the Standard dimension style is given millimetre settings
rather than ezdxf's setup defaults. The header's extents and the opening view
cover the whole drawing, so it opens fitted.
"""

from __future__ import annotations

import ezdxf
from ezdxf import bbox, zoom
from ezdxf.colors import BYLAYER
from ezdxf.enums import TextEntityAlignment

from ..files.storage import replace_atomically
from . import Arrow, Circle, Hatch, Line, Note, Polyline, Strokes, Text, draw_model
from .dxf_styles import MONO_STYLE, TEXT_STYLE, add_linetypes, add_text_styles, layer, linetype_scale

DXF_VERSION = "R2013"  # UTF-8 text (ω, α, ², ′) and true colour on layers
INSUNITS_MILLIMETRES = 4
# The opening view: the whole drawing with a twentieth to spare round it.
FIT_MARGIN = 1.05
APP_ID = "KINEPOLY"  # extended data naming the construction step or part an entity draws
# The hatch pattern for ground: ANSI31, lines at 45° through the origin 1/8 in apart, which ezdxf
# (as CAD programs do) scales by 25.4 in a metric drawing: 3.175 mm.  # common practice
GROUND_PATTERN, GROUND_PATTERN_ANGLE_DEG, GROUND_PATTERN_SPACING_MM = "ANSI31", 45.0, 3.175
# MTEXT's default line pitch is 5/3 of the text height (DXF reference).  # from memory
MTEXT_PITCH = 5.0 / 3.0
ALIGNMENTS = {
    ("left", "baseline"): TextEntityAlignment.LEFT, ("centre", "baseline"): TextEntityAlignment.CENTER,
    ("right", "baseline"): TextEntityAlignment.RIGHT, ("left", "middle"): TextEntityAlignment.MIDDLE_LEFT,
    ("centre", "middle"): TextEntityAlignment.MIDDLE_CENTER, ("right", "middle"): TextEntityAlignment.MIDDLE_RIGHT,
    ("left", "top"): TextEntityAlignment.TOP_LEFT, ("centre", "top"): TextEntityAlignment.TOP_CENTER,
    ("right", "top"): TextEntityAlignment.TOP_RIGHT,
}
# Millimetre dimension settings (ISO 129 practice: 2.5 mm text and arrows).  # common practice
DIMENSION_MM = {"dimscale": 1.0, "dimlfac": 1.0, "dimtxt": 2.5, "dimasz": 2.5, "dimexe": 1.25, "dimexo": 0.625,
                "dimgap": 0.625, "dimdec": 2, "dimlunit": 2}


def new_document():
    """An empty millimetre DXF document (no ezdxf setup defaults)."""
    doc = ezdxf.new(DXF_VERSION, units=INSUNITS_MILLIMETRES)
    doc.header["$INSUNITS"] = INSUNITS_MILLIMETRES
    doc.header["$MEASUREMENT"] = 1
    doc.header["$LUNITS"] = 2
    doc.header["$LTSCALE"] = 1.0
    standard = doc.dimstyles.get("Standard")
    for key, value in DIMENSION_MM.items():
        standard.set_dxf_attrib(key, value)
        doc.header[f"${key.upper()}"] = value
    add_linetypes(doc)
    add_text_styles(doc)
    return doc


def _solid(msp, points, attribs):
    hatch = msp.add_hatch(color=BYLAYER, dxfattribs=attribs)
    hatch.paths.add_polyline_path([tuple(p) for p in points], is_closed=True)
    return hatch


def _pattern_hatch(msp, pattern, attribs):
    """One HATCH entity for hatching strokes: the general-purpose 45° pattern turned and
    scaled onto the strokes' :class:`~kinematics.drawing.hatching.Pattern`."""
    hatch = msp.add_hatch(color=BYLAYER, dxfattribs=attribs)
    hatch.set_pattern_fill(GROUND_PATTERN, color=BYLAYER, angle=pattern.angle_deg - GROUND_PATTERN_ANGLE_DEG,
                           scale=pattern.spacing_mm / GROUND_PATTERN_SPACING_MM)
    hatch.paths.add_polyline_path(pattern.boundary, is_closed=True)
    return hatch


def _mtext(lines) -> str:
    # Backslash and braces are MTEXT's escapes; lines join with its paragraph code.
    escaped = (line.replace("\\", "\\\\").replace("{", "\\{").replace("}", "\\}") for line in lines)
    return "\\P".join(escaped)


def _tag(entities, primitive) -> None:
    """Extended data: what the entity draws ("step 3", "point B", "link crank", "scale bar velocity")
    and its view."""
    ref = primitive.ref
    tags = [(1000, f"{key} {value}") for key, value in ((ref.kind, ref.name) if ref else ("", ""),
                                                        ("view", primitive.view)) if key and value]
    if tags:
        for entity in entities:
            entity.set_xdata(APP_ID, tags)


def replay(sheet, doc) -> None:
    """Add every primitive of ``sheet`` to the modelspace of ``doc`` (sheet mm = drawing mm)."""
    msp = doc.modelspace()
    if APP_ID not in doc.appids:
        doc.appids.add(APP_ID)
    for primitive in sheet.primitives:
        attribs = {"layer": layer(doc, primitive.pen), "ltscale": linetype_scale(primitive.pen)}
        _tag(_add(msp, attribs, primitive), primitive)


def _add(msp, attribs, primitive) -> list:
    """The entities drawing one primitive."""
    if isinstance(primitive, Line):
        return [msp.add_line(primitive.start, primitive.end, dxfattribs=attribs)]
    if isinstance(primitive, Strokes):
        if primitive.pattern is not None:
            return [_pattern_hatch(msp, primitive.pattern, attribs)]
        ends = primitive.points
        return [msp.add_line(ends[i], ends[i + 1], dxfattribs=attribs) for i in range(0, len(ends) - 1, 2)]
    if isinstance(primitive, Polyline):
        return [msp.add_lwpolyline(primitive.points, close=primitive.closed, dxfattribs=attribs)]
    if isinstance(primitive, Arrow):
        return [msp.add_line(primitive.start, primitive.end, dxfattribs=attribs), _solid(msp, primitive.head, attribs)]
    if isinstance(primitive, Hatch):
        return [_solid(msp, primitive.points, attribs)]
    if isinstance(primitive, Circle):
        entities = [msp.add_circle(primitive.centre, primitive.radius, dxfattribs=attribs)]
        if primitive.filled:
            entities.append(msp.add_hatch(color=BYLAYER, dxfattribs=attribs))
            entities[-1].paths.add_edge_path().add_arc(primitive.centre, primitive.radius, 0.0, 360.0)
        return entities
    if isinstance(primitive, Text):
        style = MONO_STYLE if primitive.mono else TEXT_STYLE
        text = msp.add_text(primitive.text, height=primitive.height, dxfattribs={**attribs, "style": style})
        text.set_placement(primitive.position, align=ALIGNMENTS[(primitive.align, primitive.anchor)])
        return [text]
    if isinstance(primitive, Note):
        return [msp.add_mtext(_mtext(primitive.lines), dxfattribs={
            **attribs, "style": TEXT_STYLE, "insert": primitive.position, "char_height": primitive.height,
            "attachment_point": 1, "line_spacing_factor": primitive.pitch / (MTEXT_PITCH * primitive.height)})]
    raise TypeError(f"no DXF entity for {type(primitive).__name__}")


def _frame_view(doc) -> None:
    """Extents in the header and the opening view on the whole drawing.

    ezdxf writes $EXTMIN/$EXTMAX from the modelspace layout's own extents at
    save (a value put in the header is overwritten), so those are reset.
    """
    msp = doc.modelspace()
    extents = bbox.extents(msp)
    if extents.has_data:
        msp.reset_extents(extents.extmin, extents.extmax)
        doc.header["$LIMMIN"] = extents.extmin.vec2
        doc.header["$LIMMAX"] = extents.extmax.vec2
        zoom.extents(msp, factor=FIT_MARGIN)


def write_dxf(construction, path, file_name: str = "", date: str | None = None, with_centres: bool = False,
              forces=None):
    """Write the model drawing of ``construction`` to ``path`` as DXF.

    The space diagram is at true size in millimetres with the mechanism
    file's origin; the velocity and acceleration polygons stand to its right
    at the scales their scale bars state; ``forces`` (a ForcePolygon of the same pose), if given,
    stands beyond them on its own FORCE-… layers. The file is written beside the
    target and moved into place, so a failure leaves no partial file.
    ``with_centres`` adds the instantaneous centres on the layer CENTRES.
    Returns the Sheet written. Raises
    :class:`kinematics.files.storage.StorageError` when it cannot be written.
    """
    sheet = draw_model(construction, file_name=file_name, date=date, with_centres=with_centres, forces=forces)
    doc = new_document()
    replay(sheet, doc)
    _frame_view(doc)
    replace_atomically(path, lambda temporary: doc.saveas(temporary))
    return sheet

