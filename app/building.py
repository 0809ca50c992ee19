"""Building a mechanism from nothing: pure edits that return a new Mechanism.

Each function refuses what cannot make sense with a :class:`BuildError`
whose message says why in the user's words; none of them needs Qt.

>>> m, o = add_point(empty(), (0.0, 0.0), fixed=True)
>>> m, a = add_point(m, (30.0, 40.0))
>>> join(m, [o, a])[0].links
mappingproxy({'link1': ('O1', 'A')})
"""

from __future__ import annotations

import itertools
import math
import string
from dataclasses import replace

from kinematics import Driver, Mechanism, Slide, move_point
from kinematics.edits.masses import mass_data_kept
from kinematics.model.limits import MAX_LINKS_AND_SLIDES, MAX_POINTS, limit_sentence
from kinematics.model.mechanism import GROUND, slide_offset

DEFAULT_SPEED_RPM = 60.0


class BuildError(ValueError):
    """An edit that cannot be made; the message is for the status line."""


def empty(length_unit: str = "mm") -> Mechanism:
    return Mechanism(points={}, links={}, length_unit=length_unit, title="new design")


def _fresh(existing, candidates) -> str:
    return next(name for name in candidates if name not in existing)


def _joint_names():
    yield from (c for c in string.ascii_uppercase if c != "O")
    n = 1
    while True:
        yield f"J{n}"
        n += 1


def _numbered(prefix):
    n = 1
    while True:
        yield f"{prefix}{n}"
        n += 1


def _room_for(mech: Mechanism, what: str, bodies: int = 0) -> None:
    """Refuse ``what`` (a joint with ``bodies`` 0, else a link or slide) where it would make a design
    larger than Kinepoly analyses: its own loader would refuse the saved file."""
    if not bodies and len(mech.points) >= MAX_POINTS:
        raise BuildError(f"no room for {what}: {limit_sentence('points')}")
    if bodies and len(mech.links) + len(mech.slides) >= MAX_LINKS_AND_SLIDES:
        raise BuildError(f"no room for {what}: {limit_sentence('links')}")


def add_point(mech: Mechanism, xy, fixed: bool = False) -> tuple[Mechanism, str]:
    """A new joint (or fixed pivot) at ``xy`` in the file's length unit."""
    _room_for(mech, "another pivot" if fixed else "another joint")
    name = _fresh(mech.points, _numbered("O") if fixed else _joint_names())
    points = {**mech.points, name: (float(xy[0]), float(xy[1]))}
    ground = (*mech.ground, name) if fixed else mech.ground
    return replace(mech, points=points, ground=ground, warnings=()), name


def join(mech: Mechanism, names) -> tuple[Mechanism, str]:
    """A new rigid link through the joints ``names`` (two for a bar, more for a plate)."""
    names = list(dict.fromkeys(names))
    if len(names) < 2:
        raise BuildError("a link needs at least two joints")
    if all(n in mech.ground for n in names):
        raise BuildError("a link between fixed points only would never move: the frame already joins them")
    first, second = (mech.points[n] for n in names[:2])
    if math.dist(first, second) == 0.0:
        raise BuildError(f"{names[0]} and {names[1]} are at the same place: the link would have no length")
    for existing, points in mech.links.items():
        if set(points) == set(names):
            raise BuildError(f"link {existing} already joins {', '.join(names)}")
    _room_for(mech, "another link", bodies=1)
    name = _fresh(mech.links, _numbered("link"))
    return replace(mech, links={**mech.links, name: tuple(names)}, warnings=()), name


def guide_of(mech: Mechanism, e: str, f: str) -> str:
    """The body that carries both line points: ``"ground"`` or a link."""
    if e in mech.ground and f in mech.ground:
        return GROUND
    for link, points in mech.links.items():
        if e in points and f in points:
            return link
    raise BuildError(f"{e} and {f} must both be fixed, or both on one link, to set a slide's line")


