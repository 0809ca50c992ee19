"""What every exporter shares: write whole files or nothing, and turn a
mechanism file into a construction with errors that name the place."""

from __future__ import annotations

import os
import sys
import tempfile
from pathlib import Path

from ..errors import CannotAssemble, KinematicsError, MechanismFindings, ParallelLines


class OutputError(KinematicsError):
    """An output file that could not be written; ``location`` is its path."""


def write_atomically(target, write) -> None:
    """Call ``write(temporary_path)`` and move the result onto ``target``.

    The temporary file sits beside the target so the final ``os.replace`` is
    atomic: a reader sees the old file or the whole new one, never a part.
    On any failure the temporary file is removed; an OSError is raised again
    as OutputError naming the target.
    """
    target = Path(target)
    folder = target.parent
    try:
        handle, temporary = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".part", dir=folder)
    except OSError as err:
        raise OutputError(f"cannot write into the folder {folder}: {err.strerror or err}", str(target)) from None
    os.close(handle)
    try:
        write(temporary)
        # mkstemp makes the file private; give it the mode a plain new file (or the old one) would have.
        os.chmod(temporary, target.stat().st_mode & 0o7777 if target.exists() else 0o666 & ~_umask())
        os.replace(temporary, target)
    except OSError as err:
        raise OutputError(f"cannot write the file: {err.strerror or err}", str(target)) from None
    finally:
        if os.path.exists(temporary):
            os.remove(temporary)


def _umask() -> int:
    mask = os.umask(0)
    os.umask(mask)
    return mask


def construction_from_file(path, angle_deg=None):
    """Load, solve and construct the mechanism in ``path`` at driver angle ``angle_deg``."""
    from .. import construct, load_mechanism, solve

    return construct(solve(load_mechanism(path), angle_deg))


def run_reporting(action) -> int:
    """Run ``action()`` and turn refusals into exit codes with a message on stderr:
    0 done, 1 output not written, 2 bad file or findings, 3 no pose or no
    construction at that angle (cannot assemble, dead point)."""
    try:
        action()
    except MechanismFindings as err:
        for finding in err.findings:
            print(f"error: {finding}", file=sys.stderr)
        return 2
    except (CannotAssemble, ParallelLines) as err:
        print(f"error: {err}", file=sys.stderr)
        return 3
    except OutputError as err:
        print(f"error: {err}", file=sys.stderr)
        return 1
    except KinematicsError as err:
        print(f"error: {err}", file=sys.stderr)
        return 2
    return 0
