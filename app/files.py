"""Saving without half-written files, and the recent-files list."""

from __future__ import annotations

import os
import tempfile
from pathlib import Path

from PySide6.QtCore import QSettings

import kinematics

RECENT_KEY = "recent_files"
RECENT_COUNT = 8


def write_atomically(path, data: bytes) -> None:
    """Write ``data`` to ``path`` through a temporary file in the same folder.

    os.replace swaps it in at once, so a failure (disk full, power cut)
    leaves the old file whole; the temporary file is removed on failure. The
    new file gets the old one's permissions, or the usual ones for a new file
    (mkstemp alone would leave it readable by its owner only).
    """
    path = Path(path)
    if not path.parent.is_dir():
        raise OSError(f"{path}: the folder {path.parent} does not exist")
    handle, temporary = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=path.parent)
    try:
        with os.fdopen(handle, "wb") as stream:
            stream.write(data)
            stream.flush()
            os.fsync(stream.fileno())
        os.chmod(temporary, _mode_for(path))
        os.replace(temporary, path)
    except BaseException:
        Path(temporary).unlink(missing_ok=True)
        raise


def _mode_for(path: Path) -> int:
    if path.exists():
        return path.stat().st_mode & 0o777
    umask = os.umask(0)
    os.umask(umask)
    return 0o666 & ~umask


def save_atomically(mechanism, path) -> None:
    """Save ``mechanism`` as its JSON text (see :func:`write_atomically`)."""
    write_atomically(path, kinematics.dumps(mechanism).encode("utf-8"))


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
