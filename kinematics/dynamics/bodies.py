"""The moving masses and the loads of a design as arrays, and the motion of the centres of mass.

Shared input of both formulations (Newton-Euler and the power balance): what moves and how,
never a force result. Everything SI, with a leading batch axis over poses.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..errors import NoMassData
from ..model.mechanism import Mechanism
from ..model.memo import remembered
from .layout import Layout, layout


@dataclass(frozen=True)
class Motion:
    """The kinematics of N poses in the mechanism's point and link order (SI), points as complex
    numbers x + iy.

    ``positions``, ``accelerations``: (N, n) complex; ``omega``, ``alpha``: (N, links);
    ``angle_deg``: (N,) driver angles (a cylinder's: the direction of its axis); ``length_m``:
    (N,) a cylinder's lengths, None for a rotary driver; ``unit_velocities`` (N, n) complex and
    ``unit_omega`` (N, links): the velocities per unit driver speed (1 rad/s, or a cylinder's
    1 m/s), for the power balance."""

    angle_deg: np.ndarray
    positions: np.ndarray
    accelerations: np.ndarray
    omega: np.ndarray
    alpha: np.ndarray
    unit_velocities: np.ndarray
    unit_omega: np.ndarray
    length_m: np.ndarray | None = None

    def where(self, k: int) -> str:
        """Pose ``k`` in words, for a refusal's location: the driver angle or the cylinder's length."""
        if self.length_m is not None:
            return f"cylinder length {self.length_m[k] * 1000:.3f} mm"
        return f"driver angle {self.angle_deg[k]:.3f}°"


@dataclass(frozen=True, eq=False)
class MassModel:
    """A design's masses and loads, index arrays into the point and link order.

    Links: first and second point, the centre in the link's own axes as a complex number (along
    its first side, and turned +90°) and at the reference pose (``centre_m``), mass, inertia.
    Particles (point masses) and point loads sit on a body: ``*_link`` ≥ 0 a link index, else
    ``*_element`` an element index. Point-load and
    torque-load values are SI (forces and gravity complex); ``force_load`` and ``torque_load`` keep
    the Load objects for their intervals."""

    layout: Layout
    first: np.ndarray
    second: np.ndarray
    local_centre: np.ndarray
    centre_m: np.ndarray
    mass: np.ndarray
    inertia: np.ndarray
    particle_point: np.ndarray
    particle_mass: np.ndarray
    particle_link: np.ndarray
    particle_element: np.ndarray
    force_point: np.ndarray
    force_value: np.ndarray  # complex
    force_link: np.ndarray
    force_element: np.ndarray
    force_load: tuple
    torque_link: np.ndarray
    torque_value: np.ndarray
    torque_load: tuple
    gravity: complex
    pivot: int
    sense: float
    length_m: float
    cylinder: str | None = None


def mass_model(mechanism: Mechanism) -> MassModel:
    """The arrays of ``mechanism``'s mass data, worked out once per mechanism.

    Raises NoMassData when the design has no mass and no load."""
    data = mechanism.mass_data
    if data is None or data.is_empty:
        raise NoMassData("the design has no mass data: give link masses, point masses or loads to compute "
                         "forces from", "masses")
    return remembered(mechanism, "mass model", lambda: _build(mechanism))


def _build(mech: Mechanism) -> MassModel:
    """The model of ``mech``: what depends on names and mass data alone comes from a store kept with
    the (immutable, shared) MassData, so a drag, which changes only the points, redoes only the
    centres in their links' axes."""
    data, lay, k_m = mech.mass_data, layout(mech), mech.metres_per_unit
    sense = 1.0 if mech.driver.speed_rad_s >= 0 else -1.0
    fixed = remembered(data, ("model", lay, k_m, mech.driver.pivot, sense), lambda: _by_names(mech, lay))
    reference = np.array([mech.points[p] for p in lay.points], float).reshape(-1, 2) * k_m
    start = reference[fixed["first"]]
    side = reference[fixed["second"]] - start
    along = (side[:, 0] + 1j * side[:, 1]) / np.hypot(side[:, 0], side[:, 1])
    offset = fixed["centre_m"] - (start[:, 0] + 1j * start[:, 1])
    # The centre in the link's own axes: the offset turned back by the link's direction.
    return MassModel(local_centre=offset * np.conj(along), length_m=max(mech.size * k_m, 1e-9),
                     cylinder=mech.driver.slide if mech.driver.is_actuator else None, **fixed)


