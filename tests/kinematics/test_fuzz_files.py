"""Fuzzing the loader: documents mutated from the valid samples either load and solve or are
refused with the product's own error — never another exception, never a hang.

Profile "ci": 1,000 documents, derandomised; KINEPOLY_FULL=1: 5,000."""

import copy
import json
import os
import signal

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import kinematics
from tests.designs import SAMPLE_FILES

DOCUMENTS = [json.loads(p.read_text()) for p in SAMPLE_FILES]
CASES = 5000 if os.environ.get("KINEPOLY_FULL") else 1000
GUARD_SECONDS = 20  # a generous guard against hangs, not a timing test

extreme_numbers = st.sampled_from([0, -0.0, 1e-308, 1e308, -1e308, 10 ** 30, -(10 ** 30), 10 ** 400, 1e-9, 3])
json_values = st.recursive(
    st.none() | st.booleans() | extreme_numbers | st.floats(allow_nan=False, allow_infinity=False) |
    st.text(max_size=6),
    lambda inner: st.lists(inner, max_size=4) | st.dictionaries(st.text(max_size=4), inner, max_size=4),
    max_leaves=8)


def _paths(value, prefix=()):
    yield prefix
    if isinstance(value, dict):
        for key, item in value.items():
            yield from _paths(item, prefix + (key,))
    elif isinstance(value, list):
        for index, item in enumerate(value):
            yield from _paths(item, prefix + (index,))


def _get(doc, path):
    for key in path:
        doc = doc[key]
    return doc


@st.composite
def mutated_documents(draw):
    doc = copy.deepcopy(draw(st.sampled_from(DOCUMENTS)))
    for _ in range(draw(st.integers(1, 4))):
        paths = [p for p in _paths(doc) if p]
        if not paths:
            break
        path = draw(st.sampled_from(paths))
        parent, key = _get(doc, path[:-1]), path[-1]
        action = draw(st.sampled_from(["delete", "retype", "rename", "duplicate", "nest", "extreme"]))
        if action == "delete":
            del parent[key]
        elif action == "retype":
            parent[key] = draw(json_values)
        elif action == "rename" and isinstance(parent, dict):
            parent[draw(st.text(min_size=1, max_size=5))] = parent.pop(key)
        elif action == "duplicate" and isinstance(parent, dict):
            parent[str(key).lower() if draw(st.booleans()) else f"{key}_2"] = copy.deepcopy(parent[key])
        elif action == "duplicate" and isinstance(parent, list):
            parent.append(copy.deepcopy(parent[key]))
        elif action == "nest":
            parent[key] = [[[[[[[[[parent[key]]]]]]]]]] if draw(st.booleans()) else {"x": {"y": parent[key]}}
        elif action == "extreme":
            parent[key] = draw(extreme_numbers)
    return doc


def _timeout(signum, frame):
    raise TimeoutError("a case ran past the guard")


@settings(max_examples=CASES)
@given(doc=mutated_documents(), angle=st.sampled_from([None, 0.0, 123.4, 271.0]))
def test_mutated_documents_load_and_solve_or_are_refused(doc, angle):
    previous = signal.signal(signal.SIGALRM, _timeout)
    signal.alarm(GUARD_SECONDS)
    try:
        try:
            mech = kinematics.load_mechanism(doc)
            kinematics.diagnose(mech)
            kinematics.construct(kinematics.solve(mech, angle))
        except kinematics.KinematicsError as err:
            assert str(err)
            assert isinstance(err.location, str)
    finally:
        signal.alarm(0)
        signal.signal(signal.SIGALRM, previous)


@pytest.mark.parametrize("text", [
    '{"kinepoly": 1, "points": {"A": [0, 0], "A": [1, 0]}, "links": {}}',
    '{"kinepoly": 1, "points": {"A": [Infinity, 0]}, "links": {}}',
    '[' * 100000 + ']' * 100000,
    '{"kinepoly": 1e999, "points": {}, "links": {}}',
    '',
])
def test_hostile_text_is_refused(tmp_path, text):
    path = tmp_path / "hostile.json"
    path.write_text(text)
    with pytest.raises(kinematics.FileFormatError):
        kinematics.load_mechanism(path)


def test_oversized_file_is_refused_before_reading(tmp_path):
    path = tmp_path / "huge.json"
    with open(path, "wb") as stream:
        stream.truncate(10 * 1024 * 1024 + 1)
    with pytest.raises(kinematics.FileFormatError, match="mechanism files are at most 10 MB"):
        kinematics.load_mechanism(path)
