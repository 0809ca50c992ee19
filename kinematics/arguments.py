"""Command-line values every verb shares: a driver angle, an output file name, and argv as argparse
should see it. Each refusal is argparse's own (exit code 2, ``argument --angle: …``)."""

from __future__ import annotations

import argparse
import math

# Options whose value may start with "-" and still be a number ("-inf", "-1e5").
NUMERIC_OPTIONS = ("--angle",)


def finite_angle(text: str) -> float:
    """The ``--angle`` value: a finite number of degrees."""
    try:
        value = float(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f'"{text}" is not an angle in degrees') from None
    if not math.isfinite(value):
        raise argparse.ArgumentTypeError(f'"{text}" is not a finite angle in degrees')
    return value


def output_name(text: str) -> str:
    """The ``-o`` value: a file name, never empty (an empty one is no file, not the screen)."""
    if not text:
        raise argparse.ArgumentTypeError("the file name is empty")
    return text


def _number(text: str) -> bool:
    try:
        float(text)
    except ValueError:
        return False
    return True


def joined_numbers(argv) -> list:
    """``argv`` with ``--angle -1e5`` written ``--angle=-1e5``: argparse takes a value that starts
    with "-" and is not a plain negative number (``-inf``, ``-1e5``) for another option."""
    argv = list(argv)
    joined = []
    i = 0
    while i < len(argv):
        if argv[i] in NUMERIC_OPTIONS and i + 1 < len(argv) and argv[i + 1].startswith("-") and _number(argv[i + 1]):
            joined.append(f"{argv[i]}={argv[i + 1]}")
            i += 2
            continue
        joined.append(argv[i])
        i += 1
    return joined
