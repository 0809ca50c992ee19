"""The DXF as a drawing office opens it: layer colours, weights and line
types, a TrueType text style that holds every character written, extents
and opening view, and the polygons at the scale every other output uses.
Read back with ezdxf's recovering reader."""

import math
import re
from pathlib import Path

import pytest
from ezdxf import bbox, recover
from ezdxf.colors import aci2rgb
from ezdxf.fonts import fonts

import kinematics
from kinematics.drawing import Strokes, Text, draw_sheet, style
from kinematics.drawing.dxf import write_dxf
from kinematics.drawing.dxf_styles import FONT_FILE, MONO_FONT_FILE, TEXT_STYLE, nearest_aci
from kinematics.drawing.hatching import ground_hatch
from kinematics.drawing.sheet import DASHES
from kinematics.model.mechanism import GROUND
from tests.designs import SAMPLE_FILES

PENS = (style.SPACE_LINK, style.SPACE_GROUND, style.SPACE_PATH, style.KNOWN, style.DIRECTION, style.RESULT,
        style.CORIOLIS, style.SLIDING, style.IMAGE, style.NUMERIC, style.FLAGGED, style.ANNOTATION)


def _rgb(colour):
    return tuple(int(colour[i:i + 2], 16) for i in (1, 3, 5))


def _sample(path):
    return kinematics.construct(kinematics.solve(kinematics.load_mechanism(path)))


def _read(path):
    doc, auditor = recover.readfile(path)
    assert not auditor.has_errors, auditor.errors
    return doc


@pytest.fixture(scope="module", params=SAMPLE_FILES, ids=lambda p: p.stem)
def exported(request, tmp_path_factory):
    c = _sample(request.param)
    path = tmp_path_factory.mktemp("dxf") / "drawing.dxf"
    sheet = write_dxf(c, path, file_name=request.param.name, date="2026-05-06")
    return c, sheet, _read(path)


def test_nearest_aci_is_nearest():
    # ACI 1 is pure red and 5 pure blue in the AutoCAD Color Index (ezdxf.colors.aci2rgb is the table).
    assert nearest_aci("#ff0000") == 1 and nearest_aci("#0000ff") == 5
    for pen in PENS:
        r, g, b = _rgb(pen.colour)
        best = min(sum((u - v) ** 2 for u, v in zip(aci2rgb(i), (r, g, b), strict=True)) for i in range(1, 256))
        assert sum((u - v) ** 2 for u, v in zip(aci2rgb(nearest_aci(pen.colour)), (r, g, b), strict=True)) == best


def test_roles_have_their_own_colours():
    # Not every layer colour 7: the pens that draw different roles differ by ACI where their colours differ.
    roles = {pen.colour: nearest_aci(pen.colour) for pen in PENS}
    assert 7 not in roles.values()
    assert len(set(roles.values())) >= len(roles) - 1  # two close greys may share an ACI; true colour tells them


def test_each_layer_carries_its_pens_colour_weight_and_line_type(exported):
    _, sheet, doc = exported
    for pen in {p.pen for p in sheet.primitives}:
        layer = doc.layers.get(pen.layer)
        assert layer.color == nearest_aci(pen.colour), pen.layer
        assert layer.rgb == _rgb(pen.colour), pen.layer
        assert layer.dxf.lineweight == round(100 * pen.weight_mm), pen.layer  # DXF: 1/100 mm
        linetype = doc.linetypes.get(layer.dxf.linetype)
        if pen.dash == "solid":
            assert layer.dxf.linetype == "Continuous"
            continue
        # The ISO 128 pattern for a 1 mm line (DXF pattern: total, dashes +, gaps -), scaled by each
        # entity to its pen's width.
        pattern = linetype.pattern_tags.tags
        lengths = [abs(tag.value) for tag in pattern if tag.code == 49]
        assert lengths == pytest.approx(list(DASHES[pen.dash]), abs=1e-12), pen.layer
        for entity in doc.modelspace().query(f"*[layer=='{pen.layer}']"):
            assert entity.dxf.ltscale == pytest.approx(pen.weight_mm, abs=1e-12)


def test_centre_and_construction_lines_have_line_types(exported):
    _, _, doc = exported
    # ISO 128: 02 dashed for construction lines, 04 long dash dotted for centre lines.  # common practice
    assert "ISO 128 type 02" in doc.linetypes.get(doc.layers.get(style.DIRECTION.layer).dxf.linetype).dxf.description
    assert "DASHED" in doc.linetypes and "CENTER" in doc.linetypes and "DOT" in doc.linetypes
    assert "centre lines" in doc.linetypes.get("CENTER").dxf.description


