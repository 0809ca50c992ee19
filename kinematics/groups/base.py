"""What every group form shares: the :class:`Group` interface, the working
:class:`Frame`, and the polygon arithmetic in complex numbers.

A point is z = x + iy; turning by +90° is multiplying by i. Every function
works on numpy arrays of any shape (one pose, or a whole cycle at once).

Velocity and acceleration of a group are the intersection of two lines on
the polygon, each through a known point with a known direction: this is the
graphical construction itself. Each form is one class (the driver, RRR, RRP,
RPR and the numeric fallback, in the ``group_*`` modules) that both computes
its motion and draws its construction steps from the same records.
"""

from __future__ import annotations

import math
from abc import ABC, abstractmethod
from collections.abc import Mapping
from dataclasses import dataclass, field
from types import MappingProxyType
from typing import ClassVar

import numpy as np

from ..errors import CannotAssemble
from ..model.mechanism import GROUND, Mechanism


def cross(a, b):
    """cross(a, b) = a_x b_y − a_y b_x for complex a, b."""
    return (np.conj(a) * b).imag


def dot(a, b):
    """dot(a, b) = a_x b_x + a_y b_y for complex a, b."""
    return (np.conj(a) * b).real


def unit(z):
    """``z`` scaled to length 1 (complex; nan where ``z`` is zero)."""
    # Multiplying by the real reciprocal is several times faster than complex division.
    return z * (1.0 / np.abs(z))


# A pose drawn exactly at a dead point computes as reaching by a hair more than it can.
REACH_TOLERANCE = 1e-12


@dataclass(frozen=True)
class Line:
    """The line through ``through`` with direction ``direction`` (complex)."""

    through: np.ndarray
    direction: np.ndarray


@dataclass(frozen=True)
class Intersection:
    """Where two construction lines meet; ``sine`` of the angle between them."""

    first: Line
    second: Line
    point: np.ndarray
    sine: np.ndarray

    @property
    def condition(self):
        """Condition figure of the 2×2 solve with unit directions: √((1+|cos|)/(1−|cos|))."""
        if np.ndim(self.sine) == 0:  # one pose (the drawn construction): plain floats are many times faster
            s = float(self.sine)
            if math.isnan(s):
                return math.nan
            c = math.sqrt(min(max(1.0 - s * s, 0.0), 1.0))  # s * s, as numpy squares: the same last digit
            return math.sqrt((1.0 + c) / (1.0 - c)) if c < 1.0 else math.inf
        c = np.sqrt(np.clip(1.0 - self.sine ** 2, 0.0, 1.0))
        with np.errstate(divide="ignore"):
            return np.sqrt((1.0 + c) / np.maximum(1.0 - c, 0.0))


def intersect(first: Line, second: Line) -> Intersection:
    """Intersect two lines; parallel lines give an infinite point, never silently a number."""
    denominator = cross(first.direction, second.direction)
    with np.errstate(divide="ignore", invalid="ignore"):
        t = cross(second.through - first.through, second.direction) / denominator
        point = first.through + t * first.direction
    sine = denominator / (np.abs(first.direction) * np.abs(second.direction))
    return Intersection(first, second, point, sine)


@dataclass(frozen=True)
class Laid:
    """A known vector laid on a polygon from ``start`` to ``end``."""

    component: str  # "driver", "radial", "coriolis"
    start: np.ndarray
    end: np.ndarray
    point: str      # the point whose motion it belongs to
    about: str      # the point (or guide) it is relative to


