"""DXF export: the model drawing (space diagram at true size in millimetres,
both polygons beside it at round scales) replayed into an ezdxf document.

One layer per pen of :mod:`kinematics.drawing.style`, with the pen's true colour,
ISO 128 weight and line type; entities take everything BYLAYER so a CAD user
can restyle a role at once. Units are millimetres ($INSUNITS 4, metric
$MEASUREMENT); the Standard dimension style is given millimetre settings
rather than ezdxf's setup defaults.
"""

from __future__ import annotations

import ezdxf
from ezdxf import bbox
from ezdxf.enums import TextEntityAlignment

from ..files.storage import replace_atomically
from . import Arrow, Circle, Hatch, Line, Note, Polyline, Strokes, Text, draw_model
from .sheet import DASHES

DXF_VERSION = "R2013"  # UTF-8 text (ω, α, ², ′) and true colour on layers
INSUNITS_MILLIMETRES = 4
APP_ID = "KINEPOLY"  # extended data naming the construction step or part an entity draws
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


def _linetype(doc, pen) -> str:
    """The layer's line type: the ISO 128 pattern in mm for this pen's width."""
    if pen.dash not in DASHES:
        return "Continuous"
    name = f"{pen.dash.upper()}-{round(pen.weight_mm * 100):03d}"
    if name not in doc.linetypes:
        lengths = [value * pen.weight_mm for value in DASHES[pen.dash]]
        pattern = [sum(lengths)] + [v if i % 2 == 0 else -v for i, v in enumerate(lengths)]
        doc.linetypes.add(name, pattern=pattern, description=f"ISO 128 {pen.dash}, for {pen.weight_mm} mm lines")
    return name


def _layer(doc, pen) -> str:
    if pen.layer not in doc.layers:
        layer = doc.layers.add(pen.layer)
        layer.rgb = tuple(int(pen.colour[i:i + 2], 16) for i in (1, 3, 5))
        layer.dxf.lineweight = round(pen.weight_mm * 100)  # DXF line weights are in 1/100 mm
        layer.dxf.linetype = _linetype(doc, pen)
        layer.description = pen.legend
    return pen.layer


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
    return doc


def _solid(msp, points, attribs):
    hatch = msp.add_hatch(dxfattribs=attribs)
    hatch.paths.add_polyline_path([tuple(p) for p in points], is_closed=True)
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
        _tag(_add(msp, {"layer": _layer(doc, primitive.pen)}, primitive), primitive)


def _add(msp, attribs, primitive) -> list:
    """The entities drawing one primitive."""
    if isinstance(primitive, Line):
        return [msp.add_line(primitive.start, primitive.end, dxfattribs=attribs)]
    if isinstance(primitive, Strokes):
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
            entities.append(msp.add_hatch(dxfattribs=attribs))
            entities[-1].paths.add_edge_path().add_arc(primitive.centre, primitive.radius, 0.0, 360.0)
        return entities
    if isinstance(primitive, Text):
        text = msp.add_text(primitive.text, height=primitive.height, dxfattribs=attribs)
        text.set_placement(primitive.position, align=ALIGNMENTS[(primitive.align, primitive.anchor)])
        return [text]
    if isinstance(primitive, Note):
        return [msp.add_mtext(_mtext(primitive.lines), dxfattribs={
            **attribs, "insert": primitive.position, "char_height": primitive.height, "attachment_point": 1,
            "line_spacing_factor": primitive.pitch / (MTEXT_PITCH * primitive.height)})]
    raise TypeError(f"no DXF entity for {type(primitive).__name__}")


def _frame_view(doc) -> None:
    """Extents in the header and the opening view on the whole drawing."""
    extents = bbox.extents(doc.modelspace())
    if extents.has_data:
        doc.header["$EXTMIN"] = extents.extmin
        doc.header["$EXTMAX"] = extents.extmax
        doc.set_modelspace_vport(height=1.1 * extents.size.y, center=extents.center)


def write_dxf(construction, path, file_name: str = "", date: str | None = None, forces=None):
    """Write the model drawing of ``construction`` to ``path`` as DXF.

    The space diagram is at true size in millimetres with the mechanism
    file's origin; the velocity and acceleration polygons stand to its right
    at the scales their scale bars state; ``forces`` (a ForcePolygon of the same pose), if given,
    stands beyond them on its own FORCE-… layers. The file is written beside the
    target and moved into place, so a failure leaves no partial file.
    Returns the Sheet written. Raises
    :class:`kinematics.files.storage.StorageError` when it cannot be written.
    """
    sheet = draw_model(construction, file_name=file_name, date=date, forces=forces)
    doc = new_document()
    replay(sheet, doc)
    _frame_view(doc)
    replace_atomically(path, lambda temporary: doc.saveas(temporary))
    return sheet

