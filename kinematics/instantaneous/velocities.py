"""Velocities from the centres alone: the third velocity result, beside the polygon and the solver.

Everything is per unit angular velocity of the driver (so a driver at rest still has its
ratios). The driver turns about its centre on the frame, the pivot. A body k whose motion
is unknown follows from a body j already known through their common centre I_jk, the one
point with the same velocity in both:

- I_1k finite and I_jk finite: v = ω_j × (I_jk − I_1j) there, and ω_k × (I_jk − I_1k) is the same
  vector, so ω_k = ω_j (I_jk − I_1j)/(I_jk − I_1k), the signed ratio of distances along the line
  of the three centres (positive when I_jk lies outside the segment I_1j I_1k);
- I_jk at infinity: j and k translate relative to each other, ω_k = ω_j;
- I_1k at infinity: k translates (ω_k = 0) with the velocity of I_jk as a point of j.

A point's velocity is then ω_k × (P − I_1k), or the translation of its body. Nothing here reads
the solver's or the polygon's velocities; :func:`crosscheck` compares with them afterwards.
"""

from __future__ import annotations

from dataclasses import dataclass

from ..errors import KinematicsError
from ..model.mechanism import GROUND
from .lines import COINCIDENT


@dataclass(frozen=True)
class Motion:
    """A body's velocity field per unit driver speed: turning at ``omega`` about ``pole``
    (complex, m), or, with ``pole`` None, translating at ``translation`` (complex, m/rad)."""

    omega: float
    pole: complex | None
    translation: complex = 0j

    def velocity(self, z: complex) -> complex:
        """The velocity per unit driver speed (complex, m/rad) of the body's point at ``z``."""
        if self.pole is None:
            return self.translation
        return 1j * self.omega * (z - self.pole)


def motions(finder) -> dict:
    """Body -> :class:`Motion` for every body the centres reach from the driver (the rest are left out)."""
    mech = finder.mech
    driver = mech.driver
    pivot = finder.known(GROUND, driver.link)
    if pivot is None or pivot.kind != "point":
        raise KinematicsError(f"the driver {driver.link} has no centre on the frame", f"driver {driver.link}")
    known = {GROUND: Motion(0.0, None), driver.link: Motion(1.0, pivot.place.point)}
    waiting = [b for b in finder.bodies if b not in known]
    while waiting:
        for body in waiting:
            motion = _from_known(finder, body, known)
            if motion is not None:
                known[body] = motion
                waiting.remove(body)
                break
        else:
            break
    return known


def _from_known(finder, body: str, known: dict) -> Motion | None:
    on_frame = finder.known(GROUND, body)
    if on_frame is None:
        return None
    shared = [(j, finder.known(j, body)) for j in known if j != GROUND and finder.known(j, body)]
    if on_frame.place.infinite:
        for j, centre in shared:
            if not centre.place.infinite:
                return Motion(0.0, None, known[j].velocity(centre.place.point))
        return None
    pole = on_frame.place.point
    for j, centre in shared:
        if centre.place.infinite:
            return Motion(known[j].omega, pole)
    # The longest lever from the body's centre on the frame gives the ratio least touched by rounding.
    levers = [(abs(c.place.point - pole), j, c) for j, c in shared if abs(c.place.point - pole) > COINCIDENT *
              finder.size_m]
    if not levers:
        return None
    _, j, centre = max(levers, key=lambda item: item[0])
    lever = centre.place.point - pole
    v = known[j].velocity(centre.place.point)
    return Motion((lever.conjugate() * v).imag / abs(lever) ** 2, pole)


def point_ratios(finder, known: dict) -> dict:
    """Point -> velocity per unit driver speed (complex, m/rad), for every point a known body carries."""
    mech = finder.mech
    ratios = {}
    for point in mech.points:
        holders = [b for b in mech.bodies_of(point) if b in known]
        if holders:
            ratios[point] = known[holders[0]].velocity(finder.pos(point))
    return ratios


def driver_speed(mech, ratios: dict, position) -> float:
    """The driver link's ω (rad/s) that the centres' ratios are per unit of: the given speed of a
    turning driver; for a cylinder, the barrel's ω found from the centres alone, from the rod's
    known speed in its barrel: L̇ = u·(v̂_B − v̂_Bg)·ω_barrel, v̂ per unit ω of the barrel (the
    barrel's point under B turns about its pivot C: v̂_Bg = i·(B − C)).

    ``ratios`` maps points to complex velocities per unit driver speed, ``position(name)`` gives
    (x, y) m. A cylinder in line with the link it drives (no sliding per unit turn) gives 0."""
    driver = mech.driver
    if not driver.is_actuator:
        return driver.speed_rad_s
    slide = mech.slides[driver.slide]
    b, c = (complex(*position(n)) for n in (slide.point, slide.line[0]))
    u = (b - c) / abs(b - c)
    sliding = ((ratios[slide.point] - 1j * (b - c)) * u.conjugate()).real
    return driver.linear_speed_m_s / sliding if sliding != 0.0 else 0.0


def crosscheck(solution, ratios: dict, omega_ratios: dict, polygon_images: dict | None):
    """(largest relative difference, where): the centres' velocities against the solver's and the
    polygon's (each relative to the largest speed of that source), and the links' ω against the
    solver's (relative to the largest |ω|)."""
    speed = driver_speed(solution.mechanism, ratios, solution.position)
    worst, where = 0.0, ""
    row = {name: i for i, name in enumerate(solution.point_names)}
    solver = {name: complex(*solution.velocities[row[name]]) for name in ratios}
    sources = [("solver", solver)] + ([("polygon", polygon_images)] if polygon_images is not None else [])
    for source, values in sources:
        reference = max((abs(values[n]) for n in ratios if n in values), default=0.0)
        if reference == 0.0:
            continue
        for name, ratio in ratios.items():
            if name in values:
                difference = abs(ratio * speed - values[name]) / reference
                if difference > worst or not where:
                    worst, where = difference, f"{name} (velocity against the {source})"
    reference = max((abs(solution.angular_velocity[k]) for k in omega_ratios), default=0.0)
    if reference:
        for link, ratio in omega_ratios.items():
            difference = abs(ratio * speed - solution.angular_velocity[link]) / reference
            if difference > worst:
                worst, where = difference, f"{link} (angular velocity against the solver)"
    return worst, where
