"""Command-line hygiene: messages say what is wrong with what the user gave; a closed pipe, an
empty file name or an odd angle never ends in a traceback or the wrong exit code."""

import contextlib
import io
import json
import subprocess
import sys

import pytest

import kinematics
from app.main import main as kinepoly
from tests.designs import CLAW_FEED, SAMPLES

QUICK = str(SAMPLES / "tile-trimmer-quick-return.json")


def run_main(*argv) -> tuple[int, str, str]:
    """Exit code, stdout and stderr of ``kinepoly ARGV`` run in this interpreter."""
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        try:
            code = kinepoly(list(argv))
        except SystemExit as stop:  # argparse's refusals
            code = stop.code
    return code, out.getvalue(), err.getvalue()


def test_a_closed_pipe_ends_quietly():
    """``kinepoly check FILE | head -1``: the reader leaves early; no BrokenPipeError traceback.
    Here the reader has gone before the first line is written (closed as soon as the process starts),
    so the write fails every time, not only when the race with ``head`` goes that way."""
    process = subprocess.Popen([sys.executable, "-m", "app.main", "check", QUICK], stdout=subprocess.PIPE,
                               stderr=subprocess.PIPE, text=True)
    process.stdout.close()
    _, err = process.communicate(timeout=60)
    assert err == ""
    assert process.returncode == 1, "exit code 1: the output could not be written"


@pytest.mark.parametrize("verb", ["solve", "construct", "sweep", "export", "render", "print"])
def test_an_empty_output_name_is_refused_as_such(verb):
    code, out, err = run_main(verb, QUICK, "-o", "")
    assert code == 2 and out == ""
    assert "argument -o/--output: the file name is empty" in err


@pytest.mark.parametrize("verb", ["solve", "construct", "export", "render", "print"])
@pytest.mark.parametrize("angle", ["nan", "inf", "-inf", "1e400"])
def test_an_angle_that_is_no_finite_number_exits_2(verb, angle, tmp_path):
    code, _, err = run_main(verb, QUICK, "--angle", angle, "-o", str(tmp_path / "out"))
    assert code == 2, err
    assert f'argument --angle: "{angle}" is not a finite angle in degrees' in err


@pytest.mark.parametrize("angle", ["-30", "-1e1", "-.5"])
def test_negative_angles_in_any_spelling_are_angles(angle):
    code, out, err = run_main("solve", QUICK, "--angle", angle, "--json")
    assert code == 0, err
    assert json.loads(out)["driver_angle_deg"] == float(angle)


def test_a_5000_digit_integer_is_named_without_pythons_advice(tmp_path):
    path = tmp_path / "digits.json"
    path.write_text('{"kinepoly": 1,\n "points": {"A": [' + "7" * 5000 + ', 0]}, "links": {}}', encoding="utf-8")
    with pytest.raises(kinematics.FileFormatError) as caught:
        kinematics.load_mechanism(path)
    assert str(caught.value) == (f"{path} line 2 column 19: a whole number of 5000 digits; "
                                 "numbers in this format have at most 400")
    assert "set_int_max_str_digits" not in str(caught.value)


def test_a_nested_extension_names_the_file_once_and_the_key(tmp_path):
    doc = dict(CLAW_FEED)
    deep = value = {}
    for _ in range(12):
        value["in"] = {}
        value = value["in"]
    doc["x-deep"] = deep
    path = tmp_path / "deep.json"
    path.write_text(json.dumps(doc), encoding="utf-8")
    with pytest.raises(kinematics.FileFormatError) as caught:
        kinematics.load_mechanism(path)
    # The file named once; the place is the value nested too deep (the schema names it).
    assert str(caught.value) == f"{path}: x-deep.in.in.in.in.in.in.in: nested deeper than the format allows (8 levels)"


def test_a_crank_whose_end_is_on_its_pivot_says_so():
    doc = json.loads(json.dumps(CLAW_FEED))
    doc["points"]["A"] = [0, 0]
    with pytest.raises(kinematics.FileFormatError) as caught:
        kinematics.load_mechanism(doc)
    assert str(caught.value) == ("links.crank: its first two points O2 and A are both at (0, 0); they give the "
                                 "link its length and angle, so they must differ")


def test_two_points_a_hair_apart_are_named_not_called_redundant():
    doc = json.loads(json.dumps(CLAW_FEED))
    doc["points"]["A"] = [1e-13, 0]
    (finding,) = kinematics.diagnose(kinematics.load_mechanism(doc))
    assert finding.location == "links.crank"
    assert finding.message.startswith("the first two points O2 and A of link crank are 1e-13 mm apart")


def test_render_writes_nothing_but_its_own_words(tmp_path):
    """Qt's offscreen plugin warns "This plugin does not support propagateSizeHints()" on every
    window it shows; that is no message for the user."""
    done = subprocess.run([sys.executable, "-m", "app.main", "render", QUICK, "-o", str(tmp_path / "view.png"),
                           "--size", "600x400"], capture_output=True, text=True, timeout=120)
    assert done.returncode == 0, done.stderr
    assert done.stderr == ""
    assert done.stdout.startswith("wrote ")
