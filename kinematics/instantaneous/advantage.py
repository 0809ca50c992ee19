"""The output against the driver at one pose, from the centres.

The velocity ratio is the output's rate per unit rate of the driver: ω_out/ω_in (rad/rad) for
an output link, v_out/ω_in (m/rad) for an output point. Frictionless, the power in is the power
out, so the mechanical advantage (output torque or force per unit driver torque) is its
reciprocal: N·m/N·m, or N/(N·m) = 1/m. Where the output stops while the driver turns (a toggle)
the ratio is zero and the advantage infinite: the output locks against a load there.

A point running on a fixed slide moves along the slide (its rate signed, positive from the
line's first point towards its second); any other output point moves along its path, and its
rate is its speed.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..errors import KinematicsError
from ..model.mechanism import GROUND

# A velocity ratio below this share of its scale (1 rad/rad, or the mechanism's size per radian)
# is the rounding of a toggle pose: the output is locked there.
LOCKED = 1e-12


@dataclass(frozen=True)
class Advantage:
    """The output of one pose against the driver (see the module docstring for units and signs)."""

    output: str
    velocity_ratio: float
    unit: str
    mechanical_advantage: float
    advantage_unit: str
    locked: bool

    def sentence(self) -> str:
        """The velocity ratio and mechanical advantage in words, or that the output locks here."""
        if self.locked:
            return (f"{self.output}: velocity ratio 0 {self.unit}: the output locks here (toggle), the mechanical "
                    "advantage is infinite")
        return (f"{self.output}: velocity ratio {self.velocity_ratio:.6g} {self.unit}, mechanical advantage "
                f"{self.mechanical_advantage:.6g} {self.advantage_unit}")


def output_rate(mech, velocity_xy, point: str, positions) -> float:
    """The rate of an output point: along its fixed slide, or its speed along its path."""
    slide = next((s for s in mech.slides.values() if s.point == point and s.guide == GROUND), None)
    vx, vy = velocity_xy
    if slide is None:
        return math.hypot(vx, vy)
    (ex, ey), (fx, fy) = (positions(p) for p in slide.line)
    length = math.hypot(fx - ex, fy - ey)
    return (vx * (fx - ex) + vy * (fy - ey)) / length


def _output(mech):
    if mech.output is None:
        raise KinematicsError("the file names no output: no velocity ratio or mechanical advantage", "output")
    return mech.output


def _advantage(mech, ratio: float, is_link: bool, name: str) -> Advantage:
    """The Advantage of one output's velocity ratio, with the toggle read off within rounding."""
    scale = 1.0 if is_link else mech.size * mech.metres_per_unit
    locked = abs(ratio) <= LOCKED * scale
    return Advantage(output=name, velocity_ratio=0.0 if locked else float(ratio),
                     unit="rad/rad" if is_link else "m/rad",
                     mechanical_advantage=math.inf if locked else 1.0 / float(ratio),
                     advantage_unit="N·m/N·m" if is_link else "N/(N·m)", locked=locked)


def advantage(centres) -> Advantage:
    """Velocity ratio and mechanical advantage of the file's output at the centres' pose."""
    solution = centres.solution
    mech = solution.mechanism
    out = _output(mech)
    if "link" in out:
        link = out["link"]
        if link not in centres.angular_velocity_ratio:
            raise KinematicsError(f"the centres do not reach the output link {link}", "output.link")
        return _advantage(mech, centres.angular_velocity_ratio[link], True, f"link {link}")
    point = out["point"]
    if point not in centres.velocity_ratio:
        raise KinematicsError(f"the centres do not reach the output point {point}", "output.point")
    ratio = output_rate(mech, centres.velocity_ratio[point], point, lambda p: tuple(solution.position(p)))
    return _advantage(mech, ratio, False, f"point {point}")


def solver_advantage(solution) -> Advantage:
    """The same from the solver's rates (what the window's results table shows beside them, at no
    cost per frame); the centres' figure agrees within their velocity cross-check. Needs a
    turning driver: the solver's rates at standstill are all zero."""
    mech = solution.mechanism
    out = _output(mech)
    omega = mech.driver.speed_rad_s
    if omega == 0.0:
        raise KinematicsError("the driver's speed is zero: the solver's rates give no velocity ratio",
                              "driver.speed")
    if "link" in out:
        return _advantage(mech, solution.angular_velocity[out["link"]] / omega, True, f"link {out['link']}")
    point = out["point"]
    rate = output_rate(mech, tuple(solution.velocity(point)), point, lambda p: tuple(solution.position(p)))
    return _advantage(mech, rate / omega, False, f"point {point}")
