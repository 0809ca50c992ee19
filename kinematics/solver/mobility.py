"""Degrees of freedom: the Gruebler-Kutzbach count and the true mobility
from the rank of the constraint Jacobian, and what stops analysis."""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..errors import MechanismFindings
from ..model.limits import beyond_limits
from ..model.mechanism import GROUND, Mechanism
from ..model.memo import remembered
from .constraints import constraint_system


@dataclass(frozen=True)
class Finding:
    """Something that stops analysis, with the place it is about."""

    location: str
    message: str

    def __str__(self):
        return f"{self.location}: {self.message}" if self.location else self.message


def gruebler_count(mech: Mechanism) -> int:
    """M = 3(n − 1) − 2·j1 − j2 over the bodies that exist (links and frame)."""
    bodies = len(mech.links) + 1
    pins = sum(max(len(mech.bodies_of(p)) - 1, 0) for p in mech.points)
    return 3 * (bodies - 1) - 2 * pins - len(mech.slides)


def loose_points(mech: Mechanism) -> list:
    return [p for p in mech.points if not mech.bodies_of(p)]


RANK_RELATIVE = 1e-9  # singular values below this share of the largest count as zero
INVOLVED = 1e-8  # a row whose weight in a dependency among the rows is below this takes no part in it


def _rank(matrix) -> int:
    if matrix.size == 0:
        return 0
    singular = np.linalg.svd(matrix, compute_uv=False)
    return int(np.sum(singular > RANK_RELATIVE * max(singular[0], 1e-300)))


@dataclass(frozen=True)
class Redundancy:
    """The constraint rows of one design that repeat others.

    ``removable``: links and slides whose constraints could all go without changing the rank;
    ``involved``: every link and slide with a row in a dependency among the rows (file order,
    links first)."""

    mobility: int
    removable: tuple
    involved: tuple


def redundancy(mech: Mechanism) -> Redundancy:
    """Mobility from the rank of the constraint Jacobian at the reference pose, and which links and
    slides repeat each other's constraints there (kept for as long as the mechanism lives)."""
    return remembered(mech, "redundancy", lambda: _redundancy(mech))


def _private_points(mech: Mechanism) -> set:
    """Moving points past the first two of exactly one link and on no slide.

    Such a point's two rows (dot and cross with its link's first two points, which lie apart) are
    the only rows that move it, and are independent on its own two coordinates: each adds exactly
    2 to the rank and 2 unknowns, and takes part in no dependency. The rank test leaves them out,
    so a link of ten thousand points costs what a link of two does."""
    on_slides = {p for slide in mech.slides.values() for p in (slide.point, *slide.line)}
    links_of = {}
    for pts in mech.links.values():
        for p in pts:
            links_of[p] = links_of.get(p, 0) + 1
    return {p for pts in mech.links.values() for p in pts[2:]
            if links_of[p] == 1 and p not in on_slides and p not in mech.ground}


def _redundancy(mech: Mechanism) -> Redundancy:
    system = constraint_system(mech)
    skipped = set(loose_points(mech)) | _private_points(mech)
    keep = [i for i, n in enumerate(system.names) if system.free[i] and n not in skipped]
    columns = np.array([2 * i + k for i in keep for k in (0, 1)], dtype=int)
    private = [i for i, n in enumerate(system.names) if n in skipped]
    rows = np.flatnonzero(~np.isin(system.c, private))
    jac = system.jacobian(system.x0, rows)[:, columns] if len(rows) else np.zeros((0, len(columns)))
    rank = _rank(jac)
    mobility = len(columns) - rank
    if rank == len(jac):
        return Redundancy(mobility, (), ())
    # The left null space holds the dependencies among the rows: a row with weight in it repeats others.
    left, singular, _ = np.linalg.svd(jac, full_matrices=True)
    weight = np.linalg.norm(left[:, rank:], axis=1)
    owners = np.array(system.owner, dtype=object)[rows]
    order = [*mech.links, *mech.slides]
    involved = tuple(o for o in order if (weight[owners == o] > INVOLVED).any())
    removable = tuple(o for o in involved if _rank(jac[owners != o]) == rank)
    return Redundancy(mobility, removable, involved)


def jacobian_mobility(mech: Mechanism):
    """(mobility, redundant links and slides) from the rank of the constraint Jacobian at the reference pose."""
    found = redundancy(mech)
    return found.mobility, list(found.removable)


