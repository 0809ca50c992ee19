"""The ``kinepoly`` command, the one entry point: a verb runs the command line
(:mod:`app.cli`, which imports Qt only for the verbs that draw), anything else opens
the drafting window."""

from __future__ import annotations

import os
import sys


def main(argv=None) -> int:
    """Run ``kinepoly ARGV``; a reader that leaves early (``| head -1``) ends it quietly with exit code 1."""
    try:
        code = _dispatch(list(sys.argv[1:] if argv is None else argv))
        sys.stdout.flush()
    except BrokenPipeError:
        # Nothing more can reach the reader; point stdout at nothing so the interpreter's own final
        # flush does not fail again on the way out.
        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
        return 1
    return code


def _dispatch(argv: list) -> int:
    from app.cli import USAGE, VERBS

    if argv[:1] in (["-h"], ["--help"]):
        print(USAGE)
        return 0

    if argv and argv[0] in VERBS:
        from app.cli import main as command_line

        return command_line(argv)
    from app.window import run

    return run(argv)


if __name__ == "__main__":
    sys.exit(main())
