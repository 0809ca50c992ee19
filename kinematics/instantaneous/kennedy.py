"""The instantaneous centres of every pair of bodies of a solved pose.

The bodies are the frame (``ground``), every link in the file's order, and one block
for every slide, named as the slide: the file states a slide as a point of a link
running on a guide line, and the block is what the trade draws there (so
:mod:`kinematics.groups.decompose` treats a slide group as a single link). The block is
pinned at the slide's point to every body that holds that point and slides on the
guide; a slider-crank therefore has four bodies and six centres, as in the books.

Primary centres are seen at a glance: a point shared by two bodies is their pin; a
block's centre on its guide lies at infinity, perpendicular to the guide line.
Secondary centres follow from Kennedy's theorem (the three centres of any three
bodies lie on one line) in the trade's order: the bodies are the corners of a
polygon whose sides are the centres known; a diagonal is drawn when it closes two
triangles of known sides, and the centre is where the two lines meet. Each is a
:class:`~kinematics.groups.steps.Step` (role KNOWN for a primary centre,
DIRECTION for a line, INTERSECTION for a centre found), coordinates in metres.
"""

from __future__ import annotations

from dataclasses import dataclass
from itertools import combinations
from types import MappingProxyType

import numpy as np

from ..groups.steps import FLAG_CONDITION, Role, Step
from ..model.mechanism import GROUND, Mechanism
from ..solver.solve import Solution
from .lines import KennedyLine, Place, join, meet


@dataclass(frozen=True)
class Centre:
    """The instantaneous centre of two bodies.

    ``kind`` is ``"point"`` (``place.point`` in m), ``"direction"`` (at infinity, the unit
    ``place.direction``: the bodies translate relative to each other, perpendicular to it) or
    ``"undetermined"`` (``reason`` says why). ``how`` says how it was found, in words;
    ``step`` is the id of its step; ``condition`` the condition figure of the intersection that
    fixed it (None for a primary centre) and ``flagged`` whether that figure is large; ``lines``
    the ids of the steps of the two lines of Kennedy's theorem that meet there (none for a primary
    centre, or one found where two centres of a triple coincide).
    """

    bodies: tuple
    kind: str
    place: Place | None
    how: str
    primary: bool
    step: str
    reason: str = ""
    condition: float | None = None
    flagged: bool = False
    lines: tuple = ()

    @property
    def name(self) -> str:
        """The pair's name, ``"a|b"``."""
        return "|".join(self.bodies)

    @property
    def at_m(self) -> tuple | None:
        """(x, y) in metres for a finite centre, else None."""
        return self.place.xy() if self.kind == "point" else None

    @property
    def direction(self) -> tuple | None:
        """The unit direction (x, y) of a centre at infinity, else None."""
        return self.place.xy() if self.kind == "direction" else None


@dataclass(frozen=True)
class Centres:
    """Every centre of one pose, and the velocities found from them alone.

    Attributes
    ----------
    solution : the pose.
    bodies : ``ground``, the links in the file's order, then the slides' blocks (named as the slides).
    centres : pair name ``"a|b"`` (a before b in ``bodies``) -> :class:`Centre`, in the order found.
    steps : the drawn steps, primary centres first, then each Kennedy construction.
    angular_velocity_ratio : link -> ω of the link per unit ω of the driver (from the centres).
    velocity_ratio : point -> (x, y) velocity per unit ω of the driver, m/rad (from the centres).
    max_relative_difference, where : the largest difference of these velocities (and ω) from the
        velocity polygon and the solver, relative to the largest of each kind, and where it occurs.
    warnings : what could not be found, and nearly parallel lines.
    """

    solution: Solution
    bodies: tuple
    centres: MappingProxyType
    steps: tuple
    angular_velocity_ratio: MappingProxyType
    velocity_ratio: MappingProxyType
    max_relative_difference: float
    where: str
    warnings: tuple = ()

    def centre(self, a: str, b: str) -> Centre:
        """The centre of bodies ``a`` and ``b``, in either order."""
        return self.centres[pair_name(self.bodies, a, b)]

    def _driver_speed(self) -> float:
        """The driver link's ω the ratios are per unit of (a cylinder's barrel: from the centres)."""
        from .velocities import driver_speed

        ratios = {k: complex(x, y) for k, (x, y) in self.velocity_ratio.items()}
        return driver_speed(self.solution.mechanism, ratios, self.solution.position)

    @property
    def angular_velocity(self) -> MappingProxyType:
        """Link -> rad/s, from the centres and the driver's speed."""
        omega = self._driver_speed()
        return MappingProxyType({k: v * omega for k, v in self.angular_velocity_ratio.items()})

    @property
    def velocities(self) -> MappingProxyType:
        """Point -> (vx, vy) m/s, from the centres and the driver's speed."""
        omega = self._driver_speed()
        return MappingProxyType({k: (x * omega, y * omega) for k, (x, y) in self.velocity_ratio.items()})


