"""Files that are not what they claim: special files, sizes that lie, text a file cannot store.
Every one is refused at once with a message naming the place; nothing hangs, nothing is read whole."""

import json
import os
import subprocess
import sys

import pytest

import kinematics
from kinematics.files import fileformat
from kinematics.files.storage import StorageError, save_mechanism, write_recovery
from tests.designs import CLAW_FEED, load

LOADER = "import sys, kinematics\ntry:\n    kinematics.load_mechanism(sys.argv[1])\n" \
         "except kinematics.KinematicsError as error:\n    print(error)\n"


def load_in_subprocess(path) -> str:
    """The loader's message for ``path``, from a separate interpreter that is killed after 20 s
    (a blocking open of a named pipe would otherwise hang the test run)."""
    done = subprocess.run([sys.executable, "-c", LOADER, str(path)], capture_output=True, text=True, timeout=20)
    assert done.returncode == 0, done.stderr
    return done.stdout.strip()


@pytest.mark.skipif(not hasattr(os, "mkfifo"), reason="named pipes are POSIX")
def test_a_named_pipe_is_refused_at_once(tmp_path):
    pipe = tmp_path / "design.json"
    os.mkfifo(pipe)
    assert load_in_subprocess(pipe) == f"{pipe}: it is a named pipe, not a regular file"


@pytest.mark.skipif(not os.path.exists("/dev/zero"), reason="needs /dev/zero")
def test_a_device_is_refused_without_reading_it():
    # /dev/zero reports size 0 and never ends: reading it exhausted memory before.
    assert load_in_subprocess("/dev/zero") == "/dev/zero: it is a character device, not a regular file"


def test_a_folder_is_refused_plainly(tmp_path):
    with pytest.raises(kinematics.FileFormatError) as caught:
        kinematics.load_mechanism(tmp_path)
    assert str(caught.value) == f"{tmp_path}: it is a folder, not a file"


def test_at_most_the_limit_plus_one_byte_is_read_whatever_the_size_claims(tmp_path, monkeypatch):
    """A file whose reported size is 0 (as /proc files and some network mounts report) is still
    refused once more than the limit has come in."""
    path = tmp_path / "grown.json"
    path.write_text(json.dumps({**CLAW_FEED, "notes": "x" * 5000}), encoding="utf-8")
    monkeypatch.setattr(fileformat, "MAX_FILE_BYTES", 1024)
    real_stat, real_fstat = os.stat, os.fstat

    def lying(result):
        fields = list(result)
        fields[6] = 0  # st_size
        return os.stat_result(fields)

    monkeypatch.setattr(os, "stat", lambda p, *a, **k: lying(real_stat(p, *a, **k)))
    monkeypatch.setattr(os, "fstat", lambda fd: lying(real_fstat(fd)))
    with pytest.raises(kinematics.FileFormatError) as caught:
        kinematics.load_mechanism(path)
    assert caught.value.location == str(path)
    assert caught.value.detail.startswith("the file is larger than 0.000977 MB; mechanism files are at most")


def test_a_file_over_the_limit_is_refused_by_its_size(tmp_path):
    path = tmp_path / "huge.json"
    with open(path, "wb") as stream:
        stream.truncate(12 * 1024 * 1024)
    with pytest.raises(kinematics.FileFormatError, match="the file is 12.6 MB; mechanism files are at most 10 MB"):
        kinematics.load_mechanism(path)


# Lone surrogates: JSON's \ud800 escape decodes to a code point UTF-8 cannot encode, so such a design
# could be opened but never saved again.
@pytest.mark.parametrize(("where", "place"), [
    (lambda d: d.update(title="press \ud800"), "title"),
    (lambda d: d.update(notes="\udfff"), "notes"),
    (lambda d: d.update({"x-shop": {"tags": ["ok", "b\udc00d"]}}), "x-shop.tags[1]"),
    (lambda d: d.update({"x-shop": {"\ud800": 1}}), "x-shop (a key)"),
])
def test_text_with_a_lone_surrogate_is_refused_at_load_with_its_place(tmp_path, where, place):
    doc = json.loads(json.dumps(CLAW_FEED))
    where(doc)
    path = tmp_path / "odd.json"
    path.write_text(json.dumps(doc), encoding="utf-8")  # ensure_ascii: the file holds the \ud800 escape
    assert "\\ud" in path.read_text(encoding="utf-8") or "\\udfff" in path.read_text(encoding="utf-8")
    with pytest.raises(kinematics.FileFormatError) as caught:
        kinematics.load_mechanism(path)
    assert caught.value.location == f"{path}: {place}"
    assert "lone UTF-16 surrogate" in caught.value.detail


def test_a_design_holding_a_lone_surrogate_is_refused_by_save_in_plain_words(tmp_path):
    """A mechanism made in code (not loaded) may still hold one: the save says why, writes nothing."""
    target = tmp_path / "claw.json"
    save_mechanism(load(CLAW_FEED), target)
    before = target.read_bytes()
    odd = kinematics.Mechanism(**{**load(CLAW_FEED).__dict__, "title": "claw \ud800"})
    with pytest.raises(StorageError) as caught:
        save_mechanism(odd, target)
    assert "cannot be stored as UTF-8" in str(caught.value)
    assert target.read_bytes() == before
    with pytest.raises(StorageError):
        write_recovery(odd, tmp_path / "recovery.json")
    assert sorted(p.name for p in tmp_path.iterdir()) == ["claw.json"]
