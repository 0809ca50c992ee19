"""The force polygon's labels never cover one another: a vertex that ends several forces stacks
their labels one a line, and a block with no free side near its point is fanned further out.

A plain geometric property of the drawing (two label boxes, as the declutter estimates them,
share no area); no outside reference is needed for it.
"""

import itertools
from pathlib import Path

import pytest

import kinematics
from kinematics.drawing import Text
from kinematics.drawing.declutter import text_box
from kinematics.drawing.force_sheet import draw_force_sheet
from kinematics.drawing.forces import force_pane
from kinematics.drawing.layout import draw_model
from kinematics.drawing.symbols import Symbols
from kinematics.forcepolygon import force_polygon

SAMPLES = Path(__file__).resolve().parents[2] / "samples"
# Every sample with mass data whose force polygon is drawn (a cylinder-driven one is refused in words).
WITH_MASSES = sorted(p.name for p in SAMPLES.glob("*.json")
                     if '"masses"' in (text := p.read_text(encoding="utf-8")) and '"actuator"' not in text)


def clashes(sheet) -> list:
    """Pairs of force-step labels whose boxes overlap."""
    boxes = [(p.text, text_box(p)) for p in sheet.primitives
             if isinstance(p, Text) and p.view == "force" and p.ref is not None and p.ref.kind == "step"]
    return [(a, b) for (a, p), (b, q) in itertools.combinations(boxes, 2)
            if p[0] < q[2] and q[0] < p[2] and p[1] < q[3] and q[1] < p[3]]


def made_of(name: str, angle=None):
    return force_polygon(kinematics.construct(kinematics.solve(kinematics.load_mechanism(SAMPLES / name), angle)))


def test_the_samples_with_mass_data_are_all_here():
    assert len(WITH_MASSES) >= 5


@pytest.mark.parametrize("name", WITH_MASSES)
def test_no_force_label_covers_another_on_the_pane_the_sheet_and_the_dxf_drawing(name):
    made = made_of(name)
    for sheet in (force_pane(made, Symbols()), draw_force_sheet(made),
                  draw_model(made.construction, date="2026-01-01", forces=made)):
        assert clashes(sheet) == []


@pytest.mark.parametrize("name", WITH_MASSES)
def test_no_force_label_covers_another_through_the_cycle(name):
    for angle in range(0, 360, 45):
        try:
            made = made_of(name, float(angle))
        except kinematics.KinematicsError:
            continue  # a pose the linkage does not reach, or a dead point: said elsewhere
        assert clashes(force_pane(made, Symbols())) == [], angle


def test_a_busy_vertex_gets_one_label_a_line_each_for_its_own_step():
    made = made_of("baler-tamper-watt.json")
    texts = [p for p in force_pane(made, Symbols()).primitives if isinstance(p, Text) and p.view == "force"]
    labels = {s.label for s in made.polygon.steps if s.label}
    drawn = [t.text for t in texts if t.ref is not None and t.ref.kind == "step"]
    assert not [t for t in drawn if ", " in t]  # none joined into one long string
    assert labels <= set(drawn)

