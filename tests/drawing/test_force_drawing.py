"""The force polygon as a drawing: it closes as drawn, its scale bar is as long as it says (DXF
read back with ezdxf, PDF read back with pdfplumber), its labels are on the page.

Reference for the closing: d'Alembert's principle, the forces on a body with its inertia force
included sum to zero (J. J. Uicker, G. R. Pennock, J. E. Shigley, Theory of Machines and
Mechanisms, 4th ed., §15.1-15.3, the dynamic force polygon of a link closes).  # from memory
The joint forces drawn are also held against the Newton-Euler solution (kinematics.dynamics),
the project's independent formulation.
"""

import math
import re
import subprocess
import sys
from pathlib import Path

import ezdxf
import pdfplumber
import pytest

import kinematics
from kinematics.drawing import Arrow, Text
from kinematics.drawing.dxf import write_dxf
from kinematics.drawing.force_sheet import draw_force_sheet
from kinematics.drawing.forces import force_pane, line_of_action_pane
from kinematics.drawing.symbols import Symbols
from kinematics.dynamics import forces
from kinematics.forcepolygon import force_polygon

SAMPLES = Path(__file__).resolve().parents[2] / "samples"
# The bodies whose forces (inertia included) each close a polygon, by their labels as drawn.
LOOPS = {
    "cap-press-feeder.json": (
        ("Fᵢ(rod)", "W(rod)", "Fᵢ(D)", "W(D)", "F(frame→block D)", "F(crank→rod)"),  # rod with its block
        ("Fᵢ(crank)", "W(crank)", "F(rod→crank)", "F(frame→crank)")),
    "tile-trimmer-quick-return.json": (
        ("Fᵢ(rod)", "W(rod)", "Fᵢ(R)", "W(R)", "cutting", "F(frame→block R)", "F(lever→rod)"),
        ("Fᵢ(lever)", "W(lever)", "F(rod→lever)", "F(block A→lever)", "F(frame→lever)"),
        ("Fᵢ(crank)", "W(crank)", "Fᵢ(A)", "W(A)", "F(lever→block A)", "F(frame→crank)")),
}
# A load that is zero at a pose (a point mass at rest, a load out of its range) is not drawn.
MAY_BE_ZERO = re.compile(r"Fᵢ\(.*\)|cutting")
# The drawn vectors are the construction's N values over its scale (one division each), summed a
# handful at a time: round-off is ~1e-15 of the largest. 1e-9 of the largest force is far above
# that and far below any drawing error (a vector misdrawn by a hair of a millimetre is 1e-3).
CLOSE = 1e-9
# A bar's length in the PDF: drawn at 1200 dpi (0.02 mm a device pixel), flat caps; 0.05 mm.
BAR_MM = 0.05


def made_of(name: str, angle=None):
    return force_polygon(kinematics.construct(kinematics.solve(kinematics.load_mechanism(SAMPLES / name), angle)))


def drawn_vectors(sheet, made) -> dict:
    """Label -> the drawn vector in N (sheet mm over the view's mm per N), from the Arrows."""
    labels = {s.id: s.label for s in made.polygon.steps}
    k = sheet.views["force"].mm_per_unit
    return {labels[p.ref.name]: complex(p.end[0] - p.start[0], p.end[1] - p.start[1]) / k
            for p in sheet.primitives if isinstance(p, Arrow) and p.ref and p.ref.kind == "step"}


@pytest.mark.parametrize("name", sorted(LOOPS))
@pytest.mark.parametrize("angle", [None, 75.0, 200.0])
def test_each_bodys_drawn_polygon_closes(name, angle):
    made = made_of(name, angle)
    sheet = force_pane(made, Symbols())
    vectors = drawn_vectors(sheet, made)
    largest = max(abs(v) for v in vectors.values())
    for loop in LOOPS[name]:
        drawn = [vectors[label] if label in vectors or not MAY_BE_ZERO.fullmatch(label) else 0j for label in loop]
        assert abs(sum(drawn)) <= CLOSE * largest, loop


def test_the_drawn_pivot_force_is_the_newton_euler_one():
    made = made_of("cap-press-feeder.json")
    drawn = drawn_vectors(force_pane(made, Symbols()), made)["F(frame→crank)"]
    numeric = complex(*forces(made.construction.solution).joints_n["O2"]["crank"])
    assert abs(drawn - numeric) <= CLOSE * abs(numeric)  # the tolerance of CLOSE, same reasons


def test_the_pane_states_its_scale_in_newtons_per_millimetre():
    made = made_of("cap-press-feeder.json")
    sheet = force_pane(made, Symbols())
    words = [p.text for p in sheet.primitives if isinstance(p, Text)]
    assert f"{made.polygon.scale_per_mm:g} N per mm" in words


