"""`kinepoly forces` (one pose, --cycle) and `kinepoly sweep --forces`, run as a user runs them."""

import csv
import io
import json
import math
import subprocess
import sys

import numpy as np
import pytest

import kinematics
from app.cli import main
from tests.designs import SAMPLES

PRESS = str(SAMPLES / "cap-press-feeder.json")  # offset slider-crank with a block at D and a pressing force
TRIMMER = str(SAMPLES / "tile-trimmer-quick-return.json")
BARE = str(SAMPLES / "label-swing-arm.json")  # no mass data


def run(capsys, *args):
    code = main(list(args))
    out, err = capsys.readouterr()
    return code, out, err


def test_one_pose_json_has_exactly_the_published_keys(capsys):
    code, out, err = run(capsys, "forces", PRESS, "--angle", "30", "--json")
    assert code == 0, err
    data = json.loads(out)
    assert list(data) == ["kinepoly_forces", "driver_angle_deg", "units", "driver_torque", "joints", "slides",
                          "inertia", "shaking_force", "shaking_moment", "power_balance", "warnings"]
    assert data["kinepoly_forces"] == 1 and data["driver_angle_deg"] == 30.0
    assert data["units"] == {"force": "N", "torque": "N*m", "power": "W"}
    assert set(data["joints"]) == {"O2", "A", "D"} and set(data["joints"]["A"]) == {"crank", "rod"}
    assert set(data["slides"]["ram"]) == {"normal_force", "force"}
    assert set(data["inertia"]["rod"]) == {"force", "couple", "offset"}
    assert set(data["power_balance"]) == {"drive_power", "relative_difference"}
    # Full precision: the core's own numbers, unrounded.
    result = kinematics.forces(kinematics.solve(kinematics.load_mechanism(PRESS), 30.0))
    assert data["driver_torque"] == result.drive_torque_n_m
    assert data["joints"]["A"]["rod"] == result.joints_n["A"]["rod"].tolist()
    # Drive power is T·ω (ω = 300 rpm = 10π rad/s); the two formulations agree to rounding.
    assert data["power_balance"]["drive_power"] == pytest.approx(data["driver_torque"] * 10 * math.pi, rel=1e-12)
    assert data["power_balance"]["relative_difference"] < 1e-9
    # The slide's force is its normal force along the guide line's left normal: the line E-F runs along +x,
    # so its left normal is +y (the sign convention of the keys).
    assert data["slides"]["ram"]["force"] == pytest.approx([0.0, data["slides"]["ram"]["normal_force"]], abs=1e-12)


def test_one_pose_table_words(capsys):
    code, out, _ = run(capsys, "forces", TRIMMER, "--angle", "200")
    assert code == 0
    lines = out.splitlines()
    assert lines[0] == ("Tile trimmer quick-return ram — forces with driver crank at 200.00°, 60 rpm; forces of "
                        "frictionless rigid joints (no friction is modelled)")
    assert lines[2].startswith("drive torque on crank: ") and lines[2].endswith(" N·m CW")
    assert lines[4].split() == ["joint", "on", "link", "from", "Fx", "[N]", "Fy", "[N]", "|F|", "[N]", "dir", "[°]"]
    rows = {tuple(line.split()[:3]) for line in lines[5:11]}
    assert rows == {("C", "lever", "frame"), ("O2", "crank", "frame"), ("A", "crank", "block"),
                    ("T", "lever", "rod"), ("T", "rod", "lever"), ("R", "rod", "block")}
    assert "(normal: on the block, along the guide line's left normal)" in lines
    assert any(line.startswith("power balance: drive power ") and "relative difference" in line for line in lines)
    assert out.rstrip().endswith(kinematics.CAUTION)
    assert "frictionless rigid bodies and are no strength or fatigue check" in kinematics.CAUTION


def test_no_mass_data_is_exit_2_with_a_message(capsys):
    code, out, err = run(capsys, "forces", BARE)
    assert (code, out) == (2, "")
    assert err == ("error: masses: the design has no mass data: give link masses, point masses or loads to "
                   "compute forces from\n")


@pytest.mark.parametrize("args, message", [
    (["--cycle", "--angle", "30"], "error: --angle is for one pose; --cycle sweeps the whole turn: choose one\n"),
    (["--fluctuation", "0.05"], "error: --fluctuation is for the summary of a cycle: add --cycle\n"),
    (["--steps", "90"], "error: --steps is for the summary of a cycle: add --cycle\n"),
    (["--cycle", "--fluctuation", "0"],
     "error: fluctuation: the coefficient of speed fluctuation must be a positive number, not 0.0\n"),
    (["--cycle", "--fluctuation", "nan"],
     "error: fluctuation: the coefficient of speed fluctuation must be a positive number, not nan\n"),
])
def test_option_mistakes_are_named(capsys, args, message):
    code, out, err = run(capsys, "forces", PRESS, *args)
    assert (code, out, err) == (2, "", message)


