"""What every group form shares in the force polygon: the known loads on each body, the
reactions passed back to the bodies found earlier, and the steps every form lays alike.

Notation (one, everywhere): ``F(a→b)`` is the force of body a on body b, with the bodies'
names: a link's name, ``frame``, ``pin P`` (the pin element at point P where one stands: a
moving point that carries a mass or a pin load and joins two links, or joins three or more) or
``block P`` (the block at the sliding point P). A slide's guide force is ``F(guide→block P)``,
normal to the guide (no friction). Forces are complex N (x + iy), points complex m; a couple
is N·m, counter-clockwise positive.

The groups are met from the last back to the driver. Each finds the forces at its outer
connections and passes their reactions on to the bodies there (:meth:`ForceState.react`), so
when a group is reached every load on its links is known.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from ..errors import ParallelLines
from ..model.mechanism import GROUND
from .base import Line, cross, intersect, unit
from .steps import Component, PolygonBuilder, Role, as_xy, figure
from .vectors import direction_deg

FRAME = "frame"


def force_label(by: str, on: str) -> str:
    """``F(by→on)``: the force of ``by`` on ``on`` (the one notation of the force polygon)."""
    return f"F({by}→{on})"


@dataclass(frozen=True)
class Applied:
    """A known load on a body: ``force`` (complex N) with its line of action through ``at``
    (complex m), plus a ``couple`` (N·m); a pure couple has ``force`` 0."""

    force: complex
    at: complex
    label: str
    component: Component
    text: str
    couple: float = 0.0
    links: tuple = ()
    points: tuple = ()


@dataclass
class ForceState:
    """The working state of one force construction.

    ``pos``: point -> complex m (the space diagram); ``elements``: the moving points where a pin
    or block element stands; ``owned``: group name -> the points it places; ``numeric``: the
    numeric forces, read by a group that is no dyad and by nothing else. Filled as the groups
    go: ``applied`` (body -> [Applied]), ``joints`` (point -> link -> complex N, the force on
    the link at the point from what it is pinned to there), ``normals`` (slide -> N along the
    guide line's left normal, on the block), ``torque_n_m``, and for a cylinder driver
    ``drive_force_n`` (its force along its axis, push positive)."""

    mech: object
    pos: dict
    elements: frozenset
    owned: dict = field(default_factory=dict)  # group name -> the points it places
    numeric: object = None
    applied: dict = field(default_factory=dict)
    joints: dict = field(default_factory=dict)
    normals: dict = field(default_factory=dict)
    torque_n_m: float = 0.0
    drive_force_n: float | None = None

    def body_name(self, body: tuple) -> str:
        """A body in words: a link's name, "block B" for a slide's block, "pin P" for a point mass's pin."""
        kind, name = body
        if kind == "link":
            return name
        return f"{'block' if any(s.point == name for s in self.mech.slides.values()) else 'pin'} {name}"

    def add(self, body: tuple, load: Applied):
        """Add ``load`` to the loads known on ``body``."""
        self.applied.setdefault(body, []).append(load)

    def holders(self, point: str) -> list:
        """The links (not the frame) that hold ``point``."""
        return [k for k in self.mech.bodies_of(point) if k != GROUND]

    def other_side(self, point: str, link: str):
        """What ``link`` is pinned to at ``point``: None for the frame, or a body."""
        if point in self.mech.ground:
            return None
        if point in self.elements:
            return ("pin", point)
        return ("link", next(k for k in self.holders(point) if k != link))

    def react(self, point: str, link: str, force: complex, numeric: bool = False):
        """``force`` acts on ``link`` at ``point`` from what it is pinned to there: record it, and
        pass its reaction on to that body (the frame keeps its own)."""
        self.joints.setdefault(point, {})[link] = complex(force)
        other = self.other_side(point, link)
        if other is None:
            return
        by = self.body_name(other)
        if other[0] == "link":
            self.joints[point][other[1]] = -complex(force)
        self.add(other, Applied(-complex(force), self.pos[point], force_label(link, by), Component.REACTION,
                                f"reaction of {link} on {by} at {point}" + (" (from the numeric forces)"
                                                                           if numeric else ""),
                                links=(link,), points=(point,)))

    def guide_reaction(self, slide, normal_n: float, block_known: bool, guide_known: bool):
        """A slide's guide force N·n on its block and −N·n on its guide, passed on to whichever of
        the two was found earlier (``block_known``, ``guide_known``)."""
        self.normals[slide.name] = float(normal_n)
        n = left_normal(self.pos, slide)
        at = self.pos[slide.point]
        guide = FRAME if slide.guide == GROUND else slide.guide
        if block_known and slide.point in self.elements:
            self.add(("pin", slide.point), Applied(normal_n * n, at, force_label(guide, f"block {slide.point}"),
                                                   Component.REACTION, f"guide force of {guide} on the block at "
                                                   f"{slide.point}", points=(slide.point,)))
        if guide_known and slide.guide != GROUND:
            self.add(("link", slide.guide), Applied(-normal_n * n, at, force_label(f"block {slide.point}", guide),
                                                    Component.REACTION, f"reaction of the block at {slide.point} on "
                                                    f"the guide {guide}", links=(guide,), points=(slide.point,)))

    def owned_by(self, group) -> set:
        """The points ``group`` places."""
        return self.owned[group.name]


def left_normal(pos: dict, slide) -> complex:
    """The guide line's left normal (its direction turned +90°)."""
    e, f = slide.line
    return complex(1j * unit(pos[f] - pos[e]))


def moment(loads, about: complex) -> float:
    """Σ moments about ``about`` of ``loads`` (N·m, counter-clockwise positive)."""
    return float(sum(cross(ld.at - about, ld.force) + ld.couple for ld in loads))


def gather(state: ForceState, link: str, owned: set, last: tuple = ()) -> list:
    """[(body, its loads)]: ``link``'s own, then those of the elements at its points that its group
    places (``owned``), carried by ``link``; the elements at the points of ``last`` come last."""
    pins = [p for p in dict.fromkeys(state.mech.links[link]) if p in owned and p in state.elements and p not in last]
    pins += [p for p in last if p in state.elements]
    return [(("link", link), list(state.applied.get(("link", link), ())))] + [
        (("pin", p), list(state.applied.get(("pin", p), ()))) for p in pins]


def every(runs: list) -> list:
    """All the loads of ``runs`` [(body, loads)], in order."""
    return [load for _, loads in runs for load in loads]


def lay(builder: PolygonBuilder, start: complex, runs: list) -> tuple:
    """Lay the loads of ``runs`` [(body, loads)] head to tail from ``start`` (a couple goes into the
    text, not on the polygon). Returns the end and body -> (start, end) of its run."""
    at, ends = complex(start), {}
    for body, loads in runs:
        first = at
        for load in loads:
            if load.force == 0:
                continue
            size = figure(abs(load.force))
            builder.vector(load.component, at, at + load.force, load.label, f"{load.label} = {size} N",
                           f"{load.label}: {load.text}, {size} N at "
                           f"{direction_deg(load.force.real, load.force.imag):.1f}°"
                           + (f", with a couple of {figure(load.couple)} N·m" if load.couple else ""),
                           links=load.links, points=load.points, space=(as_xy(load.at),))
            at += load.force
        ends[body] = (first, at)
    return at, ends


def couples_text(loads) -> str:
    """The pure couples among ``loads`` in words, for a step's sentence ("" if none)."""
    pure = [ld for ld in loads if ld.force == 0 and ld.couple]
    return "".join(f"; {ld.label}: a couple of {figure(ld.couple)} N·m" for ld in pure)


def pins_carried(builder: PolygonBuilder, state: ForceState, link: str, runs: list, ends: dict):
    """The force of each element ``link`` carries on ``link``: the sum of the element's loads
    (the element is massless but for them, so what reaches it from ``link`` balances them)."""
    for body, _ in runs[1:]:
        start, end = ends[body]
        state.joints.setdefault(body[1], {})[link] = result(
            builder, start, end, force_label(state.body_name(body), link),
            f"the force of the element at {body[1]} on {link}, the sum of the loads on it", Component.REACTION,
            links=(link,), points=(body[1],))


def by_name(state: ForceState, point: str, link: str) -> str:
    """The name of what ``link`` is pinned to at ``point`` ("frame" for the ground)."""
    other = state.other_side(point, link)
    return FRAME if other is None else state.body_name(other)


def perpendicular(builder: PolygonBuilder, start: complex, loads: list, pin: str, about: str, on: str, by: str,
                  pos: dict, group_name: str) -> complex:
    """Lay the component of the force of ``by`` on ``on`` at ``pin`` perpendicular to
    about→pin, from the moments about ``about`` of ``on``'s known ``loads``: t·|r| + M = 0."""
    r = pos[pin] - pos[about]
    length = abs(r)
    if length == 0.0:
        raise ParallelLines(f"points {pin} and {about} coincide: the moment about {about} cannot fix the force "
                            f"at {pin}", f"force polygon, {group_name}")
    turning = moment(loads, pos[about])
    vector = -turning / length * 1j * complex(unit(r))
    label = force_label(by, on) + "ᵗ"
    builder.vector(Component.PERPENDICULAR, start, start + vector, label,
                   f"{label}·{about}{pin} + ΣM_{about}({on}) = 0",
                   f"{label}: the part of the force at {pin} perpendicular to {about}{pin}, from the moments about "
                   f"{about} of the loads on {on} (ΣM = {figure(turning)} N·m over {figure(length)} m"
                   f"{couples_text(loads)}): "
                   f"{figure(abs(vector))} N", links=(on,), points=(pin,), about=about)
    return start + vector


def result(builder: PolygonBuilder, start: complex, end: complex, label: str, text: str, component=None, **extra):
    """A force found on the polygon, from ``start`` to ``end``, with its value."""
    force = end - start
    builder.vector(component, start, end, label, f"{label} = {figure(abs(force))} N",
                   f"{label}: {text}, {figure(abs(force))} N at {direction_deg(force.real, force.imag):.1f}°"
                   if abs(force) else f"{label}: {text}, 0 N", role=Role.RESULT, **extra)
    return force


def intersect_lines(builder: PolygonBuilder, group, first: tuple, second: tuple, what: str) -> complex:
    """Draw two lines of known direction, (through, direction, component, text) each, and where they meet."""
    for through, direction, component, text in (first, second):
        builder.direction(component, through, direction, "", text, links=tuple(group.links))
    meet = intersect(Line(np.complex128(first[0]), np.complex128(first[1])),
                     Line(np.complex128(second[0]), np.complex128(second[1])))
    label = f"x{sum(1 for s in builder.steps if s is not None and s.role is Role.INTERSECTION) + 1}"
    builder.intersection(meet, label, what, group)
    return complex(meet.point)


@dataclass(frozen=True)
class TwoLinkClose:
    """What :func:`close_two_links` found: the polygon's ``meet`` (the two along-link lines'
    intersection), ``end1`` (the end of the first link's loads), and the runs of loads laid for
    each link with their ends, for the forces at the middle pin."""

    meet: complex
    end1: complex
    runs1: list
    ends1: dict
    runs2: list
    ends2: dict


def close_two_links(builder: PolygonBuilder, state: ForceState, group, a: str, b: str, c: str, l1: str,
                    l2: str) -> TwoLinkClose:
    """Two links A-B (``l1``) and C-B (``l2``) meeting at B, their outer pins A and C known: each
    outer pin force split along its link and across it, the moments about B of each link giving
    the parts across (laid), the lines along AB and CB closing the polygon. The forces at A and
    C are recorded; an element at B is carried by ``l1`` (its loads laid last of ``l1``'s)."""
    pos = state.pos
    owned = state.owned_by(group)
    runs1 = gather(state, l1, owned, last=(b,))
    runs2 = gather(state, l2, owned - {b})
    by_a, by_c = by_name(state, a, l1), by_name(state, c, l2)
    start1 = perpendicular(builder, 0j, every(runs1), a, b, l1, by_a, pos, group.name)
    end1, ends1 = lay(builder, start1, runs1)
    end2, ends2 = lay(builder, end1, runs2)
    tip = perpendicular(builder, end2, every(runs2), c, b, l2, by_c, pos, group.name)
    meet = intersect_lines(
        builder, group, (tip, pos[b] - pos[c], Component.ALONG_LINK, f"line along {c}{b} through the end: the "
                         f"part of {force_label(by_c, l2)} along {l2}"),
        (0j, pos[b] - pos[a], Component.ALONG_LINK, f"line along {a}{b} through the start: the part of "
         f"{force_label(by_a, l1)} along {l1}"), f"the close of the polygon of {l1} and {l2}")
    state.react(a, l1, result(builder, meet, start1, force_label(by_a, l1), f"the force at {a}", points=(a,),
                              links=(l1,)))
    state.react(c, l2, result(builder, end2, meet, force_label(by_c, l2), f"the force at {c}", points=(c,),
                              links=(l2,)))
    return TwoLinkClose(meet, end1, runs1, ends1, runs2, ends2)
