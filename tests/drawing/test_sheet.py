"""The Sheet, checked through the collector (no Qt): true-scale placement,
ISO scale series, every step drawn, everything inside the frame."""

import math
import subprocess
import sys
from fractions import Fraction

import pytest

import kinematics
from kinematics.drawing import PAPER, Arrow, Circle, Line, Polyline, Ref, Text, draw_model, draw_sheet, style
from kinematics.drawing.layout import MARGIN, MARGIN_FILING
from kinematics.drawing.scaling import iso5455_ratio, polygon_scale, ratio_text
from kinematics.drawing.space import outline
from kinematics.groups.steps import Role
from tests.designs import (
    BOTTLE_PUSHER,
    GATE_LIFTER,
    SAMPLE_FILES,
    SAMPLES,
    SHEET_DESIGNS,
    SWING_LEVER,
    TRIAD_PRESS,
    construction,
)

# ISO 5455 recommended scales (enlargement, full size, reduction), the series
# extended by powers of ten as the standard allows.
ISO_5455 = {Fraction(m) * Fraction(10) ** n for m in (1, 2, 5) for n in range(-6, 4)}


def test_iso5455_ratio_is_the_largest_recommended_scale_that_fits():
    for limit in (0.0009, 0.003, 0.37, 0.5, 0.99, 1.0, 1.7, 4.99, 12.0):
        ratio = iso5455_ratio(limit)
        assert ratio in ISO_5455 and ratio <= limit
        assert not [s for s in ISO_5455 if ratio < s <= limit]


def test_ratio_text_as_drawings_write_it():
    # ISO 5455 writes scales as 1:1, 1:X (reduction), X:1 (enlargement).
    assert [ratio_text(Fraction(*r)) for r in ((1, 1), (1, 20), (5, 1), (1, 500))] == ["1:1", "1:20", "5:1", "1:500"]


def test_polygon_scale_is_the_smallest_round_value_not_below_need():
    assert [polygon_scale(x) for x in (0.0123, 0.01, 0.06, 0.3, 7.0)] == [0.02, 0.01, 0.1, 0.5, 10.0]


def test_outline_of_a_plate_goes_round_it_and_a_bar_runs_along():
    square = {"A": (0, 0), "B": (1, 1), "C": (1, 0), "D": (0, 1)}
    order, closed = outline("ABCD", square)
    assert closed and set(order) == set("ABCD")
    ring = [square[n] for n in order]
    # A simple (non-crossing) quadrilateral has shoelace area 1 for the unit square.
    area = 0.5 * abs(sum(x0 * y1 - x1 * y0 for (x0, y0), (x1, y1) in zip(ring, ring[1:] + ring[:1], strict=True)))
    assert area == pytest.approx(1.0)
    assert outline("ABC", {"A": (0, 0), "B": (2, 2), "C": (1, 1)}) == (("A", "C", "B"), False)


@pytest.mark.parametrize("name", sorted(SHEET_DESIGNS))
def test_space_diagram_links_run_joint_centre_to_joint_centre_at_sheet_scale(name):
    c = construction(SHEET_DESIGNS[name])
    sheet = draw_sheet(c, file_name="x.json", date="2026-01-01")
    view = sheet.views["space"]
    ratio = Fraction(view.scale_text.split(":")[0]) / Fraction(view.scale_text.split(":")[1])
    assert view.mm_per_unit == pytest.approx(1000.0 * float(ratio), rel=1e-12)
    for link, names in c.solution.mechanism.links.items():
        drawn = [p for p in sheet.of_view("space") if p.ref == Ref("link", link) and p.pen.layer == "SPACE-LINKS"
                 and isinstance(p, (Line, Polyline))]
        assert len(drawn) == 1, link
        corners = [drawn[0].start, drawn[0].end] if isinstance(drawn[0], Line) else list(drawn[0].points)
        joints = [view.place(c.solution.position(n)) for n in names]
        assert len(corners) == len(joints)
        for joint in joints:
            assert min(math.dist(joint, corner) for corner in corners) < 1e-9, (link, joint)


def test_a_link_measures_true_length_times_the_scale():
    # Crank O2A of the gate lifter is 40 mm (24, 32): a 3-4-5 triangle.
    sheet = draw_sheet(construction(GATE_LIFTER))
    view = sheet.views["space"]
    crank = next(p for p in sheet.of_view("space") if p.ref == Ref("link", "crank") and isinstance(p, Line))
    assert math.dist(crank.start, crank.end) == pytest.approx(40.0 * view.mm_per_unit / 1000.0, abs=1e-9)


@pytest.mark.parametrize("name", sorted(SHEET_DESIGNS))
def test_every_polygon_step_is_drawn_from_its_geometry(name):
    c = construction(SHEET_DESIGNS[name])
    sheet = draw_sheet(c)
    for kind in ("velocity", "acceleration"):
        polygon, view = getattr(c, kind), sheet.views[kind]
        for step in polygon.steps:
            drawn = [p for p in sheet.of_step(step.id) if p.view == kind and not isinstance(p, Text)]
            coords = [view.place(xy) for xy in step.geometry.coords]
            if step.is_vector and math.dist(coords[0], coords[-1]) < 1e-9:
                continue  # a zero vector has no arrow
            assert drawn, f"{kind} step {step.id} not drawn"
            if step.role is Role.DIRECTION or step.is_vector:
                line = next(p for p in drawn if isinstance(p, (Line, Arrow)))
                assert line.start == pytest.approx(coords[0], abs=1e-9)
                assert line.end == pytest.approx(coords[-1], abs=1e-9)


