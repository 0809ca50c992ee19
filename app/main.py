"""The ``kinepoly`` command: analysis subcommands run without Qt; ``render``
and ``print`` draw offscreen; anything else opens the window."""

from __future__ import annotations

import os
import sys

CORE_COMMANDS = ("check", "solve", "construct", "centres", "sweep", "export")


USAGE = """usage: kinepoly [FILE]                 open the drafting window (on FILE)
       kinepoly check FILE              mobility, Grashof, transmission angle, limit positions
       kinepoly solve FILE [--angle DEG] [--json | --csv]
       kinepoly construct FILE [--angle DEG] [--json]
       kinepoly centres FILE [--angle DEG] [--json]
       kinepoly sweep FILE [--steps N] [-o cycle.csv] [--peaks] [--json]
       kinepoly render FILE [--angle DEG] -o view.png [--size 1600x1000]
       kinepoly print FILE [--angle DEG] [--paper A3] [--landscape] -o sheet.pdf
       kinepoly export FILE [--angle DEG] -o drawing.dxf
       kinepoly report FILE [-o review.pdf] [--paper A4|A3] [--steps N] [--angles 30,150,...]
Each command takes --help. Exit codes: 0 ok, 1 output not written, 2 bad file or findings,
3 cannot assemble at that angle."""


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
    if argv[:1] in (["-h"], ["--help"]):
        print(USAGE)
        return 0
    if argv and argv[0] in CORE_COMMANDS:
        from kinematics.cli import main as core_main

        return core_main(argv)
    if argv and argv[0] == "render":
        from app.render import main as render_main

        return render_main(argv[1:])
    if argv and argv[0] == "print":
        from app.printing import main as print_main

        return print_main(argv[1:])
    if argv and argv[0] == "report":
        from app.review import main as report_main

        return report_main(argv[1:])
    from app.window import run

    return run(argv)


if __name__ == "__main__":
    sys.exit(main())
