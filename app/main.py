"""The ``kinepoly`` command: analysis subcommands run without Qt; ``render``
and ``print`` draw offscreen; anything else opens the window."""

from __future__ import annotations

import sys

CORE_COMMANDS = ("check", "solve", "construct", "sweep", "export")


def main(argv=None) -> int:
    argv = list(sys.argv[1:] if argv is None else argv)
    if argv and argv[0] in CORE_COMMANDS:
        from kinematics.cli import main as core_main

        return core_main(argv)
    if argv and argv[0] == "render":
        from app.render import main as render_main

        return render_main(argv[1:])
    if argv and argv[0] == "print":
        from app.printing import main as print_main

        return print_main(argv[1:])
    from app.window import run

    return run(argv)


if __name__ == "__main__":
    sys.exit(main())
