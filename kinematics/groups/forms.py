"""Closed forms of the driver and of each dyad, in complex arithmetic.

A point is z = x + iy; turning by +90° is multiplying by i. Every function
works on numpy arrays of any shape (one pose, or a whole cycle at once).

Velocity and acceleration of a group are the intersection of two lines on
the polygon, each through a known point with a known direction: this is the
graphical construction itself, and :mod:`kinematics.construction.construct` turns the
intermediate records returned here into drawn steps.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np

from ..errors import CannotAssemble
from ..model.mechanism import GROUND, Mechanism
from .decompose import Group


def cross(a, b):
    """cross(a, b) = a_x b_y − a_y b_x for complex a, b."""
    return (np.conj(a) * b).imag


def dot(a, b):
    return (np.conj(a) * b).real


def unit(z):
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
    strict: bool = True
    invalid: np.ndarray | bool = False
    # Group name -> how near each pose is to the group's straight (dead or change) configuration:
    # 1 where the two candidate positions of the group meet, above 1 where it cannot assemble.
    nearness: dict = field(default_factory=dict)
    pos: dict = field(default_factory=dict)
    vel: dict = field(default_factory=dict)
    acc: dict = field(default_factory=dict)
    omega: dict = field(default_factory=dict)
    alpha: dict = field(default_factory=dict)
    sliding_velocity: dict = field(default_factory=dict)
    sliding_acceleration: dict = field(default_factory=dict)

    @classmethod
    def start(cls, mech: Mechanism, shape=(), strict=True):
        """An empty frame with the ground placed. ``strict=False`` marks poses that
        cannot assemble in ``invalid`` instead of raising."""
        ref = {n: complex(*mech.position_m(n)) for n in mech.points}
        frame = cls(mech=mech, ref=ref, strict=strict, invalid=np.zeros(shape, dtype=bool))
        zero = np.zeros(shape)
        for name in mech.ground:
            frame.pos[name] = np.full(shape, ref[name])
            frame.vel[name] = zero + 0j
            frame.acc[name] = zero + 0j
        return frame

    def place(self, link: str, p: str, q: str):
        """Place every point of ``link`` rigidly from the placed points p and q."""
        turn = unit(self.pos[q] - self.pos[p]) / unit(self.ref[q] - self.ref[p])
        for name in self.mech.links[link]:
            if name not in (p, q):
                self.pos[name] = self.pos[p] + (self.ref[name] - self.ref[p]) * turn

    def velocity_images(self, link: str, p: str):
        """Velocity images of the points of ``link`` by similarity from image p."""
        for name in self.mech.links[link]:
            if name != p:
                self.vel[name] = self.vel[p] + 1j * self.omega[link] * (self.pos[name] - self.pos[p])

    def acceleration_images(self, link: str, p: str):
        factor = -self.omega[link] ** 2 + 1j * self.alpha[link]
        for name in self.mech.links[link]:
            if name != p:
                self.acc[name] = self.acc[p] + factor * (self.pos[name] - self.pos[p])

    def angular_velocity(self, p: str, q: str):
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
        return self.acc[base] + (-self.omega[guide] ** 2 + 1j * self.alpha[guide]) * r

    def slot(self, slide):
        e, f = slide.line
        return unit(self.pos[f] - self.pos[e]), self.pos[e]


def _refuse(frame: Frame, where: str, message: str, bad):
    if not frame.strict:
        frame.invalid = frame.invalid | bad
    elif np.any(bad):
        raise CannotAssemble(message, where)


def _reach_message(mech, group: Group) -> str:
    if group.form == "RRR":
        return f"links {group.links[0]} and {group.links[1]} cannot reach"
    slide = mech.slides[group.slide]
    if group.form == "RRP":
        carriers = [b for b in mech.bodies_of(group.roles["A"]) if b not in group.links and b != GROUND]
        if carriers:
            return f"links {group.links[0]} and {carriers[0]} cannot reach"
        return f"link {group.links[0]} cannot reach the line of slide {slide.name}"
    return f"the slot of link {group.links[0]} cannot pass through point {group.roles['D']}"


def position(frame: Frame, group: Group, where: str = ""):
    """Place the group's points; raises CannotAssemble with the links named."""
    mech, ref, pos = frame.mech, frame.ref, frame.pos
    r = group.roles
    message = _reach_message(mech, group)
    if group.form == "RRR":
        a, c = pos[r["A"]], pos[r["C"]]
        la = abs(ref[r["B"]] - ref[r["A"]])
        lc = abs(ref[r["B"]] - ref[r["C"]])
        d = c - a
        dist = np.abs(d)
        with np.errstate(divide="ignore", invalid="ignore"):
            cos_beta = (la ** 2 + dist ** 2 - lc ** 2) / (2.0 * la * dist)
        frame.nearness[group.name] = np.abs(cos_beta)
        _refuse(frame, where, message, ~(np.abs(cos_beta) <= 1.0 + REACH_TOLERANCE))
        beta = np.arccos(np.clip(cos_beta, -1.0, 1.0))
        pos[r["B"]] = a + la * unit(d) * np.exp(1j * group.sign * beta)
        frame.place(group.links[0], r["A"], r["B"])
        frame.place(group.links[1], r["C"], r["B"])
    elif group.form == "RRP":
        slide = mech.slides[group.slide]
        u, e = frame.slot(slide)
        a = pos[r["A"]]
        length = abs(ref[r["D"]] - ref[r["A"]])
        h = cross(u, a - e)
        frame.nearness[group.name] = np.abs(h) / length
        _refuse(frame, where, message, np.abs(h) > length * (1.0 + REACH_TOLERANCE))
        s = dot(u, a - e) + group.sign * np.sqrt(np.maximum(length ** 2 - h ** 2, 0.0))
        pos[r["D"]] = e + s * u
        frame.place(group.links[0], r["A"], r["D"])
    elif group.form == "RPR":
        slide = mech.slides[group.slide]
        link = group.links[0]
        e_ref, f_ref = ref[slide.line[0]], ref[slide.line[1]]
        u_ref = unit(f_ref - e_ref)
        offset = cross(u_ref, ref[r["C"]] - e_ref)
        w = pos[r["D"]] - pos[r["C"]]
        rho = np.abs(w)
        # Straight here means the slot's line is tangent to the circle |C − D| = |e|, or, for a slot
        # through the pivot, the pin passing over the pivot (the slot's direction is then undefined).
        with np.errstate(divide="ignore", invalid="ignore"):
            frame.nearness[group.name] = np.fmax(np.abs(offset) / rho, 1.0 - rho / abs(ref[r["D"]] - ref[r["C"]]))
        _refuse(frame, where, message, np.abs(offset) > rho * (1.0 + REACH_TOLERANCE))
        turn_in = np.arcsin(np.clip(offset / rho, -1.0, 1.0))
        psi = np.angle(w) + np.where(group.sign > 0, turn_in, np.pi - turn_in)
        turn = np.exp(1j * psi) / u_ref
        for name in mech.links[link]:
            if name != r["C"]:
                pos[name] = pos[r["C"]] + (ref[name] - ref[r["C"]]) * turn


