"""Random crank-rockers: the sheet always fits its frame and the DXF model
drawing keeps true size."""

import math

from hypothesis import assume, given, settings
from hypothesis import strategies as st

import kinematics
from kinematics.drawing import Ref, draw_model, draw_sheet
from tests.designs import four_bar

from .test_sheet import MARGIN, MARGIN_FILING, _extent


@st.composite
def crank_rockers(draw):
    crank = draw(st.floats(5, 60))
    frame = draw(st.floats(2.0, 5.0)) * crank
    coupler = draw(st.floats(1.5, 5.0)) * crank
    # Grashof with the crank shortest: s + l < p + q, and the rocker long enough to close the loop.
    low, high = max(frame - coupler, coupler - frame) + crank * 1.05, frame + coupler - crank * 1.05
    assume(high > low)
    rocker = draw(st.floats(low, high))
    longest = max(coupler, frame, rocker)
    assume(crank + longest < coupler + frame + rocker - longest)
    return {**four_bar(crank, coupler, rocker, frame, draw(st.floats(0, 359)), rpm=draw(st.floats(10, 3000))),
            "title": "random crank-rocker"}


@settings(max_examples=30)
@given(crank_rockers(), st.booleans())
def test_random_crank_rockers_fit_the_frame(design, landscape):
    c = kinematics.construct(kinematics.solve(kinematics.load_mechanism(design)))
    sheet = draw_sheet(c, landscape=landscape)
    x0, y0, x1, y1 = MARGIN_FILING, MARGIN, sheet.width - MARGIN, sheet.height - MARGIN
    for p in sheet.primitives:
        for x, y in _extent(p):
            assert x0 - 1e-6 <= x <= x1 + 1e-6 and y0 - 1e-6 <= y <= y1 + 1e-6, p
    model = draw_model(c)
    crank = next(p for p in model.of_view("space") if p.ref == Ref("link", "crank") and hasattr(p, "start"))
    assert math.isclose(math.dist(crank.start, crank.end), math.hypot(*design["points"]["A"]), rel_tol=1e-12)