def _slide_on(mech: Mechanism, name: str, point: str, e: str, f: str) -> Mechanism:
    """``mech`` with slide ``name``: joint ``point`` sliding along the line through ``e`` and ``f``,
    set onto that line."""
    if point in (e, f) or e == f:
        raise BuildError("a slide needs the sliding joint and two other points for its line")
    if math.dist(mech.points[e], mech.points[f]) == 0.0:
        raise BuildError(f"{e} and {f} are at the same place: they set no line")
    guide = guide_of(mech, e, f)
    if point in mech.body_points(guide):
        raise BuildError(f"{point} is on {guide} itself: it cannot slide on it")
    slides = {**mech.slides, name: Slide(name, point, guide, (e, f))}
    return keep_slides_on_guides(replace(mech, slides=slides, warnings=()))


def add_slide(mech: Mechanism, point: str, e: str, f: str) -> tuple[Mechanism, str]:
    """Joint ``point`` slides along the line through ``e`` and ``f``; it is set onto that line."""
    _room_for(mech, "another slide", bodies=1)
    name = _fresh(mech.slides, _numbered("slide"))
    return _slide_on(mech, name, point, e, f), name


def set_slide_line(mech: Mechanism, name: str, e: str, f: str) -> Mechanism:
    """Slide ``name`` runs along the line through ``e`` and ``f`` instead (its guide follows: the
    frame, or the link holding both); its joint is set onto the new line. A cylinder driver's
    slide keeps its barrel's line: its pivot is the line's first point."""
    driver = mech.driver
    if driver is not None and driver.slide == name:
        raise BuildError(f"{name} is the cylinder that drives the design: its line runs from its barrel's pivot "
                         "along the barrel; move the barrel's points instead")
    return _slide_on(mech, name, mech.slides[name].point, e, f)


def set_driver(mech: Mechanism, pivot: str, point: str, speed_value: float | None = None,
               speed_unit: str | None = None) -> Mechanism:
    """The link through fixed ``pivot`` and ``point`` becomes the driver (keeping a former speed)."""
    if pivot not in mech.ground:
        raise BuildError(f"{pivot} is not fixed: a driver turns about a fixed pivot")
    link = next((n for n, pts in mech.links.items() if pivot in pts and point in pts), None)
    if link is None:
        raise BuildError(f"no link joins {pivot} and {point}: join them first")
    old = mech.driver if mech.driver is not None and not mech.driver.is_actuator else None
    value = speed_value if speed_value is not None else (old.speed_value if old else DEFAULT_SPEED_RPM)
    unit = speed_unit or (old.speed_unit if old else "rpm")
    alpha = (old.angular_acceleration_value, old.angular_acceleration_unit) if old else (0.0, "rad/s^2")
    return replace(mech, driver=Driver(link, pivot, float(value), unit, *alpha), warnings=())


# A new cylinder extends at this speed until the Design tab or the file says otherwise.
DEFAULT_CYLINDER_SPEED_M_S = 0.05


def cylinder_slide(mech: Mechanism, pivot: str, point: str) -> str | None:
    """The slide a cylinder driver would be between fixed ``pivot`` (the barrel's) and its sliding
    joint ``point`` (the rod's end): one whose joint is ``point`` and whose line runs through
    ``pivot`` on a moving guide; None when there is none."""
    return next((s.name for s in mech.slides.values() if s.point == point and pivot in s.line
                 and s.guide in mech.links and pivot in mech.links[s.guide]), None)


def set_cylinder_driver(mech: Mechanism, pivot: str, point: str) -> Mechanism:
    """The slide between fixed ``pivot`` and its joint ``point`` becomes a cylinder driver: its guide
    the barrel pivoted at ``pivot`` (its line turned to start there, by the file's convention), its
    length from ``pivot`` to ``point``, extending at 50 mm/s with no stroke limits yet."""
    if pivot not in mech.ground:
        raise BuildError(f"{pivot} is not fixed: a cylinder's barrel is pivoted on the frame")
    name = cylinder_slide(mech, pivot, point)
    if name is None:
        raise BuildError(f"no slide of {point} runs along a line through {pivot}: add the cylinder's slide first")
    slide = mech.slides[name]
    if slide.line[0] != pivot:
        slide = replace(slide, line=(pivot, slide.line[0]))
    driver = Driver(slide.guide, pivot, 0.0, kind="actuator", slide=name,
                    linear_speed_value=DEFAULT_CYLINDER_SPEED_M_S * 1e3, linear_speed_unit="mm/s",
                    linear_acceleration_value=0.0, linear_acceleration_unit="mm/s^2")
    return replace(mech, slides={**mech.slides, name: slide}, driver=driver, warnings=())


