"""The recent-files list, and saving with the question an editor asks before it replaces a
read-only or another user's file (saving itself is :func:`kinematics.files.storage.save_mechanism`)."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtCore import QSettings
from PySide6.QtWidgets import QMessageBox

from kinematics.files.storage import ProtectedFile, save_mechanism

RECENT_KEY = "recent_files"
RECENT_COUNT = 8


def settings() -> QSettings:
    return QSettings("Kinepoly", "Kinepoly")


def recent_files() -> list[str]:
    value = settings().value(RECENT_KEY, [])
    if isinstance(value, str):  # QSettings returns a lone entry as a string
        value = [value]
    return [p for p in (value or []) if Path(p).exists()]


def remember(path) -> list[str]:
    """Put ``path`` first in the recent files and return the new list."""
    path = str(Path(path).resolve())
    files = [path] + [p for p in recent_files() if p != path]
    settings().setValue(RECENT_KEY, files[:RECENT_COUNT])
    return files[:RECENT_COUNT]


def clear_recent():
    settings().setValue(RECENT_KEY, [])


def save_asking(parent, mechanism, path) -> bool:
    """Save ``mechanism`` to ``path``; a read-only or another user's file is replaced only when the
    user says so. False when the user declined; refusals raise as :func:`save_mechanism` does."""
    try:
        save_mechanism(mechanism, path)
    except ProtectedFile as protected:
        button = QMessageBox.StandardButton
        answer = QMessageBox.question(parent, "Replace a protected file?",
                                      f"{path}:\n{protected.reason}.\n\nReplace it anyway?",
                                      button.Yes | button.No, button.No)
        if answer != button.Yes:
            return False
        save_mechanism(mechanism, path, overwrite_protected=True)
    return True
