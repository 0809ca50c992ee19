"""The pin-pin-pin group (RRR): links A-B and C-B joined by pin B, with A and
C known. Position is a circle-circle intersection; velocity and acceleration
the meeting of two lines perpendicular to AB and CB on the polygon."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from typing_extensions import override

from ..model.mechanism import Mechanism
from .base import Frame, Group, Line, cross, intersect, known_jerk, radial, triangle_apex
from .force_steps import ForceState, close_two_links, force_label, pins_carried, result
from .loops import LoopCheck, driving_crank, grashof_class, length
from .polygon_steps import image_steps, radial_step
from .poses import IN_LINE_DEG, angle_between_lines, toggle_warnings, vector
from .steps import Component, PolygonBuilder, Role, figure


@dataclass(frozen=True)
class RRRGroup(Group):
    """Roles A, B, C; ``links`` is (the link A-B, the link C-B)."""

    notation = "RRR"

    @override
    def branch_sign(self, mech: Mechanism) -> float:
        (ax, ay), (bx, by), (cx, cy) = (mech.position_m(self.roles[k]) for k in "ABC")
        return 1.0 if (cx - ax) * (by - ay) - (cy - ay) * (bx - ax) >= 0 else -1.0

    @override
    def reach_message(self, mech: Mechanism) -> str:
        return f"links {self.links[0]} and {self.links[1]} cannot reach"

    @override
    def position(self, frame: Frame, where: str = ""):
        ref, pos, r = frame.ref, frame.pos, self.roles
        a, c = pos[r["A"]], pos[r["C"]]
        la = abs(ref[r["B"]] - ref[r["A"]])
        lc = abs(ref[r["B"]] - ref[r["C"]])
        pos[r["B"]] = triangle_apex(frame, self, where, a, c, la, lc)
        frame.place(self.links[0], r["A"], r["B"])
        frame.place(self.links[1], r["C"], r["B"])

    @override
    def velocity(self, frame: Frame):
        pos, vel = frame.pos, frame.vel
        a, b, c = (self.roles[k] for k in "ABC")
        meet = intersect(Line(vel[a], 1j * (pos[b] - pos[a])), Line(vel[c], 1j * (pos[b] - pos[c])))
        vel[b] = meet.point
        for link, pin in zip(self.links, (a, c), strict=True):
            frame.omega[link] = frame.angular_velocity(pin, b)
            frame.velocity_images(link, pin)
        return meet

    @override
    def acceleration(self, frame: Frame):
        pos, vel, acc = frame.pos, frame.vel, frame.acc
        a, b, c = (self.roles[k] for k in "ABC")
        first = radial(frame, b, a, acc[a], vel[b] - vel[a])
        second = radial(frame, b, c, acc[c], vel[b] - vel[c])
        meet = intersect(Line(first.end, 1j * (pos[b] - pos[a])), Line(second.end, 1j * (pos[b] - pos[c])))
        acc[b] = meet.point
        for link, pin, laid in zip(self.links, (a, c), (first, second), strict=True):
            frame.alpha[link] = frame.angular_acceleration(laid.end, pin, b)
            frame.acceleration_images(link, pin)
        return (first, second), meet

    @override
    def jerk(self, frame: Frame):
        """j_B = j_A + (i(α̇1 − ω1³) − 3ω1α1)·r_AB = j_C + (i(α̇2 − ω2³) − 3ω2α2)·r_CB: two lines again."""
        pos = frame.pos
        a, b, c = (self.roles[k] for k in "ABC")
        starts = [known_jerk(frame, link, pin, b) for link, pin in zip(self.links, (a, c), strict=True)]
        meet = intersect(Line(starts[0], 1j * (pos[b] - pos[a])), Line(starts[1], 1j * (pos[b] - pos[c])))
        frame.jerk[b] = meet.point
        for link, pin, start in zip(self.links, (a, c), starts, strict=True):
            r = pos[b] - pos[pin]
            frame.angular_jerk[link] = cross(r, meet.point - start) / np.abs(r) ** 2
            frame.jerk_images(link, pin)
        return meet

    @override
    def velocity_steps(self, builder: PolygonBuilder, frame: Frame, placed: set):
        vb, pos = builder, frame.pos
        a, b, c = (self.roles[k] for k in "ABC")
        l1, l2 = self.links
        vb.direction(None, frame.vel[a], 1j * (pos[b] - pos[a]), f"v_{b}{a} ⊥ {a}{b}",
                     f"line through {vb.label(a)} perpendicular to {a}{b}: velocity of {b} relative to {a}",
                     points=(b,), links=(l1,))
        vb.direction(None, frame.vel[c], 1j * (pos[b] - pos[c]), f"v_{b}{c} ⊥ {c}{b}",
                     f"line through {vb.label(c)} perpendicular to {c}{b}: velocity of {b} relative to {c}",
                     points=(b,), links=(l2,))
        meet = self.velocity(frame)
        vb.intersection(meet, vb.label(b), f"velocity image of {b}", self, points=(b,),
                        equation=f"v_{b} = v_{a} + v_{b}{a} = v_{c} + v_{b}{c}")
        for pin, link in ((a, l1), (c, l2)):
            rel = frame.vel[b] - frame.vel[pin]
            vb.vector(None, frame.vel[pin], frame.vel[b], "", f"v_{b}{pin} = ω_{link} × r_{pin}{b}",
                      f"velocity of {b} relative to {pin}: {figure(abs(rel))} m/s, so ω_{link} = "
                      f"{figure(float(frame.omega[link]))} rad/s", role=Role.RESULT, points=(b,), links=(link,))
        placed.add(b)
        for link in self.links:
            image_steps(vb, frame, link, placed, "vel")

    @override
    def acceleration_steps(self, builder: PolygonBuilder, frame: Frame, placed: set):
        ab, pos = builder, frame.pos
        a, b, c = (self.roles[k] for k in "ABC")
        # The arithmetic runs first; the steps then draw its records in the draftsman's order.
        laid, meet = self.acceleration(frame)
        for item, pin, link in zip(laid, (a, c), self.links, strict=True):
            radial_step(ab, item, frame, self.links)
            ab.direction(Component.TANGENTIAL, item.end, 1j * (pos[b] - pos[pin]), f"a_{b}{pin}^t ⊥ {pin}{b}",
                         f"line of the tangential component of {b} relative to {pin}, perpendicular to {pin}{b}",
                         points=(b,), links=(link,))
        ab.intersection(meet, ab.label(b), f"acceleration image of {b}", self, points=(b,),
                        equation=f"a_{b} = a_{a} + a^r + a^t = a_{c} + a^r + a^t")
        for item, pin, link in zip(laid, (a, c), self.links, strict=True):
            ab.vector(Component.TANGENTIAL, item.end, frame.acc[b], "", f"a_{b}{pin}^t = α_{link} × r_{pin}{b}",
                      f"tangential component of {b} relative to {pin}: r·α = {figure(abs(frame.acc[b] - item.end))} "
                      f"m/s², so α_{link} = {figure(float(frame.alpha[link]))} rad/s²", role=Role.RESULT,
                      points=(b,), links=(link,), about=pin)
        placed.add(b)
        for link in self.links:
            image_steps(ab, frame, link, placed, "acc")

    @override
    def force_steps(self, builder: PolygonBuilder, state: ForceState):
        """Each outer pin force split along its link and across it: the moments about B of each link
        give the parts across (laid), the lines along AB and CB close the polygon; the force at B
        from link C-B's own polygon. An element at B is carried by link A-B."""
        a, b, c = (self.roles[k] for k in "ABC")
        l1, l2 = self.links
        closed = close_two_links(builder, state, self, a, b, c, l1, l2)
        meet, end1 = closed.meet, closed.end1
        at_b = state.body_name(("pin", b)) if b in state.elements else None
        carried = closed.ends1[("pin", b)][0] if at_b else end1
        state.joints.setdefault(b, {})[l2] = result(
            builder, meet, end1, force_label(at_b or l1, l2), f"the force at {b}, from the polygon of {l2}",
            points=(b,), links=(l2,))
        state.joints[b][l1] = result(builder, carried, meet, force_label(at_b or l2, l1), f"the force at {b} on "
                                     f"{l1}", points=(b,), links=(l1,))
        pins_carried(builder, state, l1, closed.runs1[:-1] if at_b else closed.runs1, closed.ends1)
        pins_carried(builder, state, l2, closed.runs2, closed.ends2)

    @override
    def pose_warnings(self, mech: Mechanism, xy: dict) -> list:
        a, b, c = (self.roles[k] for k in "ABC")
        warnings = []
        off_line = angle_between_lines(vector(xy, b, a), vector(xy, b, c))
        if off_line < IN_LINE_DEG:
            first, second = self.links
            warnings.append(f"near a dead point of the driver: links {first} and {second} are {off_line:.2f}° "
                            f"from being in line at {b}; the polygon's construction lines are nearly parallel")
        return warnings + toggle_warnings(mech, self.links, xy, ((a, b), (c, b)))

    @override
    def loop_check(self, mech: Mechanism):
        a, b, c = (self.roles[k] for k in "ABC")
        links = tuple(self.links)
        if a in mech.ground and c not in mech.ground:
            # The file listed the rocker first: read the loop from the crank's side.
            a, c, links = c, a, links[::-1]
        found = driving_crank(mech, self, a)
        if found is None or c not in mech.ground:
            return None
        carrier, pivot, crank = found
        frame, coupler, output = length(mech, pivot, c), length(mech, a, b), length(mech, c, b)
        verdict, turns = grashof_class(frame, crank, coupler, output)
        names = {"input": carrier, "output": links[1], "coupler": links[0], "frame": "ground",
                 "input and output": f"{carrier} and {links[1]}"}
        return LoopCheck(f"four-bar {carrier}-{links[0]}-{links[1]}", verdict, names.get(turns) if turns else None,
                         {"frame": frame, carrier: crank, links[0]: coupler, links[1]: output})

    @override
    def transmission_angles(self, result) -> dict:
        """The angle at joint B between B-A and B-C, 0–180°."""
        index = result.point_names.index
        a, b, c = (self.roles[k] for k in "ABC")
        at_b = result.positions[:, index(b)]
        to_a = result.positions[:, index(a)] - at_b
        to_c = result.positions[:, index(c)] - at_b
        cosine = np.sum(to_a * to_c, axis=1) / (np.linalg.norm(to_a, axis=1) * np.linalg.norm(to_c, axis=1))
        return {f"{self.links[0]}/{self.links[1]} at {b}": np.degrees(np.arccos(np.clip(cosine, -1, 1)))}
