"""The analysis commands, run as a user runs them."""

import json
import subprocess
import sys

import pytest

from tests.designs import SAMPLES, four_bar

QUICK = str(SAMPLES / "tile-trimmer-quick-return.json")


def run(*args):
    return subprocess.run([sys.executable, "-m", "app.main", *args], capture_output=True, text=True)


def test_solve_json_is_si_at_full_precision():
    out = run("solve", QUICK, "--angle", "30", "--json")
    assert out.returncode == 0, out.stderr
    data = json.loads(out.stdout)
    assert data["kinepoly_result"] == 1 and data["driver_angle_deg"] == 30.0
    assert data["units"]["acceleration"] == "m/s^2"
    assert set(data["slides"]) == {"slot", "ram"} and data["slides"]["slot"]["point"] == "A"
    import kinematics

    solution = kinematics.solve(kinematics.load_mechanism(QUICK), 30.0)
    assert data["points"]["T"]["acceleration"] == solution.acceleration("T").tolist()


def test_readable_table_and_construction_words():
    out = run("solve", QUICK)
    assert out.returncode == 0 and "ω [rad/s]" in out.stdout and "CCW" in out.stdout and "Caution" in out.stdout
    words = run("construct", QUICK, "--angle", "30")
    assert "Coriolis component of A sliding on lever" in words.stdout
    assert "cross-check against the numeric solver" in words.stdout
    data = json.loads(run("construct", QUICK, "--json").stdout)
    assert data["kinepoly_construction"] == 1 and data["crosscheck"]["max_relative_difference"] < 1e-9
    assert data["velocity"]["steps"][0]["geometry"].startswith("POINT")
    # The components in SI, each the vector of the step that draws it.
    steps = {s["id"]: s for s in data["acceleration"]["steps"]}
    coriolis = next(c for c in data["acceleration_components"] if c["component"] == "coriolis")
    assert (coriolis["point"], coriolis["about"]) == ("A", "lever")
    assert (steps[coriolis["step"]]["component"], steps[coriolis["step"]]["about"]) == ("coriolis", "lever")
    assert "Coriolis component" in words.stdout and "Coriolis A sliding on lever" in words.stdout


def test_check_reports_the_trade_figures():
    out = run("check", QUICK)
    assert out.returncode == 0, out.stderr
    assert "crank and slotted lever crank-lever: r + |e| < d" in out.stdout
    assert "time ratio 1.7100" in out.stdout


def test_exit_codes(tmp_path):
    unfinished = tmp_path / "unfinished.json"
    doc = four_bar(40, 120, 100, 140, 30)
    del doc["driver"]
    unfinished.write_text(json.dumps(doc))
    out = run("check", str(unfinished))
    assert out.returncode == 2 and "driver: no driver" in out.stderr
    bad = tmp_path / "bad.json"
    bad.write_text('{"kinepoly": 1, "points": {"A": [0, 0]}, "links": {"bar": ["A", "Q"]}}')
    out = run("solve", str(bad))
    assert out.returncode == 2
    assert out.stderr.strip() == f'error: {bad}: links.bar[1]: unknown point "Q"'
    assert "Traceback" not in out.stderr
    rocker = tmp_path / "rocker.json"
    rocker.write_text(json.dumps(four_bar(100, 60, 90, 120, 60)))
    out = run("solve", str(rocker), "--angle", "212")
    assert out.returncode == 3 and "cannot assemble at driver angle 212.00°" in out.stderr


@pytest.mark.parametrize("extra", [["--peaks"], []])
def test_sweep_command(tmp_path, extra):
    target = tmp_path / "cycle.csv"
    out = run("sweep", QUICK, "--steps", "36", "-o", str(target), *extra)
    assert out.returncode == 0, out.stderr
    text = target.read_text()
    if extra:
        # 36 steps of 10°: the interpolated limit angles give the ratio to about 1 %.
        ratio = float(text.split("time ratio ")[1].split()[0])
        assert ratio == pytest.approx(1.71, rel=0.01) and "max |α| [rad/s²]" in text
    else:
        assert len(text.splitlines()) == 37


def test_sweep_json_has_peaks_and_csv():
    data = json.loads(run("sweep", QUICK, "--steps", "36", "--json").stdout)
    assert data["peaks"]["output"]["time_ratio"] > 1.6
    assert data["csv"].splitlines()[0].startswith("driver_angle_deg,")


def test_unwritable_output_says_so(tmp_path):
    target = tmp_path / "missing-folder" / "cycle.csv"
    out = run("sweep", QUICK, "-o", str(target))
    assert out.returncode == 1 and "missing-folder: it is not an existing folder" in out.stderr
    assert not target.parent.exists()


def test_top_level_help_lists_every_command():
    out = run("--help")
    assert out.returncode == 0
    from app.cli import VERBS, parser

    verbs = set(parser()._subparsers._group_actions[0].choices)
    assert verbs == set(VERBS)
    for command in VERBS:
        assert f"kinepoly {command} FILE" in out.stdout