@dataclass
class Frame:
    """Working state of one evaluation: complex positions, velocities and
    accelerations by point name, ω and α by link, slide rates by slide."""

    mech: Mechanism
    ref: dict
    driver_angle_rad: np.ndarray | float = 0.0
    # A cylinder driver's length (m) at each pose, the frame's shape (unused by a rotary driver).
    driver_length_m: np.ndarray | float = 0.0
    strict: bool = True
    # The solved pose a group with no closed form takes its motion from (the construction's).
    solution: object = None
    invalid: np.ndarray | bool = False
    # Group name -> how near each pose is to the group's straight (dead or change) configuration:
    # 1 where the two candidate positions of the group meet, above 1 where it cannot assemble.
    nearness: dict = field(default_factory=dict)
    pos: dict = field(default_factory=dict)
    # The driver link's points as placed from its given angle: its motion is given, so its images are
    # made from this placement even where ``pos`` then takes another pose (the solver's, to draw on).
    driver_pose: dict = field(default_factory=dict)
    vel: dict = field(default_factory=dict)
    acc: dict = field(default_factory=dict)
    omega: dict = field(default_factory=dict)
    alpha: dict = field(default_factory=dict)
    sliding_velocity: dict = field(default_factory=dict)
    sliding_acceleration: dict = field(default_factory=dict)
    jerk: dict = field(default_factory=dict)
    angular_jerk: dict = field(default_factory=dict)
    sliding_jerk: dict = field(default_factory=dict)

    @classmethod
    def start(cls, mech: Mechanism, driver_angle_rad=0.0, strict=True, solution=None, driver_length_m=None):
        """An empty frame with the ground placed, for the driver at ``driver_angle_rad`` (a number
        or an array: the frame's shape), or a cylinder driver at ``driver_length_m``.
        ``strict=False`` marks poses that cannot assemble in ``invalid`` instead of raising."""
        ref = {n: complex(*mech.position_m(n)) for n in mech.points}
        parameter = driver_angle_rad if driver_length_m is None else driver_length_m
        shape = np.shape(parameter)
        frame = cls(mech=mech, ref=ref, driver_angle_rad=driver_angle_rad, strict=strict, solution=solution,
                    invalid=np.zeros(shape, dtype=bool),
                    driver_length_m=0.0 if driver_length_m is None else driver_length_m)
        zero = np.zeros(shape)
        for name in mech.ground:
            frame.pos[name] = np.full(shape, ref[name])
            frame.vel[name] = zero + 0j
            frame.acc[name] = zero + 0j
            frame.jerk[name] = zero + 0j
        return frame

    def place(self, link: str, p: str, q: str):
        """Place every point of ``link`` rigidly from the placed points p and q."""
        turn = unit(self.pos[q] - self.pos[p]) / unit(self.ref[q] - self.ref[p])
        for name in self.mech.links[link]:
            if name not in (p, q):
                self.pos[name] = self.pos[p] + (self.ref[name] - self.ref[p]) * turn

    def velocity_images(self, link: str, p: str, pos: dict | None = None):
        """Velocity images of the points of ``link`` by similarity from image p (of the pose ``pos``,
        the frame's by default)."""
        pos = self.pos if pos is None else pos
        for name in self.mech.links[link]:
            if name != p:
                self.vel[name] = self.vel[p] + 1j * self.omega[link] * (pos[name] - pos[p])

    def acceleration_images(self, link: str, p: str, pos: dict | None = None):
        """Acceleration images of the points of ``link`` by similarity from image p′: a_Q = a_P + (iα − ω²)(z_Q − z_P)
        (of the pose ``pos``, the frame's by default)."""
        pos = self.pos if pos is None else pos
        factor = -self.omega[link] ** 2 + 1j * self.alpha[link]
        for name in self.mech.links[link]:
            if name != p:
                self.acc[name] = self.acc[p] + factor * (pos[name] - pos[p])

    def jerk_factor(self, link: str, angular_jerk):
        """j_Q − j_P = factor·(z_Q − z_P) on one link: i(α̇ − ω³) − 3ωα."""
        omega, alpha = self.omega[link], self.alpha[link]
        return 1j * (angular_jerk - omega ** 3) - 3.0 * omega * alpha

    def jerk_images(self, link: str, p: str, pos: dict | None = None):
        """Jerks of the points of ``link`` from the jerk of p and the link's α̇ (``angular_jerk``)."""
        pos = self.pos if pos is None else pos
        factor = self.jerk_factor(link, self.angular_jerk[link])
        for name in self.mech.links[link]:
            if name != p:
                self.jerk[name] = self.jerk[p] + factor * (pos[name] - pos[p])

    def angular_velocity(self, p: str, q: str):
        """ω of the line p→q from the velocities of its ends: cross(r, v_q − v_p)/|r|²."""
        r = self.pos[q] - self.pos[p]
        return cross(r, self.vel[q] - self.vel[p]) / np.abs(r) ** 2

    def angular_acceleration(self, tangential_start, p: str, q: str):
        """α from the tangential component, laid from ``tangential_start`` to q′."""
        r = self.pos[q] - self.pos[p]
        return cross(r, self.acc[q] - tangential_start) / np.abs(r) ** 2

    def guide_point(self, guide: str, at: str, field_name: str):
        """Velocity or acceleration image of the point of ``guide`` under point ``at``."""
        if guide == GROUND:
            return np.zeros_like(self.pos[at])
        base = self.mech.links[guide][0]
        r = self.pos[at] - self.pos[base]
        if field_name == "vel":
            return self.vel[base] + 1j * self.omega[guide] * r
        if field_name == "jerk":
            return self.jerk[base] + self.jerk_factor(guide, self.angular_jerk[guide]) * r
        return self.acc[base] + (-self.omega[guide] ** 2 + 1j * self.alpha[guide]) * r

    def slot(self, slide):
        """The unit direction of ``slide``'s guide line and a point on it, at the frame's pose."""
        e, f = slide.line
        return unit(self.pos[f] - self.pos[e]), self.pos[e]