def test_text_is_in_a_truetype_style_that_has_every_character(exported):
    _, _, doc = exported
    msp = doc.modelspace()
    assert doc.styles.get(TEXT_STYLE).dxf.font == FONT_FILE
    assert doc.header["$TEXTSTYLE"] == TEXT_STYLE
    written = {}
    for entity in msp.query("TEXT MTEXT"):
        text = entity.dxf.text if entity.dxftype() == "TEXT" else entity.plain_text()
        written.setdefault(doc.styles.get(entity.dxf.style).dxf.font, set()).update(text)
    assert set(written) <= {FONT_FILE, MONO_FONT_FILE}
    for font, characters in written.items():
        # The font's own character map (fontTools, through ezdxf's font manager) must hold each one.
        cmap = fonts.font_manager.get_ttf_font(font).getBestCmap()
        missing = sorted(ch for ch in characters - {"\n"} if ord(ch) not in cmap)
        assert not missing, (font, missing)
    assert any(ch in written[FONT_FILE] for ch in "′₁²ωα")


def test_extents_and_opening_view_cover_the_drawing(exported):
    _, _, doc = exported
    msp = doc.modelspace()
    drawn = bbox.extents(msp)
    low, high = doc.header["$EXTMIN"], doc.header["$EXTMAX"]
    assert low[:2] == pytest.approx(tuple(drawn.extmin)[:2], abs=1e-6)
    assert high[:2] == pytest.approx(tuple(drawn.extmax)[:2], abs=1e-6)
    (vport,) = doc.viewports.get("*Active")
    cx, cy = vport.dxf.center.x, vport.dxf.center.y
    assert (cx, cy) == pytest.approx(tuple(drawn.center)[:2], abs=1e-6)
    # The view's height (and width, by its aspect ratio) takes in all the drawing and at most 10 % more.
    height, width = vport.dxf.height, vport.dxf.height * vport.dxf.aspect_ratio
    assert height >= drawn.size.y - 1e-9 and width >= drawn.size.x - 1e-9
    assert min(height / drawn.size.y, width / drawn.size.x) <= 1.1


def test_polygons_at_the_scale_of_the_window_and_the_sheet_stated_by_each_bar(exported):
    c, sheet, doc = exported
    bars = [t.dxf.text for t in doc.modelspace().query(f"TEXT[layer=='{style.ANNOTATION.layer}']")]
    printed = draw_sheet(c, paper="A4").views
    for kind in ("velocity", "acceleration"):
        polygon = getattr(c, kind)
        # The window draws a polygon at polygon.scale_per_mm (app/polygon_scene.py).
        assert sheet.views[kind].mm_per_unit == pytest.approx(1.0 / polygon.scale_per_mm, rel=1e-12)
        # The printed sheet keeps the construction's scale unless the polygon would not fit its A4 area
        # there (the documented fallback to a coarser round scale, stated beside its bar).
        if printed[kind].mm_per_unit != sheet.views[kind].mm_per_unit:
            assert printed[kind].mm_per_unit < sheet.views[kind].mm_per_unit
        else:
            assert printed[kind].scale_text == sheet.views[kind].scale_text
        assert f"{kind.capitalize()} polygon {sheet.views[kind].scale_text}" in bars


def test_every_rotary_sample_polygon_fits_a4_at_the_construction_scale():
    # The rule (one scale per polygon) costs nothing on the smallest paper for the crank-driven samples;
    # the slow cylinder sample's acceleration polygon takes the documented coarser fallback.
    for path in SAMPLE_FILES:
        if path.stem == "crate-tipping-table":
            continue
        c = _sample(path)
        views = draw_sheet(c, paper="A4").views
        for kind in ("velocity", "acceleration"):
            assert math.isclose(views[kind].mm_per_unit, 1.0 / getattr(c, kind).scale_per_mm), (path.stem, kind)