# A new cylinder's barrel reaches this share of the way from its pivot to the rod's end.
BARREL_SHARE = 0.5


def add_cylinder(mech: Mechanism, pivot: str, rod_end: str) -> tuple[Mechanism, str]:
    """A cylinder between fixed ``pivot`` (its barrel's) and joint ``rod_end`` (where its rod is
    pinned to a moving link), and it becomes the driver: a barrel link from the pivot to a new
    point BARREL_SHARE of the way along, the rod's end sliding on the barrel's line, extending at
    50 mm/s with no stroke limits yet (:func:`set_cylinder_driver`). Returns the design and the
    slide's name."""
    if pivot == rod_end:
        raise BuildError("a cylinder needs its barrel's pivot and its rod's end: two joints")
    if pivot not in mech.ground:
        raise BuildError(f"{pivot} is not fixed: a cylinder's barrel is pivoted on the frame")
    if rod_end in mech.ground or not mech.bodies_of(rod_end):
        raise BuildError(f"{rod_end} is {'fixed' if rod_end in mech.ground else 'on no link'}: a cylinder's rod "
                         "end is pinned to a moving link")
    if any(slide.point == rod_end for slide in mech.slides.values()):
        raise BuildError(f"{rod_end} already slides on a line: pick the joint the rod is pinned to")
    (x0, y0), (x1, y1) = mech.points[pivot], mech.points[rod_end]
    if math.hypot(x1 - x0, y1 - y0) == 0.0:
        raise BuildError(f"{pivot} and {rod_end} are at the same place: the cylinder would have no length")
    _room_for(mech, "a cylinder's barrel end")
    _room_for(mech, "a cylinder", bodies=2)
    end = _fresh(mech.points, _joint_names())
    barrel = _fresh(mech.links, itertools.chain(["barrel"], _numbered("barrel")))
    name = _fresh(mech.slides, itertools.chain(["cylinder"], _numbered("cylinder")))
    points = {**mech.points, end: (x0 + BARREL_SHARE * (x1 - x0), y0 + BARREL_SHARE * (y1 - y0))}
    slides = {**mech.slides, name: Slide(name, rod_end, barrel, (pivot, end))}
    built = replace(mech, points=points, links={**mech.links, barrel: (pivot, end)}, slides=slides, warnings=())
    return set_cylinder_driver(built, pivot, rod_end), name


def set_speed(mech: Mechanism, speed_value: float, speed_unit: str, angular_acceleration: float) -> Mechanism:
    """The driver's speed (in ``speed_unit``) and angular acceleration (rad/s²)."""
    if mech.driver is None:
        raise BuildError("there is no driver yet: choose one with the Driver tool")
    return replace(mech, driver=replace(mech.driver, speed_value=float(speed_value), speed_unit=speed_unit,
                                        angular_acceleration_value=float(angular_acceleration),
                                        angular_acceleration_unit="rad/s^2"), warnings=())


def set_cylinder_motion(mech: Mechanism, speed_value: float, unit: str, acceleration: float,
                        stroke: tuple) -> Mechanism:
    """A cylinder driver's extension speed in ``unit`` ("mm/s" or "m/s"), its acceleration in the
    matching unit per second (mm/s² or m/s²) and its ``stroke`` (min, max) in the design's length
    unit, None where it has no limit. A stroke out of order is refused by the core, naming
    ``driver.stroke``."""
    driver = mech.driver
    if driver is None or not driver.is_actuator:
        raise BuildError("the driver is not a cylinder: choose one with the Driver tool on a slide through a "
                         "fixed pivot")
    low, high = stroke
    return replace(mech, driver=replace(driver, linear_speed_value=float(speed_value), linear_speed_unit=unit,
                                        linear_acceleration_value=float(acceleration),
                                        linear_acceleration_unit=f"{unit}^2", stroke_min=low, stroke_max=high),
                   warnings=())


