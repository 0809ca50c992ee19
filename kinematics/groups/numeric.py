"""The fallback: what is left when no dyad fits (a three-link group, for one).
It has no closed form; its motion is the numeric solver's, and its polygon
points are drawn as taken from the solver, and say so."""

from __future__ import annotations

from dataclasses import dataclass

from typing_extensions import override

from ..errors import KinematicsError
from .base import Frame, Group
from .force_steps import ForceState, by_name, force_label, result
from .steps import PolygonBuilder, Role


@dataclass(frozen=True)
class NumericGroup(Group):
    """The remaining ``links``, solved together by the numeric solver (``frame.solution``)."""

    notation = "numeric"
    is_dyad = False

    @property
    @override
    def construction_warning(self) -> str:
        return f"{self.name} is not a dyad: its polygon points come from the numeric solver"

    @override
    def position(self, frame: Frame, where: str = ""):
        raise KinematicsError(f"the {self.name} is not a dyad: it has no closed form; solve it pose by pose",
                              where or self.name)

    def _take(self, frame: Frame, values: dict, rates: dict, quantity: str, rate_name: str):
        """The solver's motion of the group's points not yet known, and of its links."""
        solution = frame.solution
        if solution is None:
            raise KinematicsError(f"the {self.name} is not a dyad: its motion needs the numeric solver", self.name)
        table = getattr(solution, quantity)
        for link in self.links:
            rates[link] = getattr(solution, rate_name)[link]
            for name in frame.mech.links[link]:
                if name not in values:
                    values[name] = complex(*table[solution.point_names.index(name)])

    @override
    def velocity(self, frame: Frame):
        self._take(frame, frame.vel, frame.omega, "velocities", "angular_velocity")

    @override
    def acceleration(self, frame: Frame):
        self._take(frame, frame.acc, frame.alpha, "accelerations", "angular_acceleration")

    @override
    def jerk(self, frame: Frame):
        self._take(frame, frame.jerk, frame.angular_jerk, "jerks", "angular_jerk")

    @override
    def velocity_steps(self, builder: PolygonBuilder, frame: Frame, placed: set):
        self._steps(builder, frame, placed, self.velocity, frame.vel)

    @override
    def acceleration_steps(self, builder: PolygonBuilder, frame: Frame, placed: set):
        self._steps(builder, frame, placed, self.acceleration, frame.acc)

    def _steps(self, builder: PolygonBuilder, frame: Frame, placed: set, work_out, values: dict):
        fresh = []
        for link in self.links:
            for name in frame.mech.links[link]:
                if name not in placed:
                    placed.add(name)
                    fresh.append((link, name))
        work_out(frame)
        for link, name in fresh:
            builder.add(Role.IMAGE, None, builder.label(name), (values[name],), "from the numeric solver",
                        f"{builder.label(name)}: taken from the numeric solver ({self.name} is not a dyad; "
                        "no intersection construction)", points=(name,), links=(link,), numeric=True)

    @override
    def force_steps(self, builder: PolygonBuilder, state: ForceState):
        """No intersection construction: the group's joint and guide forces are the numeric forces'
        (``state.numeric``), drawn from the pole and marked numeric; their reactions are passed on."""
        numeric = state.numeric
        if numeric is None:
            raise KinematicsError(f"the {self.name} is not a dyad: its forces need the numeric forces", self.name)
        owned = state.owned_by(self)
        for link in self.links:
            for point in dict.fromkeys(state.mech.links[link]):
                force = complex(*numeric.joints_n[point][link])
                result(builder, 0j, force, force_label(by_name(state, point, link), link),
                       f"the force at {point}, taken from the numeric forces ({self.name} is not a dyad)",
                       points=(point,), links=(link,), numeric=True)
                if point in owned:
                    state.joints.setdefault(point, {})[link] = force
                else:
                    state.react(point, link, force, numeric=True)
        for slide in state.mech.slides.values():
            if slide.guide in self.links or slide.point in owned:
                state.guide_reaction(slide, float(numeric.slides[slide.name].normal_n),
                                     block_known=slide.point not in owned, guide_known=slide.guide not in self.links)