def velocity(frame: Frame, group: Group) -> Intersection:
    """Velocity images of the group by intersecting its two direction lines."""
    mech, pos, vel = frame.mech, frame.pos, frame.vel
    r = group.roles
    if group.form == "RRR":
        a, b, c = r["A"], r["B"], r["C"]
        meet = intersect(Line(vel[a], 1j * (pos[b] - pos[a])), Line(vel[c], 1j * (pos[b] - pos[c])))
        vel[b] = meet.point
        for link, pin in zip(group.links, (a, c), strict=True):
            frame.omega[link] = frame.angular_velocity(pin, b)
            frame.velocity_images(link, pin)
        return meet
    slide = mech.slides[group.slide]
    u, _ = frame.slot(slide)
    if group.form == "RRP":
        a, d = r["A"], r["D"]
        coincident = frame.guide_point(slide.guide, d, "vel")
        meet = intersect(Line(vel[a], 1j * (pos[d] - pos[a])), Line(coincident, u))
        vel[d] = meet.point
        link = group.links[0]
        frame.omega[link] = frame.angular_velocity(a, d)
        frame.velocity_images(link, a)
        frame.sliding_velocity[slide.name] = dot(u, vel[d] - coincident)
        return meet
    c, d = r["C"], r["D"]
    link = group.links[0]
    meet = intersect(Line(vel[c], 1j * (pos[d] - pos[c])), Line(vel[d], u))
    rel = pos[d] - pos[c]
    frame.omega[link] = cross(rel, meet.point - vel[c]) / np.abs(rel) ** 2
    frame.velocity_images(link, c)
    frame.sliding_velocity[slide.name] = dot(u, vel[d] - meet.point)
    return meet