def test_a_line_of_action_goes_through_the_steps_point_along_its_force():
    made = made_of("cap-press-feeder.json")
    step = next(s for s in made.polygon.steps if s.label == "Fᵢ(rod)")
    (line, *_) = (p for p in line_of_action_pane(made, step.id, Symbols()).primitives if hasattr(p, "start"))
    at = (1e3 * step.space[0][0], 1e3 * step.space[0][1])  # the space view is true size, mm
    (x0, y0), (x1, y1) = step.coords
    along = complex(line.end[0] - line.start[0], line.end[1] - line.start[1])
    force = complex(x1 - x0, y1 - y0)
    assert abs((along / force).imag) <= 1e-9 * abs(along / force)  # parallel to the force
    to_point = complex(at[0] - line.start[0], at[1] - line.start[1])
    assert abs((to_point * along.conjugate()).imag) / abs(along) <= 1e-9 * abs(along)  # through the point


def test_a_step_with_no_place_in_the_space_diagram_draws_nothing_there():
    made = made_of("cap-press-feeder.json")
    intersection = next(s for s in made.polygon.steps if s.label == "x1")
    assert line_of_action_pane(made, intersection.id, Symbols()).primitives == ()


def test_the_dxf_holds_the_force_polygon_on_its_own_layers_with_its_scale_bar(tmp_path):
    made = made_of("cap-press-feeder.json")
    path = tmp_path / "forces.dxf"
    sheet = write_dxf(made.construction, path, forces=made)
    doc = ezdxf.readfile(path)
    msp = doc.modelspace()
    layers = {e.dxf.layer for e in msp}
    assert {"FORCE-KNOWN", "FORCE-RESULT", "FORCE-CONSTRUCTION"} <= layers
    assert not any(e.dxf.layer in {"KNOWN-VECTORS", "RESULT-VECTORS"} and _view(e) == "force" for e in msp)
    texts = [e.dxf.text for e in msp.query("TEXT")]
    for label in ("F(frame→crank)", "Fᵢ(rod)", "F(crank→rod)"):
        assert any(label in t for t in texts), label
    scale = float(next(re.search(r"([\d.]+) N per mm", t).group(1) for t in texts if "N per mm" in t))
    assert scale == 1.0 / sheet.views["force"].mm_per_unit
    bar = [e for e in msp.query("LINE") if _tag(e) == "scale bar force"]
    end = next(float(t.split()[0]) for t in (e.dxf.text for e in msp.query("TEXT") if _tag(e) == "scale bar force")
               if t.endswith(" N") and t != "0")
    longest = max(math.dist(tuple(e.dxf.start)[:2], tuple(e.dxf.end)[:2]) for e in bar)
    assert longest == pytest.approx(end / scale, rel=1e-12)  # replayed coordinates: float round-off only


def _xdata(entity) -> list:
    try:
        return [value for _, value in entity.get_xdata("KINEPOLY")]
    except ezdxf.DXFValueError:
        return []


def _tag(entity) -> str:
    return next((v for v in _xdata(entity) if not v.startswith("view ")), "")


def _view(entity) -> str:
    return next((v[5:] for v in _xdata(entity) if v.startswith("view ")), "")


def test_print_forces_adds_a_sheet_with_the_polygon_its_labels_and_a_true_scale_bar(tmp_path):
    path = tmp_path / "sheet.pdf"
    done = subprocess.run([sys.executable, "-m", "app.main", "print", str(SAMPLES / "cap-press-feeder.json"),
                           "--forces", "-o", str(path)], capture_output=True, text=True,
                          env={"QT_QPA_PLATFORM": "offscreen", "PATH": ""}, cwd=SAMPLES.parent)
    assert done.returncode == 0, done.stderr
    made = made_of("cap-press-feeder.json")
    sheet = draw_force_sheet(made)
    scale = 1.0 / sheet.views["force"].mm_per_unit
    with pdfplumber.open(path) as pdf:
        assert len(pdf.pages) == 2
        page = pdf.pages[1]
        text = page.extract_text()
        for label in ("F(frame→crank)", "Fᵢ(rod)", "W(D)", f"Force polygon {scale:g} N per mm", "drive torque"):
            assert label in text, label
        value = next(float(t.split()[0]) for t in (p.text for p in sheet.primitives
                                                  if isinstance(p, Text) and p.ref and p.ref.name == "force")
                     if t.endswith(" N") and t != "0")
        lengths = [abs(line["x1"] - line["x0"]) * 25.4 / 72.0 for line in page.lines
                   if abs(line["top"] - line["bottom"]) < 1e-6]
        assert min(abs(length - value / scale) for length in lengths) <= BAR_MM


def test_print_forces_without_mass_data_says_so_and_writes_nothing(tmp_path):
    path = tmp_path / "sheet.pdf"
    done = subprocess.run([sys.executable, "-m", "app.main", "print", str(SAMPLES / "label-swing-arm.json"),
                           "--forces", "-o", str(path)], capture_output=True, text=True,
                          env={"QT_QPA_PLATFORM": "offscreen", "PATH": ""}, cwd=SAMPLES.parent)
    assert done.returncode == 2
    assert "no mass data" in done.stderr
    assert not path.exists()
