"""Writing files so that a crash, a full disk or a power cut never leaves a torn
one: every output goes to a temporary file beside its target, is flushed to
disk, and is swapped in with ``os.replace``; the folder is flushed after.

A save through a symbolic link writes the link's target (the link stays); a
named pipe, a device or a folder is never a target; a read-only file or another
user's is replaced only when the caller says the user agreed; the target keeps its
permissions (and, for root, its owner). A temporary holds a lock while it is
written, so the next save or open can tell a cut-short save's leftovers from a
live one and remove them.

Saving a design also keeps the previous version as ``NAME.bak`` (one
generation). Recovery copies carry their time and source in an ``x-`` key, so
they are ordinary mechanism files that round-trip exactly.
"""

from __future__ import annotations

import datetime as _dt
import json
import os
import re
import shutil
import stat
import tempfile
import time
from collections.abc import Callable
from pathlib import Path

from ..errors import ProtectedFile, StorageError
from ..model.mechanism import Mechanism
from .fileformat import document_from_mechanism, dumps, mechanism_from_document, not_a_regular_file, read_document

try:
    import fcntl
except ImportError:  # not POSIX: leftovers are told by their age alone
    fcntl = None

RECOVERY_KEY = "x-kinepoly-recovery"
# A file name's length limit on the common file systems (ext4, APFS, NTFS), in bytes.
NAME_MAX_BYTES = 255
# Room a temporary's name needs beyond ".NAME.": "<pid>-<8 random>.part" with a pid of up to 10 digits.
_TEMPORARY_TAIL = 1 + 10 + 1 + 8 + 5
# A temporary nobody holds the lock of is a leftover once this old (a live save locks it within microseconds).
STALE_AFTER_S = 60.0


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


def _temporary_prefix(target: Path) -> str:
    """".NAME." with NAME shortened so that the whole temporary's name fits a file name."""
    name = target.name
    while len(f".{name}.".encode(errors="surrogateescape")) + _TEMPORARY_TAIL > NAME_MAX_BYTES:
        name = name[:-1]
    return f".{name}."


def _temporary(folder: Path, target: Path) -> tuple[int, str]:
    """(open handle, path) of a new temporary for ``target``, locked while this process writes it."""
    handle, path = tempfile.mkstemp(prefix=f"{_temporary_prefix(target)}{os.getpid()}-", suffix=".part", dir=folder)
    if fcntl is not None:
        try:
            fcntl.flock(handle, fcntl.LOCK_EX | fcntl.LOCK_NB)
        except OSError:
            pass  # a file system without locks: the leftover test falls back on the writer's pid and age
    return handle, path


def _alive(pid: int) -> bool:
    if os.name != "posix":
        return True  # no cheap, harmless test elsewhere: age decides
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except (PermissionError, OverflowError):
        return True
    return True


def _locked_by_someone(path: Path) -> bool:
    if fcntl is None:
        return False
    try:
        handle = os.open(path, os.O_RDONLY | getattr(os, "O_NONBLOCK", 0))
    except OSError:
        return True  # cannot even look: leave it
    try:
        fcntl.flock(handle, fcntl.LOCK_SH | fcntl.LOCK_NB)
        return False
    except OSError:
        return True
    finally:
        os.close(handle)


def remove_stale_temporaries(target) -> list[Path]:
    """Remove the temporaries of ``target`` that saves cut short left beside it, and return them.

    One is stale when no process holds its lock and either its writer's process is gone or it
    is older than :data:`STALE_AFTER_S`. Other designs' temporaries, and every live one, stay.
    """
    target = Path(target)
    folder = target.parent
    pattern = re.compile(re.escape(_temporary_prefix(target)) + r"(?:(\d+)-\w+|\w{8}|bak)\.part")
    removed = []
    try:
        entries = list(os.scandir(folder if str(folder) else "."))
    except OSError:
        return removed
    for entry in entries:
        match = pattern.fullmatch(entry.name)
        if match is None or not entry.is_file(follow_symlinks=False):
            continue
        path = folder / entry.name
        try:
            age = time.time() - entry.stat(follow_symlinks=False).st_mtime
        except OSError:
            continue
        writer_gone = match.group(1) is not None and not _alive(int(match.group(1)))
        if (writer_gone or age > STALE_AFTER_S) and not _locked_by_someone(path):
            try:
                path.unlink()
            except OSError:
                continue
            removed.append(path)
    return removed


def _keep_backup(target: Path):
    """Hard-link (or copy) the current target to NAME.bak, swapped in atomically too."""
    backup = target.with_name(target.name + ".bak")
    if len(backup.name.encode(errors="surrogateescape")) > NAME_MAX_BYTES:
        return  # no room for the suffix: the save itself still goes ahead
    staging = target.with_name(f"{_temporary_prefix(target)}bak.part")
    staging.unlink(missing_ok=True)
    try:
        try:
            os.link(target, staging)
        except OSError:
            shutil.copy2(target, staging)
        os.replace(staging, backup)
    finally:
        staging.unlink(missing_ok=True)


