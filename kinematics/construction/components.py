"""The components of each relative acceleration, read off the acceleration polygon.

Every radial, tangential and Coriolis vector the construction lays or finds is
one :class:`RelativeComponent`: whose acceleration it is part of, relative to
what, on which link, and the vector itself (m/s², from the step's coordinates).
Nothing is recomputed here, so a table of them shows the polygon's own values.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..groups.steps import Component, Construction

KINDS = (Component.RADIAL, Component.TANGENTIAL, Component.CORIOLIS)


@dataclass(frozen=True)
class RelativeComponent:
    """One component of a relative acceleration.

    ``point``'s acceleration relative to ``about`` (a point; for a Coriolis component, the link
    whose slide carries ``point``) has this ``component`` on ``link``; ``vector`` is (x, y) in m/s².
    ``carried`` is True where the point meant is the one of ``link`` under ``point`` (a slotted
    link sliding over ``point``). ``step`` is the id of the step that draws it.
    """

    point: str
    about: str
    component: Component
    link: str
    vector: tuple
    step: str
    carried: bool = False

    @property
    def magnitude(self) -> float:
        """The component's size, m/s²."""
        return math.hypot(*self.vector)

    @property
    def what(self) -> str:
        """In words: "B rel. A", "arm's point at D rel. C" (carried), "D sliding on arm"."""
        if self.component is Component.CORIOLIS:
            return f"{self.point} sliding on {self.about}"
        whose = f"{self.link}'s point at {self.point}" if self.carried else self.point
        return f"{whose} rel. {self.about}"

    @property
    def title(self) -> str:
        """A table row's title: "radial B rel. A (coupler)", "Coriolis D sliding on arm"."""
        if self.component is Component.CORIOLIS:
            return f"Coriolis {self.what}"
        return f"{self.component.value} {self.what}" + ("" if self.carried else f" ({self.link})")


def acceleration_components(construction: Construction) -> tuple:
    """The :class:`RelativeComponent` of every radial, tangential and Coriolis vector of the
    acceleration polygon, in the order the construction draws them."""
    carried = frozenset().union(*(g.carried_points for g in construction.decomposition.chain))
    found = []
    for step in construction.acceleration.steps:
        if step.component not in KINDS or not step.is_vector:
            continue
        (x0, y0), (x1, y1) = step.coords
        point, link = step.points[0], step.links[0]
        found.append(RelativeComponent(
            point=point, about=step.about, component=step.component, link=link, vector=(x1 - x0, y1 - y0),
            step=step.id, carried=step.component is not Component.CORIOLIS and (link, point) in carried))
    return tuple(found)