def _by_names(mech: Mechanism, lay) -> dict:
    data = mech.mass_data
    k_m = mech.metres_per_unit
    points = {p: i for i, p in enumerate(lay.points)}
    links = {k: i for i, k in enumerate(lay.links)}
    elements = {p: e for e, p in enumerate(lay.elements)}
    centre = np.zeros(len(lay.links), complex)
    mass, inertia = np.zeros(len(lay.links)), np.zeros(len(lay.links))
    for name, entry in data.masses.items():
        k = links[name]
        centre[k] = complex(*entry.centre) * k_m
        mass[k], inertia[k] = entry.mass_kg, entry.inertia_kg_m2

    def body(point, link=None):
        # A load on a named link goes there; otherwise the element at the point, or the point's one link.
        if link is not None:
            return links[link], -1
        if point in elements:
            return -1, elements[point]
        return links[mech.bodies_of(point)[0]], -1

    particles = [(points[p], m.mass_kg, *body(p)) for p, m in data.point_masses.items() if m.mass_kg > 0]
    forces = [(points[ld.point], complex(*ld.force_n), *body(ld.point, ld.link), ld) for ld in data.loads.values()
              if ld.force_value is not None]
    torques = [(links[ld.link], ld.torque_n_m, ld) for ld in data.loads.values() if ld.torque_value is not None]

    def column(rows, i, dtype):
        return np.array([r[i] for r in rows], dtype).reshape(len(rows))

    return dict(
        layout=lay, first=np.array([points[mech.links[k][0]] for k in lay.links], int),
        second=np.array([points[mech.links[k][1]] for k in lay.links], int), centre_m=centre, mass=mass,
        inertia=inertia, particle_point=column(particles, 0, int), particle_mass=column(particles, 1, float),
        particle_link=column(particles, 2, int), particle_element=column(particles, 3, int),
        force_point=column(forces, 0, int), force_value=column(forces, 1, complex),
        force_link=column(forces, 2, int), force_element=column(forces, 3, int),
        force_load=tuple(r[4] for r in forces),
        torque_link=column(torques, 0, int), torque_value=column(torques, 1, float),
        torque_load=tuple(r[2] for r in torques),
        gravity=complex(*data.gravity_m_s2), pivot=points[mech.driver.pivot],
        sense=1.0 if mech.driver.speed_rad_s >= 0 else -1.0)


def active(loads: tuple, angle_deg: np.ndarray, sense: float) -> np.ndarray:
    """(N, loads) 1.0 where each load acts at each driver angle, else 0.0."""
    if not loads:
        return np.zeros((len(angle_deg), 0))
    return np.stack([ld.active(angle_deg, sense) for ld in loads], axis=1).astype(float)


def cross(a: np.ndarray, b: np.ndarray) -> np.ndarray:
    """cross(a, b) = a_x·b_y − a_y·b_x of complex a, b."""
    return a.real * b.imag - a.imag * b.real


@dataclass(frozen=True)
class Centres:
    """Where the centres of mass are and how they move: (N, links) complex each;
    ``unit_velocity`` is the velocity per unit driver speed; ``arm`` the centre less the link's
    first point."""

    position: np.ndarray
    acceleration: np.ndarray
    unit_velocity: np.ndarray
    arm: np.ndarray


def centres(model: MassModel, motion: Motion) -> Centres:
    """Centres of mass carried by their links from the reference pose: G = P1 + c·u (complex), u
    the unit vector along the link's first side; then a_G = a_P1 + (iα − ω²)·r and
    v̂_G = v̂_P1 + iω̂·r per unit driver speed (r = G − P1)."""
    z = motion.positions
    start = np.take(z, model.first, axis=1)
    side = np.take(z, model.second, axis=1) - start
    arm = side * (model.local_centre / np.abs(side))
    acceleration = np.take(motion.accelerations, model.first, axis=1) + (1j * motion.alpha - motion.omega ** 2) * arm
    unit_velocity = np.take(motion.unit_velocities, model.first, axis=1) + 1j * motion.unit_omega * arm
    return Centres(position=start + arm, acceleration=acceleration, unit_velocity=unit_velocity, arm=arm)