@pytest.mark.parametrize("paper", ["A4", "A3"])
@pytest.mark.parametrize("landscape", [False, True])
@pytest.mark.parametrize("source", sorted(SHEET_DESIGNS) + [p.name for p in SAMPLE_FILES])
def test_everything_stays_inside_the_frame(source, paper, landscape):
    mechanism = kinematics.load_mechanism(SHEET_DESIGNS[source] if source in SHEET_DESIGNS else SAMPLES / source)
    sheet = draw_sheet(kinematics.construct(kinematics.solve(mechanism)), paper=paper, landscape=landscape,
                       file_name=source)
    width, height = PAPER[paper][::-1] if landscape else PAPER[paper]
    assert (sheet.width, sheet.height) == (width, height)
    # ISO 5457 frame: 20 mm filing margin on the left, 10 mm elsewhere.  # from memory
    x0, y0, x1, y1 = MARGIN_FILING, MARGIN, width - MARGIN, height - MARGIN
    for p in sheet.primitives:
        for x, y in _extent(p):
            assert x0 - 1e-6 <= x <= x1 + 1e-6 and y0 - 1e-6 <= y <= y1 + 1e-6, (p, source)


def _extent(p):
    """Corners a primitive reaches (text by the widest estimate, 0.8 h per character)."""
    if isinstance(p, Text):
        width = len(p.text) * p.height * 0.8
        left = p.position[0] - {"left": 0.0, "centre": 0.5, "right": 1.0}[p.align] * width
        return [(left, p.position[1]), (left + width, p.position[1] + p.height)]
    if isinstance(p, Circle):
        (x, y), r = p.centre, p.radius
        return [(x - r, y - r), (x + r, y + r)]
    if isinstance(p, (Line, Arrow)):
        return [p.start, p.end, *getattr(p, "head", ())]
    return list(p.points)


def test_the_sheet_states_caution_scales_driver_and_results():
    c = construction(BOTTLE_PUSHER, 30.0)
    sheet = draw_sheet(c, file_name="pusher.json", date="2026-03-04")
    texts = [p.text for p in sheet.primitives if isinstance(p, Text)]
    joined = " ".join(texts)
    block = " ".join(p.text for p in sheet.primitives if isinstance(p, Text) and p.ref == Ref("title block"))
    assert kinematics.CAUTION in block  # wrapped at spaces, so the lines join back to the whole caution
    for name in ("space", "velocity", "acceleration"):
        assert sheet.views[name].scale_text in joined
    assert "30.00°" in joined and "200 rpm" in joined and "pusher.json" in joined and "2026-03-04" in joined
    assert "block" in texts and "rod" in texts  # slide and link rows of the results table
    assert f"{math.hypot(*c.solution.velocity('D')):.4g}" in texts


def test_points_from_the_numeric_solver_are_drawn_and_said_so():
    c = construction(TRIAD_PRESS)
    sheet = draw_sheet(c)
    numeric = [s for s in c.velocity.steps + c.acceleration.steps if s.numeric]
    assert numeric
    for step in numeric:
        assert any(isinstance(p, Circle) and p.pen is style.NUMERIC for p in sheet.of_step(step.id))
    assert style.NUMERIC.legend in [p.text for p in sheet.primitives if isinstance(p, Text)]


def test_model_drawing_keeps_true_millimetres_and_the_files_origin():
    c = construction(SWING_LEVER)
    sheet = draw_model(c)
    assert sheet.views["space"].mm_per_unit == 1000.0 and sheet.views["space"].origin == (0.0, 0.0)
    crank = next(p for p in sheet.of_view("space") if p.ref == Ref("link", "crank") and isinstance(p, Line))
    assert sorted([crank.start, crank.end]) == [pytest.approx((0.0, 90.0)), pytest.approx((40.0, 90.0))]
    velocity, space = sheet.views["velocity"], sheet.views["space"]
    assert velocity.box[0] > space.box[2]  # the polygons stand beside the space diagram


def test_drawing_never_imports_qt():
    code = ("import sys, kinematics.drawing, kinematics.drawing.dxf; "
            "sys.exit(any(m.startswith(('PySide6', 'app')) for m in sys.modules))")
    assert subprocess.run([sys.executable, "-c", code]).returncode == 0


def test_unknown_paper_is_refused_by_name():
    with pytest.raises(ValueError, match="B5"):
        draw_sheet(construction(GATE_LIFTER), paper="B5")


def test_a_cylinders_rod_runs_from_the_barrels_end_to_the_rod_end():
    """The crate tipping table at 800 mm: the rod stands 800 − |CF| mm out of the barrel, drawn from F
    to B at the sheet's scale (placement is exact arithmetic: 1e-9 mm)."""
    mech = kinematics.load_mechanism(SAMPLES / "crate-tipping-table.json")
    solution = kinematics.solve(mech, length=0.8)
    sheet = draw_sheet(kinematics.construct(solution), file_name="x.json", date="2026-01-01")
    view = sheet.views["space"]
    rods = [p for p in sheet.of_view("space") if p.ref == Ref("slide", "cylinder") and isinstance(p, Line)]
    assert len(rods) == 1
    assert math.dist(rods[0].start, view.place(solution.position("F"))) < 1e-9
    assert math.dist(rods[0].end, view.place(solution.position("B"))) < 1e-9
