"""The data of a construction: ordered, labelled steps with their geometry.

A :class:`Construction` holds both polygons of one pose; each :class:`Polygon`
holds its images, its intermediate marks and its :class:`Step` records, each
with a role and a component in the trade's words. The window, the printer and
the DXF writer draw from these; :mod:`kinematics.construction.construct` builds them.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from enum import Enum
from functools import cached_property
from typing import TYPE_CHECKING

import numpy as np
from shapely.geometry import LineString, Point

from ..errors import ParallelLines
from .scales import preferred_scale
from .vectors import direction_deg

if TYPE_CHECKING:  # the groups draw their own steps here: these modules import this one
    from ..solver.solve import Solution
    from .base import Group
    from .decompose import Decomposition

# An intersection whose condition figure exceeds this is flagged on its step.
FLAG_CONDITION = 1e3
SUBSCRIPTS = str.maketrans("0123456789", "₀₁₂₃₄₅₆₇₈₉")
PRIME = "′"


class Role(Enum):
    """What a step is in its polygon: a known vector, a line of known direction, the intersection of two
    such lines, an image point, or a vector found by the construction."""

    KNOWN = "known"
    DIRECTION = "direction"
    INTERSECTION = "intersection"
    IMAGE = "image"
    RESULT = "result"


class Component(Enum):
    """The kind of vector a step lays: the motion components of the velocity and acceleration polygons,
    and the loads and reactions of the force polygon."""

    DRIVER = "driver"
    RADIAL = "radial"
    TANGENTIAL = "tangential"
    SLIDING = "sliding"
    CORIOLIS = "coriolis"
    # The force polygon's (kinematics.groups.force_steps):
    INERTIA = "inertia"
    LOAD = "load"
    GRAVITY = "gravity"
    PERPENDICULAR = "perpendicular"
    ALONG_LINK = "along-link"
    NORMAL = "normal"
    REACTION = "reaction"
    TORQUE = "torque"
    DRIVE = "drive force"  # a cylinder's force along its axis


@dataclass(frozen=True)
class Step:
    """One drawn step of a polygon.

    ``coords`` locates it in polygon units: ((x, y),) a point, ((x0, y0), (x1, y1)) a line or a
    vector (from its start to its end, which takes the arrowhead); ``geometry`` is the same as a
    shapely Point or LineString, made when first asked for (a drag frame draws from ``coords``
    alone). ``points`` and ``links`` name what the step concerns; a radial, tangential or
    Coriolis vector names in ``about`` the point its point's motion is taken relative to (for a
    Coriolis component, the link that carries the slide). A force step may also locate itself in
    the space diagram, in metres (``space``): its line of action, or the arm of the drive torque.
    """

    id: str
    polygon: str
    role: Role
    component: Component | None
    label: str
    coords: tuple
    equation: str
    text: str
    points: tuple = ()
    links: tuple = ()
    about: str = ""
    condition: float | None = None
    angle_between_deg: float | None = None
    flagged: bool = False
    numeric: bool = False
    space: tuple = ()

    @cached_property
    def geometry(self):
        """The step as a shapely Point or LineString, in polygon units."""
        return Point(self.coords[0]) if len(self.coords) == 1 else LineString(self.coords)

    @property
    def is_vector(self) -> bool:
        """Whether the step is drawn as a vector with an arrowhead."""
        return self.role in (Role.KNOWN, Role.RESULT) and len(self.coords) == 2


@dataclass(frozen=True)
class Polygon:
    """One polygon: ``images`` (point name -> (x, y), SI, from the pole),
    ``marks`` (intermediate construction points, label -> (x, y)), ordered
    ``steps``, and the drawing scale in units per mm of drawing."""

    kind: str
    unit: str
    pole_label: str
    scale_per_mm: float
    images: dict
    marks: dict
    steps: tuple

    def image_label(self, point: str) -> str:
        """The label of ``point``'s image on this polygon: "b" on the velocity polygon, "b′" on the acceleration one."""
        return point.lower() + (PRIME if self.kind == "acceleration" else "")


@dataclass(frozen=True)
class Construction:
    """Both polygons of one pose, and their cross-check against the solver."""

    solution: Solution
    decomposition: Decomposition
    velocity: Polygon
    acceleration: Polygon
    max_relative_difference: float
    where: str
    warnings: tuple = ()


def figure(value: float) -> str:
    """A value to four significant figures, for the sentences of the steps."""
    return f"{value:.4g}"


# A relative difference of two double-precision results cannot be told from rounding below a few
# units in the last place (machine epsilon 2.2e-16; IEEE 754 binary64): below this it says "rounding".
ROUNDING_FLOOR = 1e-15


def agreement(relative_difference: float, digits: int = 1) -> str:
    """A cross-check's largest relative difference in words: "agrees to rounding" below
    ROUNDING_FLOOR, else "to 3.2e-12" (``digits`` after the point). The number itself stays in
    machine-readable output."""
    if relative_difference < ROUNDING_FLOOR:
        return "agrees to rounding"
    return f"agrees to {relative_difference:.{digits}e} (largest relative difference)"


def as_xy(z) -> tuple:
    """A complex number as an (x, y) pair of floats."""
    z = complex(z)
    return (z.real, z.imag)


