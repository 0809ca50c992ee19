"""The driver: a link turned about its fixed pivot at a given angle, speed and
angular acceleration. It heads every decomposition; its motion is given, so its
polygon steps lay known vectors from the pole."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from typing_extensions import override

from .base import Frame, Group
from .force_steps import FRAME, ForceState, every, force_label, gather, lay, moment, pins_carried, result
from .steps import Component, PolygonBuilder, Role, as_xy, direction_words, figure


@dataclass(frozen=True)
class DriverGroup(Group):
    """The driver link ``links[0]`` turning about ``roles["O"]``."""

    notation = "driver"

    @property
    def link(self) -> str:
        """The driving link."""
        return self.links[0]

    @property
    def pivot(self) -> str:
        """The ground pivot the driving link turns about."""
        return self.roles["O"]

    @property
    @override
    def name(self) -> str:
        return f"driver {self.link}"

    @override
    def position(self, frame: Frame, where: str = ""):
        """Place the driver link at ``frame.driver_angle_rad``."""
        mech, ref = frame.mech, frame.ref
        first = next(p for p in mech.links[self.link] if p != self.pivot)
        turn = np.exp(1j * (frame.driver_angle_rad - np.angle(ref[first] - ref[self.pivot])))
        o = frame.pos[self.pivot]
        frame.driver_pose[self.pivot] = o
        for name in mech.links[self.link]:
            if name != self.pivot:
                frame.pos[name] = frame.driver_pose[name] = o + (ref[name] - ref[self.pivot]) * turn

    @override
    def velocity(self, frame: Frame):
        """ω as given; the images from the placement at the given angle (``frame.driver_pose``)."""
        omega = frame.mech.driver.speed_rad_s
        frame.omega[self.link] = np.broadcast_to(np.asarray(omega, float), np.shape(frame.pos[self.pivot])) + 0.0
        frame.velocity_images(self.link, self.pivot, frame.driver_pose)
        return None

    @override
    def acceleration(self, frame: Frame):
        alpha = frame.mech.driver.angular_acceleration_rad_s2
        frame.alpha[self.link] = np.broadcast_to(np.asarray(alpha, float), np.shape(frame.pos[self.pivot])) + 0.0
        frame.acceleration_images(self.link, self.pivot, frame.driver_pose)
        return None

    @override
    def jerk(self, frame: Frame):
        """α̇ as given (zero at constant angular acceleration); the images from the given placement."""
        jerk = frame.mech.driver.angular_jerk_rad_s3
        frame.angular_jerk[self.link] = np.broadcast_to(np.asarray(jerk, float), np.shape(frame.pos[self.pivot])) + 0.0
        frame.jerk_images(self.link, self.pivot, frame.driver_pose)
        return None

    @override
    def velocity_steps(self, builder: PolygonBuilder, frame: Frame, placed: set):
        self.velocity(frame)
        link, pivot, omega = self.link, self.pivot, frame.omega[self.link]
        for q in frame.mech.links[link]:
            if q == pivot:
                continue
            r = frame.pos[q] - frame.pos[pivot]
            v = frame.vel[q]
            builder.vector(Component.DRIVER, 0.0, v, builder.label(q), f"v_{q} = ω_{link} × r_{pivot}{q}",
                           f"velocity of {q}: ω·r = {figure(abs(omega))} rad/s × {figure(abs(r))} m = "
                           f"{figure(abs(v))} m/s, perpendicular to {pivot}{q}{direction_words(v)}",
                           points=(q,), links=(link,))
        placed.update(frame.mech.links[link])

    @override
    def acceleration_steps(self, builder: PolygonBuilder, frame: Frame, placed: set):
        self.acceleration(frame)
        link, pivot = self.link, self.pivot
        omega, alpha = frame.omega[link], frame.alpha[link]
        for q in frame.mech.links[link]:
            if q == pivot:
                continue
            r = frame.pos[q] - frame.pos[pivot]
            radial_end = -(omega ** 2) * r
            builder.vector(Component.RADIAL, 0.0, radial_end, "" if alpha else builder.label(q),
                           f"a_{q}{pivot}^r = ω²·r_{q}{pivot}",
                           f"radial component of {q} about {pivot}: ω²·r = {figure(abs(radial_end))} m/s², "
                           f"directed from {q} to {pivot}", points=(q,), links=(link,), about=pivot)
            if alpha:
                builder.vector(Component.TANGENTIAL, radial_end, frame.acc[q], builder.label(q),
                               f"a_{q}{pivot}^t = α_{link} × r",
                               f"tangential component of {q} about {pivot}: r·α = {figure(abs(alpha * r))} m/s², "
                               f"perpendicular to {pivot}{q}", points=(q,), links=(link,), about=pivot)
        placed.update(frame.mech.links[link])

    @override
    def force_steps(self, builder: PolygonBuilder, state: ForceState):
        """Last: the loads on the driver laid, the frame's force at the pivot closes its polygon, and
        the drive torque balances their moment about the pivot (the arm of their resultant drawn)."""
        link, pivot = self.link, self.pivot
        runs = gather(state, link, state.owned_by(self))
        end, ends = lay(builder, 0j, runs)
        state.joints.setdefault(pivot, {})[link] = result(builder, end, 0j, force_label(FRAME, link),
                                                          f"the frame's force on {link} at the pivot {pivot}",
                                                          points=(pivot,), links=(link,))
        pins_carried(builder, state, link, runs, ends)
        o = complex(state.pos[pivot])
        turning = moment(every(runs), o)
        torque = -turning
        state.torque_n_m = torque
        if abs(end) > 0.0:
            # The point of the resultant's line nearest the pivot: cross(r, R) = ΣM with r ⊥ R.
            foot = o - 1j * turning * end / abs(end) ** 2
            arm = f"the resultant {figure(abs(end))} N of the loads on {link} acts at {figure(abs(foot - o))} m " \
                  f"from {pivot}"
            space = (as_xy(o), as_xy(foot))
        else:
            arm, space = f"the loads on {link} are a pure couple", (as_xy(o),)
        builder.add(Role.RESULT, Component.TORQUE, "T", (0j,), f"T + ΣM_{pivot}({link}) = 0",
                    f"T: the drive torque on {link}, {figure(torque)} N·m (counter-clockwise positive): {arm}, "
                    f"its moment about {pivot} is {figure(turning)} N·m", points=(pivot,), links=(link,), space=space)
