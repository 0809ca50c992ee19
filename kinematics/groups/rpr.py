"""The pin-slide-pin group (RPR): a link with known pin C whose slot slides
over a known point D (the crank and slotted lever). On the polygon the line
of the link's point under D meets the line of the sliding motion; the
Coriolis component is laid back from d′."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from typing_extensions import override

from ..model.mechanism import Mechanism
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
    unit,
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
from .steps import Component, PolygonBuilder, Role, figure


@dataclass(frozen=True)
class RPRGroup(Group):
    """Roles C (the link's known pin) and D (the point its slot slides over); ``slide`` names the slot."""

    notation = "RPR"

    @override
    def branch_sign(self, mech: Mechanism) -> float:
        return sign_along_slide(mech, self.slide, self.roles["C"], self.roles["D"])

    @override
    def reach_message(self, mech: Mechanism) -> str:
        return f"the slot of link {self.links[0]} cannot pass through point {self.roles['D']}"

    @property
    @override
    def carried_points(self) -> frozenset:
        return frozenset({(self.links[0], self.roles["D"])})

    @override
    def position(self, frame: Frame, where: str = ""):
        mech, ref, pos, r = frame.mech, frame.ref, frame.pos, self.roles
        slide = mech.slides[self.slide]
        e_ref, f_ref = ref[slide.line[0]], ref[slide.line[1]]
        u_ref = unit(f_ref - e_ref)
        offset = cross(u_ref, ref[r["C"]] - e_ref)
        w = pos[r["D"]] - pos[r["C"]]
        rho = np.abs(w)
        # Straight here means the slot's line is tangent to the circle |C − D| = |e|, or, for a slot
        # through the pivot, the pin passing over the pivot (the slot's direction is then undefined).
        with np.errstate(divide="ignore", invalid="ignore"):
            frame.nearness[self.name] = np.fmax(np.abs(offset) / rho, 1.0 - rho / abs(ref[r["D"]] - ref[r["C"]]))
        refuse(frame, where, self.reach_message(mech), np.abs(offset) > rho * (1.0 + REACH_TOLERANCE))
        turn_in = np.arcsin(np.clip(offset / rho, -1.0, 1.0))
        psi = np.angle(w) + np.where(self.sign > 0, turn_in, np.pi - turn_in)
        turn = np.exp(1j * psi) / u_ref
        for name in mech.links[self.links[0]]:
            if name != r["C"]:
                pos[name] = pos[r["C"]] + (ref[name] - ref[r["C"]]) * turn

    @override
    def velocity(self, frame: Frame):
        pos, vel = frame.pos, frame.vel
        slide = frame.mech.slides[self.slide]
        u, _ = frame.slot(slide)
        c, d = self.roles["C"], self.roles["D"]
        link = self.links[0]
        meet = intersect(Line(vel[c], 1j * (pos[d] - pos[c])), Line(vel[d], u))
        rel = pos[d] - pos[c]
        frame.omega[link] = cross(rel, meet.point - vel[c]) / np.abs(rel) ** 2
        frame.velocity_images(link, c)
        frame.sliding_velocity[slide.name] = dot(u, vel[d] - meet.point)
        return meet

    @override
    def acceleration(self, frame: Frame):
        pos, vel, acc = frame.pos, frame.vel, frame.acc
        slide = frame.mech.slides[self.slide]
        u, _ = frame.slot(slide)
        link = self.links[0]
        c, d = self.roles["C"], self.roles["D"]
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

    @override
    def jerk(self, frame: Frame):
        """The jerk of the slotted link's point under D (⊥ CD through its known part) meets the line
        parallel to the slot through j_D less the terms of D's sliding motion on the turning slot."""
        pos = frame.pos
        slide = frame.mech.slides[self.slide]
        u, _ = frame.slot(slide)
        link = self.links[0]
        c, d = self.roles["C"], self.roles["D"]
        start = known_jerk(frame, link, c, d)
        back = frame.jerk[d] - sliding_jerk_terms(frame.omega[link], frame.alpha[link], u,
                                                  frame.sliding_velocity[slide.name],
                                                  frame.sliding_acceleration[slide.name])
        meet = intersect(Line(start, 1j * (pos[d] - pos[c])), Line(back, u))
        r = pos[d] - pos[c]
        frame.angular_jerk[link] = cross(r, meet.point - start) / np.abs(r) ** 2
        frame.jerk_images(link, c)
        frame.sliding_jerk[slide.name] = dot(u, back - meet.point)
        return meet

    @override
    def velocity_steps(self, builder: PolygonBuilder, frame: Frame, placed: set):
        vb, pos = builder, frame.pos
        slide = frame.mech.slides[self.slide]
        link = self.links[0]
        u = frame.slot(slide)[0]
        c, d = self.roles["C"], self.roles["D"]
        vb.direction(None, frame.vel[c], 1j * (pos[d] - pos[c]), f"v_{d}/{link} ⊥ {c}{d}",
                     f"line through {vb.label(c)} perpendicular to {c}{d}: the point of {link} under {d}",
                     points=(d,), links=(link,))
        vb.direction(Component.SLIDING, frame.vel[d], u, f"v_slide ∥ slot of {link}",
                     f"line through {vb.label(d)} parallel to the slot of {link}", points=(d,), links=(link,))
        meet = self.velocity(frame)
        label = vb.mark(meet.point, f"image of the point of {link} under {d}",
                        f"v_{d} = v_{d}/{link} + v_slide", points=(d,), links=(link,))
        vb.intersection(meet, label, f"velocity image of the point of {link} under {d}", self, points=(d,))
        vb.vector(Component.SLIDING, meet.point, frame.vel[d], "", "v_slide ∥ slot",
                  f"sliding velocity of {d} in the slot of {link}: {figure(float(frame.sliding_velocity[slide.name]))} "
                  f"m/s from {slide.line[0]} towards {slide.line[1]}; ω_{link} = {figure(float(frame.omega[link]))} "
                  "rad/s", role=Role.RESULT, points=(d,), links=(link,))
        image_steps(vb, frame, link, placed, "vel")

    @override
    def acceleration_steps(self, builder: PolygonBuilder, frame: Frame, placed: set):
        ab, pos = builder, frame.pos
        slide = frame.mech.slides[self.slide]
        link = self.links[0]
        u = frame.slot(slide)[0]
        c, d = self.roles["C"], self.roles["D"]
        # The arithmetic runs first; the steps then draw its records in the draftsman's order.
        (radial_laid, coriolis_laid), meet = self.acceleration(frame)
        radial_step(ab, radial_laid, frame, self.links, carried=True)
        ab.direction(Component.TANGENTIAL, radial_laid.end, 1j * (pos[d] - pos[c]), f"a_{d}/{link}^t ⊥ {c}{d}",
                     f"line of the tangential component of the point of {link} under {d}", points=(d,), links=(link,))
        back = ab.mark(coriolis_laid.end, f"{ab.label(d)} less the Coriolis component", "", points=(d,))
        coriolis_step(ab, Laid("coriolis", coriolis_laid.end, coriolis_laid.start, d, link), slide.guide)
        ab.direction(Component.SLIDING, coriolis_laid.end, u, "a_slide ∥ slot",
                     f"line through {back} parallel to the slot of {link}", points=(d,), links=(link,))
        label = ab.mark(meet.point, f"image of the point of {link} under {d}", f"a_{d} = a_{d}/{link} + a_slide + a_c",
                        points=(d,), links=(link,))
        ab.intersection(meet, label, f"acceleration image of the point of {link} under {d}", self, points=(d,))
        ab.vector(Component.TANGENTIAL, radial_laid.end, meet.point, "", f"a_{d}/{link}^t = α_{link} × r_{c}{d}",
                  f"tangential component: {figure(abs(meet.point - radial_laid.end))} m/s², so α_{link} = "
                  f"{figure(float(frame.alpha[link]))} rad/s²", role=Role.RESULT, points=(d,), links=(link,), about=c)
        ab.vector(Component.SLIDING, meet.point, coriolis_laid.end, "", "a_slide ∥ slot",
                  f"sliding acceleration of {d} in the slot of {link}: "
                  f"{figure(float(frame.sliding_acceleration[slide.name]))} m/s² from {slide.line[0]} towards "
                  f"{slide.line[1]}", role=Role.RESULT, points=(d,), links=(link,))
        image_steps(ab, frame, link, placed, "acc")

    @override
    def force_steps(self, builder: PolygonBuilder, state: ForceState):
        """The lever alone: the block's force on the slot acts through D, normal to the slot, so the
        moments about D give the part of the force at C across CD (laid); the slot's normal and the
        line along CD close the polygon."""
        pos = state.pos
        slide = state.mech.slides[self.slide]
        c, d = self.roles["C"], self.roles["D"]
        lever = self.links[0]
        runs = gather(state, lever, state.owned_by(self))
        by_c = by_name(state, c, lever)
        block = state.body_name(("pin", d)) if d in state.elements else "frame"
        start = perpendicular(builder, 0j, every(runs), c, d, lever, by_c, pos, self.name)
        end, ends = lay(builder, start, runs)
        normal = left_normal(pos, slide)
        meet = intersect_lines(
            builder, self, (end, normal, Component.NORMAL, f"line through the end normal to the slot of {lever}: "
                            f"{force_label(block, lever)}, acting through {d}"),
            (0j, pos[d] - pos[c], Component.ALONG_LINK, f"line along {c}{d} through the start: the part of "
             f"{force_label(by_c, lever)} along {c}{d}"), f"the close of the polygon of {lever}")
        push = result(builder, end, meet, force_label(block, lever), f"the block's force on the slot at {d}, normal "
                      "to the slot", Component.NORMAL, points=(d,), links=(lever,))
        state.react(c, lever, result(builder, meet, start, force_label(by_c, lever), f"the force at {c}",
                                     points=(c,), links=(lever,)))
        pins_carried(builder, state, lever, runs, ends)
        state.guide_reaction(slide, -dot(normal, push), block_known=True, guide_known=False)

    @override
    def loop_check(self, mech: Mechanism):
        """The crank and slotted lever's verdict, for a lever pivoted on the ground."""
        c, d = self.roles["C"], self.roles["D"]
        found = driving_crank(mech, self, d)
        if found is None or c not in mech.ground:
            return None
        carrier, pivot, crank = found
        slide = mech.slides[self.slide]
        offset = distance_from_line(mech, c, slide.line)
        centres = length(mech, pivot, c)
        # The slot must pass the crank pin at every crank angle: |C - pin| stays ≥ |e|, and it
        # ranges over [|d - r|, d + r]. Below d the lever rocks; beyond, it turns too (Whitworth).
        if crank + offset < centres:
            verdict = f"r + |e| < d: {crank:.4g} + {offset:.4g} < {centres:.4g}, the lever rocks"
        elif crank - offset > centres:
            verdict = f"r − |e| > d: {crank:.4g} − {offset:.4g} > {centres:.4g}, the lever turns fully too"
        else:
            verdict = f"|d − r| < |e| or the pin passes the pivot: {crank:.4g}, {offset:.4g}, {centres:.4g}"
        turns = crank + offset < centres or crank - offset > centres
        return LoopCheck(f"crank and slotted lever {carrier}-{self.links[0]}", verdict, carrier if turns else None,
                         {carrier: crank, "offset": offset, "centre distance": centres})
