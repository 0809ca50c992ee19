"""The force results: immutable values, SI, read-only containers.

The same classes serve one pose (:class:`Forces`: floats and (2,) vectors) and a cycle
(:class:`ForceSweep`: every value with a leading axis over the poses). All forces are those
of frictionless rigid joints: no friction is modelled.

Signs: ``joints_n[P][link]`` is the force on ``link`` at point P from what it is pinned to
there (the frame at a fixed pivot; the pin or block element at a point that carries a mass, a
pin load, a slide or three or more links; otherwise the other link). A slide's ``normal_n`` acts
on its block along the guide line's left normal (the line's direction turned +90°). The drive
torque is the couple the drive applies to the driver link, counter-clockwise positive. A
cylinder drives by its axial force instead (``drive_force_n``): on the rod's end along the axis
from the barrel's pivot, push positive, and its opposite on the barrel; its drive torque is 0.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass

import numpy as np

from ..model.mechanism import Mechanism

FRICTIONLESS = "forces of frictionless rigid joints (no friction is modelled)"


@dataclass(frozen=True)
class LinkInertia:
    """A link's D'Alembert inertia: ``force_n`` = −m·a_G at ``centre_m``, ``couple_n_m`` = −I·α;
    as one equivalent force, the same ``force_n`` along the line through ``offset_point_m``,
    ``offset_m`` = I·|α|/(m·|a_G|) from the centre. A pure couple (a_G = 0, α ≠ 0) has
    ``offset_m`` = inf and its ``offset_point_m`` is the centre."""

    centre_m: np.ndarray
    force_n: np.ndarray
    couple_n_m: float
    offset_m: float
    offset_point_m: np.ndarray


@dataclass(frozen=True)
class SlideForce:
    """The normal force of a slide's guide on its block: signed along the guide line's left
    normal (``normal_n``), and as a vector (``force_n``)."""

    normal_n: float
    force_n: np.ndarray


@dataclass(frozen=True)
class FrameLoads:
    """What the frame receives: at each fixed pivot (``pivots_n``), through each slide whose
    guide or block is fixed (``guides_n``), the drive's reaction −T, and their sum (``force_n``)
    and moment about the driver pivot (``moment_n_m``)."""

    pivots_n: Mapping
    guides_n: Mapping
    drive_reaction_n_m: float
    force_n: np.ndarray
    moment_n_m: float


@dataclass(frozen=True)
class PowerBalance:
    """The drive torque by the power balance, computed on its own (``drive_torque_n_m``), the
    drive power T·ω of the Newton-Euler torque (``drive_power_w``), and the two torques'
    ``relative_difference`` (to the larger of the two and the sum of the balance's terms). For a
    cylinder: its axial force by the power balance (``drive_force_n``; the torque is 0), the
    power F·L̇ of the Newton-Euler force, and the two forces' relative difference."""

    drive_torque_n_m: float
    drive_power_w: float
    relative_difference: float
    drive_force_n: float | None = None


@dataclass(frozen=True)
class Forces:
    """The forces of one solved pose, SI, by Newton-Euler, checked by the power balance.

    Attributes
    ----------
    drive_torque_n_m : couple of the drive on the driver link, N·m, CCW positive.
    joints_n : point -> link -> (2,) force on the link at the point from what it is pinned to.
    slides : slide -> :class:`SlideForce`.
    inertia : link (those with a mass entry) -> :class:`LinkInertia`.
    particle_inertia_n : point (those with a point mass) -> (2,) −m·a_P.
    shaking_force_n, shaking_moment_n_m : Σ(−m·a) of every moving mass, and its moment about
        the driver pivot less Σ I·α.
    frame : :class:`FrameLoads`; equals the shaking force and moment with no gravity and no loads.
    power_balance : :class:`PowerBalance`.
    warnings : the pose's own warnings.
    drive_force_n : a cylinder's axial force, N, push positive (None for a rotary driver).
    driver_length_m : a cylinder's length at the pose, m (None for a rotary driver).
    """

    mechanism: Mechanism
    driver_angle_deg: float
    drive_torque_n_m: float
    joints_n: Mapping
    slides: Mapping
    inertia: Mapping
    particle_inertia_n: Mapping
    shaking_force_n: np.ndarray
    shaking_moment_n_m: float
    frame: FrameLoads
    power_balance: PowerBalance
    warnings: tuple = ()
    drive_force_n: float | None = None
    driver_length_m: float | None = None


@dataclass(frozen=True)
class ForceSweep(Forces):
    """The fields of :class:`Forces` over a cycle: every value has a leading axis over the N
    poses of the sweep, ``driver_angle_deg`` (N,) among them. ``full_turn`` and
    ``speed_rad_s`` come from the sweep, for the drive summary."""

    full_turn: bool = True
    speed_rad_s: float = 0.0

    @property
    def max_relative_difference(self) -> float:
        """The power-balance check over the whole cycle: its largest relative difference."""
        return float(np.max(self.power_balance.relative_difference))
