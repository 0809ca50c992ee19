"""The forces of a pose drawn on the space diagram (kinematics.drawing.space_forces): each arrow is
the force polygon's, and is checked here against the numeric forces (kinematics.forces, the
Newton-Euler solution: an independent formulation) at the place the trade draws it."""

import math
import re

import numpy as np
import pytest

import kinematics
from kinematics.drawing import Arrow, Text
from kinematics.drawing.declutter import text_box
from kinematics.drawing.space_forces import ARROW_SHARE, space_forces_pane
from kinematics.drawing.symbols import Symbols
from kinematics.forcepolygon import force_polygon
from tests.designs import SAMPLES

WITH_MASSES = [path for path in sorted(SAMPLES.glob("*.json")) if '"masses"' in path.read_text()]
LABEL = re.compile(r"^F\((?P<by>.+)→(?P<on>.+)\)$")


def _made(path, angle):
    mech = kinematics.load_mechanism(path)
    solution = kinematics.solve(mech, angle_deg=angle) if angle is not None else kinematics.solve(mech)
    return mech, solution, force_polygon(kinematics.construct(solution))


def _scale(sheet) -> float:
    return float(re.search(r"1 mm = ([0-9.e+-]+) N", sheet.views["space"].scale_text).group(1))


@pytest.mark.parametrize("path", WITH_MASSES, ids=lambda p: p.stem)
def test_each_joint_force_ends_at_its_pin_and_is_the_newton_euler_force_on_its_link(path):
    mech, solution, made = _made(path, None)
    numeric = kinematics.forces(solution)
    sheet = space_forces_pane(made, Symbols())
    n_per_mm = _scale(sheet)
    steps = {s.id: s for s in made.polygon.steps}
    at = dict(zip(solution.point_names, solution.positions.tolist(), strict=True))
    checked = 0
    for arrow in (p for p in sheet.primitives if isinstance(p, Arrow)):
        step = steps[arrow.ref.name]
        found = LABEL.match(step.label)
        if step.role.name != "RESULT" or found is None or found["on"] not in mech.links:
            continue
        point = step.points[0]
        assert arrow.end == pytest.approx(tuple(1e3 * c for c in at[point]), abs=1e-9)
        drawn = np.subtract(arrow.end, arrow.start) * n_per_mm
        if found["on"] in numeric.joints_n.get(point, {}):
            expected = numeric.joints_n[point][found["on"]]
        else:  # a block's force on the link that is its guide: minus the guide's force on the block
            (slide,) = [k for k, s in mech.slides.items() if s.point == point and s.guide == found["on"]]
            expected = -numeric.slides[slide].force_n
        assert np.allclose(drawn, expected, rtol=1e-9, atol=1e-9 * np.linalg.norm(expected)), step.label
        checked += 1
    assert checked >= 2


@pytest.mark.parametrize("path", WITH_MASSES, ids=lambda p: p.stem)
def test_each_inertia_force_lies_on_its_offset_line(path):
    mech, solution, made = _made(path, None)
    numeric = kinematics.forces(solution)
    sheet = space_forces_pane(made, Symbols())
    n_per_mm = _scale(sheet)
    steps = {s.id: s for s in made.polygon.steps}
    for arrow in (p for p in sheet.primitives if isinstance(p, Arrow)):
        step = steps[arrow.ref.name]
        link = step.label[len("Fᵢ("):-1] if step.label.startswith("Fᵢ(") else None
        if link not in numeric.inertia:
            continue
        inertia = numeric.inertia[link]
        force = np.subtract(arrow.end, arrow.start) * n_per_mm
        assert np.allclose(force, inertia.force_n, rtol=1e-9, atol=1e-12)
        # The single equivalent force stands off the centre of mass by h = I·|α|/(m·|a_G|) (D'Alembert;
        # common practice): the distance from G to the arrow's line.
        g = 1e3 * inertia.centre_m
        ux, uy = force / np.linalg.norm(force)
        h = abs((g[0] - arrow.end[0]) * uy - (g[1] - arrow.end[1]) * ux)
        assert h == pytest.approx(1e3 * inertia.offset_m, rel=1e-9, abs=1e-9)


@pytest.mark.parametrize("path", WITH_MASSES, ids=lambda p: p.stem)
def test_the_scale_is_of_the_series_and_keeps_the_largest_arrow_within_its_share(path):
    mech, _, made = _made(path, None)
    sheet = space_forces_pane(made, Symbols())
    n_per_mm = _scale(sheet)
    mantissa = n_per_mm / 10 ** math.floor(math.log10(n_per_mm))
    assert round(mantissa, 9) in (1.0, 2.0, 5.0)
    longest = max(math.dist(p.start, p.end) for p in sheet.primitives if isinstance(p, Arrow))
    design_mm = 1e3 * mech.size * mech.metres_per_unit
    assert ARROW_SHARE * design_mm / 2.5 < longest <= ARROW_SHARE * design_mm * (1 + 1e-12)


def test_the_labels_keep_clear_of_the_marks_given_and_of_each_other():
    _, _, made = _made(SAMPLES / "cap-press-feeder.json", None)
    pin = (200.0, 0.0, 210.0, 10.0)
    sheet = space_forces_pane(made, Symbols(), marks=[pin])
    boxes = [text_box(p) for p in sheet.primitives if isinstance(p, Text)]

    def overlap(a, b):
        return a[0] < b[2] and b[0] < a[2] and a[1] < b[3] and b[1] < a[3]

    assert not any(overlap(box, pin) for box in boxes)
    assert not any(overlap(a, b) for i, a in enumerate(boxes) for b in boxes[i + 1:])
