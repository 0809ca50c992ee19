"""Which forces are unknown and which balances hold them: the shape of the Newton-Euler system.

Bodies in balance: every moving link (force x, force y, moment: three rows) and every pin or
block element (force x, force y: two rows). An element stands at a moving point that carries
a slide, joins three or more links, or joins two links and carries a point mass or a load on
its pin; at a fixed point the pin is part of the frame; elsewhere two links are pinned to each
other directly. Unknowns: a force pair for each link at each joint, one normal force per
slide, the drive torque.

The layout depends on names only (links, slides, ground, which points carry masses or pin
loads), so a drag, which makes a new Mechanism every frame, finds it in a cache.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache

from ..errors import ForcesUndetermined
from ..model.mechanism import Mechanism

FRAME = "ground"


@dataclass(frozen=True)
class Pair:
    """A force pair (two unknown columns from ``column``) and where it acts.

    ``on`` lists (body, sign, point): body is ("link", k) or ("element", e); sign +1 where the
    unknown is the force on that body. ``reported`` lists (point, link, sign) for ``joints``;
    ``frame`` is the fixed point where the frame receives −(the unknown), or None."""

    column: int
    on: tuple
    reported: tuple
    frame: str | None


@dataclass(frozen=True)
class SlideUnknown:
    """A slide's normal force (one column): on its block (element ``element``, or the frame at a
    fixed point) along the guide line's left normal, and its opposite on the guide link ``guide``
    (None for a ground guide, whose frame receives it)."""

    name: str
    column: int
    point: str
    line: tuple
    element: int | None
    guide: int | None


@dataclass(frozen=True)
class Layout:
    """Rows: link k has 3k, 3k + 1 (forces) and 3k + 2 (moment); element e has
    3·len(links) + 2e and + 1. Columns: ``pairs``, then ``slides``, then the drive torque."""

    points: tuple
    links: tuple
    fixed: frozenset
    elements: tuple  # the points that carry an element, in point order
    pairs: tuple
    slides: tuple
    driver: int
    torque_column: int
    size: int

    def element_row(self, e: int) -> int:
        """The first of element ``e``'s two force rows."""
        return 3 * len(self.links) + 2 * e


def layout(mechanism: Mechanism) -> Layout:
    """The Newton-Euler layout of ``mechanism`` (with its mass data), from the cache."""
    data = mechanism.mass_data
    massive = tuple(sorted(p for p, m in data.point_masses.items() if m.mass_kg > 0)) if data else ()
    pin_loads = tuple(sorted(ld.point for ld in data.loads.values() if ld.point and not ld.link)) if data else ()
    slides = tuple((s.name, s.point, s.guide, tuple(s.line)) for s in mechanism.slides.values())
    return _layout(tuple(mechanism.points), tuple(mechanism.links.items()), tuple(mechanism.ground), slides,
                   mechanism.driver.link, frozenset(massive + pin_loads))


@lru_cache(maxsize=64)
def _layout(points, link_items, ground, slides, driver, carried) -> Layout:
    links = tuple(name for name, _ in link_items)
    link_index = {name: k for k, name in enumerate(links)}
    holders = {p: [] for p in points}
    for name, pts in link_items:
        for p in dict.fromkeys(pts):
            holders[p].append(name)
    slid = {point for _, point, _, _ in slides}
    fixed = set(ground)

    def has_element(p):
        count = len(holders[p])
        return p not in fixed and (p in slid or count >= 3 or (count == 2 and p in carried))

    elements = tuple(p for p in points if has_element(p))
    element_index = {p: e for e, p in enumerate(elements)}
    pairs, column = [], 0
    for p in points:
        at = holders[p]
        if p in fixed:
            for link in at:
                pairs.append(Pair(column, ((("link", link_index[link]), 1.0, p),), ((p, link, 1.0),), p))
                column += 2
        elif p in element_index:
            e = element_index[p]
            for link in at:
                pairs.append(Pair(column, ((("link", link_index[link]), 1.0, p), (("element", e), -1.0, p)),
                                  ((p, link, 1.0),), None))
                column += 2
        elif len(at) == 2:
            first, second = at
            pairs.append(Pair(column, ((("link", link_index[first]), 1.0, p), (("link", link_index[second]), -1.0, p)),
                              ((p, first, 1.0), (p, second, -1.0)), None))
            column += 2
    unknown_slides = []
    for name, point, guide, line in slides:
        unknown_slides.append(SlideUnknown(name, column, point, line, element_index.get(point),
                                           None if guide == FRAME else link_index[guide]))
        column += 1
    rows = 3 * len(links) + 2 * len(elements)
    size = column + 1
    if size != rows:
        raise ForcesUndetermined(f"the joint forces are not determined by statics: {size} unknown force and torque "
                              f"components against {rows} balance equations", "joints")
    return Layout(points=points, links=links, fixed=frozenset(fixed), elements=elements, pairs=tuple(pairs),
                  slides=tuple(unknown_slides),
                  driver=link_index[driver], torque_column=column, size=size)
