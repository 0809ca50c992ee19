"""Break a linkage into its driver and a sequence of groups (dyads), each
with outer connections already known, in the order a draftsman draws them.

Group forms (the slider block of a slide is implied, so a slide group is a
single link), each a class of the :class:`kinematics.groups.Group` interface:

- :class:`DriverGroup`: the driver link about its fixed pivot.
- :class:`RRRGroup`: two links joined by a pin B, each with one known pin (A, C).
- :class:`RRPGroup`: a link with one known pin A whose point D slides on a known
  guide (ground, or a moving link: then the Coriolis component appears).
- :class:`RPRGroup`: a link with one known pin C whose slot slides over a known
  point D (the crank and slotted lever; Coriolis appears).
- :class:`NumericGroup`: what is left when no dyad fits (a three-link group, for
  one); its motion comes from the numeric solver.

This module only reads the structure and the reference pose; each form's
closed forms and construction steps live in its own class.
"""

from __future__ import annotations

from dataclasses import dataclass, replace
from functools import lru_cache
from types import MappingProxyType

from ..errors import KinematicsError
from ..model.mechanism import GROUND, Mechanism
from ..model.memo import remembered
from .actuator import ActuatorGroup
from .base import Group
from .driver import DriverGroup
from .numeric import NumericGroup
from .rpr import RPRGroup
from .rrp import RRPGroup
from .rrr import RRRGroup


@dataclass(frozen=True)
class Decomposition:
    """The ``driver`` (a :class:`DriverGroup`) and the driven ``groups`` in the order they are solved."""

    driver_link: str
    groups: tuple
    driver: DriverGroup | ActuatorGroup

    @property
    def chain(self) -> tuple:
        """The driver, then every group: what a pose is worked out through, in order."""
        return (self.driver, *self.groups)

    @property
    def all_dyads(self) -> bool:
        """Whether every group has a closed form (none falls back to the numeric solver)."""
        return all(g.is_dyad for g in self.groups)


def decompose(mech: Mechanism) -> Decomposition:
    """Order the links into the driver and groups. Needs a driver. Kept per mechanism."""
    return remembered(mech, "decomposition", lambda: _decompose(mech))


def _decompose(mech: Mechanism) -> Decomposition:
    if mech.driver.is_actuator:
        head = cylinder_group(mech)
        known = head.links
    else:
        head, known = DriverGroup(links=(mech.driver.link,), roles=MappingProxyType({"O": mech.driver.pivot})), (
            mech.driver.link,)
    order = _order(tuple(mech.links.items()), tuple(mech.slides.values()), mech.ground, known)
    groups = tuple(replace(group, sign=group.branch_sign(mech)) for group in order)
    return Decomposition(driver_link=head.link, groups=groups, driver=replace(head, sign=head.branch_sign(mech)))


def cylinder_group(mech: Mechanism) -> ActuatorGroup:
    """The cylinder's group: its slide must be a link's point on another link's line, the barrel pivoted
    on the ground at the line's first point, the rod's end on a link with one more ground pin."""
    slide = mech.slides.get(mech.driver.slide)
    where = "driver.slide"
    if slide is None:
        raise KinematicsError(f'the cylinder driver names no slide of the design ("{mech.driver.slide}")', where)
    carriers = [b for b in mech.bodies_of(slide.point) if b != GROUND and b != slide.guide]
    if slide.guide == GROUND or not carriers:
        raise KinematicsError(f"the cylinder {slide.name} must be a link's point sliding on another link's line "
                              "(rod on barrel); this slide is not link-on-link", where)
    pivot = slide.line[0]
    if pivot not in mech.ground:
        raise KinematicsError(f"the cylinder {slide.name}'s barrel must be pivoted on the ground at its line's first "
                              f"point, and {pivot} is not a ground point", where)
    carrier = carriers[0]
    pins = [p for p in mech.links[carrier] if p in mech.ground and p != slide.point]
    if not pins:
        raise KinematicsError(f"the link {carrier} that the cylinder {slide.name} drives needs a ground pivot", where)
    return ActuatorGroup(links=(slide.guide, carrier), roles=MappingProxyType({"C": pivot, "B": slide.point,
                                                                             "A": pins[0]}), slide=slide.name)


@lru_cache(maxsize=64)
def _order(link_items: tuple, slides: tuple, ground: tuple, known_links: tuple) -> tuple:
    """The groups in the order they are solved after the head (the driver, or the cylinder's barrel
    and the link it drives: ``known_links``), each with the branch sign +1.

    It follows from the topology alone, so a drag, which makes a new mechanism each frame with the
    same links, finds it once; the branch signs are read off each mechanism's pose."""
    points_of = dict(link_items)  # link -> its points
    known_bodies = {GROUND, *known_links}
    known_points = set(ground).union(*(points_of[link] for link in known_links))
    unknown = [name for name in points_of if name not in known_links]
    # The cylinder's own slide is settled by its head group.
    slides = tuple(s for s in slides if not (s.point in known_points and s.guide in known_bodies))
    groups = []

    def known_pins(link):
        return [p for p in points_of[link] if p in known_points]

    def pending(link):
        """Slides that tie ``link`` to what is known: (point-on-known-guide, slot-over-known)."""
        on_guide = [s for s in slides
                    if s.point in points_of[link] and s.point not in known_points and s.guide in known_bodies]
        slots = [s for s in slides if s.guide == link and s.point in known_points]
        return on_guide, slots

    def settle(form: type[Group], links, roles, slide=None):
        groups.append(form(links=tuple(links), roles=MappingProxyType(roles), slide=slide.name if slide else None))
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
                settle(RRPGroup, [link], {"A": pins[0], "D": on_guide[0].point}, on_guide[0])
                found = True
                break
            if len(pins) == 1 and len(slots) == 1 and not on_guide:
                settle(RPRGroup, [link], {"C": pins[0], "D": slots[0].point}, slots[0])
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
                    settle(RRRGroup, [first, second], {"A": pins1[0], "B": shared[0], "C": pins2[0]})
                    found = True
                    break
        if not found:
            settle(NumericGroup, list(unknown), {})
    return tuple(groups)
