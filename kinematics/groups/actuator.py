"""The cylinder driver: a barrel pivoted on the ground at C, its rod's end B pinned to a link
pivoted at a known point A, the length L = |B − C| given with its rates. It heads the
decomposition in place of the rotary driver.

Position is a circle-circle intersection (radius L about C, |AB| about A). On the polygon the
barrel's point under B lies on the line through c perpendicular to CB; moved by the known sliding
velocity L̇·u (u along CB) it meets the line through a perpendicular to AB. The acceleration
polygon lays the radial component of the barrel's point, the Coriolis component 2·ω_barrel·L̇·u⊥
and the known sliding acceleration L̈·u before the tangential line.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from typing_extensions import override

from ..model.mechanism import Mechanism, cylinder_words
from .base import (
    Frame,
    Group,
    Laid,
    Line,
    coriolis,
    cross,
    dot,
    intersect,
    known_jerk,
    radial,
    sliding_jerk_terms,
    triangle_apex,
    unit,
)
from .force_steps import ForceState, close_two_links, force_label, left_normal, pins_carried, result
from .polygon_steps import coriolis_step, image_steps, radial_step
from .poses import IN_LINE_DEG, angle_between_lines, vector
from .steps import Component, PolygonBuilder, Role, figure


@dataclass(frozen=True)
class ActuatorGroup(Group):
    """The cylinder heading a decomposition.

    Attributes
    ----------
    roles : dict
        ``C`` the barrel's pivot on the ground, ``B`` the rod's end, ``A`` the known pin of the
        link carrying B.
    links : tuple of str
        (the barrel, the link carrying B).
    slide : str
        The cylinder's slide (its point the rod's end, its guide the barrel).
    """

    notation = "cylinder"

    @property
    def link(self) -> str:
        """The barrel: the link the cylinder's length is measured along.

        Returns
        -------
        str
            The barrel link's name.
        """
        return self.links[0]

    @property
    def pivot(self) -> str:
        """The barrel's ground pivot, where the cylinder's length is measured from.

        Returns
        -------
        str
            The pivot point's name.
        """
        return self.roles["C"]

    @property
    @override
    def carried_points(self) -> frozenset:
        """The barrel's point under the rod's end: its radial component belongs to the barrel."""
        return frozenset({(self.links[0], self.roles["B"])})

    @property
    @override
    def name(self) -> str:
        return cylinder_words(self.slide)

    @override
    def branch_sign(self, mech: Mechanism) -> float:
        (cx, cy), (bx, by), (ax, ay) = (mech.position_m(self.roles[k]) for k in "CBA")
        return 1.0 if (ax - cx) * (by - cy) - (ay - cy) * (bx - cx) >= 0 else -1.0

    @override
    def reach_message(self, mech: Mechanism) -> str:
        return f"the cylinder {self.slide} and link {self.links[1]} cannot reach"

    def _line_sense(self, frame: Frame) -> float:
        """+1 when the slide's line runs from the pivot towards the rod's end (its sliding motion is L's)."""
        e, f = frame.mech.slides[self.slide].line
        return 1.0 if dot(frame.ref[f] - frame.ref[e], frame.ref[self.roles["B"]] - frame.ref[e]) >= 0 else -1.0

    @override
    def position(self, frame: Frame, where: str = ""):
        ref, pos, r = frame.ref, frame.pos, self.roles
        c, a = pos[r["C"]], pos[r["A"]]
        length = frame.driver_length_m
        carrier = abs(ref[r["B"]] - ref[r["A"]])
        pos[r["B"]] = triangle_apex(frame, self, where, c, a, length, carrier)
        frame.place(self.links[1], r["A"], r["B"])
        # The barrel turns with the cylinder's axis; its points keep their places relative to it.
        turn = unit(pos[r["B"]] - c) / unit(ref[r["B"]] - ref[r["C"]])
        frame.driver_pose[r["C"]] = c
        for name in frame.mech.links[self.links[0]]:
            if name != r["C"]:
                pos[name] = c + (ref[name] - ref[r["C"]]) * turn
        for name in frame.mech.links[self.links[0]]:
            frame.driver_pose[name] = pos[name]

    def _axis(self, frame: Frame):
        c, b = self.roles["C"], self.roles["B"]
        r = frame.pos[b] - frame.pos[c]
        return r, unit(r)

    def _sliding_velocity(self, frame: Frame, u):
        """The rod's known velocity in the barrel, L̇·u, laid from c."""
        return frame.vel[self.roles["C"]] + frame.mech.driver.linear_speed_m_s * u

    @override
    def velocity(self, frame: Frame):
        pos, vel = frame.pos, frame.vel
        c, b, a = (self.roles[k] for k in "CBA")
        barrel, carrier = self.links
        r, u = self._axis(frame)
        through = self._sliding_velocity(frame, u)
        meet = intersect(Line(through, 1j * r), Line(vel[a], 1j * (pos[b] - pos[a])))
        vel[b] = meet.point
        frame.omega[barrel] = cross(r, meet.point - through) / np.abs(r) ** 2
        frame.omega[carrier] = frame.angular_velocity(a, b)
        frame.velocity_images(barrel, c)
        frame.velocity_images(carrier, a)
        speed = frame.mech.driver.linear_speed_m_s
        frame.sliding_velocity[self.slide] = self._line_sense(frame) * (np.zeros(np.shape(r)) + speed)
        return meet

    def _laid_acceleration(self, frame: Frame):
        """(the radial of the barrel's point under B about C, the Coriolis component after it, the
        start of the barrel's tangential line: after the known sliding acceleration)."""
        c, b = self.roles["C"], self.roles["B"]
        barrel = self.links[0]
        r, u = self._axis(frame)
        omega = frame.omega[barrel]
        first = radial(frame, b, c, frame.acc[c], 1j * omega * r)
        speed, accel = frame.mech.driver.linear_speed_m_s, frame.mech.driver.linear_acceleration_m_s2
        turned = coriolis(omega, speed * u)
        return first, (first.end, first.end + turned), first.end + turned + accel * u

    @override
    def acceleration(self, frame: Frame):
        pos, vel, acc = frame.pos, frame.vel, frame.acc
        c, b, a = (self.roles[k] for k in "CBA")
        barrel, carrier = self.links
        r, _ = self._axis(frame)
        first, _, start = self._laid_acceleration(frame)
        second = radial(frame, b, a, acc[a], vel[b] - vel[a])
        meet = intersect(Line(start, 1j * r), Line(second.end, 1j * (pos[b] - pos[a])))
        acc[b] = meet.point
        frame.alpha[barrel] = cross(r, meet.point - start) / np.abs(r) ** 2
        frame.alpha[carrier] = frame.angular_acceleration(second.end, a, b)
        frame.acceleration_images(barrel, c)
        frame.acceleration_images(carrier, a)
        accel = frame.mech.driver.linear_acceleration_m_s2
        frame.sliding_acceleration[self.slide] = self._line_sense(frame) * (np.zeros(np.shape(r)) + accel)
        return (first, second), meet

    @override
    def jerk(self, frame: Frame):
        """j_B = j_Bg + L⃛·u + 3·L̇·(iα − ω²)·u + 3·L̈·iω·u (L⃛ = 0: constant sliding acceleration)."""
        pos = frame.pos
        c, b, a = (self.roles[k] for k in "CBA")
        barrel, carrier = self.links
        r, u = self._axis(frame)
        driver = frame.mech.driver
        start = known_jerk(frame, barrel, c, b) + sliding_jerk_terms(
            frame.omega[barrel], frame.alpha[barrel], u, driver.linear_speed_m_s, driver.linear_acceleration_m_s2)
        other = known_jerk(frame, carrier, a, b)
        meet = intersect(Line(start, 1j * r), Line(other, 1j * (pos[b] - pos[a])))
        frame.jerk[b] = meet.point
        frame.angular_jerk[barrel] = cross(r, meet.point - start) / np.abs(r) ** 2
        rel = pos[b] - pos[a]
        frame.angular_jerk[carrier] = cross(rel, meet.point - other) / np.abs(rel) ** 2
        frame.jerk_images(barrel, c)
        frame.jerk_images(carrier, a)
        frame.sliding_jerk[self.slide] = np.zeros(np.shape(r))
        return meet

    @override
    def velocity_steps(self, builder: PolygonBuilder, frame: Frame, placed: set):
        vb, pos = builder, frame.pos
        c, b, a = (self.roles[k] for k in "CBA")
        barrel, carrier = self.links
        r, u = self._axis(frame)
        through = self._sliding_velocity(frame, u)
        speed = frame.mech.driver.linear_speed_m_s
        vb.vector(Component.SLIDING, frame.vel[c], through, "", f"v_slide = L̇ along {c}{b}",
                  f"the rod's velocity in the barrel, known: {figure(speed)} m/s along {c}{b}", points=(b,),
                  links=(barrel,))
        vb.direction(None, through, 1j * r, f"v_{b}/{barrel} ⊥ {c}{b}",
                     f"line through the end of the sliding velocity perpendicular to {c}{b}: the barrel's point "
                     f"under {b}, moved by the sliding velocity", points=(b,), links=(barrel,))
        vb.direction(None, frame.vel[a], 1j * (pos[b] - pos[a]), f"v_{b}{a} ⊥ {a}{b}",
                     f"line through {vb.label(a)} perpendicular to {a}{b}", points=(b,), links=(carrier,))
        meet = self.velocity(frame)
        vb.intersection(meet, vb.label(b), f"velocity image of {b}", self, points=(b,),
                        equation=f"v_{b} = v_{b}/{barrel} + v_slide = v_{a} + v_{b}{a}")
        vb.vector(None, frame.vel[a], frame.vel[b], "", f"v_{b}{a} = ω_{carrier} × r_{a}{b}",
                  f"velocity of {b} relative to {a}: so ω_{carrier} = {figure(float(frame.omega[carrier]))} rad/s, "
                  f"ω_{barrel} = {figure(float(frame.omega[barrel]))} rad/s", role=Role.RESULT, points=(b,),
                  links=(carrier,))
        placed.update((c, b))
        for link in self.links:
            image_steps(vb, frame, link, placed, "vel")

    @override
    def acceleration_steps(self, builder: PolygonBuilder, frame: Frame, placed: set):
        ab, pos = builder, frame.pos
        c, b, a = (self.roles[k] for k in "CBA")
        barrel, carrier = self.links
        r, u = self._axis(frame)
        (first, second), meet = self.acceleration(frame)
        _, (coriolis_start, coriolis_end), start = self._laid_acceleration(frame)
        radial_step(ab, first, frame, self.links, carried=True)
        coriolis_step(ab, Laid("coriolis", coriolis_start, coriolis_end, b, barrel), barrel)
        accel = frame.mech.driver.linear_acceleration_m_s2
        ab.vector(Component.SLIDING, coriolis_end, start, "", f"a_slide = L̈ along {c}{b}",
                  f"the rod's known acceleration in the barrel: {figure(accel)} m/s² along {c}{b}", points=(b,),
                  links=(barrel,))
        ab.direction(Component.TANGENTIAL, start, 1j * r, f"a_{b}/{barrel}^t ⊥ {c}{b}",
                     f"line of the tangential component of the barrel's point under {b}", points=(b,),
                     links=(barrel,))
        radial_step(ab, second, frame, self.links)
        ab.direction(Component.TANGENTIAL, second.end, 1j * (pos[b] - pos[a]), f"a_{b}{a}^t ⊥ {a}{b}",
                     f"line of the tangential component of {b} relative to {a}", points=(b,), links=(carrier,))
        ab.intersection(meet, ab.label(b), f"acceleration image of {b}", self, points=(b,),
                        equation=f"a_{b} = a_{b}/{barrel} + a_c + a_slide = a_{a} + a^r + a^t")
        ab.vector(Component.TANGENTIAL, second.end, frame.acc[b], "", f"a_{b}{a}^t = α_{carrier} × r_{a}{b}",
                  f"tangential component of {b} relative to {a}: so α_{carrier} = "
                  f"{figure(float(frame.alpha[carrier]))} rad/s², α_{barrel} = {figure(float(frame.alpha[barrel]))} "
                  "rad/s²", role=Role.RESULT, points=(b,), links=(carrier,), about=a)
        placed.update((c, b))
        for link in self.links:
            image_steps(ab, frame, link, placed, "acc")

    @override
    def force_steps(self, builder: PolygonBuilder, state: ForceState):
        """The barrel C-B and the link A-B carrying the rod's end close as two links meeting at B
        (the block at B is massless but for its own loads, so the barrel's force on it acts
        through B): the moments about B give the parts of the pivot forces across each link, the
        lines along AB and CB close the polygon. The barrel's force on the block is then split
        along the cylinder's axis (the cylinder's force, push positive) and across it (the
        guide's normal force, frictionless)."""
        c, b, a = (self.roles[k] for k in "CBA")
        barrel, carrier = self.links
        closed = close_two_links(builder, state, self, a, b, c, carrier, barrel)
        block = state.body_name(("pin", b))
        carried = closed.ends1[("pin", b)][0]
        state.joints.setdefault(b, {})[carrier] = result(
            builder, carried, closed.meet, force_label(block, carrier), f"the force of the rod's end at {b} on "
            f"{carrier}", points=(b,), links=(carrier,))
        pins_carried(builder, state, carrier, closed.runs1[:-1], closed.ends1)
        pins_carried(builder, state, barrel, closed.runs2, closed.ends2)
        slide = state.mech.slides[self.slide]
        on_block = closed.meet - closed.end1
        normal = left_normal(state.pos, slide)
        along = complex(unit(state.pos[b] - state.pos[c]))
        turned = closed.end1 + dot(normal, on_block) * normal
        result(builder, closed.end1, turned, force_label(barrel, block) + "ₙ", f"the guide's normal force of the "
               f"barrel on the rod at {b}, across the cylinder's axis", Component.NORMAL, points=(b,), links=(barrel,))
        state.drive_force_n = float(dot(along, on_block))
        result(builder, turned, closed.meet, f"F({self.slide})", f"the cylinder's force on the rod's end along its "
               f"axis {c}{b}: {'a push' if state.drive_force_n >= 0 else 'a pull'}", Component.DRIVE, points=(b,),
               links=(barrel,))
        state.guide_reaction(slide, dot(normal, on_block), block_known=False, guide_known=False)

    @override
    def pose_warnings(self, mech: Mechanism, xy: dict) -> list:
        c, b, a = (self.roles[k] for k in "CBA")
        off_line = angle_between_lines(vector(xy, b, c), vector(xy, b, a))
        if off_line < IN_LINE_DEG:
            return [f"near a dead point of the cylinder: its axis is {off_line:.2f}° from being in line with "
                    f"link {self.links[1]} at {b}"]
        return []

    @override
    def transmission_angles(self, result) -> dict:
        """The cylinder's own: the angle at B between the cylinder's axis and the link it drives, 0–180°."""
        index = result.point_names.index
        c, b, a = (self.roles[k] for k in "CBA")
        at_b = result.positions[:, index(b)]
        to_c = result.positions[:, index(c)] - at_b
        to_a = result.positions[:, index(a)] - at_b
        cosine = np.sum(to_a * to_c, axis=1) / (np.linalg.norm(to_a, axis=1) * np.linalg.norm(to_c, axis=1))
        return {f"{cylinder_words(self.slide)}/{self.links[1]} at {b}": np.degrees(np.arccos(np.clip(cosine, -1, 1)))}
