"""The largest design Kinepoly analyses, and the sentence that refuses a larger one.

Chosen from ``bench/bench_sizes.py``: below these, every command-line verb (check, solve,
construct, centres, sweep, render, print, export) does its own work within 2 s on a shared
two-core machine. The points bound the numeric solver (a dense Jacobian of two columns a point)
and the drawings; the links and slides bound the instantaneous centres, whose count grows with
the square of the bodies and whose search by Kennedy's theorem faster still.
"""

from __future__ import annotations

MAX_POINTS = 100
MAX_LINKS_AND_SLIDES = 24


def limit_sentence(place: str) -> str:
    """The limit of ``place`` (``"points"`` or ``"links"``) in plain words, with why it is there."""
    if place == "points":
        return (f"Kinepoly analyses designs of at most {MAX_POINTS:,} points (beyond that its answers would "
                "take more than a few seconds)")
    return (f"Kinepoly analyses designs of at most {MAX_LINKS_AND_SLIDES} links and slides together (the "
            "instantaneous centres of more bodies would take more than a few seconds)")


def beyond_limits(points: int, links: int, slides: int) -> tuple:
    """("", "") within the limits, else (the place, why) in plain words."""
    if points > MAX_POINTS:
        return "points", f"the design has {points:,} points; {limit_sentence('points')}"
    if links + slides > MAX_LINKS_AND_SLIDES:
        return "links", f"the design has {links:,} links and {slides:,} slides; {limit_sentence('links')}"
    return "", ""