def set_link_length(mech: Mechanism, link: str, length: float) -> Mechanism:
    """Bar ``link`` made ``length`` long (the file's unit): its free end moves along the bar's
    direction, the second joint unless it is fixed, then the first; the centres of mass and slides
    follow as for a drag. Refused for a plate (three joints or more), a bar between two fixed
    points, or a length that is not positive."""
    points = mech.links[link]
    if len(points) != 2:
        raise BuildError(f"{link} joins {len(points)} joints: only a bar (two joints) has one length to set")
    if not (math.isfinite(length) and length > 0.0):
        raise BuildError(f"a length must be a positive number, not {length:g}")
    first, second = points
    if second in mech.ground:
        first, second = second, first
    if second in mech.ground:
        raise BuildError(f"both ends of {link} are fixed: its length is the frame's")
    (x0, y0), (x1, y1) = mech.points[first], mech.points[second]
    now = math.hypot(x1 - x0, y1 - y0)
    if now == 0.0:
        raise BuildError(f"the two joints of {link} are at one place: it has no direction to lengthen along")
    end = (x0 + (x1 - x0) * length / now, y0 + (y1 - y0) * length / now)
    return keep_slides_on_guides(move_point(mech, second, end))


def set_fixed(mech: Mechanism, name: str, fixed: bool) -> Mechanism:
    """Fix joint ``name`` to the frame, or free it."""
    ground = tuple(dict.fromkeys((*mech.ground, name))) if fixed else tuple(g for g in mech.ground if g != name)
    driver = mech.driver if fixed or mech.driver is None or mech.driver.pivot != name else None
    return replace(mech, ground=ground, driver=driver, warnings=(),
                   mass_data=mass_data_kept(mech.mass_data, mech.points, mech.links, ground))


def delete_point(mech: Mechanism, name: str) -> Mechanism:
    """Remove joint ``name`` and whatever cannot stand without it (short links, its slides, the driver)."""
    points = {n: xy for n, xy in mech.points.items() if n != name}
    links = {}
    for link, members in mech.links.items():
        kept = tuple(p for p in members if p != name)
        if len(kept) >= 2:
            links[link] = kept
    return _standing(mech, points, links, tuple(g for g in mech.ground if g != name))


def delete_link(mech: Mechanism, name: str) -> Mechanism:
    """Remove link ``name`` (its joints stay) and whatever cannot stand without it (slides on it, the driver)."""
    if name not in mech.links:
        raise BuildError(f"there is no link {name}")
    return _standing(mech, mech.points, {n: p for n, p in mech.links.items() if n != name}, mech.ground)


def _standing(mech: Mechanism, points: dict, links: dict, ground: tuple) -> Mechanism:
    """``mech`` left with ``points``, ``links`` and ``ground``, and only the slides, driver, output and
    mass data that still have all they name."""
    slides = {n: s for n, s in mech.slides.items()
              if all(p in points for p in (s.point, *s.line)) and (s.guide == GROUND or s.guide in links)}
    driver = mech.driver
    if driver is not None and (driver.link not in links or driver.pivot not in ground):
        driver = None
    output = mech.output
    if output is not None and (output.get("point", "") not in (*points, "")
                               or output.get("link", "") not in (*links, "")):
        output = None
    return replace(mech, points=points, links=links, slides=slides, driver=driver, output=output, ground=ground,
                   mass_data=mass_data_kept(mech.mass_data, points, links, ground), warnings=())


def keep_slides_on_guides(mechanism: Mechanism) -> Mechanism:
    """Each sliding point set back onto its slide line (as the file format requires of a reference pose)."""
    for slide in mechanism.slides.values():
        off, foot = slide_offset(mechanism, slide)
        if off:
            mechanism = move_point(mechanism, slide.point, foot)
    return mechanism


def snap(xy, step: float):
    """``xy`` rounded to the nearest grid node ``step`` apart (no snapping for step 0)."""
    if not step:
        return (float(xy[0]), float(xy[1]))
    return (round(xy[0] / step) * step, round(xy[1] / step) * step)
