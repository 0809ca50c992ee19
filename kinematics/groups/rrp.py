"""The pin-pin-slide group (RRP): a link with known pin A whose point D slides
on a known guide (the ground, or a moving link: then the Coriolis component
appears). Position is a circle-line intersection; on the polygon the line
perpendicular to AD meets the line of the sliding motion."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from typing_extensions import override

from ..model.mechanism import GROUND, Mechanism
from .base import (
    REACH_TOLERANCE,
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
    refuse,
    sign_along_slide,
    sliding_jerk_terms,
)
from .force_steps import (
    ForceState,
    by_name,
    every,
    force_label,
    gather,
    intersect_lines,
    lay,
    left_normal,
    perpendicular,
    pins_carried,
    result,
)
from .loops import LoopCheck, distance_from_line, driving_crank, length
from .polygon_steps import coriolis_step, image_steps, radial_step
from .poses import IN_LINE_DEG, angle_between_lines, toggle_warnings, vector
from .steps import Component, PolygonBuilder, Role, figure


@dataclass(frozen=True)
class RRPGroup(Group):
    """Roles A (the known pin) and D (the sliding point); ``slide`` names D's slide."""

    notation = "RRP"

    @override
    def branch_sign(self, mech: Mechanism) -> float:
        return sign_along_slide(mech, self.slide, self.roles["A"], self.roles["D"])

    @override
    def reach_message(self, mech: Mechanism) -> str:
        carriers = [b for b in mech.bodies_of(self.roles["A"]) if b not in self.links and b != GROUND]
        if carriers:
            return f"links {self.links[0]} and {carriers[0]} cannot reach"
        return f"link {self.links[0]} cannot reach the line of slide {mech.slides[self.slide].name}"

    @override
    def position(self, frame: Frame, where: str = ""):
        ref, pos, r = frame.ref, frame.pos, self.roles
        u, e = frame.slot(frame.mech.slides[self.slide])
        a = pos[r["A"]]
        rod = abs(ref[r["D"]] - ref[r["A"]])
        h = cross(u, a - e)
        frame.nearness[self.name] = np.abs(h) / rod
        refuse(frame, where, self.reach_message(frame.mech), np.abs(h) > rod * (1.0 + REACH_TOLERANCE))
        s = dot(u, a - e) + self.sign * np.sqrt(np.maximum(rod ** 2 - h ** 2, 0.0))
        pos[r["D"]] = e + s * u
        frame.place(self.links[0], r["A"], r["D"])

    @override
    def velocity(self, frame: Frame):
        pos, vel = frame.pos, frame.vel
        slide = frame.mech.slides[self.slide]
        u, _ = frame.slot(slide)
        a, d = self.roles["A"], self.roles["D"]
        coincident = frame.guide_point(slide.guide, d, "vel")
        meet = intersect(Line(vel[a], 1j * (pos[d] - pos[a])), Line(coincident, u))
        vel[d] = meet.point
        link = self.links[0]
        frame.omega[link] = frame.angular_velocity(a, d)
        frame.velocity_images(link, a)
        frame.sliding_velocity[slide.name] = dot(u, vel[d] - coincident)
        return meet

    @override
    def acceleration(self, frame: Frame):
        pos, vel, acc = frame.pos, frame.vel, frame.acc
        slide = frame.mech.slides[self.slide]
        u, _ = frame.slot(slide)
        link = self.links[0]
        a, d = self.roles["A"], self.roles["D"]
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

    @override
    def jerk(self, frame: Frame):
        """The line of D's jerk on its link (⊥ AD) meets the line of the sliding jerk (∥ guide) laid
        from the guide's point under D plus the terms of the sliding motion on a turning guide."""
        pos = frame.pos
        slide = frame.mech.slides[self.slide]
        u, _ = frame.slot(slide)
        link = self.links[0]
        a, d = self.roles["A"], self.roles["D"]
        start = known_jerk(frame, link, a, d)
        guided = frame.guide_point(slide.guide, d, "jerk")
        if slide.guide != GROUND:
            guided = guided + sliding_jerk_terms(frame.omega[slide.guide], frame.alpha[slide.guide], u,
                                                 frame.sliding_velocity[slide.name],
                                                 frame.sliding_acceleration[slide.name])
        meet = intersect(Line(start, 1j * (pos[d] - pos[a])), Line(guided, u))
        frame.jerk[d] = meet.point
        r = pos[d] - pos[a]
        frame.angular_jerk[link] = cross(r, meet.point - start) / np.abs(r) ** 2
        frame.jerk_images(link, a)
        frame.sliding_jerk[slide.name] = dot(u, meet.point - guided)
        return meet

    @override
    def velocity_steps(self, builder: PolygonBuilder, frame: Frame, placed: set):
        vb, pos = builder, frame.pos
        slide = frame.mech.slides[self.slide]
        link = self.links[0]
        u = frame.slot(slide)[0]
        a, d = self.roles["A"], self.roles["D"]
        vb.direction(None, frame.vel[a], 1j * (pos[d] - pos[a]), f"v_{d}{a} ⊥ {a}{d}",
                     f"line through {vb.label(a)} perpendicular to {a}{d}", points=(d,), links=(link,))
        coincident = frame.guide_point(slide.guide, d, "vel")
        where = "o"
        if slide.guide != GROUND:
            where = vb.mark(coincident, f"image of the point of {slide.guide} under {d}",
                            f"v_{d}/{slide.guide} by image of {slide.guide}", points=(d,), links=(slide.guide,))
        vb.direction(Component.SLIDING, coincident, u, f"v_{d},slide ∥ {slide.line[0]}{slide.line[1]}",
                     f"line through {where} parallel to the slide {slide.name}: sliding velocity of {d}",
                     points=(d,), links=(slide.guide,) if slide.guide != GROUND else ())
        meet = self.velocity(frame)
        vb.intersection(meet, vb.label(d), f"velocity image of {d}", self, points=(d,),
                        equation=f"v_{d} = v_{a} + v_{d}{a} = " + (
                            "v_slide" if slide.guide == GROUND else f"v_{d}/{slide.guide} + v_slide"))
        vb.vector(None, frame.vel[a], frame.vel[d], "", f"v_{d}{a} = ω_{link} × r_{a}{d}",
                  f"velocity of {d} relative to {a}: {figure(abs(frame.vel[d] - frame.vel[a]))} m/s, so ω_{link} = "
                  f"{figure(float(frame.omega[link]))} rad/s", role=Role.RESULT, points=(d,), links=(link,))
        vb.vector(Component.SLIDING, coincident, frame.vel[d], "", "v_slide ∥ guide",
                  f"sliding velocity of {d} on {slide.guide}: {figure(float(frame.sliding_velocity[slide.name]))} m/s "
                  f"from {slide.line[0]} towards {slide.line[1]}", role=Role.RESULT, points=(d,))
        placed.add(d)
        image_steps(vb, frame, link, placed, "vel")

    @override
    def acceleration_steps(self, builder: PolygonBuilder, frame: Frame, placed: set):
        ab, pos = builder, frame.pos
        slide = frame.mech.slides[self.slide]
        link = self.links[0]
        u = frame.slot(slide)[0]
        a, d = self.roles["A"], self.roles["D"]
        # The arithmetic runs first; the steps then draw its records in the draftsman's order.
        (radial_laid, coriolis_laid), meet = self.acceleration(frame)
        radial_step(ab, radial_laid, frame, self.links)
        ab.direction(Component.TANGENTIAL, radial_laid.end, 1j * (pos[d] - pos[a]), f"a_{d}{a}^t ⊥ {a}{d}",
                     f"line of the tangential component of {d} relative to {a}", points=(d,), links=(link,))
        if slide.guide != GROUND:
            ab.mark(coriolis_laid.start, f"image of the point of {slide.guide} under {d}",
                    f"a_{d}/{slide.guide} by image of {slide.guide}", points=(d,), links=(slide.guide,))
            coriolis_step(ab, coriolis_laid, slide.guide)
            through = ab.mark(coriolis_laid.end, "end of the Coriolis component", "", points=(d,))
        else:
            through = "o′"
        ab.direction(Component.SLIDING, coriolis_laid.end, u, "a_slide ∥ guide",
                     f"line through {through} parallel to the slide {slide.name}: sliding acceleration of {d}",
                     points=(d,))
        ab.intersection(meet, ab.label(d), f"acceleration image of {d}", self, points=(d,),
                        equation=f"a_{d} = a_{a} + a^r + a^t = " + (
                            "a_slide" if slide.guide == GROUND else f"a_{d}/{slide.guide} + a_c + a_slide"))
        ab.vector(Component.TANGENTIAL, radial_laid.end, frame.acc[d], "", f"a_{d}{a}^t",
                  f"tangential component of {d} relative to {a}: {figure(abs(frame.acc[d] - radial_laid.end))} m/s², "
                  f"so α_{link} = {figure(float(frame.alpha[link]))} rad/s²", role=Role.RESULT, points=(d,),
                  links=(link,), about=a)
        ab.vector(Component.SLIDING, coriolis_laid.end, frame.acc[d], "", "a_slide ∥ guide",
                  f"sliding acceleration of {d}: {figure(float(frame.sliding_acceleration[slide.name]))} m/s² from "
                  f"{slide.line[0]} towards {slide.line[1]}", role=Role.RESULT, points=(d,))
        placed.add(d)
        image_steps(ab, frame, link, placed, "acc")

    @override
    def force_steps(self, builder: PolygonBuilder, state: ForceState):
        """The rod and its block together: the moments about D give the part of the force at A across
        AD (laid); the guide's force, normal to the guide, and the line along AD close the polygon.
        The guide's force acts through D: the block is a pin on the guide line, so the moment
        condition of rod and block puts its line of action there."""
        pos = state.pos
        slide = state.mech.slides[self.slide]
        a, d = self.roles["A"], self.roles["D"]
        rod = self.links[0]
        runs = gather(state, rod, state.owned_by(self), last=(d,))
        by_a = by_name(state, a, rod)
        guide = "frame" if slide.guide == GROUND else slide.guide
        block = state.body_name(("pin", d))
        start = perpendicular(builder, 0j, every(runs), a, d, rod, by_a, pos, self.name)
        end, ends = lay(builder, start, runs)
        normal = left_normal(pos, slide)
        meet = intersect_lines(
            builder, self, (end, normal, Component.NORMAL, f"line through the end normal to the guide "
                            f"{slide.line[0]}{slide.line[1]}: {force_label(guide, block)}, acting through {d}"),
            (0j, pos[d] - pos[a], Component.ALONG_LINK, f"line along {a}{d} through the start: the part of "
             f"{force_label(by_a, rod)} along {rod}"), f"the close of the polygon of {rod} and its block")
        push = result(builder, end, meet, force_label(guide, block), f"the guide's force on the block at {d}, normal "
                      "to the guide", Component.NORMAL, points=(d,), links=(rod,))
        state.react(a, rod, result(builder, meet, start, force_label(by_a, rod), f"the force at {a}", points=(a,),
                                   links=(rod,)))
        state.joints.setdefault(d, {})[rod] = result(builder, ends[("pin", d)][0], meet, force_label(block, rod),
                                                     f"the force at {d} on {rod}", points=(d,), links=(rod,))
        pins_carried(builder, state, rod, runs[:-1], ends)
        state.guide_reaction(slide, dot(normal, push), block_known=False, guide_known=True)

    @override
    def pose_warnings(self, mech: Mechanism, xy: dict) -> list:
        a, d = self.roles["A"], self.roles["D"]
        slide = mech.slides[self.slide]
        warnings = []
        square = 90.0 - angle_between_lines(vector(xy, a, d), vector(xy, *slide.line))
        if square < IN_LINE_DEG:
            warnings.append(f"near a dead point of the driver: link {self.links[0]} is {square:.2f}° from "
                            f"square to the line of slide {slide.name}")
        return warnings + toggle_warnings(mech, self.links, xy, ((a, d),))

    @override
    def loop_check(self, mech: Mechanism):
        """The slider-crank's r + |e| < l, for a slide on the ground driven by a crank."""
        a, d = self.roles["A"], self.roles["D"]
        found = driving_crank(mech, self, a)
        slide = mech.slides[self.slide]
        if found is None or slide.guide != GROUND:
            return None
        carrier, pivot, crank = found
        offset = distance_from_line(mech, pivot, slide.line)
        rod = length(mech, a, d)
        turns = crank + offset < rod
        link = self.links[0]
        return LoopCheck(f"slider-crank {carrier}-{link}",
                         f"r + |e| {'<' if turns else '≥'} l: {crank:.4g} + {offset:.4g} vs {rod:.4g}",
                         carrier if turns else None, {carrier: crank, "offset": offset, link: rod})