def direction_words(z) -> str:
    """", at 150.0°" for a vector z (complex), "" for a zero one (see :mod:`kinematics.groups.vectors`)."""
    z = complex(z)
    direction = direction_deg(z.real, z.imag)
    return "" if direction is None else f", at {direction:.1f}°"


@dataclass
class PolygonBuilder:
    """Collects the steps of one polygon as the construction proceeds.

    A construction line's Step is made by :meth:`finish`, which fits the line to the finished polygon.
    """

    kind: str
    unit: str
    ground: frozenset = frozenset()
    steps: list = field(default_factory=list)  # the Steps so far (None where a construction line will go)
    marks: dict = field(default_factory=dict)
    lines: list = field(default_factory=list)  # (index in steps, its Step's fields, through, direction, meet)

    @property
    def prime(self):
        """The prime that marks this polygon's labels: ′ on the acceleration polygon, none on the velocity one."""
        return PRIME if self.kind == "acceleration" else ""

    def label(self, point: str) -> str:
        """The image label of a point; every fixed point's image is the pole."""
        return ("o" if point in self.ground else point.lower()) + self.prime

    def add(self, role, component, label, ends, equation, text, **extra):
        """A step located by ``ends``: (z,) a point, (z0, z1) a vector from z0 to z1."""
        coords = tuple((float(z.real), float(z.imag)) for z in ends)
        self.steps.append(Step(**self._fields(role, component, label, equation, text), coords=coords, **extra))

    def _fields(self, role, component, label, equation, text) -> dict:
        return dict(id=f"{self.kind[0]}{len(self.steps) + 1}", polygon=self.kind, role=role, component=component,
                    label=label, equation=equation, text=text)

    def vector(self, component, start, end, label, equation, text, role=Role.KNOWN, **extra):
        """Lay a vector from ``start`` to ``end`` (complex, polygon units)."""
        self.add(role, component, label, (start, end), equation, text, **extra)

    def mark_label(self, z) -> str:
        """The next construction point's label (n₁, n₂, …), kept with its place, drawn by the step
        that finds it."""
        label = f"n{len(self.marks) + 1}".translate(SUBSCRIPTS) + self.prime
        self.marks[label] = as_xy(z)
        return label

    def mark(self, z, text, equation, **extra) -> str:
        """Mark an intermediate construction point at ``z`` with the next label n₁, n₂, …; returns the label."""
        label = self.mark_label(z)
        self.add(Role.IMAGE, None, label, (z,), equation, f"{label}: {text}", **extra)
        return label

    def direction(self, component, through, direction, equation, text, **extra):
        """Draw the line of known ``direction`` through ``through``; its extent is fitted in :meth:`finish`."""
        # The segment is fitted to the finished polygon in finish().
        fields = {**self._fields(Role.DIRECTION, component, "", equation, text), **extra}
        self.lines.append((len(self.steps), fields, complex(through), complex(direction)))
        self.steps.append(None)

    def intersection(self, meet, label, what, group: Group, **extra):
        """Mark where two construction lines meet (``meet``, an Intersection), flagging nearly parallel lines
        by their condition figure; parallel lines raise :class:`~kinematics.errors.ParallelLines`."""
        point = complex(meet.point)
        sine = float(meet.sine)
        angle = math.degrees(math.asin(min(1.0, abs(sine))))
        if not np.isfinite(point) or sine == 0.0:
            raise ParallelLines(f"the lines that fix {what} are parallel (a dead point of the driver): "
                                "the intersection does not exist", f"{self.kind} polygon, {group.name}")
        condition = float(meet.condition)
        flagged = condition > FLAG_CONDITION
        text = f"{label}: {what}, where the two lines meet at {angle:.3g}°"
        if flagged:
            text += f" — nearly parallel, condition figure {condition:.3g}"
        self.lines[-2:] = [line + (point,) for line in self.lines[-2:]]
        self.add(Role.INTERSECTION, None, label, (point,), extra.pop("equation", ""), text,
                 condition=condition, angle_between_deg=angle, flagged=flagged, links=tuple(group.links), **extra)

    def finish(self, images: dict, box_mm: float, scale: float | None, also: tuple = ()) -> Polygon:
        """The finished polygon; ``also`` lists further points (complex) its extent must take in (the
        force polygon's vertices, which are no images)."""
        images = {k: as_xy(v) for k, v in images.items()}
        everything = list(images.values()) + list(self.marks.values()) + [(0.0, 0.0)] + [as_xy(z) for z in also]
        extent = max(math.hypot(*xy) for xy in everything)
        margin = 0.12 * max(extent, 1e-12)
        for index, fields, through, direction, *meet in self.lines:
            ends = [through] + [complex(m) for m in meet]
            u = direction / abs(direction)
            along = [((e - through) * u.conjugate()).real for e in ends]
            first, last = through + (min(along) - margin) * u, through + (max(along) + margin) * u
            self.steps[index] = Step(**fields, coords=((first.real, first.imag), (last.real, last.imag)))
        width = 2.0 * max(max(abs(x) for x, _ in everything), max(abs(y) for _, y in everything))
        chosen = scale if scale else preferred_scale(max(width, extent), box_mm)
        return Polygon(kind=self.kind, unit=self.unit, pole_label="o" + self.prime, scale_per_mm=chosen,
                       images=images, marks=dict(self.marks), steps=tuple(self.steps))
