"""The known loads of the force polygon, read off the kinematic construction: each centre of
mass's acceleration image g′ by similarity, α of each link from the polygon's tangential
components, and from them the inertia forces (the single equivalent force, moved off G),
gravity, the point masses and the active loads.

Nothing here reads the numeric solver's accelerations or the numeric forces.
"""

from __future__ import annotations

from ..construction.components import acceleration_components
from ..groups.base import cross
from ..groups.force_steps import Applied, ForceState
from ..groups.steps import Component, Construction, Role, Step, as_xy, figure


def angular_accelerations(construction: Construction, pos: dict, acc: dict) -> dict:
    """Link -> (α rad/s², how it was read): from the first tangential component the polygon draws
    for the link, α = cross(r, a^t)/|r|²; a rotary driver with none has α = 0; a link with none
    drawn (of a group that is no dyad, or a cylinder's barrel) from two of its images,
    α = cross(r, a_Q − a_P)/|r|² (the radial part has no cross)."""
    found = {}
    for c in acceleration_components(construction):
        if c.component is Component.TANGENTIAL and c.link not in found:
            r = pos[c.point] - pos[c.about]
            found[c.link] = (cross(r, complex(*c.vector)) / abs(r) ** 2,
                             f"from the tangential component, step {c.step}")
    decomposition = construction.decomposition
    mech = construction.solution.mechanism
    if mech.driver.kind != "actuator":  # a cylinder's barrel turns: its α is read from its images
        found.setdefault(decomposition.driver_link, (0.0, "is 0: the polygon lays no tangential component"))
    for group in decomposition.chain:
        for link in group.links:
            if link not in found:
                p, q = _two(mech, mech.links[link])
                r = pos[q] - pos[p]
                found[link] = (cross(r, acc[q] - acc[p]) / abs(r) ** 2,
                               f"from the images {p.lower()}′ and {q.lower()}′"
                               + ("" if group.is_dyad else " (numeric)"))
    return {link: (float(alpha), how) for link, (alpha, how) in found.items()}


def _two(mech, points) -> tuple:
    """Two points of a link at distinct places (its first, and the first away from it)."""
    first = points[0]
    return first, next(p for p in points if mech.points[p] != mech.points[first])


# A force below this (N) is none: the inertia is then a pure couple.
NO_FORCE_N = 1e-100


def inertia_offset(force: complex, couple: float) -> complex:
    """The offset r of the inertia force's line from G: cross(r, F) = C with r perpendicular to F,
    r = −i·C·F/|F|² (|r| = |C|/|F| = I·|α|/(m·|a_G|))."""
    size = abs(force)
    return -1j * couple * (force / size) / size


def centre_images(construction: Construction, pos: dict, acc: dict) -> tuple:
    """Link -> (G, a_G) complex for every link with a mass entry, and the image steps g′ (on the
    acceleration polygon, numbered after its own steps)."""
    mech = construction.solution.mechanism
    k = mech.metres_per_unit
    centres, steps = {}, []
    for link, entry in mech.mass_data.masses.items():
        p, q = _two(mech, mech.links[link])
        ref_p, ref_q = complex(*mech.points[p]) * k, complex(*mech.points[q]) * k
        # The triangle P Q G and its image p′ q′ g′ are directly similar.
        share = (complex(*entry.centre) * k - ref_p) / (ref_q - ref_p)
        centre = pos[p] + share * (pos[q] - pos[p])
        image = acc[p] + share * (acc[q] - acc[p])
        centres[link] = (centre, image)
        label = f"g′({link})"
        steps.append(Step(id=f"a{len(construction.acceleration.steps) + len(steps) + 1}", polygon="acceleration",
                          role=Role.IMAGE, component=None, label=label, coords=(as_xy(image),),
                          equation=f"{label} by image of {link}: p′q′g′ ~ PQG",
                          text=f"{label}: image of the centre of mass of {link}, the triangle {p.lower()}′"
                               f"{q.lower()}′g′ directly similar to {p}{q}G; |a_G| = {figure(abs(image))} m/s²",
                          links=(link,), points=(p, q)))
    return centres, tuple(steps)


def known_loads(construction: Construction, state: ForceState, acc: dict) -> tuple:
    """Put every inertia force, weight, point mass and active load on its body in ``state``.
    Returns the centre image steps and link -> α as read."""
    mech = construction.solution.mechanism
    data = mech.mass_data
    pos = state.pos
    gravity = complex(*data.gravity_m_s2)
    alphas = angular_accelerations(construction, pos, acc)
    centres, steps = centre_images(construction, pos, acc)
    for link, entry in data.masses.items():
        centre, image = centres[link]
        m, inertia = entry.mass_kg, entry.inertia_kg_m2
        force, couple = -m * image, -inertia * alphas[link][0] + 0.0  # + 0.0: no "−0" in the words
        body = ("link", link)
        if abs(force) > NO_FORCE_N:
            offset = inertia_offset(force, couple)
            state.add(body, Applied(force, centre + offset, f"Fᵢ({link})", Component.INERTIA,
                                    f"inertia of {link}, −m·a_G with m = {figure(m)} kg, moved off G by h = "
                                    f"I·|α|/(m·|a_G|) = {figure(abs(offset))} m to the side that gives the couple "
                                    f"−I·α = {figure(couple)} N·m (α {alphas[link][1]})", links=(link,)))
        elif couple:
            state.add(body, Applied(0j, centre, f"Cᵢ({link})", Component.INERTIA,
                                    f"inertia couple of {link}, −I·α", couple=couple, links=(link,)))
        if m and gravity:
            state.add(body, Applied(m * gravity, centre, f"W({link})", Component.GRAVITY, f"weight of {link}, m·g",
                                    links=(link,)))
    for point, entry in data.point_masses.items():
        m = entry.mass_kg
        if not m:
            continue
        body = _body_at(state, point)
        state.add(body, Applied(-m * acc[point], pos[point], f"Fᵢ({point})", Component.INERTIA,
                                f"inertia of the point mass {figure(m)} kg at {point}, −m·a", points=(point,)))
        if gravity:
            state.add(body, Applied(m * gravity, pos[point], f"W({point})", Component.GRAVITY,
                                    f"weight of the point mass at {point}", points=(point,)))
    sense = 1.0 if mech.driver.speed_rad_s >= 0 else -1.0
    angle = construction.solution.driver_angle_deg
    for load in data.loads.values():
        if not bool(load.active(angle, sense)):
            continue
        if load.force_value is not None:
            body = ("link", load.link) if load.link else _body_at(state, load.point)
            state.add(body, Applied(complex(*load.force_n), pos[load.point], load.name, Component.LOAD,
                                    f"the load {load.name} at {load.point}", points=(load.point,)))
        else:
            state.add(("link", load.link), Applied(0j, pos[mech.links[load.link][0]], load.name, Component.LOAD,
                                                   f"the torque {load.name} on {load.link}", couple=load.torque_n_m,
                                                   links=(load.link,)))
    return steps, alphas


def _body_at(state: ForceState, point: str) -> tuple:
    """Where a load at ``point`` with no link named acts: the element there, or the point's first link."""
    return ("pin", point) if point in state.elements else ("link", state.holders(point)[0])
