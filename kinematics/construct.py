"""The graphical construction of the velocity and acceleration polygons.

From a solved pose (the space diagram), each polygon is built the way a
draftsman builds it: lay the known vectors, draw the lines whose direction is
known, intersect; images of further points by similarity. The arithmetic is
that of :mod:`kinematics.groups`; here it becomes ordered, labelled
:class:`Step` records with shapely geometry in polygon units (m/s or m/s²,
pole at the origin), which the window, the printer and the DXF writer draw.
The numeric solver's values are used only for the cross-check.
"""

from __future__ import annotations

import math

import numpy as np

from .decompose import Group, decompose
from .errors import KinematicsError
from .groups import Frame, Laid, acceleration, drive, velocity
from .model import GROUND
from .solve import Solution
from .steps import Component, Construction, PolygonBuilder, Role, direction_words, figure


def _driver_steps(frame: Frame, mech, vb: PolygonBuilder, ab: PolygonBuilder):
    d = mech.driver
    link, pivot = d.link, d.pivot
    omega, alpha = frame.omega[link], frame.alpha[link]
    for q in mech.links[link]:
        if q == pivot:
            continue
        r = frame.pos[q] - frame.pos[pivot]
        v = frame.vel[q]
        vb.vector(Component.DRIVER, 0.0, v, vb.label(q), f"v_{q} = ω_{link} × r_{pivot}{q}",
                  f"velocity of {q}: ω·r = {figure(abs(omega))} rad/s × {figure(abs(r))} m = {figure(abs(v))} m/s, "
                  f"perpendicular to {pivot}{q}{direction_words(v)}", points=(q,), links=(link,))
        radial_end = -(omega ** 2) * r
        ab.vector(Component.RADIAL, 0.0, radial_end, "" if alpha else ab.label(q),
                  f"a_{q}{pivot}^r = ω²·r_{q}{pivot}",
                  f"radial component of {q} about {pivot}: ω²·r = {figure(abs(radial_end))} m/s², "
                  f"directed from {q} to {pivot}", points=(q,), links=(link,), about=pivot)
        if alpha:
            ab.vector(Component.TANGENTIAL, radial_end, frame.acc[q], ab.label(q), f"a_{q}{pivot}^t = α_{link} × r",
                      f"tangential component of {q} about {pivot}: r·α = {figure(abs(alpha * r))} m/s², "
                      f"perpendicular to {pivot}{q}", points=(q,), links=(link,), about=pivot)


def _laid_step(builder: PolygonBuilder, laid: Laid, frame: Frame, group: Group):
    if laid.component == "radial":
        link = next((k for k in group.links if {laid.point, laid.about} <= set(frame.mech.links[k])), group.links[0])
        magnitude = abs(laid.end - laid.start)
        # In a slotted link the radial component belongs to the link's point under the slider.
        who = f"the point of {link} under {laid.point}" if group.form == "RPR" else laid.point
        equation = (f"a^r = ω_{link}²·{laid.about}{laid.point} (point of {link} under {laid.point})"
                    if group.form == "RPR" else f"a_{laid.point}{laid.about}^r = v_{laid.point}{laid.about}² / "
                    f"{laid.point}{laid.about}")
        return builder.vector(
            Component.RADIAL, laid.start, laid.end, "", equation,
            f"radial component of {who} relative to {laid.about}: v²/r = {figure(magnitude)} m/s², "
            f"directed from {laid.point} to {laid.about}", points=(laid.point,), links=(link,), about=laid.about)
    magnitude = abs(laid.end - laid.start)
    slide = frame.mech.slides[group.slide]
    guide = slide.guide
    if guide == GROUND:
        return None
    return builder.vector(
        Component.CORIOLIS, laid.start, laid.end, "", f"a_c = 2·ω_{guide} × v_{laid.point}/{guide}",
        f"Coriolis component of {laid.point} sliding on {guide}: 2·ω·v = {figure(magnitude)} m/s², "
        f"the sliding velocity turned 90° the way {guide} turns", points=(laid.point,), links=(guide,),
        about=guide)


def _image_steps(builder: PolygonBuilder, frame: Frame, link: str, placed: set, field_name: str):
    values = frame.vel if field_name == "vel" else frame.acc
    how = ("directly similar to the link, turned 90° the way it turns" if field_name == "vel"
           else "directly similar to the link, turned by arg(−ω² + iα)")
    for name in frame.mech.links[link]:
        if name in placed:
            continue
        placed.add(name)
        builder.add(Role.IMAGE, None, builder.label(name), (values[name],),
                    f"{builder.label(name)} by image of {link}", f"{builder.label(name)}: image of {name} on {link}, "
                    f"{how}", points=(name,), links=(link,))


