"""Command-line values every verb shares: a driver angle or a cylinder length, an output file name, and argv as argparse
should see it. Each refusal is argparse's own (exit code 2, ``argument --angle: …``)."""

from __future__ import annotations

import argparse
import math

# Options whose value may start with "-" and still be a number ("-inf", "-1e5").
NUMERIC_OPTIONS = ("--angle", "--length")


def finite_angle(text: str) -> float:
    """The ``--angle`` value: a finite number of degrees."""
    try:
        value = float(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f'"{text}" is not an angle in degrees') from None
    if not math.isfinite(value):
        raise argparse.ArgumentTypeError(f'"{text}" is not a finite angle in degrees')
    return value


def cylinder_length_mm(text: str) -> float:
    """The ``--length`` value: a cylinder's length, a positive finite number of millimetres."""
    try:
        value = float(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f'"{text}" is not a cylinder length in mm') from None
    if not (math.isfinite(value) and value > 0.0):
        raise argparse.ArgumentTypeError(f'"{text}" is not a positive finite cylinder length in mm')
    return value


def pose_length_m(args) -> float | None:
    """The ``--length`` asked for (mm, for people) in metres, as the core takes it; None if not given."""
    return None if getattr(args, "length", None) is None else args.length / 1000.0


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


def parse_size(text: str) -> tuple[int, int]:
    """``"1600x1000"`` -> (1600, 1000); refuses sizes that cannot hold the drawings."""
    try:
        width, height = (int(part) for part in text.lower().split("x"))
    except ValueError:
        raise argparse.ArgumentTypeError(f'size "{text}" is not WIDTHxHEIGHT in pixels, e.g. 1600x1000') from None
    if not (300 <= width <= 10000 and 200 <= height <= 10000):
        raise argparse.ArgumentTypeError(f"size {width}x{height} is outside 300x200 … 10000x10000 pixels")
    return width, height


def review_angles(text: str) -> tuple:
    """The ``--angles`` value of ``kinepoly report``: finite degrees separated by commas."""
    try:
        angles = tuple(float(part) for part in text.split(",") if part.strip())
    except ValueError:
        raise argparse.ArgumentTypeError(f"angles as degrees separated by commas (30,150), not {text!r}") from None
    if not angles or not all(math.isfinite(a) for a in angles):
        raise argparse.ArgumentTypeError(f"angles as finite degrees separated by commas, not {text!r}")
    return angles
