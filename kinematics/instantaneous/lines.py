"""The geometry of Kennedy's theorem with points at infinity.

A centre is a :class:`Place`: a point of the plane (complex, metres) or a point at
infinity (a unit direction, its sign made canonical, since a direction at infinity has
no sense). A line of Kennedy's theorem joins two known centres: through two finite
centres; through a finite centre in the direction of an infinite one; or, through two
infinite centres, the line at infinity. Two lines meet at a finite point, at infinity
in their common direction (parallel lines), or nowhere in particular (coincident
lines: the centre is undetermined). The finite case is the polygon's own
:func:`kinematics.groups.base.intersect`, so its condition figure is the same.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..groups.base import Line, intersect

# Two lines meeting at a smaller sine are parallel: their meeting point would lie more than
# 1e12 mechanism sizes away, where rounding of the space diagram (1e-16 relative) decides it.
PARALLEL_SINE = 1e-12
# Two centres closer than this share of the mechanism's size are one point (a line through
# both is not defined); two parallel lines closer than this are one line.
COINCIDENT = 1e-9


@dataclass(frozen=True)
class Place:
    """Where a centre is: ``point`` (complex, m) or, when ``infinite``, the unit ``direction``."""

    point: complex = 0j
    direction: complex = 0j
    infinite: bool = False

    @classmethod
    def at(cls, z) -> Place:
        """The finite place ``z`` (complex, m)."""
        return cls(point=complex(z))

    @classmethod
    def towards(cls, d) -> Place:
        """The point at infinity in direction ``d`` (either sense: the same point)."""
        d = complex(d) / abs(d)
        if d.real < 0 or (d.real == 0 and d.imag < 0):
            d = -d
        return cls(direction=d, infinite=True)

    def xy(self) -> tuple[float, float]:
        """The point (m), or for a place at infinity its direction, as (x, y)."""
        z = self.direction if self.infinite else self.point
        return (z.real, z.imag)


@dataclass(frozen=True)
class KennedyLine:
    """A line through two known centres; ``line`` is None for the line at infinity."""

    line: Line | None

    @property
    def at_infinity(self) -> bool:
        """Whether this is the line at infinity (through two centres at infinity)."""
        return self.line is None


def join(p: Place, q: Place, size_m: float) -> KennedyLine | Place:
    """The line through two centres. Where the two coincide no line is defined, but the third
    centre of their triple is then found already: it is that same place (every body of the
    triple has the same velocity there, or they translate the same way). Returns that Place."""
    if not p.infinite and not q.infinite:
        if abs(q.point - p.point) <= COINCIDENT * size_m:
            return p
        return KennedyLine(Line(np.complex128(p.point), np.complex128(q.point - p.point)))
    if p.infinite and q.infinite:
        if abs((p.direction.conjugate() * q.direction).imag) <= COINCIDENT:
            return p
        return KennedyLine(None)
    finite, far = (p, q) if q.infinite else (q, p)
    return KennedyLine(Line(np.complex128(finite.point), np.complex128(far.direction)))


@dataclass(frozen=True)
class Meeting:
    """Where two lines meet: ``place`` (None where they coincide), the sine of the angle
    between them and the condition figure of the 2×2 solve (1 for the line at infinity, whose
    meeting with another line is exact)."""

    place: Place | None
    sine: float
    condition: float


def meet(first: KennedyLine, second: KennedyLine, size_m: float) -> Meeting:
    """Where two Kennedy lines meet: a point, a centre at infinity where they are parallel (or one is the line
    at infinity), or no place where they coincide. ``size_m`` is the mechanism's size, for the tolerances."""
    if first.at_infinity and second.at_infinity:
        return Meeting(None, 0.0, float("inf"))
    if first.at_infinity or second.at_infinity:
        finite = second if first.at_infinity else first
        return Meeting(Place.towards(complex(finite.line.direction)), 1.0, 1.0)
    crossing = intersect(first.line, second.line)
    sine = float(crossing.sine)
    if abs(sine) > PARALLEL_SINE:
        return Meeting(Place.at(complex(crossing.point)), sine, float(crossing.condition))
    u = complex(first.line.direction) / abs(complex(first.line.direction))
    apart = abs((u.conjugate() * complex(second.line.through - first.line.through)).imag)
    if apart <= COINCIDENT * size_m:
        return Meeting(None, sine, float("inf"))
    return Meeting(Place.towards(u), sine, float("inf"))
