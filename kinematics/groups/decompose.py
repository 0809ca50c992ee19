"""Break a linkage into its driver and a sequence of groups (dyads), each
with outer connections already known, in the order a draftsman draws them.

Group forms (the slider block of a slide is implied, so a slide group is a
single link):

- ``RRR``: two links joined by a pin B, each with one known pin (A, C).
- ``RRP``: a link with one known pin A whose point D slides on a known guide
  (ground, or a moving link: then the Coriolis component appears).
- ``RPR``: a link with one known pin C whose slot slides over a known point D
  (the crank and slotted lever; Coriolis appears).
- ``numeric``: what is left when no dyad fits (a three-link group, for one);
  its motion comes from the numeric solver.

This module only reads the structure and the reference pose; the closed
forms of each group live in :mod:`kinematics.groups.forms`.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache

from ..model.mechanism import GROUND, Mechanism
from ..model.memo import remembered


@dataclass(frozen=True)
class Group:
    """One group. ``roles`` maps the group's role letters to point names:
    RRR {A, B, C}; RRP {A, D}; RPR {C, D}. ``links`` lists its links (for RRR
    the link A-B first); ``slide`` names the slide of RRP and RPR."""

    form: str
    links: tuple
    roles: dict
    slide: str | None = None
    sign: float = 1.0

    @property
    def name(self) -> str:
        return f"{self.form} group of {' and '.join(self.links)}"


@dataclass(frozen=True)
class Decomposition:
    driver_link: str
    groups: tuple

    @property
    def all_dyads(self) -> bool:
        return all(g.form != "numeric" for g in self.groups)


def _cross(a, b):
    return a[0] * b[1] - a[1] * b[0]


def _sub(p, q):
    return (p[0] - q[0], p[1] - q[1])


def _sign(value):
    return 1.0 if value >= 0 else -1.0


def _branch_sign(mech: Mechanism, form: str, roles: dict, slide=None) -> float:
    """The branch of the reference pose, kept by every later pose."""
    xy = {k: mech.position_m(v) for k, v in roles.items()}
    if form == "RRR":
        return _sign(_cross(_sub(xy["C"], xy["A"]), _sub(xy["B"], xy["A"])))
    e, f = (mech.position_m(p) for p in slide.line)
    u = _sub(f, e)
    if form == "RRP":
        ad = _sub(xy["D"], xy["A"])
        return _sign(ad[0] * u[0] + ad[1] * u[1])
    cd = _sub(xy["D"], xy["C"])
    return _sign(cd[0] * u[0] + cd[1] * u[1])


def decompose(mech: Mechanism) -> Decomposition:
    """Order the links into the driver and groups. Needs a driver. Kept per mechanism."""
    return remembered(mech, "decomposition", lambda: _decompose(mech))


def _decompose(mech: Mechanism) -> Decomposition:
    order = _order(tuple(mech.links.items()), tuple(mech.slides.values()), mech.ground, mech.driver.link)
    groups = tuple(Group(form=form, links=links, roles=dict(roles), slide=slide,
                         sign=_branch_sign(mech, form, dict(roles), mech.slides[slide] if slide else None)
                         if form != "numeric" else 1.0)
                   for form, links, roles, slide in order)
    return Decomposition(driver_link=mech.driver.link, groups=groups)


@lru_cache(maxsize=64)
def _order(link_items: tuple, slides: tuple, ground: tuple, driver: str) -> tuple:
    """(form, links, roles as pairs, slide name or None) of each group, in the order they are solved.

    It follows from the topology alone, so a drag, which makes a new mechanism each frame with the
    same links, finds it once; the branch signs are read off each mechanism's pose."""
    points_of = dict(link_items)  # link -> its points
    known_bodies = {GROUND, driver}
    known_points = set(ground) | set(points_of[driver])
    unknown = [name for name in points_of if name != driver]
    groups = []

    def known_pins(link):
        return [p for p in points_of[link] if p in known_points]

    def pending(link):
        """Slides that tie ``link`` to what is known: (point-on-known-guide, slot-over-known)."""
        on_guide = [s for s in slides
                    if s.point in points_of[link] and s.point not in known_points and s.guide in known_bodies]
        slots = [s for s in slides if s.guide == link and s.point in known_points]
        return on_guide, slots

    def settle(form, links, roles, slide=None):
        groups.append((form, tuple(links), tuple(roles.items()), slide.name if slide else None))
        for link in links:
            unknown.remove(link)
            known_bodies.add(link)
            known_points.update(points_of[link])

    while unknown:
        found = False
        for link in unknown:
            pins = known_pins(link)
            on_guide, slots = pending(link)
            if len(pins) == 1 and len(on_guide) == 1 and not slots:
                settle("RRP", [link], {"A": pins[0], "D": on_guide[0].point}, on_guide[0])
                found = True
                break
            if len(pins) == 1 and len(slots) == 1 and not on_guide:
                settle("RPR", [link], {"C": pins[0], "D": slots[0].point}, slots[0])
                found = True
                break
        if found:
            continue
        for i, first in enumerate(unknown):
            if found:
                break
            for second in unknown[i + 1:]:
                pins1, pins2 = known_pins(first), known_pins(second)
                shared = [p for p in points_of[first] if p in points_of[second]]
                joined = set(points_of[first]) | set(points_of[second])
                if (len(pins1) == 1 and len(pins2) == 1 and pins1 != pins2 and len(shared) == 1
                        and shared[0] not in known_points
                        and not any(pending(x)[0] or pending(x)[1] for x in (first, second))
                        and not any(s.guide in (first, second) and s.point in joined
                                    for s in slides)):
                    settle("RRR", [first, second], {"A": pins1[0], "B": shared[0], "C": pins2[0]})
                    found = True
                    break
        if not found:
            settle("numeric", list(unknown), {})
    return tuple(groups)