def test_ground_hatching_is_one_patterned_hatch_per_pivot_and_guide(exported):
    c, sheet, doc = exported
    msp = doc.modelspace()
    mech = c.solution.mechanism
    pivots = [n for n in mech.points if GROUND in mech.bodies_of(n) and len(mech.bodies_of(n)) > 1]
    guides = [s for s in mech.slides.values() if s.guide == GROUND]
    hatched = list(msp.query(f"HATCH[layer=='{style.SPACE_GROUND.layer}']"))
    assert len(hatched) == len(pivots) + len(guides) >= 1
    # Left on the ground layer as lines: only each pivot mark's base line and each guide's line.
    assert len(msp.query(f"LINE[layer=='{style.SPACE_GROUND.layer}']")) == len(pivots) + len(guides)
    drawn = [p for p in sheet.primitives if isinstance(p, Strokes) and p.pattern is not None]
    for hatch, primitive in zip(hatched, drawn, strict=True):
        assert hatch.dxf.pattern_name == "ANSI31" and hatch.dxf.solid_fill == 0
        assert hatch.dxf.color == 256  # BYLAYER
        (line,) = hatch.pattern.lines
        pattern = primitive.pattern
        assert line.angle == pytest.approx(pattern.angle_deg, abs=1e-9)
        assert math.hypot(*line.offset) == pytest.approx(pattern.spacing_mm, rel=1e-9)
        # The strokes a painter draws lie on the pattern's lines (through the origin, a spacing apart).
        theta = math.radians(line.angle)
        assert primitive.points
        for x, y in primitive.points:
            across = (y * math.cos(theta) - x * math.sin(theta)) / pattern.spacing_mm
            assert across == pytest.approx(round(across), abs=1e-9)
        (path,) = hatch.paths
        corners = [c for v in path.vertices for c in tuple(v)[:2]]
        assert corners == pytest.approx([c for xy in pattern.boundary for c in xy], abs=1e-9)


LIBRECAD_FONTS = Path("/usr/share/librecad/fonts")


@pytest.mark.skipif(not LIBRECAD_FONTS.is_dir(),
                    reason="LibreCAD not installed (Debian package librecad); the CI image installs it")
def test_librecad_sets_the_text_in_a_font_that_has_every_character(exported):
    # LibreCAD 2.2 sets a style's text in the LFF font named as the style (seen: a style named "cursive"
    # came out in its cursive lettering, whatever font file the style gave). An LFF file lists each glyph
    # under a "[hex code]" line (LibreCAD's font format).
    _, _, doc = exported
    lff = LIBRECAD_FONTS / f"{TEXT_STYLE}.lff"
    codes = {int(code, 16) for code in re.findall(r"^\[#?([0-9A-Fa-f]{4,6})\]", lff.read_text("utf-8"), re.M)}
    written = set()
    for entity in doc.modelspace().query("TEXT MTEXT"):
        written |= set(entity.dxf.text if entity.dxftype() == "TEXT" else entity.plain_text())
    missing = sorted(ch for ch in written - {"\n", " "} if ord(ch) not in codes)
    assert not missing


def test_scale_captions_keep_clear_of_each_other(exported):
    _, sheet, _ = exported
    # Each caption by the widest estimate of the sheet's text (0.8 of the height per character).
    captions = [p for p in sheet.primitives if isinstance(p, Text)
                and (" polygon 1 mm" in p.text or p.text.startswith("Space diagram"))]
    captions.sort(key=lambda p: p.position[0])
    assert len(captions) == 3
    for left, right in zip(captions, captions[1:], strict=False):
        assert left.position[0] + 0.8 * left.height * len(left.text) < right.position[0], (left.text, right.text)


def test_hatching_strokes_fill_a_parallelogram_as_counted_by_hand():
    # A 10 × 2 mm band hatched at 45° with 1 mm spacing: the band spans (10 + 2)·sin 45° = 8.49 mm across the
    # strokes, so the lines 1 … 8 mm off the origin cross it (the one through the origin touches its corner
    # only, and draws nothing); each stroke ends on the band's outline.
    band = ((0.0, -2.0), (10.0, -2.0), (10.0, 0.0), (0.0, 0.0))
    strokes = ground_hatch(band, 45.0, 1.0, style.SPACE_GROUND).points
    assert len(strokes) == 2 * 8
    for x, y in strokes:
        assert min(abs(x), abs(x - 10.0), abs(y), abs(y + 2.0)) < 1e-9
    # The same band given clockwise, and the strokes' direction turned half round: the same strokes.
    again = ground_hatch(band[::-1], 225.0, 1.0, style.SPACE_GROUND)
    flat = [c for xy in sorted(again.points) for c in xy]
    assert flat == pytest.approx([c for xy in sorted(strokes) for c in xy], abs=1e-12)
    assert again.pattern.angle_deg == 45.0