def _velocity_group(vb: PolygonBuilder, frame: Frame, group: Group, placed: set):
    mech, pos = frame.mech, frame.pos
    r = group.roles
    if group.form == "RRR":
        a, b, c = r["A"], r["B"], r["C"]
        l1, l2 = group.links
        vb.direction(None, frame.vel[a], 1j * (pos[b] - pos[a]), f"v_{b}{a} ⊥ {a}{b}",
                     f"line through {vb.label(a)} perpendicular to {a}{b}: velocity of {b} relative to {a}",
                     points=(b,), links=(l1,))
        vb.direction(None, frame.vel[c], 1j * (pos[b] - pos[c]), f"v_{b}{c} ⊥ {c}{b}",
                     f"line through {vb.label(c)} perpendicular to {c}{b}: velocity of {b} relative to {c}",
                     points=(b,), links=(l2,))
        meet = velocity(frame, group)
        vb.intersection(meet, vb.label(b), f"velocity image of {b}", group, points=(b,),
                        equation=f"v_{b} = v_{a} + v_{b}{a} = v_{c} + v_{b}{c}")
        for pin, link in ((a, l1), (c, l2)):
            rel = frame.vel[b] - frame.vel[pin]
            vb.vector(None, frame.vel[pin], frame.vel[b], "", f"v_{b}{pin} = ω_{link} × r_{pin}{b}",
                      f"velocity of {b} relative to {pin}: {figure(abs(rel))} m/s, so ω_{link} = "
                      f"{figure(float(frame.omega[link]))} rad/s", role=Role.RESULT, points=(b,), links=(link,))
        placed.add(b)
        for link in group.links:
            _image_steps(vb, frame, link, placed, "vel")
        return
    slide = mech.slides[group.slide]
    link = group.links[0]
    u = frame.slot(slide)[0]
    if group.form == "RRP":
        a, d = r["A"], r["D"]
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
        meet = velocity(frame, group)
        vb.intersection(meet, vb.label(d), f"velocity image of {d}", group, points=(d,),
                        equation=f"v_{d} = v_{a} + v_{d}{a} = " + (
                            "v_slide" if slide.guide == GROUND else f"v_{d}/{slide.guide} + v_slide"))
        vb.vector(None, frame.vel[a], frame.vel[d], "", f"v_{d}{a} = ω_{link} × r_{a}{d}",
                  f"velocity of {d} relative to {a}: {figure(abs(frame.vel[d] - frame.vel[a]))} m/s, so ω_{link} = "
                  f"{figure(float(frame.omega[link]))} rad/s", role=Role.RESULT, points=(d,), links=(link,))
        vb.vector(Component.SLIDING, coincident, frame.vel[d], "", "v_slide ∥ guide",
                  f"sliding velocity of {d} on {slide.guide}: {figure(float(frame.sliding_velocity[slide.name]))} m/s "
                  f"from {slide.line[0]} towards {slide.line[1]}", role=Role.RESULT, points=(d,))
        placed.add(d)
        _image_steps(vb, frame, link, placed, "vel")
        return
    c, d = r["C"], r["D"]
    vb.direction(None, frame.vel[c], 1j * (pos[d] - pos[c]), f"v_{d}/{link} ⊥ {c}{d}",
                 f"line through {vb.label(c)} perpendicular to {c}{d}: the point of {link} under {d}",
                 points=(d,), links=(link,))
    vb.direction(Component.SLIDING, frame.vel[d], u, f"v_slide ∥ slot of {link}",
                 f"line through {vb.label(d)} parallel to the slot of {link}", points=(d,), links=(link,))
    meet = velocity(frame, group)
    label = vb.mark(meet.point, f"image of the point of {link} under {d}",
                    f"v_{d} = v_{d}/{link} + v_slide", points=(d,), links=(link,))
    vb.intersection(meet, label, f"velocity image of the point of {link} under {d}", group, points=(d,))
    vb.vector(Component.SLIDING, meet.point, frame.vel[d], "", "v_slide ∥ slot",
              f"sliding velocity of {d} in the slot of {link}: {figure(float(frame.sliding_velocity[slide.name]))} m/s "
              f"from {slide.line[0]} towards {slide.line[1]}; ω_{link} = {figure(float(frame.omega[link]))} rad/s",
              role=Role.RESULT, points=(d,), links=(link,))
    _image_steps(vb, frame, link, placed, "vel")