def sign_along_slide(mech: Mechanism, slide: str, start: str, end: str) -> float:
    """+1 when the vector from point ``start`` to ``end`` runs the way of the slide's line (from its
    first point towards its second) in the reference pose, else −1: the branch a slide group keeps."""
    (sx, sy), (px, py) = mech.position_m(start), mech.position_m(end)
    (ex, ey), (fx, fy) = (mech.position_m(p) for p in mech.slides[slide].line)
    return 1.0 if (px - sx) * (fx - ex) + (py - sy) * (fy - ey) >= 0 else -1.0


def refuse(frame: Frame, where: str, message: str, bad):
    """Mark (or, strictly, refuse with CannotAssemble) the poses where ``bad``."""
    if not frame.strict:
        frame.invalid = frame.invalid | bad
    elif np.any(bad):
        raise CannotAssemble(message, where)


def triangle_apex(frame: Frame, group, where: str, p, q, side_p, side_q):
    """The apex of the triangle on p→q whose sides from p and q are ``side_p`` and ``side_q`` (the
    law of cosines), on ``group``'s branch (its ``sign``); records how near the group is to its
    straight pose in ``frame.nearness`` and refuses the poses where the sides cannot meet."""
    d = q - p
    dist = np.abs(d)
    with np.errstate(divide="ignore", invalid="ignore"):
        cos_beta = (side_p ** 2 + dist ** 2 - side_q ** 2) / (2.0 * side_p * dist)
    frame.nearness[group.name] = np.abs(cos_beta)
    refuse(frame, where, group.reach_message(frame.mech), ~(np.abs(cos_beta) <= 1.0 + REACH_TOLERANCE))
    beta = np.arccos(np.clip(cos_beta, -1.0, 1.0))
    return p + side_p * unit(d) * np.exp(1j * group.sign * beta)


def radial(frame: Frame, point: str, about: str, start, relative_velocity) -> Laid:
    """Radial component of ``point`` about ``about``: v²/r, directed from point to about."""
    r = frame.pos[point] - frame.pos[about]
    magnitude = np.abs(relative_velocity) ** 2 / np.abs(r)
    return Laid("radial", start, start - magnitude * unit(r), point, about)


def coriolis(omega_guide, relative_velocity):
    """2·ω × v_rel: the relative velocity turned 90° the way the guide turns, doubled."""
    return 2.0 * 1j * omega_guide * relative_velocity