def radial(frame: Frame, point: str, about: str, start, relative_velocity) -> Laid:
    """Radial component of ``point`` about ``about``: v²/r, directed from point to about."""
    r = frame.pos[point] - frame.pos[about]
    magnitude = np.abs(relative_velocity) ** 2 / np.abs(r)
    return Laid("radial", start, start - magnitude * unit(r), point, about)


def coriolis(omega_guide, relative_velocity):
    """2·ω × v_rel: the relative velocity turned 90° the way the guide turns, doubled."""
    return 2.0 * 1j * omega_guide * relative_velocity


def acceleration(frame: Frame, group: Group):
    """Acceleration images of the group; returns (laid vectors, intersection)."""
    mech, pos, vel, acc = frame.mech, frame.pos, frame.vel, frame.acc
    r = group.roles
    if group.form == "RRR":
        a, b, c = r["A"], r["B"], r["C"]
        first = radial(frame, b, a, acc[a], vel[b] - vel[a])
        second = radial(frame, b, c, acc[c], vel[b] - vel[c])
        meet = intersect(Line(first.end, 1j * (pos[b] - pos[a])), Line(second.end, 1j * (pos[b] - pos[c])))
        acc[b] = meet.point
        for link, pin, laid in zip(group.links, (a, c), (first, second), strict=True):
            frame.alpha[link] = frame.angular_acceleration(laid.end, pin, b)
            frame.acceleration_images(link, pin)
        return (first, second), meet
    slide = mech.slides[group.slide]
    u, _ = frame.slot(slide)
    link = group.links[0]
    if group.form == "RRP":
        a, d = r["A"], r["D"]
        first = radial(frame, d, a, acc[a], vel[d] - vel[a])
        coincident = frame.guide_point(slide.guide, d, "acc")
        omega_guide = 0.0 if slide.guide == GROUND else frame.omega[slide.guide]
        relative = vel[d] - frame.guide_point(slide.guide, d, "vel")
        second = Laid("coriolis", coincident, coincident + coriolis(omega_guide, relative), d, slide.guide)
        meet = intersect(Line(first.end, 1j * (pos[d] - pos[a])), Line(second.end, u))
        acc[d] = meet.point
        frame.alpha[link] = frame.angular_acceleration(first.end, a, d)
        frame.acceleration_images(link, a)
        frame.sliding_acceleration[slide.name] = dot(u, acc[d] - coincident)
        return (first, second), meet
    c, d = r["C"], r["D"]
    coincident_velocity = vel[c] + 1j * frame.omega[link] * (pos[d] - pos[c])
    first = radial(frame, d, c, acc[c], coincident_velocity - vel[c])
    # Laid backwards from d′: the guide point's image is d′ less Coriolis less sliding.
    second = Laid("coriolis", acc[d], acc[d] - coriolis(frame.omega[link], vel[d] - coincident_velocity), d, link)
    meet = intersect(Line(first.end, 1j * (pos[d] - pos[c])), Line(second.end, u))
    rel = pos[d] - pos[c]
    frame.alpha[link] = cross(rel, meet.point - first.end) / np.abs(rel) ** 2
    frame.acceleration_images(link, c)
    frame.sliding_acceleration[slide.name] = dot(u, second.end - meet.point)
    return (first, second), meet


def drive(frame: Frame, link: str, pivot: str, angle_rad, omega, alpha):
    """Place the driver link at ``angle_rad`` and give its points their motion."""
    mech, ref = frame.mech, frame.ref
    first = next(p for p in mech.links[link] if p != pivot)
    turn = np.exp(1j * (angle_rad - np.angle(ref[first] - ref[pivot])))
    o = frame.pos[pivot]
    frame.omega[link] = np.broadcast_to(np.asarray(omega, float), np.shape(o)) + 0.0
    frame.alpha[link] = np.broadcast_to(np.asarray(alpha, float), np.shape(o)) + 0.0
    for name in mech.links[link]:
        if name != pivot:
            frame.pos[name] = o + (ref[name] - ref[pivot]) * turn
    frame.velocity_images(link, pivot)
    frame.acceleration_images(link, pivot)
    return first
