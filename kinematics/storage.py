"""Writing files so that a crash, a full disk or a power cut never leaves a torn
one: every output goes to a temporary file beside its target, is flushed to
disk, and is swapped in with ``os.replace``; the folder is flushed after.

Saving a design also keeps the previous version as ``NAME.bak`` (one
generation). Recovery copies carry their time and source in an ``x-`` key, so
they are ordinary mechanism files that round-trip exactly.
"""

from __future__ import annotations

import datetime as _dt
import json
import os
import shutil
import tempfile
from collections.abc import Callable
from pathlib import Path

from .errors import KinematicsError
from .fileformat import document_from_mechanism, dumps, mechanism_from_document, read_document
from .model import Mechanism

RECOVERY_KEY = "x-kinepoly-recovery"


class StorageError(KinematicsError):
    """A file that could not be written; nothing at the target was changed."""


def _umask() -> int:
    mask = os.umask(0)
    os.umask(mask)
    return mask


def _sync_folder(folder: Path):
    try:
        handle = os.open(folder, os.O_RDONLY)
    except OSError:
        return  # some platforms cannot open a folder; the rename itself is still atomic
    try:
        os.fsync(handle)
    except OSError:
        pass
    finally:
        os.close(handle)


def _keep_backup(target: Path):
    """Hard-link (or copy) the current target to NAME.bak, swapped in atomically too."""
    backup = target.with_name(target.name + ".bak")
    staging = target.with_name(f".{target.name}.bak.part")
    staging.unlink(missing_ok=True)
    try:
        try:
            os.link(target, staging)
        except OSError:
            shutil.copy2(target, staging)
        os.replace(staging, backup)
    finally:
        staging.unlink(missing_ok=True)


def replace_atomically(target, write: Callable[[str], None], keep_backup: bool = False) -> None:
    """Call ``write(temporary_path)``, then put that file in place of ``target``.

    Raises
    ------
    StorageError
        in plain words (folder missing or read-only, disk full ...); the
        target and its folder are left as they were, apart from the backup.
    """
    target = Path(target)
    folder = target.parent if str(target.parent) else Path(".")
    if not folder.is_dir():
        raise StorageError(f"cannot write into the folder {folder}: it is not an existing folder", str(target))
    try:
        handle, temporary = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".part", dir=folder)
    except OSError as err:
        raise StorageError(f"cannot write into the folder {folder}: {err.strerror or err}", str(target)) from None
    os.close(handle)
    try:
        write(temporary)
        with open(temporary, "rb+") as stream:
            os.fsync(stream.fileno())
        # mkstemp makes the file private; give it the old file's mode, or a plain new file's.
        os.chmod(temporary, target.stat().st_mode & 0o7777 if target.exists() else 0o666 & ~_umask())
        if keep_backup and target.exists():
            _keep_backup(target)
        os.replace(temporary, target)
        _sync_folder(folder)
    except OSError as err:
        raise StorageError(f"cannot write the file: {err.strerror or err}", str(target)) from None
    finally:
        if os.path.exists(temporary):
            os.remove(temporary)


def write_atomically(target, data: bytes | str, keep_backup: bool = False) -> None:
    """Write bytes (or UTF-8 text) to ``target`` through :func:`replace_atomically`."""
    try:
        payload = data.encode("utf-8") if isinstance(data, str) else data
    except UnicodeEncodeError as err:
        raise StorageError(f"the design holds text that cannot be stored as UTF-8 (a lone UTF-16 surrogate, "
                           f"\\u{ord(err.object[err.start]):04x}, at character {err.start + 1} of the file); "
                           "nothing was written", str(target)) from None
    replace_atomically(target, lambda path: Path(path).write_bytes(payload), keep_backup)


def save_mechanism(mechanism: Mechanism, path) -> None:
    """Save a design: never a moment without a complete file at ``path``; the
    previous version stays as ``path.bak``."""
    write_atomically(path, dumps(mechanism), keep_backup=True)


def write_recovery(mechanism: Mechanism, path, source: str = "", now: _dt.datetime | None = None) -> None:
    """A recovery copy: the design itself plus when it was written and from which file."""
    stamp = (now or _dt.datetime.now(_dt.UTC)).isoformat(timespec="seconds")
    document = document_from_mechanism(mechanism)
    document[RECOVERY_KEY] = {"saved_at": stamp, "source": source}
    write_atomically(path, json.dumps(document, indent=2, ensure_ascii=False) + "\n")


def read_recovery(path) -> tuple[Mechanism, str, str]:
    """(mechanism, saved_at, source) of a recovery copy."""
    document = read_document(path)
    note = document.pop(RECOVERY_KEY, {}) or {}
    mechanism = mechanism_from_document(document, str(path))
    return mechanism, str(note.get("saved_at", "")), str(note.get("source", ""))
