"""Plots, paginated pages and the review report's assembly, read from the recorded Sheets (no Qt)."""

import math

import numpy as np
import pytest

from kinematics.drawing.pages import Heading, Paragraph, Table, body_box, furnish, paginate
from kinematics.drawing.plots import Curve, Plot, draw_plot, ticks
from kinematics.drawing.sheet import Polyline, Recorder, Text
from kinematics.errors import MechanismFindings, SweepCancelled
from kinematics.review import SECTION_BUILDERS, build_report
from tests.designs import SAMPLES, TRIPLE_ROCKER, UNFINISHED, load

STEPHENSON = SAMPLES / "stacker-transfer-stephenson.json"


@pytest.mark.parametrize("low, high, most", [(-2.0, 1.0, 5), (0.0, 360.0, 18), (62.4, 139.9, 8), (1e-4, 7e-3, 6)])
def test_ticks_are_whole_steps_of_the_1_2_5_series_covering_the_range(low, high, most):
    values = ticks(low, high, most)
    step = values[1] - values[0]
    mantissa = step / 10 ** math.floor(math.log10(step))
    assert min(abs(mantissa - m) for m in (1, 2, 5)) < 1e-9  # the preferred 1, 2, 5 × 10ⁿ series  # common practice
    assert values[0] <= low and values[-1] >= high and len(values) - 1 <= most
    assert np.allclose(np.diff(values), step)


def test_a_plot_maps_its_curve_into_its_box_linearly():
    rec = Recorder()
    x = np.linspace(0.0, 360.0, 361)
    draw_plot(rec, (20.0, 20.0, 190.0, 120.0), Plot("sine", "θ [°]", "y [1]", (Curve("sin", x, np.sin(np.radians(x))),),
                                                     marks=((90.0, "90°"),), x_range=(0.0, 360.0)))
    curve = next(p for p in rec.primitives if isinstance(p, Polyline) and len(p.points) == 361)
    xs, ys = np.array(curve.points).T
    assert 20.0 <= xs.min() < xs.max() <= 190.0 and 20.0 <= ys.min() < ys.max() <= 120.0
    # sin is odd about 180°: the sheet curve is point-symmetric about its middle point (a linear map keeps that).
    assert np.allclose(xs + xs[::-1], 2 * xs[180]) and np.allclose(ys + ys[::-1], 2 * ys[180])
    assert any(isinstance(p, Text) and p.text == "90°" for p in rec.primitives)


def test_a_long_table_breaks_over_pages_and_repeats_its_header():
    rows = tuple((f"P{i}", f"{i}.0") for i in range(200))
    sheets = paginate([Heading("Points"), Paragraph("All of them."), Table(("point", "x [mm]"), rows)], "A4")
    assert len(sheets) >= 2
    for sheet in sheets:
        texts = [p.text for p in sheet.primitives if isinstance(p, Text)]
        assert "point" in texts
        x0, y0, x1, y1 = body_box("A4")
        assert all(y0 - 1e-9 <= p.position[1] <= y1 for p in sheet.primitives if isinstance(p, Text))
    furnished = furnish(sheets[1], "Title", "fp", "foot", 2, len(sheets))
    assert f"page 2 of {len(sheets)}" in [p.text for p in furnished.primitives if isinstance(p, Text)]


def test_report_has_a_sheet_and_steps_per_angle_and_every_page_furnished():
    report = build_report(load_file(STEPHENSON), STEPHENSON.read_bytes(), "arm.json", steps=360,
                          angles_deg=(30.0, 150.0))
    titles = [e.title for e in report.outline]
    # The sample carries mass data (samples/README.md), so its forces have their section.
    assert titles == ["Cover", "Checks", "Construction at the analysis angles", "Cycle", "Forces",
                      "Appendix: mechanism data"]
    assert [c.title for c in report.outline[2].children] == ["θ = 30°", "θ = 150°"]
    for sheet in report.sheets:
        assert sheet.width == pytest.approx(210.0) and sheet.height == pytest.approx(297.0)
    n = len(report.sheets)
    assert all(any(isinstance(p, Text) and p.text == f"page {i} of {n}" for p in s.primitives)
               for i, s in enumerate(report.sheets, start=1))
    assert [b.name for b in SECTION_BUILDERS] == ["cover", "checks", "analysis angles", "cycle", "forces", "appendix"]


def test_report_of_a_rocking_driver_marks_an_angle_that_cannot_assemble():
    report = build_report(load(TRIPLE_ROCKER), b"{}", steps=360, angles_deg=(30.0, 180.0))
    page = report.outline[2].children[1].page
    assert any(isinstance(p, Text) and "no construction" in p.text for p in report.sheets[page].primitives)


def test_findings_refuse_the_report_and_progress_can_stop_it():
    with pytest.raises(MechanismFindings):
        build_report(load(UNFINISHED), b"{}")
    with pytest.raises(SweepCancelled):
        build_report(load_file(STEPHENSON), b"{}", steps=360, progress=lambda fraction: fraction < 0.3)


def load_file(path):
    import kinematics

    return kinematics.load_mechanism(path)


def test_the_appendix_states_the_masses_and_loads_as_the_file_does():
    # A sample with mass data (format 2): the appendix lists every link mass, point mass and load,
    # so the report stands alone.
    path = SAMPLES / "cap-press-feeder.json"
    mech = load(path)
    report = build_report(mech, path.read_bytes(), file_name=path.name, steps=36)
    words = " ".join(p.text for sheet in report.sheets for p in sheet.primitives if isinstance(p, Text))
    assert "Masses and loads" in words and "Frictionless joints." in words
    for name in (*mech.mass_data.masses, *mech.mass_data.point_masses, *mech.mass_data.loads):
        assert name in words