def sliding_jerk_terms(omega_guide, alpha_guide, u, sliding_velocity, sliding_acceleration):
    """What a point sliding along u on a turning guide adds to the jerk of the guide's point under it,
    besides its own sliding jerk: 3·ṡ·(iα − ω²)·u + 3·s̈·iω·u (the third derivative of s·u, u turning)."""
    return 3.0 * (sliding_velocity * (1j * alpha_guide - omega_guide ** 2)
                  + sliding_acceleration * 1j * omega_guide) * u


def known_jerk(frame: Frame, link: str, pin: str, point: str):
    """The jerk of ``point`` of ``link`` less its unknown part iα̇·r: j_pin + (−iω³ − 3ωα)·r."""
    return frame.jerk[pin] + frame.jerk_factor(link, 0.0) * (frame.pos[point] - frame.pos[pin])




@dataclass(frozen=True)
class Group(ABC):
    """One group of the decomposition, with its outer connections known when it is reached.

    ``links`` lists its links, ``roles`` maps the form's role letters to point names, ``slide``
    names its slide (if any) and ``sign`` is the branch of the reference pose (see
    :meth:`branch_sign`). Each form is a subclass; nothing outside a subclass asks which form it is.
    """

    links: tuple
    roles: Mapping = field(default_factory=lambda: MappingProxyType({}))
    slide: str | None = None
    sign: float = 1.0

    notation: ClassVar[str] = ""  # the form in words, for display only
    is_dyad: ClassVar[bool] = True  # a closed form exists (otherwise the numeric solver gives the motion)

    @property
    def name(self) -> str:
        """The group in words, for messages and steps: "RRR group of coupler and rocker"."""
        return f"{self.notation} group of {' and '.join(self.links)}"

    @abstractmethod
    def position(self, frame: Frame, where: str = ""):
        """Place the group's points in ``frame`` (vectorised); refuses what cannot assemble."""

    @abstractmethod
    def velocity(self, frame: Frame):
        """Velocities of the group's points and ω of its links; returns the Intersection (or None)."""

    @abstractmethod
    def acceleration(self, frame: Frame):
        """Accelerations and α; returns (the laid vectors, the Intersection), or None."""

    @abstractmethod
    def jerk(self, frame: Frame):
        """Jerks of the group's points and α̇ of its links (after :meth:`acceleration`)."""

    @abstractmethod
    def velocity_steps(self, builder, frame: Frame, placed: set):
        """Work out the velocities and draw their construction steps on ``builder``."""

    @abstractmethod
    def acceleration_steps(self, builder, frame: Frame, placed: set):
        """Work out the accelerations and draw their construction steps on ``builder``."""

    @abstractmethod
    def force_steps(self, builder, state):
        """Find the forces at the group's joints from the known loads on its links (``state``, a
        :class:`~kinematics.groups.force_steps.ForceState`), lay their steps on the force polygon
        ``builder`` and pass their reactions on to the bodies found earlier."""

    def branch_sign(self, mech: Mechanism) -> float:
        """The branch of the reference pose, kept by every later pose (+1 or −1)."""
        return 1.0

    def reach_message(self, mech: Mechanism) -> str:
        """What cannot reach when the group cannot assemble."""
        return f"the {self.name} cannot assemble"

    def pose_warnings(self, mech: Mechanism, xy: dict) -> list:
        """Dead point and toggle warnings of this group at the pose ``xy`` (name -> (x, y))."""
        return []

    def loop_check(self, mech: Mechanism):
        """The rotatability check of the loop this group closes (a LoopCheck), or None."""
        return None

    def transmission_angles(self, result) -> dict:
        """Label -> (N,) transmission angles (degrees) over the sweep ``result``, where they apply."""
        return {}

    @property
    def carried_points(self) -> frozenset:
        """(link, point) pairs whose radial and tangential components belong to the link's point
        under ``point`` (a slotted link sliding over it), not to ``point`` itself."""
        return frozenset()

    @property
    def construction_warning(self) -> str:
        """A sentence for the construction's warnings about how this group is drawn ("" if none)."""
        return ""
