"""The centre-of-mass mark on the space diagram: where the force analysis carries each centre, in
every pose, and on its own DXF layer (read back with ezdxf)."""

import json
from pathlib import Path

import ezdxf
import pytest

import kinematics
from kinematics.drawing import Circle, Hatch, Ref
from kinematics.drawing.dxf import write_dxf
from kinematics.drawing.panes import space_pane
from kinematics.drawing.symbols import Symbols
from kinematics.dynamics import forces

SAMPLES = Path(__file__).resolve().parents[2] / "samples"
WITH_MASSES = sorted(p.name for p in SAMPLES.glob("*.json") if "masses" in json.loads(p.read_text()))


@pytest.mark.parametrize("name", WITH_MASSES)
@pytest.mark.parametrize("step", [0, 1, 2])
def test_each_mark_sits_where_newton_euler_carries_the_centre(name, step):
    mech = kinematics.load_mechanism(SAMPLES / name)
    result = kinematics.sweep(mech, 3)
    if mech.driver.is_actuator:
        solution = kinematics.solve(mech, length=float(result.driver_length_m[step]))
    else:
        solution = kinematics.solve(mech, float(result.driver_angle_deg[step]))
    sheet = space_pane(mech, solution, Symbols())
    # The Newton-Euler analysis (kinematics.dynamics) carries each centre with its link on its own.
    found = forces(solution)
    for link in mech.mass_data.masses:
        mark = [p for p in sheet.primitives if p.ref == Ref("mass centre", link)]
        rings = [p for p in mark if isinstance(p, Circle)]
        assert len(rings) == 1
        assert rings[0].centre == pytest.approx(tuple(found.inertia[link].centre_m * 1e3), abs=1e-9)
        assert sum(isinstance(p, Hatch) for p in mark) == 2


def test_marks_go_to_their_own_dxf_layer(tmp_path):
    mech = kinematics.load_mechanism(SAMPLES / "cap-press-feeder.json")
    path = tmp_path / "marks.dxf"
    write_dxf(kinematics.construct(kinematics.solve(mech)), path)
    on_layer = [e.dxftype() for e in ezdxf.readfile(path).modelspace() if e.dxf.layer == "MASS-CENTRES"]
    links = len(mech.mass_data.masses)
    assert on_layer.count("CIRCLE") == links and on_layer.count("HATCH") == 2 * links


def test_a_design_without_masses_draws_no_mark():
    mech = kinematics.load_mechanism(SAMPLES / "label-swing-arm.json")
    sheet = space_pane(mech, kinematics.solve(mech), Symbols())
    assert not [p for p in sheet.primitives if p.ref is not None and p.ref.kind == "mass centre"]
