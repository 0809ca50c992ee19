"""Where a save lands: through a symbolic link to its target, never onto a special file, never over a
read-only or another user's file unasked, keeping the target's permissions and owner; and the
temporaries of saves that were cut short are cleared by the next save or open."""

import os
import stat
import subprocess
import sys
import time

import pytest

import kinematics
from kinematics.files import storage
from kinematics.files.storage import ProtectedFile, StorageError, remove_stale_temporaries, save_mechanism
from tests.designs import CLAW_FEED, load

POSIX = pytest.mark.skipif(os.name != "posix", reason="links, pipes and owners as POSIX has them")


@pytest.fixture
def claw():
    return load(CLAW_FEED)


@POSIX
def test_a_save_through_a_link_writes_its_target_and_keeps_the_link(tmp_path, claw):
    shared = tmp_path / "shared"
    shared.mkdir()
    real = shared / "claw.json"
    save_mechanism(claw, real)
    os.chmod(real, 0o664)
    link = tmp_path / "mine.json"
    link.symlink_to(real)
    moved = kinematics.move_point(claw, "P", (71.0, 140.0))
    save_mechanism(moved, link)
    assert link.is_symlink() and os.readlink(link) == str(real)
    assert kinematics.load_mechanism(real).points["P"] == (71.0, 140.0)
    assert stat.S_IMODE(real.stat().st_mode) == 0o664, "the target keeps its permissions"
    assert (shared / "claw.json.bak").exists(), "the backup stands beside the target, not the link"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["mine.json", "shared"]


@POSIX
@pytest.mark.parametrize("special", ["/dev/null", "pipe"])
def test_special_files_are_refused_as_targets(tmp_path, claw, special):
    if special == "pipe":
        special = tmp_path / "pipe"
        os.mkfifo(special)
    link = tmp_path / "out.json"
    link.symlink_to(special)
    for target in (special, link):
        with pytest.raises(StorageError, match="not a regular file"):
            save_mechanism(claw, target)
    assert link.is_symlink()
    assert not stat.S_ISREG(os.stat(special).st_mode)


def test_an_empty_file_name_is_refused_in_words(claw):
    with pytest.raises(StorageError) as caught:
        save_mechanism(claw, "")
    assert str(caught.value) == "no file name was given"


def test_a_read_only_file_is_not_replaced_unasked(tmp_path, claw):
    target = tmp_path / "claw.json"
    target.write_text("kept", encoding="utf-8")
    os.chmod(target, 0o444)
    with pytest.raises(ProtectedFile) as caught:
        save_mechanism(claw, target)
    assert str(caught.value) == f"{target}: the file is read-only (mode 0444), so it was left as it was"
    assert target.read_text(encoding="utf-8") == "kept"
    save_mechanism(claw, target, overwrite_protected=True)  # the user said yes
    assert kinematics.load_mechanism(target) == claw
    assert stat.S_IMODE(target.stat().st_mode) == 0o444


@POSIX
def test_another_users_file_is_not_taken_over(tmp_path, claw, monkeypatch):
    target = tmp_path / "claw.json"
    target.write_text("theirs", encoding="utf-8")
    owner = target.stat().st_uid
    monkeypatch.setattr(storage.os, "geteuid", lambda: owner + 1)
    with pytest.raises(ProtectedFile, match=f"belongs to another user \\(uid {owner}\\)"):
        save_mechanism(claw, target)
    assert target.read_text(encoding="utf-8") == "theirs"


@pytest.mark.skipif(os.name != "posix" or os.geteuid() != 0, reason="only root can give a file away")
def test_root_keeps_the_owner_of_the_file_it_saves(tmp_path, claw):
    target = tmp_path / "claw.json"
    save_mechanism(claw, target)
    os.chown(target, 65534, 65534)
    save_mechanism(kinematics.move_point(claw, "P", (71.0, 140.0)), target)
    assert (target.stat().st_uid, target.stat().st_gid) == (65534, 65534)


HOLDER = """
import fcntl, os, sys, time
handle = os.open(sys.argv[1], os.O_RDWR | os.O_CREAT)
fcntl.flock(handle, fcntl.LOCK_EX)
print("holding", flush=True)
time.sleep(60)
"""


@POSIX
def test_stale_temporaries_are_removed_and_live_ones_kept(tmp_path, claw):
    target = tmp_path / "claw.json"
    save_mechanism(claw, target)
    dead = subprocess.run([sys.executable, "-c", "import os; print(os.getpid())"], capture_output=True,
                          text=True, check=True).stdout.strip()
    stale = [tmp_path / f".claw.json.{dead}-a1b2c3d4.part", tmp_path / ".claw.json.k9x_e2rq.part",
             tmp_path / ".claw.json.bak.part"]
    for path in stale:
        path.write_text("torn", encoding="utf-8")
        os.utime(path, (time.time() - 3600, time.time() - 3600))
    others = [tmp_path / ".other.json.k9x_e2rq.part", tmp_path / ".claw.json.x.json.k9x_e2rq.part"]
    for path in others:
        path.write_text("not ours", encoding="utf-8")
        os.utime(path, (time.time() - 3600, time.time() - 3600))
    live = tmp_path / f".claw.json.{os.getpid()}-livelive.part"
    holder = subprocess.Popen([sys.executable, "-c", HOLDER, str(live)], stdout=subprocess.PIPE, text=True)
    try:
        assert holder.stdout.readline().strip() == "holding"
        os.utime(live, (time.time() - 3600, time.time() - 3600))
        save_mechanism(kinematics.move_point(claw, "P", (71.0, 140.0)), target)
        assert [p.exists() for p in stale] == [False, False, False]
        assert all(p.exists() for p in others), "another design's temporaries are not this save's business"
        assert live.exists(), "a temporary some process still writes is left alone"
    finally:
        holder.kill()
        holder.wait()
    assert remove_stale_temporaries(target) == [live]
    assert not live.exists()


def test_a_long_file_name_saves(tmp_path, claw):
    """The temporary name is longer than the target's: it is shortened, not refused."""
    target = tmp_path / ("d" * 245 + ".json")
    save_mechanism(claw, target)
    save_mechanism(kinematics.move_point(claw, "P", (71.0, 140.0)), target)
    assert kinematics.load_mechanism(target).points["P"] == (71.0, 140.0)
