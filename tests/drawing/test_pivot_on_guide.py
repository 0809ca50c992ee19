"""A fixed pivot just above a fixed guide stands on the guide's hatched line: its own base and
hatching would run into the guide's. A pivot clear of any guide keeps its hatched base."""

from pathlib import Path

import pytest

import kinematics
from kinematics.drawing import Polyline, Ref, Strokes
from kinematics.drawing.layout import draw_sheet
from kinematics.drawing.panes import space_pane
from kinematics.drawing.symbols import Symbols

SAMPLES = Path(__file__).resolve().parents[2] / "samples"


def _pivot(sheet, name):
    parts = [p for p in sheet.primitives if p.ref == Ref("point", name)]
    triangles = [p for p in parts if isinstance(p, Polyline) and p.closed and len(p.points) == 3]
    strokes = [p for p in parts if isinstance(p, Strokes)]
    return triangles, strokes


@pytest.mark.parametrize("paper", [True, False])
def test_the_cap_press_pivot_stands_on_its_guide(paper):
    mech = kinematics.load_mechanism(SAMPLES / "cap-press-feeder.json")
    construction = kinematics.construct(kinematics.solve(mech))
    # On paper (1:5) and on screen zoomed out (symbols five times their paper size in machine mm),
    # the pivot's mark reaches the guide 20 mm under its pin.
    sheet = draw_sheet(construction) if paper else space_pane(mech, construction.solution, Symbols().scaled(5.0))
    (triangle,), strokes = _pivot(sheet, "O2")
    assert not strokes, "no base line or hatching of its own"
    # The triangle's base lies on the guide line E-F (y = -20 mm in the file), as drawn.
    view = sheet.views["space"]
    guide_y = view.place((0.0, -0.020))[1]
    assert triangle.points[1][1] == pytest.approx(guide_y, abs=1e-9)
    assert triangle.points[2][1] == pytest.approx(guide_y, abs=1e-9)


def test_a_pivot_clear_of_guides_keeps_its_hatched_base():
    mech = kinematics.load_mechanism(SAMPLES / "stacker-transfer-stephenson.json")
    sheet = space_pane(mech, kinematics.solve(mech), Symbols())
    (triangle,), strokes = _pivot(sheet, "O2")
    assert len(strokes) == 2  # the base line and its hatching
