"""Recovery copies: written while work is unsaved, offered back after a crash, gone after a clean exit."""

import datetime
import os
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest
from PySide6.QtWidgets import QMessageBox

import kinematics
from app import recovery
from app.recovery import EDITS_PER_COPY, Autosave, left_behind, offer_recovery
from tests.designs import CLAW_FEED, load


@pytest.fixture
def folder(tmp_path, monkeypatch):
    monkeypatch.setattr(recovery, "recovery_folder", lambda: tmp_path / "recovery")
    return tmp_path / "recovery"


def nudge(window, name="B", dx=0.5):
    mech = window.document.mechanism
    x, y = mech.points[name]
    window.document.edit(kinematics.move_point(mech, name, (x + dx, y)), f"move {name}")


def test_every_twentieth_edit_writes_a_copy_that_round_trips(make_window, folder):
    window = make_window()
    for _ in range(EDITS_PER_COPY - 1):
        nudge(window, dx=0.01)
    assert not window.autosave.path.exists()
    nudge(window, dx=0.01)
    assert window.autosave.path.exists()
    restored, saved_at, source = kinematics.files.storage.read_recovery(window.autosave.path)
    assert restored == window.document.mechanism and saved_at


def test_a_long_drag_is_one_edit_and_writes_no_copy_while_it_lasts(make_window, folder):
    window = make_window()
    for _ in range(3 * EDITS_PER_COPY):  # the frames of one drag are one undo step
        mech = window.document.mechanism
        x, y = mech.points["B"]
        window.document.edit(kinematics.move_point(mech, "B", (x + 0.01, y)), "move B", drag=7)
    assert window.document.undo_stack.count() == 1
    assert window.autosave.edits == 1 and not window.autosave.path.exists()


def test_the_timer_writes_while_unsaved_and_saving_removes_it(make_window, folder, tmp_path):
    window = make_window()
    assert window.autosave.timer.interval() == 60_000 and window.autosave.timer.isActive()
    window.autosave.timer.timeout.emit()  # a minute has passed, nothing unsaved yet
    assert not window.autosave.path.exists()
    nudge(window)
    window.autosave.timer.timeout.emit()
    assert window.autosave.path.exists()
    assert window.save_to(tmp_path / "design.json")
    assert not window.autosave.path.exists()
    assert (tmp_path / "design.json").exists() and not (tmp_path / "design.json.bak").exists()
    nudge(window)
    assert window.save_to(tmp_path / "design.json")
    assert (tmp_path / "design.json.bak").exists()  # the previous version, one generation


def test_a_clean_exit_leaves_no_copy(make_window, folder):
    window = make_window()
    nudge(window)
    window.autosave.write_if_unsaved()
    assert window.autosave.path.exists()
    window.close()
    assert not window.autosave.path.exists()


def test_after_a_crash_the_next_start_offers_the_copy(make_window, folder, monkeypatch):
    # A process that wrote a copy and died without cleaning up.
    mech = kinematics.move_point(load(CLAW_FEED), "B", (123.25, 99.5))
    dead = subprocess.run([sys.executable, "-c", "import os; print(os.getpid())"], capture_output=True, text=True)
    folder.mkdir(parents=True)
    copy = folder / f"recovery-{int(dead.stdout)}-1.json"
    kinematics.files.storage.write_recovery(mech, copy, source="/designs/pusher.json")
    assert left_behind() == [copy]
    asked = []
    monkeypatch.setattr(QMessageBox, "question", lambda *args: asked.append(args[2]) or QMessageBox.Yes)
    window = make_window()
    assert offer_recovery(window)
    assert "A recovery copy from" in asked[0] and "/designs/pusher.json" in asked[0]
    assert "+00:00" not in asked[0] and " at " in asked[0]  # local time in words, not the raw stamp
    assert window.document.mechanism == mech and window.document.path == "/designs/pusher.json"
    assert not window.document.undo_stack.isClean()  # restored work is still unsaved
    assert not copy.exists() and window.autosave.path.exists()


def test_a_declined_copy_is_removed_and_a_live_ones_is_left(make_window, folder, monkeypatch):
    folder.mkdir(parents=True)
    live = folder / f"recovery-{os.getppid()}-1.json"
    kinematics.files.storage.write_recovery(load(CLAW_FEED), live)
    dead = folder / "recovery-999999999-1.json"
    kinematics.files.storage.write_recovery(load(CLAW_FEED), dead)
    monkeypatch.setattr(QMessageBox, "question", lambda *args: QMessageBox.No)
    assert not offer_recovery(make_window())
    assert not dead.exists() and live.exists()


def test_a_copy_that_cannot_be_written_does_not_interrupt_work(make_window, tmp_path, monkeypatch):
    blocker = tmp_path / "plain-file"
    blocker.write_text("not a folder")
    monkeypatch.setattr(recovery, "recovery_folder", lambda: blocker / "recovery")
    window = make_window()
    nudge(window)
    assert window.autosave.write_if_unsaved() is False
    assert isinstance(window.autosave, Autosave)


def test_a_killed_process_not_yet_collected_leaves_its_copy_offered_at_once(folder):
    # SIGKILL, and the parent (this test) has not waited: the process is a zombie, which still
    # answers kill(pid, 0). Its copy must be offered on the very next start, not one start later.
    child = subprocess.Popen([sys.executable, "-c", "import time; time.sleep(60)"])
    try:
        folder.mkdir(parents=True)
        copy = folder / f"recovery-{child.pid}-1.json"
        kinematics.files.storage.write_recovery(load(CLAW_FEED), copy)
        assert left_behind() == []  # running: its copy is its own
        child.send_signal(signal.SIGKILL)
        for _ in range(200):  # until the kernel has made it a zombie
            if Path(f"/proc/{child.pid}/stat").read_text().rsplit(")", 1)[1].split()[0] == "Z":
                break
            time.sleep(0.01)
        assert left_behind() == [copy]
    finally:
        child.kill()
        child.wait()


def test_the_time_of_a_copy_is_said_in_local_words():
    stamp = "2026-03-04T05:06:07+00:00"
    local = datetime.datetime.fromisoformat(stamp).astimezone()
    assert recovery.when_in_words(stamp) == f"{local:%A} {local.day} {local:%B %Y} at {local:%H:%M}"
    assert recovery.when_in_words("") == "an unknown time"
