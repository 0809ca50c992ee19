"""A polar plot (a force vector's tip) is drawn at one scale on both axes, through the origin."""

import math

import numpy as np
import pytest

from kinematics.drawing.plots import Curve, Plot, draw_plot
from kinematics.drawing.sheet import Line, Polyline, Recorder, Ref


def _drawn(curve, box=(20, 20, 190, 150)):
    rec = Recorder()
    draw_plot(rec, box, Plot("tip", "Fx [N]", "Fy [N]", (curve,), polar=True))
    return rec.primitives


@pytest.mark.parametrize("centre, radius", [((300.0, 40.0), 50.0), ((-20.0, -900.0), 250.0)])
def test_a_circle_stays_a_circle(centre, radius):
    # A circle of the data is a circle on the sheet only if both axes have one scale (analytic geometry):
    # its drawn extents across and up agree to float rounding (1e-9 mm).
    t = np.linspace(0, 2 * math.pi, 721)
    curve = Curve("tip", centre[0] + radius * np.cos(t), centre[1] + radius * np.sin(t))
    points = np.array([p for prim in _drawn(curve) if isinstance(prim, Polyline) and prim.ref == Ref("plot", "tip")
                       and prim.pen.legend == "curve" for p in prim.points])
    width, height = np.ptp(points[:, 0]), np.ptp(points[:, 1])
    assert width == pytest.approx(height, abs=1e-9)


def test_both_zero_lines_are_drawn_even_when_the_tip_stays_on_one_side():
    t = np.linspace(0, 2 * math.pi, 361)
    primitives = _drawn(Curve("tip", 500 + 100 * np.cos(t), 300 + 50 * np.sin(t)))
    lines = [p for p in primitives if isinstance(p, Line) and p.pen.legend != "grid"]
    vertical = [p for p in lines if p.start[0] == p.end[0] and abs(p.end[1] - p.start[1]) > 20]
    horizontal = [p for p in lines if p.start[1] == p.end[1] and abs(p.end[0] - p.start[0]) > 20]
    assert vertical and horizontal, "the origin's axes"
