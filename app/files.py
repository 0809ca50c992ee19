"""The recent-files list (saving itself is :func:`kinematics.files.storage.save_mechanism`)."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtCore import QSettings

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