def test_cycle_summary_against_its_own_csv(capsys):
    """ΔE, the mean torque and the flywheel from `sweep --forces`'s torque column, worked out here by the
    handbook formulas (mean of the equally spaced turn, ΔE = max − min of ∫(T − T_m)dθ by trapezoids,
    I = ΔE/(C_s·ω²); common practice): the summary must say the same."""
    code, out, err = run(capsys, "forces", PRESS, "--cycle", "--steps", "720", "--fluctuation", "0.05", "--json")
    assert code == 0, err
    summary = json.loads(out)
    code, table, _ = run(capsys, "sweep", PRESS, "--steps", "720", "--forces")
    rows = list(csv.DictReader(io.StringIO(table)))
    torque = np.array([float(r["driver.torque [N*m]"]) for r in rows])
    omega = 300 * 2 * math.pi / 60
    step = 2 * math.pi / len(torque)
    energy = np.concatenate([[0.0], np.cumsum((0.5 * (torque + np.roll(torque, -1)) - torque.mean()) * step)])
    delta_e = energy.max() - energy.min()
    # Tolerances: the same sums in another order, so rounding only (1e-12 relative).
    assert summary["mean_torque"] == pytest.approx(torque.mean(), rel=1e-12)
    assert summary["energy_fluctuation"] == pytest.approx(delta_e, rel=1e-12)
    assert summary["flywheel_inertia"] == pytest.approx(delta_e / (0.05 * omega ** 2), rel=1e-12)
    assert summary["rms_torque"] == pytest.approx(math.sqrt(np.mean(torque ** 2)), rel=1e-12)
    assert summary["steps"] == 720 and summary["fluctuation"] == 0.05
    peak = max(float(r["D.rod.F [N]"]) for r in rows)
    assert summary["joints"]["D"]["rod"]["peak"] == pytest.approx(peak, rel=1e-12)
    assert summary["power_balance"]["max_relative_difference"] < 1e-9


def test_cycle_summary_words(capsys):
    code, out, _ = run(capsys, "forces", TRIMMER, "--cycle")
    assert code == 0
    lines = out.splitlines()
    assert lines[0] == ("Tile trimmer quick-return ram — drive and bearings over one turn of crank at 60 rpm "
                        "(6.283 rad/s), 360 poses; forces of frictionless rigid joints (no friction is modelled)")
    assert [line.split()[0] for line in lines[2:9]] == ["peak", "mean", "RMS", "mean", "peak", "energy", "flywheel"]
    assert lines[7].startswith("energy fluctuation  ΔE = ") and lines[7].endswith(" J")
    assert lines[8].startswith("flywheel            I = ΔE/(C_s·ω²) = ") and lines[8].endswith("for C_s = 0.02")
    assert lines[10].split() == ["joint", "on", "link", "from", "peak", "[N]", "at", "[°]", "mean", "[N]", "RMS",
                                 "[N]"]
    assert any(line.startswith("power balance over the cycle: largest relative difference") for line in lines)
    assert out.rstrip().endswith(kinematics.CAUTION)


def test_sweep_forces_columns_are_named_as_published(capsys, tmp_path):
    target = tmp_path / "cycle.csv"
    code, _, err = run(capsys, "sweep", PRESS, "--steps", "36", "--forces", "-o", str(target))
    assert code == 0, err
    header = target.read_text().splitlines()[0].split(",")
    plain = run(capsys, "sweep", PRESS, "--steps", "36")[1].splitlines()[0].split(",")
    assert header[:len(plain)] == plain, "the kinematic columns first, as without --forces"
    assert header[len(plain):] == [
        "driver.torque [N*m]", "O2.crank.Fx [N]", "O2.crank.Fy [N]", "O2.crank.F [N]", "A.crank.Fx [N]",
        "A.crank.Fy [N]", "A.crank.F [N]", "A.rod.Fx [N]", "A.rod.Fy [N]", "A.rod.F [N]", "D.rod.Fx [N]",
        "D.rod.Fy [N]", "D.rod.F [N]", "ram.normal [N]", "shaking.Fx [N]", "shaking.Fy [N]", "shaking.M [N*m]"]
    rows = list(csv.DictReader(io.StringIO(target.read_text())))
    assert len(rows) == 36
    row = rows[5]
    assert float(row["A.rod.F [N]"]) == pytest.approx(math.hypot(float(row["A.rod.Fx [N]"]),
                                                                 float(row["A.rod.Fy [N]"])), rel=1e-15)


def test_sweep_forces_refusals(capsys):
    code, out, err = run(capsys, "sweep", BARE, "--forces")
    assert (code, out) == (2, "") and "the design has no mass data" in err
    code, _, err = run(capsys, "sweep", PRESS, "--forces", "--peaks")
    assert (code, err) == (2, "error: --forces adds the force columns to the CSV; --peaks prints the peaks table "
                              "without it: choose one\n")


def test_the_verb_is_listed_and_runs_as_a_program():
    out = subprocess.run([sys.executable, "-m", "app.main", "forces", PRESS, "--json"], capture_output=True,
                         text=True)
    assert out.returncode == 0, out.stderr
    assert json.loads(out.stdout)["kinepoly_forces"] == 1
    from app.cli import USAGE, VERBS

    assert "forces" in VERBS
    assert "kinepoly forces FILE [--angle DEG | --length MM] [--json]" in USAGE
    assert "kinepoly forces FILE --cycle [--fluctuation 0.02] [--steps N] [--json]" in USAGE