def _named(mech: Mechanism, owner: str) -> str:
    return f"slide {owner}" if owner in mech.slides else f"link {owner}"


def _redundancy_finding(mech: Mechanism, found: Redundancy, count: int) -> Finding:
    """The finding for constraints that repeat others, at the last removable link or slide."""
    last = (found.removable or found.involved)[-1]
    others = ", ".join(_named(mech, o) for o in found.involved if o != last) or "its own other constraints"
    where = f"slides.{last}" if last in mech.slides else f"links.{last}"
    return Finding(where, f"{_named(mech, last)} is redundant: at this geometry its constraints repeat those of "
                          f"{others} (Gruebler-Kutzbach count {count}, true mobility {found.mobility} from the rank "
                          "of the constraint Jacobian)")


def diagnose(mech: Mechanism) -> list:
    """The findings that stop analysis (an empty list means ready to solve).

    Mechanisms are immutable, so the answer is kept for as long as the mechanism lives."""
    return list(remembered(mech, "findings", lambda: tuple(_diagnose(mech))))


# The solver converges to 1e-12 of the larger of the design's size and 1 mm (solve.newton_tolerance):
# below 1 µm that floor is more than a billionth of the design, and at 1e-154 m the squares of its
# lengths underflow to zero.
MIN_SIZE_M = 1e-6


def _too_small(mech: Mechanism) -> list:
    size_m = mech.size * mech.metres_per_unit
    if not 0.0 < size_m < MIN_SIZE_M:
        return []
    size_mm = size_m * 1e3
    return [Finding("points", f"the design is {size_mm:.3g} mm across; designs smaller than {MIN_SIZE_M * 1e3:g} mm "
                              "(1 µm) cannot be analysed (the solver's tolerance would exceed a billionth of their "
                              "size)")]


def _diagnose(mech: Mechanism) -> list:
    place, why = beyond_limits(len(mech.points), len(mech.links), len(mech.slides))
    if why:  # a design built in code, past the limits the file format keeps
        return [Finding(place, why)]
    findings = _too_small(mech)
    if findings:
        return findings
    unit = mech.length_unit
    for link, pts in mech.links.items():
        (ax, ay), (bx, by) = mech.points[pts[0]], mech.points[pts[1]]
        apart = math.hypot(bx - ax, by - ay)
        if apart == 0.0:
            findings.append(Finding(f"links.{link}", f"the first two points {pts[0]} and {pts[1]} of link {link} "
                                                     "coincide: the link has no length to keep"))
        elif apart <= RANK_RELATIVE * mech.size:
            # Shorter than the rank test can tell from nothing: it would read as a redundant link.
            findings.append(Finding(f"links.{link}", f"the first two points {pts[0]} and {pts[1]} of link {link} "
                                                     f"are {apart:.3g} {unit} apart, under a billionth of the "
                                                     f"design's size ({mech.size:.3g} {unit}): too short to analyse"))
    if findings:
        return findings
    for p in loose_points(mech):
        findings.append(Finding(f"points.{p}", f"point {p} is on no link and not on ground"))
    if mech.driver is None:
        findings.append(Finding("driver", "no driver: choose the driving link, its pivot and its speed"))
    else:
        fixed = [p for p in mech.links[mech.driver.link] if p in mech.ground and p != mech.driver.pivot]
        if fixed:
            findings.append(Finding("driver.link", f"the driver {mech.driver.link} is fixed to ground at "
                                                   f"{mech.driver.pivot} and {fixed[0]}: it cannot turn"))
    found = redundancy(mech)
    mobility, count = found.mobility, gruebler_count(mech)
    if found.involved:
        findings.append(_redundancy_finding(mech, found, count))
    elif mobility != 1:
        need = ("the linkage needs another link or constraint" if mobility > 1
                else "the linkage is a structure: it cannot move")
        findings.append(Finding("", f"mobility is {mobility} (expected 1): {need} "
                                    f"(Gruebler-Kutzbach count {count})"))
    return findings


def require_ready(mech: Mechanism):
    """Raise :class:`MechanismFindings` unless the mechanism can be analysed."""
    findings = diagnose(mech)
    if findings:
        raise MechanismFindings(findings)


__all__ = ["Finding", "diagnose", "gruebler_count", "jacobian_mobility", "require_ready", "GROUND"]