def _acceleration_group(ab: PolygonBuilder, frame: Frame, group: Group, placed: set):
    mech, pos = frame.mech, frame.pos
    r = group.roles
    # The arithmetic runs first; the steps then draw its records in the draftsman's order.
    laid, meet = acceleration(frame, group)
    if group.form == "RRR":
        a, b, c = r["A"], r["B"], r["C"]
        for item, pin, link in zip(laid, (a, c), group.links, strict=True):
            _laid_step(ab, item, frame, group)
            ab.direction(Component.TANGENTIAL, item.end, 1j * (pos[b] - pos[pin]), f"a_{b}{pin}^t ⊥ {pin}{b}",
                         f"line of the tangential component of {b} relative to {pin}, perpendicular to {pin}{b}",
                         points=(b,), links=(link,))
        ab.intersection(meet, ab.label(b), f"acceleration image of {b}", group, points=(b,),
                        equation=f"a_{b} = a_{a} + a^r + a^t = a_{c} + a^r + a^t")
        for item, pin, link in zip(laid, (a, c), group.links, strict=True):
            ab.vector(Component.TANGENTIAL, item.end, frame.acc[b], "", f"a_{b}{pin}^t = α_{link} × r_{pin}{b}",
                      f"tangential component of {b} relative to {pin}: r·α = {figure(abs(frame.acc[b] - item.end))} "
                      f"m/s², so α_{link} = {figure(float(frame.alpha[link]))} rad/s²", role=Role.RESULT,
                      points=(b,), links=(link,), about=pin)
        placed.add(b)
        for link in group.links:
            _image_steps(ab, frame, link, placed, "acc")
        return
    slide = mech.slides[group.slide]
    link = group.links[0]
    u = frame.slot(slide)[0]
    radial_laid, coriolis_laid = laid
    if group.form == "RRP":
        a, d = r["A"], r["D"]
        _laid_step(ab, radial_laid, frame, group)
        ab.direction(Component.TANGENTIAL, radial_laid.end, 1j * (pos[d] - pos[a]), f"a_{d}{a}^t ⊥ {a}{d}",
                     f"line of the tangential component of {d} relative to {a}", points=(d,), links=(link,))
        if slide.guide != GROUND:
            ab.mark(coriolis_laid.start, f"image of the point of {slide.guide} under {d}",
                    f"a_{d}/{slide.guide} by image of {slide.guide}", points=(d,), links=(slide.guide,))
            _laid_step(ab, coriolis_laid, frame, group)
            through = ab.mark(coriolis_laid.end, "end of the Coriolis component", "", points=(d,))
        else:
            through = "o′"
        ab.direction(Component.SLIDING, coriolis_laid.end, u, "a_slide ∥ guide",
                     f"line through {through} parallel to the slide {slide.name}: sliding acceleration of {d}",
                     points=(d,))
        ab.intersection(meet, ab.label(d), f"acceleration image of {d}", group, points=(d,),
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
        _image_steps(ab, frame, link, placed, "acc")
        return
    c, d = r["C"], r["D"]
    _laid_step(ab, radial_laid, frame, group)
    ab.direction(Component.TANGENTIAL, radial_laid.end, 1j * (pos[d] - pos[c]), f"a_{d}/{link}^t ⊥ {c}{d}",
                 f"line of the tangential component of the point of {link} under {d}", points=(d,), links=(link,))
    back = ab.mark(coriolis_laid.end, f"{ab.label(d)} less the Coriolis component", "", points=(d,))
    _laid_step(ab, Laid("coriolis", coriolis_laid.end, coriolis_laid.start, d, link), frame, group)
    ab.direction(Component.SLIDING, coriolis_laid.end, u, "a_slide ∥ slot",
                 f"line through {back} parallel to the slot of {link}", points=(d,), links=(link,))
    label = ab.mark(meet.point, f"image of the point of {link} under {d}", f"a_{d} = a_{d}/{link} + a_slide + a_c",
                    points=(d,), links=(link,))
    ab.intersection(meet, label, f"acceleration image of the point of {link} under {d}", group, points=(d,))
    ab.vector(Component.TANGENTIAL, radial_laid.end, meet.point, "", f"a_{d}/{link}^t = α_{link} × r_{c}{d}",
              f"tangential component: {figure(abs(meet.point - radial_laid.end))} m/s², so α_{link} = "
              f"{figure(float(frame.alpha[link]))} rad/s²", role=Role.RESULT, points=(d,), links=(link,), about=c)
    ab.vector(Component.SLIDING, meet.point, coriolis_laid.end, "", "a_slide ∥ slot",
              f"sliding acceleration of {d} in the slot of {link}: "
              f"{figure(float(frame.sliding_acceleration[slide.name]))} m/s² from {slide.line[0]} towards "
              f"{slide.line[1]}", role=Role.RESULT, points=(d,), links=(link,))
    _image_steps(ab, frame, link, placed, "acc")


def _numeric_group(vb: PolygonBuilder, ab: PolygonBuilder, frame: Frame, group: Group, solution: Solution,
                   placed_v, placed_a):
    """A group that is no dyad: its images are taken from the numeric solver, and say so."""
    for link in group.links:
        frame.omega[link] = solution.angular_velocity[link]
        frame.alpha[link] = solution.angular_acceleration[link]
    for builder, placed, values, field_name in ((vb, placed_v, frame.vel, "velocities"),
                                                (ab, placed_a, frame.acc, "accelerations")):
        for link in group.links:
            for name in frame.mech.links[link]:
                if name in placed:
                    continue
                placed.add(name)
                values[name] = complex(*getattr(solution, field_name)[solution.point_names.index(name)])
                builder.add(Role.IMAGE, None, builder.label(name), (values[name],),
                            "from the numeric solver",
                            f"{builder.label(name)}: taken from the numeric solver ({group.name} is not a dyad; "
                            "no intersection construction)", points=(name,), links=(link,), numeric=True)


def _crosscheck(solution: Solution, velocity_images: dict, acceleration_images: dict):
    worst, where = 0.0, ""
    row = {name: i for i, name in enumerate(solution.point_names)}
    for kind, images, values in (("velocity", velocity_images, solution.velocities),
                                 ("acceleration", acceleration_images, solution.accelerations)):
        reference = max((abs(z) for z in images.values()), default=0.0)
        if reference == 0.0:
            continue
        solver = values.tolist()
        for name, z in images.items():
            difference = abs(complex(z) - complex(*solver[row[name]])) / reference
            if difference > worst or not where:
                worst, where = difference, f"{name} ({kind})"
    return worst, where


def construct(solution: Solution, box_mm: float = 120.0, velocity_scale: float | None = None,
              acceleration_scale: float | None = None) -> Construction:
    """Build both polygons of ``solution`` by graphical construction.

    Parameters
    ----------
    box_mm : size of the square box each polygon should fit when drawn.
    velocity_scale, acceleration_scale : fixed scales (m/s or m/s² per mm), or None to choose.
    """
    for name, value, allow_none in (("box_mm", box_mm, False), ("velocity_scale", velocity_scale, True),
                                    ("acceleration_scale", acceleration_scale, True)):
        if value is None and allow_none:
            continue
        if not (isinstance(value, (int, float)) and math.isfinite(value) and value > 0):
            raise KinematicsError(f"{name} must be a positive number, not {value!r}", name)
    mech = solution.mechanism
    decomposition = decompose(mech)
    frame = Frame.start(mech)
    for i, name in enumerate(solution.point_names):
        frame.pos[name] = np.complex128(complex(*solution.positions[i]))
    driver = mech.driver
    angle = math.radians(solution.driver_angle_deg)
    drive(frame, driver.link, driver.pivot, angle, driver.speed_rad_s, driver.angular_acceleration_rad_s2)
    for i, name in enumerate(solution.point_names):  # keep the solver's space diagram exactly
        frame.pos[name] = np.complex128(complex(*solution.positions[i]))
    ground = frozenset(mech.ground)
    vb, ab = PolygonBuilder("velocity", "m/s", ground), PolygonBuilder("acceleration", "m/s^2", ground)
    placed_v, placed_a = set(mech.ground), set(mech.ground)
    vb.add(Role.IMAGE, None, "o", (0j,), "v = 0 for every fixed point",
           "o: the pole; every fixed point has its velocity image here", points=tuple(mech.ground))
    ab.add(Role.IMAGE, None, "o′", (0j,), "a = 0 for every fixed point",
           "o′: the pole; every fixed point has its acceleration image here", points=tuple(mech.ground))
    _driver_steps(frame, mech, vb, ab)
    placed_v.update(mech.links[driver.link])
    placed_a.update(mech.links[driver.link])
    warnings = list(solution.warnings)
    for group in decomposition.groups:
        if group.form == "numeric":
            warnings.append(f"{group.name} is not a dyad: its polygon points come from the numeric solver")
            _numeric_group(vb, ab, frame, group, solution, placed_v, placed_a)
            continue
        _velocity_group(vb, frame, group, placed_v)
    for group in decomposition.groups:
        if group.form != "numeric":
            _acceleration_group(ab, frame, group, placed_a)
    velocity_images = {n: frame.vel[n] for n in mech.points if n in frame.vel}
    acceleration_images = {n: frame.acc[n] for n in mech.points if n in frame.acc}
    worst, where = _crosscheck(solution, velocity_images, acceleration_images)
    velocity = vb.finish(velocity_images, box_mm, velocity_scale)
    acceleration = ab.finish(acceleration_images, box_mm, acceleration_scale)
    for step in velocity.steps + acceleration.steps:
        if step.flagged:
            warnings.append(f"{step.polygon} polygon, step {step.id} ({step.label}): construction lines meet at "
                            f"{step.angle_between_deg:.3g}°, condition figure {step.condition:.3g}")
    return Construction(solution=solution, decomposition=decomposition, velocity=velocity,
                        acceleration=acceleration, max_relative_difference=worst, where=where,
                        warnings=tuple(warnings))
