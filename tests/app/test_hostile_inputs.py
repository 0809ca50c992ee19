"""Every verb on hostile inputs: exit code 2 with a message naming the place, no traceback, no NaN,
each run within a time limit.

Regular files run through ``kinepoly``'s ``main()`` in this interpreter (a subprocess per run would
cost a second of start-up each); special files and lone surrogates run in subprocesses, where a
blocking open would be killed and an unencodable message would end in a traceback."""

import contextlib
import copy
import io
import json
import os
import re
import signal
import subprocess
import sys
import time

import pytest

from app.main import main as kinepoly
from tests.designs import CARTON_PUSHER, CLAW_FEED

VERBS = ("check", "solve", "construct", "sweep", "render", "print", "export")
TIME_LIMIT_S = 20  # generous on a shared 2-core machine: the point is that nothing hangs
NOT_A_NUMBER = re.compile(r"\b(nan|NaN|inf|Infinity)\b")


def scaled(design, factor):
    doc = copy.deepcopy(design)
    doc["points"] = {k: [x * factor, y * factor] for k, (x, y) in doc["points"].items()}
    return doc


def repeated_slide():
    doc = copy.deepcopy(CARTON_PUSHER)
    doc["slides"]["again"] = dict(doc["slides"]["guide"])
    return doc


def slide_a_link_fixes():
    doc = copy.deepcopy(CARTON_PUSHER)
    doc["links"]["stop"] = ["E", "F", "D"]
    return doc


def crank_on_its_pivot():
    doc = copy.deepcopy(CLAW_FEED)
    doc["points"]["A"] = [0, 0]
    return doc


def beyond_the_limit():
    doc = copy.deepcopy(CLAW_FEED)
    doc["points"]["P"] = [2e9, 80]
    return doc


def deep_extension():
    doc = copy.deepcopy(CLAW_FEED)
    deep = inner = {}
    for _ in range(12):
        inner["in"] = {}
        inner = inner["in"]
    doc["x-deep"] = deep
    return doc


# name -> (file text, the place the message must name)
DESIGNS = {
    "repeated slide": (json.dumps(repeated_slide()), "slides.again: slide again is redundant"),
    "slide a link fixes": (json.dumps(slide_a_link_fixes()), "slides.guide: slide guide is redundant"),
    "scaled by 1e-300": (json.dumps(scaled(CLAW_FEED, 1e-300)), "points: the design is"),
    "scaled by 1e-6": (json.dumps(scaled(CARTON_PUSHER, 1e-6)), "points: the design is"),
    "beyond 1e9": (json.dumps(beyond_the_limit()), "points.P: a coordinate is beyond"),
    "5000 digits": ('{"kinepoly": 1, "points": {"A": [' + "9" * 5000 + ", 0]}}", "line 1 column 34"),
    "crank on its pivot": (json.dumps(crank_on_its_pivot()), "links.crank: its first two points"),
    "nested deeply": (json.dumps(deep_extension()), "x-deep.in.in.in.in.in.in.in: nested deeper"),
    "broken JSON": ('{"kinepoly": 1, "points": {', "line 1 column 28"),
}


def arguments(verb, path, out_folder):
    extra = {"render": ["-o", str(out_folder / "v.png"), "--size", "400x300"],
             "print": ["-o", str(out_folder / "s.pdf")], "export": ["-o", str(out_folder / "d.dxf")],
             "sweep": ["--steps", "36"]}
    return [verb, str(path), *extra.get(verb, [])]


@contextlib.contextmanager
def time_limit(seconds):
    def expired(*_):
        raise TimeoutError(f"no answer within {seconds} s")

    previous = signal.signal(signal.SIGALRM, expired)
    signal.alarm(seconds)
    try:
        yield
    finally:
        signal.alarm(0)
        signal.signal(signal.SIGALRM, previous)


def check_refusal(code, out, err, place, what):
    assert code == 2, f"{what}: exit {code}\n{err}"
    assert place in err, f"{what}: the message does not name {place!r}:\n{err}"
    assert "Traceback" not in err, what
    assert not NOT_A_NUMBER.search(out + err), f"{what}: {out}{err}"


@pytest.mark.skipif(not hasattr(signal, "SIGALRM"), reason="the time limit uses SIGALRM")
@pytest.mark.parametrize("name", list(DESIGNS))
def test_every_verb_refuses_a_hostile_design_in_plain_words(qapp, tmp_path, name):
    text, place = DESIGNS[name]
    path = tmp_path / "hostile.json"
    path.write_text(text, encoding="utf-8")
    for verb in VERBS:
        out, err = io.StringIO(), io.StringIO()
        with time_limit(TIME_LIMIT_S), contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
            code = kinepoly(arguments(verb, path, tmp_path))
        check_refusal(code, out.getvalue(), err.getvalue(), place, f"{verb} on {name}")
    assert sorted(p.name for p in tmp_path.iterdir()) == ["hostile.json"], "no output was written"


def special_inputs(folder):
    """name -> (path, the place the message must name)."""
    pipe = folder / "pipe.json"
    os.mkfifo(pipe)
    surrogate = folder / "surrogate.json"
    surrogate.write_text(json.dumps({**CLAW_FEED, "title": "press \ud800"}), encoding="utf-8")
    huge = folder / "huge.json"
    with open(huge, "wb") as stream:
        stream.truncate(11 * 1024 * 1024)
    inputs = {"named pipe": (pipe, f"{pipe}: it is a named pipe, not a regular file"),
              "folder": (folder, f"{folder}: it is a folder, not a file"),
              "lone surrogate": (surrogate, f"{surrogate}: title: the text holds a lone UTF-16 surrogate"),
              "over 10 MB": (huge, f"{huge}: the file is 11.5 MB")}
    if os.path.exists("/dev/zero"):
        inputs["/dev/zero"] = ("/dev/zero", "/dev/zero: it is a character device, not a regular file")
    return inputs


@pytest.mark.skipif(not hasattr(os, "mkfifo"), reason="named pipes are POSIX")
def test_every_verb_refuses_special_files_at_once(tmp_path):
    inputs = tmp_path / "inputs"
    inputs.mkdir()
    runs = [(verb, name, path, place) for name, (path, place) in special_inputs(inputs).items() for verb in VERBS]
    pending = list(runs)
    running = []
    env = {**os.environ, "QT_QPA_PLATFORM": "offscreen"}
    while pending or running:
        while pending and len(running) < 4:  # a few at a time on a shared 2-core machine
            verb, name, path, place = pending.pop()
            process = subprocess.Popen([sys.executable, "-m", "app.main", *arguments(verb, path, tmp_path)],
                                       stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True, env=env)
            running.append((process, time.monotonic(), verb, name, place))
        process, started, verb, name, place = running.pop(0)
        try:
            out, err = process.communicate(timeout=max(1.0, TIME_LIMIT_S - (time.monotonic() - started)))
        except subprocess.TimeoutExpired:
            process.kill()
            process.communicate()
            pytest.fail(f"{verb} on {name}: no answer within {TIME_LIMIT_S} s")
        check_refusal(process.returncode, out, err, place, f"{verb} on {name}")
    assert sorted(p.name for p in tmp_path.iterdir()) == ["inputs"], "no output was written"
