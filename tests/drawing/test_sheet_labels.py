"""The printed sheet's labels (joints, links, image points, centres of mass) on every sample, on
A4 and A3: none covers another, none covers a pin or an image point's dot."""

import itertools
from pathlib import Path

import pytest

import kinematics
from kinematics.drawing import Circle, Text
from kinematics.drawing.declutter import text_box
from kinematics.drawing.layout import draw_sheet

SAMPLES = sorted((Path(__file__).resolve().parents[2] / "samples").glob("*.json"))
LABELLED = ("point", "link", "step", "mass centre")


def _overlap(a, b) -> bool:
    return a[0] < b[2] and b[0] < a[2] and a[1] < b[3] and b[1] < a[3]


@pytest.mark.parametrize("paper", ["A4", "A3"])
@pytest.mark.parametrize("path", SAMPLES, ids=lambda p: p.stem)
def test_no_label_covers_another_or_a_pin(path, paper):
    mech = kinematics.load_mechanism(path)
    sheet = draw_sheet(kinematics.construct(kinematics.solve(mech)), paper=paper)
    texts = [t for t in sheet.primitives if isinstance(t, Text) and t.ref and t.ref.kind in LABELLED]
    assert texts
    for a, b in itertools.combinations(texts, 2):
        assert not (a.view == b.view and _overlap(text_box(a), text_box(b))), (a.text, b.text)
    dots = [c for c in sheet.primitives if isinstance(c, Circle)]
    for text in texts:
        for dot in dots:
            (x, y), r = dot.centre, dot.radius
            assert not (text.view == dot.view and _overlap(text_box(text), (x - r, y - r, x + r, y + r))), \
                (text.text, dot.ref)