def _resolve(target) -> Path:
    """The file a save of ``target`` must write: a symbolic link's final target, refused if empty."""
    if not os.fspath(target):
        raise StorageError("no file name was given")
    target = Path(target)
    if target.is_symlink():
        target = Path(os.path.realpath(target))
    return target


def _refuse_protected(target: Path, info: os.stat_result):
    """Raise :class:`ProtectedFile` for a read-only target or one that belongs to another user."""
    me = os.geteuid() if hasattr(os, "geteuid") else info.st_uid
    if me not in (0, info.st_uid):  # root keeps the owner (below); anyone else would take the file over
        raise ProtectedFile(f"the file belongs to another user (uid {info.st_uid}); replacing it would make it "
                            "yours", str(target))
    mode = stat.S_IMODE(info.st_mode)
    if not mode & 0o222 or not os.access(target, os.W_OK):  # the mode bits too: root may write anything
        raise ProtectedFile(f"the file is read-only (mode {mode:04o})", str(target))


def _take_over_attributes(temporary: str, info: os.stat_result | None):
    """Give the temporary the old file's mode (a plain new file's if none), and its owner where allowed."""
    # mkstemp makes the file private.
    os.chmod(temporary, stat.S_IMODE(info.st_mode) if info else 0o666 & ~_umask())
    if info is not None and hasattr(os, "chown"):
        try:
            os.chown(temporary, info.st_uid if os.geteuid() == 0 else -1, info.st_gid)
        except OSError:
            pass  # not a member of the file's group: the file keeps our group, as editors do


def replace_atomically(target, write: Callable[[str], None], keep_backup: bool = False,
                       overwrite_protected: bool = False) -> None:
    """Call ``write(temporary_path)``, then put that file in place of ``target``.

    Parameters
    ----------
    target : the file to write; a symbolic link is followed to its target, which is written.
    write : writes the whole output into the path it is given.
    keep_backup : keep the previous version as ``NAME.bak``.
    overwrite_protected : replace a read-only file or another user's (the user agreed).

    Raises
    ------
    ProtectedFile
        for a read-only target or another user's, unless ``overwrite_protected``.
    StorageError
        in plain words (no name given, folder missing or read-only, a special file as
        target, disk full ...); the target and its folder are left as they were,
        apart from the backup and leftovers of earlier saves cut short.
    """
    target = _resolve(target)
    folder = target.parent if str(target.parent) else Path(".")
    if not folder.is_dir():
        raise StorageError(f"cannot write into the folder {folder}: it is not an existing folder", str(target))
    try:
        info = os.stat(target)
    except FileNotFoundError:
        info = None
    except OSError as err:
        raise StorageError(f"cannot write the file: {err.strerror or err}", str(target)) from None
    if info is not None:
        if not_a_regular_file(info.st_mode):
            raise StorageError(f"{not_a_regular_file(info.st_mode)}; Kinepoly writes only regular files",
                               str(target))
        if not overwrite_protected:
            _refuse_protected(target, info)
    remove_stale_temporaries(target)
    try:
        handle, temporary = _temporary(folder, target)
    except OSError as err:
        raise StorageError(f"cannot write into the folder {folder}: {err.strerror or err}", str(target)) from None
    try:
        write(temporary)
        with open(temporary, "rb+") as stream:
            os.fsync(stream.fileno())
        _take_over_attributes(temporary, info)
        if keep_backup and info is not None:
            _keep_backup(target)
        os.replace(temporary, target)
        _sync_folder(folder)
    except OSError as err:
        raise StorageError(f"cannot write the file: {err.strerror or err}", str(target)) from None
    finally:
        if os.path.exists(temporary):
            os.remove(temporary)
        os.close(handle)


def write_atomically(target, data: bytes | str, keep_backup: bool = False, overwrite_protected: bool = False) -> None:
    """Write bytes (or UTF-8 text) to ``target`` through :func:`replace_atomically`."""
    try:
        payload = data.encode("utf-8") if isinstance(data, str) else data
    except UnicodeEncodeError as err:
        raise StorageError(f"the design holds text that cannot be stored as UTF-8 (a lone UTF-16 surrogate, "
                           f"\\u{ord(err.object[err.start]):04x}, at character {err.start + 1} of the file); "
                           "nothing was written", str(target)) from None
    replace_atomically(target, lambda path: Path(path).write_bytes(payload), keep_backup, overwrite_protected)


def save_mechanism(mechanism: Mechanism, path, overwrite_protected: bool = False) -> None:
    """Save a design: never a moment without a complete file at ``path``; the
    previous version stays as ``path.bak``. A read-only or another user's file is
    replaced only with ``overwrite_protected`` (see :func:`replace_atomically`)."""
    write_atomically(path, dumps(mechanism), keep_backup=True, overwrite_protected=overwrite_protected)


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
