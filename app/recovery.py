"""Recovery copies of unsaved work.

While the design has unsaved changes, a copy is written every 60 s and on
every 20th edit to the platform's application-data folder, never over the
user's file. The next start after a crash offers it back, with its time and
title; saving, or a clean exit, removes it. A copy belongs to the process
that wrote it, so a second Kinepoly running at the same time leaves it alone.
"""

from __future__ import annotations

import datetime as _dt
import os
from pathlib import Path

from PySide6.QtCore import QObject, QStandardPaths, QTimer
from PySide6.QtWidgets import QMessageBox

from kinematics import KinematicsError
from kinematics.files.storage import read_recovery, write_recovery

AUTOSAVE_MS = 60_000
EDITS_PER_COPY = 20
PREFIX = "recovery-"


def recovery_folder() -> Path:
    """Where recovery copies live: ``<AppDataLocation>/recovery``."""
    return Path(QStandardPaths.writableLocation(QStandardPaths.StandardLocation.AppDataLocation)) / "recovery"


def _alive(pid: int) -> bool:
    """Whether process ``pid`` still runs. A killed process whose parent has not yet collected it
    (a zombie) answers signals but will never write again: it counts as gone."""
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except PermissionError:
        return True
    try:
        # /proc/PID/stat: "pid (name) state ..."; the name may hold spaces or brackets, the state follows the last ")".
        state = Path(f"/proc/{pid}/stat").read_text().rsplit(")", 1)[1].split()[0]
    except (OSError, IndexError):
        return True  # no /proc (not Linux): the signal's answer stands
    return state not in ("Z", "X")


def when_in_words(saved_at: str) -> str:
    """A recovery copy's ISO 8601 time stamp as the local date and time in words
    ("Thursday 3 December 2026 at 14:32"); the stamp itself if it cannot be read."""
    try:
        moment = _dt.datetime.fromisoformat(saved_at)
    except ValueError:
        return saved_at or "an unknown time"
    local = moment.astimezone() if moment.tzinfo else moment
    return f"{local:%A} {local.day} {local:%B %Y} at {local:%H:%M}"


class Autosave(QObject):
    """Keeps a recovery copy of one Document while it has unsaved changes."""

    def __init__(self, document, folder: Path | None = None, parent=None):
        super().__init__(parent)
        self.document = document
        self.folder = Path(folder) if folder is not None else recovery_folder()
        self.path = self.folder / f"{PREFIX}{os.getpid()}-{id(self):x}.json"
        self.edits = 0
        self._index = document.undo_stack.index()
        self.timer = QTimer(self)
        self.timer.setInterval(AUTOSAVE_MS)
        self.timer.timeout.connect(self.write_if_unsaved)
        self.timer.start()
        document.undo_stack.indexChanged.connect(self._edited)
        document.undo_stack.cleanChanged.connect(self._clean_changed)

    def _edited(self, index: int):
        # A drag is one edit however many frames it merges: the stack says so by keeping its index.
        if index == self._index:
            return
        self._index = index
        self.edits += 1
        if self.edits % EDITS_PER_COPY == 0:
            self.write_if_unsaved()

    def _clean_changed(self, clean: bool):
        if clean:
            self.discard()

    def write_if_unsaved(self) -> bool:
        """Write the copy if there is unsaved work; a copy that cannot be written never interrupts it."""
        if self.document.undo_stack.isClean():
            return False
        try:
            self.folder.mkdir(parents=True, exist_ok=True)
            write_recovery(self.document.mechanism, self.path, source=str(self.document.path or ""))
        except (KinematicsError, OSError):
            return False
        return True

    def discard(self):
        try:
            self.path.unlink(missing_ok=True)
        except OSError:
            pass  # a folder that never held a copy


def left_behind(folder: Path | None = None) -> list[Path]:
    """Recovery copies of processes that are no longer running, newest first."""
    folder = Path(folder) if folder is not None else recovery_folder()
    copies = []
    for path in folder.glob(f"{PREFIX}*.json"):
        try:
            pid = int(path.name[len(PREFIX):].split("-")[0])
        except ValueError:
            continue
        if pid != os.getpid() and not _alive(pid):
            copies.append(path)
    return sorted(copies, key=lambda p: p.stat().st_mtime, reverse=True)


def offer_recovery(window, folder: Path | None = None) -> bool:
    """Offer the newest left-behind copy; True when the user took it back. Copies declined or
    unreadable are removed, so the question comes once."""
    for path in left_behind(folder):
        try:
            mechanism, saved_at, source = read_recovery(path)
        except KinematicsError:
            path.unlink(missing_ok=True)
            continue
        title = mechanism.title or "an untitled design"
        origin = f" (from {source})" if source else ""
        answer = QMessageBox.question(
            window, "Restore unsaved work?",
            f"Kinepoly stopped before “{title}”{origin} was saved.\n"
            f"A recovery copy from {when_in_words(saved_at)} is kept.\n\n"
            "Restore it? (No deletes the copy.)")
        if answer == QMessageBox.StandardButton.Yes:
            window.restore(mechanism, source or None)
            window.autosave.write_if_unsaved()
            path.unlink(missing_ok=True)
            return True
        path.unlink(missing_ok=True)
    return False
