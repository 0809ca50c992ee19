"""Never lose a design: atomic saves with a backup, recovery copies, plain refusals."""

import datetime
import json
import os
import random
import signal
import subprocess
import sys
import time

import pytest

import kinematics
from kinematics.errors import StorageError
from kinematics.files.storage import read_recovery, save_mechanism, write_recovery
from kinematics.model.limits import MAX_LINKS_AND_SLIDES
from tests.designs import SAMPLES

KILLS = 200 if os.environ.get("KINEPOLY_FULL") else 20


def big_design(offset: float) -> dict:
    """A chain of links as long as the format allows, and a shop's 300 kB of own data (an ``x-`` key kept
    as it is): a save takes milliseconds, long enough to be cut."""
    points = {f"P{i}": [i * 1.0 + offset, (i % 7) * 1.0] for i in range(CHAIN)}
    links = {f"bar{i}": [f"P{i}", f"P{i + 1}"] for i in range(CHAIN - 1)}
    return {"kinepoly": 1, "title": f"chain {offset}", "length_unit": "mm", "points": points,
            "ground": ["P0"], "links": links, "x-shop": {"log": ["cut and welded, batch 7"] * 12000}}


CHAIN = MAX_LINKS_AND_SLIDES + 1  # points; one link fewer


def test_save_keeps_one_backup_and_saves_identical(tmp_path):
    target = tmp_path / "press.json"
    first = kinematics.load_mechanism(SAMPLES / "tablet-press-toggle.json")
    save_mechanism(first, target)
    assert json.loads(target.read_text()) == json.loads((SAMPLES / "tablet-press-toggle.json").read_text())
    second = kinematics.move_point(first, "B", (8.0, 100.0))
    save_mechanism(second, target)
    assert kinematics.load_mechanism(target).points["B"] == (8.0, 100.0)
    assert kinematics.load_mechanism(tmp_path / "press.json.bak").points["B"] == first.points["B"]
    assert sorted(p.name for p in tmp_path.iterdir()) == ["press.json", "press.json.bak"]


@pytest.mark.skipif(os.geteuid() == 0, reason="root may write into read-only folders")
def test_read_only_folder_says_so_and_keeps_the_old_file(tmp_path):
    target = tmp_path / "press.json"
    mech = kinematics.load_mechanism(SAMPLES / "tablet-press-toggle.json")
    save_mechanism(mech, target)
    tmp_path.chmod(0o500)
    try:
        with pytest.raises(StorageError, match="Permission denied"):
            save_mechanism(kinematics.move_point(mech, "B", (9.0, 99.0)), target)
    finally:
        tmp_path.chmod(0o700)
    assert kinematics.load_mechanism(target) == mech


def test_refusal_when_writing_fails_midway_leaves_nothing_behind(tmp_path, monkeypatch):
    """A full disk shows up as an OSError from the write; simulate it, as root ignores permissions."""
    target = tmp_path / "press.json"
    mech = kinematics.load_mechanism(SAMPLES / "tablet-press-toggle.json")
    save_mechanism(mech, target)
    before = target.read_bytes()

    def full_disk(self, data):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr("pathlib.Path.write_bytes", full_disk)
    with pytest.raises(StorageError) as caught:
        save_mechanism(kinematics.move_point(mech, "B", (9.0, 99.0)), target)
    assert str(caught.value) == f"{target}: cannot write the file: No space left on device"
    monkeypatch.undo()
    assert target.read_bytes() == before
    assert sorted(p.name for p in tmp_path.iterdir()) == ["press.json"]


def test_vanished_folder_says_so(tmp_path):
    target = tmp_path / "gone" / "press.json"
    with pytest.raises(StorageError) as caught:
        save_mechanism(kinematics.load_mechanism(SAMPLES / "tablet-press-toggle.json"), target)
    assert str(caught.value) == f"{target}: cannot write into the folder {target.parent}: it is not an existing folder"


def test_recovery_copy_round_trips_exactly(tmp_path):
    mech = kinematics.move_point(kinematics.load_mechanism(SAMPLES / "baler-tamper-watt.json"), "C", (471.25, 150.5))
    when = datetime.datetime(2026, 3, 4, 5, 6, 7, tzinfo=datetime.UTC)
    write_recovery(mech, tmp_path / "recovery.json", source="/designs/baler.json", now=when)
    restored, saved_at, source = read_recovery(tmp_path / "recovery.json")
    assert restored == mech
    assert (saved_at, source) == ("2026-03-04T05:06:07+00:00", "/designs/baler.json")


SAVER = """
import sys, json, kinematics
from kinematics.files.storage import save_mechanism
target = sys.argv[1]
designs = [kinematics.load_mechanism(json.load(open(p))) for p in sys.argv[2:4]]
print("ready", flush=True)
i = 0
while True:
    save_mechanism(designs[i % 2], target)
    i += 1
"""


def test_killed_while_saving_leaves_the_old_or_the_new_design(tmp_path):
    """SIGKILL at random moments while saving a large design, alternately two versions."""
    old, new = big_design(0.0), big_design(0.5)
    for name, doc in (("old.json", old), ("new.json", new)):
        (tmp_path / name).write_text(json.dumps(doc))
    target = tmp_path / "design.json"
    save_mechanism(kinematics.load_mechanism(old), target)
    titles = {old["title"], new["title"]}
    rng = random.Random(1234)
    for _ in range(KILLS):
        process = subprocess.Popen([sys.executable, "-c", SAVER, str(target), str(tmp_path / "old.json"),
                                    str(tmp_path / "new.json")], stdout=subprocess.PIPE, text=True)
        assert process.stdout.readline().strip() == "ready"
        time.sleep(rng.uniform(0.0, 0.15))
        process.send_signal(signal.SIGKILL)
        process.wait()
        loaded = kinematics.load_mechanism(target)
        assert loaded.title in titles
        assert len(loaded.points) == CHAIN and len(loaded.extensions["x-shop"]["log"]) == 12000
        assert loaded.points[f"P{CHAIN - 1}"][0] in (CHAIN - 1.0, CHAIN - 0.5)
