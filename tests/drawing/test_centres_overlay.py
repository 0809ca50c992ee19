"""The centres over the space diagram: recorded once, on the sheet, in the DXF on their own layer,
and through `kinepoly export --centres` (`kinepoly print --centres` in tests/app)."""

import math

import ezdxf
from ezdxf import recover

import kinematics
from app.cli import main
from kinematics.drawing import Arrow, Circle, Text, draw_sheet
from kinematics.drawing.centre_places import centre_places
from kinematics.drawing.layout import draw_model
from kinematics.drawing.style import CENTRE
from tests.designs import SAMPLE_FILES, four_bar, load, slider_crank

QUICK_RETURN = next(p for p in SAMPLE_FILES if p.name.startswith("tile-trimmer"))


def centre_primitives(sheet):
    return [p for p in sheet.primitives if p.pen is CENTRE]


def test_each_centre_on_the_view_is_a_ring_at_its_place_with_its_bodies_named():
    construction = kinematics.construct(kinematics.solve(load(slider_crank(30, 110, 10, 50))))
    sheet = draw_sheet(construction, with_centres=True)
    view = sheet.views["space"]
    found = kinematics.centres(construction.solution, construction)
    rings = {p.centre for p in centre_primitives(sheet) if isinstance(p, Circle)}
    for place in centre_places(found):
        if place.kind == "on view":
            x, y = view.place(place.at_m)
            # Rings are placed by the view's own transform: equal to rounding of sheet mm.
            assert any(math.dist((x, y), ring) <= 1e-9 for ring in rings), place.name
    labels = " ".join(p.text for p in centre_primitives(sheet) if isinstance(p, Text))
    assert "crank|rod" in labels and "ground|piston at infinity, 90.0°" in labels
    # Every centre is inside the space view's box, and the box holds the linkage too.
    x0, y0, x1, y1 = view.box
    for ring in rings:
        assert x0 - 1e-9 <= ring[0] <= x1 + 1e-9 and y0 - 1e-9 <= ring[1] <= y1 + 1e-9


def test_a_far_centre_is_an_arrow_at_the_edge_and_the_linkage_keeps_its_scale():
    construction = kinematics.construct(kinematics.solve(load(four_bar(40, 120, 41, 120, 89))))
    plain, shown = draw_sheet(construction), draw_sheet(construction, with_centres=True)
    # Both far centres are left off the view: the linkage is drawn at the scale it has without them.
    assert shown.views["space"].mm_per_unit == plain.views["space"].mm_per_unit
    arrows = [p for p in centre_primitives(shown) if isinstance(p, Arrow)]
    assert arrows
    words = [p.text for p in centre_primitives(shown) if isinstance(p, Text)]
    assert any(w.startswith("ground|coupler off the view at (") for w in words)
    assert any("crank|rocker off the view at (" in w for w in words)
    x0, y0, x1, y1 = shown.views["space"].box
    for arrow in arrows:  # the tip on the view's edge
        tx, ty = arrow.end
        assert min(abs(tx - x0), abs(tx - x1), abs(ty - y0), abs(ty - y1)) <= 1e-9


def test_no_centres_unless_asked():
    construction = kinematics.construct(kinematics.solve(load(slider_crank(30, 110, 10, 50))))
    assert not centre_primitives(draw_sheet(construction)) and not centre_primitives(draw_model(construction))


def test_the_undetermined_centres_are_named():
    construction = kinematics.construct(kinematics.solve(kinematics.load_mechanism(QUICK_RETURN)))
    texts = [p.text for p in centre_primitives(draw_model(construction, with_centres=True)) if isinstance(p, Text)]
    assert "undetermined: crank|rod, crank|ram" in texts


def test_export_puts_the_centres_on_their_own_layer(tmp_path, capsys):
    out = tmp_path / "trimmer.dxf"
    assert main(["export", str(QUICK_RETURN), "--centres", "-o", str(out)]) == 0
    doc, auditor = recover.readfile(out)
    assert not auditor.has_errors
    msp = doc.modelspace()
    assert len(msp.query("CIRCLE[layer=='CENTRES']")) >= 1
    assert any("undetermined" in e.plain_text() for e in msp.query("MTEXT[layer=='CENTRES']")) or any(
        "undetermined" in e.dxf.text for e in msp.query("TEXT[layer=='CENTRES']"))
    plain = tmp_path / "plain.dxf"
    assert main(["export", str(QUICK_RETURN), "-o", str(plain)]) == 0
    assert not ezdxf.readfile(plain).modelspace().query("*[layer=='CENTRES']")