def body_names(mech: Mechanism) -> tuple:
    """The bodies whose centres are found: ``ground``, the links in the file's order, then the slides' blocks."""
    return (GROUND, *mech.links, *mech.slides)


def pair_name(bodies: tuple, a: str, b: str) -> str:
    """The name ``"a|b"`` of a pair of bodies, the one earlier in ``bodies`` first."""
    first, second = sorted((a, b), key=bodies.index)
    return f"{first}|{second}"


def _label(name: str) -> str:
    return f"I {name}"


class _Finder:
    """The centres as they are found, with their steps."""

    def __init__(self, solution: Solution):
        self.solution = solution
        self.mech = solution.mechanism
        self.bodies = body_names(self.mech)
        extent = np.ptp(solution.positions, axis=0).max() if len(solution.positions) else 0.0
        self.size_m = max(float(extent), self.mech.size * self.mech.metres_per_unit, 1e-6)
        self.found: dict[str, Centre] = {}
        self.steps: list[Step] = []
        self.warnings: list[str] = []
        self.coincident: dict[str, str] = {}  # pair -> why its lines so far coincide

    def pos(self, point: str) -> complex:
        return complex(*self.solution.position(point))

    def name(self, a, b) -> str:
        return pair_name(self.bodies, a, b)

    def known(self, a, b) -> Centre | None:
        centre = self.found.get(self.name(a, b))
        return centre if centre is not None and centre.kind != "undetermined" else None

    def step(self, role, label, coords, equation, text, **extra) -> str:
        sid = f"c{len(self.steps) + 1}"
        self.steps.append(Step(id=sid, polygon="centres", role=role, component=None, label=label, coords=coords,
                               equation=equation, text=text, **extra))
        return sid

    def settle(self, a, b, place: Place | None, how: str, primary: bool, role=Role.INTERSECTION, reason="",
               condition=None, sine=None, points=(), about="", lines=()):
        name = self.name(a, b)
        bodies = tuple(name.split("|"))
        kind = "undetermined" if place is None else "direction" if place.infinite else "point"
        coords = ((place.point.real, place.point.imag),) if kind == "point" else ()
        flagged = kind == "point" and condition is not None and condition > FLAG_CONDITION
        if flagged:
            how += f" — nearly parallel, condition figure {condition:.3g}"
            self.warnings.append(f"centre {name}: its two lines meet nearly parallel, condition figure "
                                 f"{condition:.3g}")
        if kind == "undetermined":
            self.warnings.append(f"centre {name} is undetermined: {reason}")
        angle = None if sine is None else float(np.degrees(np.arcsin(min(1.0, abs(sine)))))
        sid = self.step(role, name, coords, f"{_label(name)}: {how}", f"{name}: {describe(kind, place, how, reason)}",
                        points=points, links=bodies, about=about, condition=condition, angle_between_deg=angle,
                        flagged=flagged)
        self.found[name] = Centre(bodies=bodies, kind=kind, place=place, how=how, primary=primary, step=sid,
                                  reason=reason, condition=condition, flagged=flagged, lines=lines)

    def primaries(self):
        mech = self.mech
        for point in mech.points:
            holders = mech.bodies_of(point) + [s.name for s in mech.slides.values() if s.point == point]
            for a, b in combinations(holders, 2):
                if self.name(a, b) not in self.found:
                    self.settle(a, b, Place.at(self.pos(point)), f"the pin {point}", True, Role.KNOWN,
                                points=(point,))
        for slide in mech.slides.values():
            e, f = slide.line
            if self.name(slide.name, slide.guide) not in self.found:
                normal = 1j * (self.pos(f) - self.pos(e))
                self.settle(slide.name, slide.guide, Place.towards(normal),
                            f"the block of slide {slide.name} on {slide.guide}: at infinity, perpendicular to the "
                            f"guide line {e}-{f}", True, Role.KNOWN, points=(slide.point,), about=slide.guide)

    def line(self, a, b, k):
        """The line of Kennedy's theorem for bodies a, b, k through I_ak and I_bk: a KennedyLine,
        or the Place of I_ab itself where those two coincide."""
        return join(self.known(a, k).place, self.known(b, k).place, self.size_m)

    def line_step(self, a, b, k, line: KennedyLine) -> str:
        first, second = self.name(a, k), self.name(b, k)
        p, q = self.known(a, k).place, self.known(b, k).place
        if line.at_infinity:
            coords, where = (), "the line at infinity (both centres lie at infinity)"
        else:
            if p.infinite or q.infinite:  # through the finite centre, one mechanism size along
                start = complex(line.line.through)
                ends = (start, start + complex(line.line.direction) * self.size_m)
            else:
                ends = (p.point, q.point)
            coords = tuple((z.real, z.imag) for z in ends)
            where = f"the line through {_label(first)} and {_label(second)}"
        return self.step(Role.DIRECTION, "", coords,
                         f"{_label(first)}, {_label(second)}, {_label(self.name(a, b))} in line",
                         f"{where}: Kennedy's theorem for {a}, {b} and {k}", links=(a, b, k))

    def secondary(self, a, b, thirds) -> bool:
        """Find I_ab from the triples with ``thirds``. False, with the reason kept, when every two of
        their lines coincide: a triple found later may still fix it."""
        lines = {}
        for k in thirds:
            found = self.line(a, b, k)
            if isinstance(found, Place):  # two centres of the triple coincide: the third is there too
                self.settle(a, b, found, f"where {_label(self.name(a, k))} and {_label(self.name(b, k))} coincide "
                            f"(Kennedy's theorem for {a}, {b} and {k})", False)
                return True
            lines[k] = found
        best = None
        for k1, k2 in combinations(lines, 2):
            meeting = meet(lines[k1], lines[k2], self.size_m)
            rank = (meeting.place is not None, abs(meeting.sine))
            if best is None or rank > best[0]:
                best = (rank, k1, k2, meeting)
        _, k1, k2, meeting = best
        through = (f"the lines through {_label(self.name(a, k1))}, {_label(self.name(b, k1))} and through "
                   f"{_label(self.name(a, k2))}, {_label(self.name(b, k2))}")
        if meeting.place is None:
            self.coincident[self.name(a, b)] = (f"{through} coincide (Kennedy's theorem for {a}, {b} with {k1} and "
                                                f"with {k2})")
            return False
        drawn = tuple(self.line_step(a, b, k, lines[k]) for k in (k1, k2))
        if meeting.place.infinite:
            how = (f"{through} are parallel" if not (lines[k1].at_infinity or lines[k2].at_infinity)
                   else f"{through} meet at infinity")
            self.settle(a, b, meeting.place, how, False, condition=meeting.condition, sine=meeting.sine, lines=drawn)
        else:
            self.settle(a, b, meeting.place, f"where {through} meet", False, condition=meeting.condition,
                        sine=meeting.sine, lines=drawn)
        return True

    def kennedy(self):
        pairs = list(combinations(self.bodies, 2))
        progress = True
        while progress:
            progress = False
            for a, b in pairs:
                if self.name(a, b) in self.found:
                    continue
                thirds = [k for k in self.bodies if k not in (a, b) and self.known(a, k) and self.known(b, k)]
                if (len(thirds) >= 2 or any(isinstance(self.line(a, b, k), Place) for k in thirds)) \
                        and self.secondary(a, b, thirds):
                    progress = True
                    break  # the polygon changed: look again from its first diagonal
        for a, b in pairs:
            name = self.name(a, b)
            if name not in self.found:
                self.settle(a, b, None, "", False, reason=self.coincident.get(name, (
                    "Kennedy's theorem gives fewer than two lines through it (no two triangles of known centres "
                    "close this diagonal)")))


def describe(kind: str, place: Place | None, how: str, reason: str) -> str:
    """A centre in words: where it is and how it was found."""
    if kind == "undetermined":
        return f"undetermined: {reason}"
    if kind == "direction":
        ux, uy = place.xy()
        angle = float(np.degrees(np.arctan2(uy, ux)))
        return f"at infinity in direction {angle:.1f}° ({how})"
    x, y = place.xy()
    return f"at ({x * 1000:.2f}, {y * 1000:.2f}) mm: {how}"


def find_centres(solution: Solution) -> _Finder:
    """Primary centres, then the secondary ones in the trade's order."""
    finder = _Finder(solution)
    finder.primaries()
    finder.kennedy()
    return finder
