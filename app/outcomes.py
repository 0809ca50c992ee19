"""What every exporter shares: turn a mechanism file into a construction, and
refusals into exit codes with messages that name the place. Files are written
whole or not at all by :mod:`kinematics.files.storage`."""

from __future__ import annotations

import sys

from kinematics.errors import CannotAssemble, KinematicsError, MechanismFindings, ParallelLines, StorageError


def construction_from_file(path, angle_deg=None, length_m=None):
    """Load, solve and construct the mechanism in ``path`` at driver angle ``angle_deg`` (or, for a
    cylinder driver, at cylinder length ``length_m``, metres)."""
    from kinematics import construct, load_mechanism, solve

    return construct(solve(load_mechanism(path), angle_deg, length=length_m))


def forces_of(construction):
    """The force polygon of ``construction``'s pose (NoMassData, ParallelLines or
    ForcesUndetermined when it has none)."""
    from kinematics.forcepolygon import force_polygon

    return force_polygon(construction)


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
    except StorageError as err:
        print(f"error: {err}", file=sys.stderr)
        return 1
    except KinematicsError as err:
        print(f"error: {err}", file=sys.stderr)
        return 2
    return 0
