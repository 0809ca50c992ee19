"""The space diagram as the trade draws it: link centre lines from joint
centre to joint centre (a plate as its outline through its joints), so any
length on paper measures true at the drawing scale; pins, fixed pivots,
slider blocks, guides and the centres of mass as symbols of constant paper size. Each primitive
carries a :class:`~kinematics.drawing.sheet.Ref` to the point, link or slide
it draws."""

from __future__ import annotations

import math

from ..model.mass import mass_centres
from ..model.mechanism import GROUND
from . import symbols
from .declutter import declutter, hits, text_box
from .hatching import ground_hatch
from .sheet import Line, Polyline, Recorder, Text, View, ref_of
from .style import ANNOTATION, MASS_CENTRE, SPACE_GROUND, SPACE_LINK, SPACE_PATH
from .symbols import Symbols

# Points this close to one line (relative to the link's size) make a straight bar, not a plate.
COLLINEAR = 1e-9


def outline(names, xy: dict) -> tuple:
    """The joints of one link in drawing order: round the plate's centre for a
    plate, along the bar for points in one line; the second value says closed."""
    names = list(names)
    if len(names) <= 2:
        return tuple(names), False
    # Plain floats: a window orders every link at every frame of a drag, and numpy's overhead
    # on three or four points costs ten times the arithmetic.
    cx = sum(xy[n][0] for n in names) / len(names)
    cy = sum(xy[n][1] for n in names) / len(names)
    spread = [(xy[n][0] - cx, xy[n][1] - cy) for n in names]
    far = max(spread, key=lambda d: math.hypot(*d))
    size = math.hypot(*far)
    if size == 0.0:
        return tuple(names), False
    # Every point's distance from the line through the centre and the farthest point: at
    # rounding level for points in one line.
    ux, uy = far[0] / size, far[1] / size
    if max(abs(ux * dy - uy * dx) for dx, dy in spread) <= COLLINEAR * size * math.sqrt(len(names)):
        along = [ux * dx + uy * dy for dx, dy in spread]
        if along[0] > 0.0:
            along = [-a for a in along]  # the bar runs from the end nearer the link's first point
        return tuple(names[i] for i in sorted(range(len(names)), key=along.__getitem__)), False
    angles = [math.atan2(dy, dx) for dx, dy in spread]
    return tuple(names[i] for i in sorted(range(len(names)), key=angles.__getitem__)), True


def positions(solution) -> dict:
    """Point name -> (x, y) in metres, straight from the solved pose."""
    return {name: (float(x), float(y)) for name, (x, y) in zip(solution.point_names, solution.positions.tolist(),
                                                                strict=True)}


def file_positions(mech) -> dict:
    """Point name -> (x, y) in metres, as the file places them (a design not yet solvable)."""
    return {name: mech.position_m(name) for name in mech.points}


def traced_points(mech) -> tuple:
    """The points whose paths over the cycle a space diagram shows: a point carried by one
    link only, off every slide, other than the two joints the link lists first (a coupler point)."""
    on_slides = {n for slide in mech.slides.values() for n in (slide.point, *slide.line)}
    out = []
    for name in mech.points:
        bodies = mech.bodies_of(name)
        if name in mech.ground or name in on_slides or len(bodies) != 1:
            continue
        points = mech.links[bodies[0]]
        if len(points) > 2 and name not in points[:2]:
            out.append(name)
    return tuple(out)


def draw_space(rec: Recorder, solution, view: View, size: Symbols) -> None:
    """Record the space diagram of ``solution`` into ``view``."""
    draw_linkage(rec, solution.mechanism, positions(solution), view, size)


def draw_linkage(rec: Recorder, mech, xy: dict, view: View, size: Symbols) -> None:
    """Record the space diagram of ``mech`` with its points at ``xy`` (name -> (x, y), metres)."""
    at = {name: view.place(p) for name, p in xy.items()}
    if not at:
        return
    orders = {link: outline(names, xy) for link, names in mech.links.items()}
    for link, (order, closed) in orders.items():
        ids = {"view": view.name, "ref": ref_of("link", link)}
        if len(order) == 2:
            rec.add(Line(start=at[order[0]], end=at[order[1]], pen=SPACE_LINK, **ids))
        elif len(order) > 2:
            rec.add(Polyline(points=tuple(at[n] for n in order), pen=SPACE_LINK, closed=closed, **ids))
    cylinder = mech.driver.slide if mech.driver is not None and mech.driver.is_actuator else None
    for slide in mech.slides.values():
        ids = {"view": view.name, "ref": ref_of("slide", slide.name)}
        if slide.name == cylinder:
            _draw_rod(rec, slide, at, ids)
        _draw_slide(rec, slide, at, size, ids)
    for link, where in mass_centres(mech, xy).items():
        symbols.mass_centre(rec, view.place(where), MASS_CENTRE, size, view=view.name, ref=ref_of("mass centre", link))
    xs, ys = [x for x, _ in at.values()], [y for _, y in at.values()]
    centre = (sum(xs) / len(xs), sum(ys) / len(ys))
    _draw_joints(rec, mech, at, centre, size, view.name)
    _draw_link_names(rec, orders, at, centre, size, view.name)
    if mech.driver is not None:
        _draw_driver_sense(rec, mech, at, centre, size, {"view": view.name, "ref": ref_of("driver", mech.driver.link)})
    declutter(rec, view.name)


def draw_paths(rec: Recorder, sweep, view: View, names) -> None:
    """The paths of points ``names`` over the cycle ``sweep`` (a :class:`kinematics.Sweep`)."""
    for name in names:
        track = sweep.positions[:, sweep.point_names.index(name)].tolist()
        rec.add(Polyline(points=tuple(view.place(p) for p in track), pen=SPACE_PATH, closed=sweep.closes,
                         view=view.name, ref=ref_of("path", name)))


def _segments(primitives, view: str) -> list:
    """The straight pieces of the link and guide lines already drawn in ``view``."""
    out = []
    for p in primitives:
        if p.view != view or p.pen not in (SPACE_LINK, SPACE_GROUND):
            continue
        if isinstance(p, Line):
            out.append((p.start, p.end))
        elif isinstance(p, Polyline):
            ring = list(p.points) + ([p.points[0]] if p.closed else [])
            out.extend(zip(ring, ring[1:], strict=False))
    return out


def _draw_link_names(rec: Recorder, orders: dict, at, centre, size: Symbols, view: str) -> None:
    """Each link's name in small text, so the results table reads against the
    drawing: beside a bar's middle (on the side away from the mechanism's
    middle), at a plate's centre (beside it when a mark is there). ``orders`` is each link's
    :func:`outline`."""
    small = Symbols(text=size.small_text)
    marks = [box for on, box in rec.marks if on == view]
    for link, (order, closed) in orders.items():
        ids = {"view": view, "ref": ref_of("link", link)}
        if closed:
            where = (sum(at[n][0] for n in order) / len(order), sum(at[n][1] for n in order) / len(order))
            name = Text(position=where, text=link, height=size.small_text, pen=ANNOTATION, align="centre",
                        anchor="middle", **ids)
            if hits(text_box(name), marks):
                # A mark at the plate's centre (its centre of mass, often): the name goes beside it.
                symbols.label(rec, where, link, (where[0], where[1] + 1.0), ANNOTATION, small,
                              gap=2.0 * symbols.MASS_CENTRE_RADIUS * size.pin, **ids)
            else:
                rec.add(name)
            continue
        if len(order) < 2:
            continue
        (x0, y0), (x1, y1) = at[order[0]], at[order[-1]]
        length = math.hypot(x1 - x0, y1 - y0)
        if length < 4 * size.text:
            continue  # too short on paper to carry its name
        middle = (0.5 * (x0 + x1), 0.5 * (y0 + y1))
        nx, ny = -(y1 - y0) / length, (x1 - x0) / length
        if (middle[0] - centre[0]) * nx + (middle[1] - centre[1]) * ny < 0:
            nx, ny = -nx, -ny
        near = (middle[0] - size.pin, middle[1] - size.pin, middle[0] + size.pin, middle[1] + size.pin)
        # A centre-of-mass mark at the bar's middle (a uniform bar's): the name stands clear of its ring.
        gap = 2.0 * symbols.MASS_CENTRE_RADIUS * size.pin if hits(near, marks) else 0.5 * size.small_text
        symbols.label(rec, middle, link, (middle[0] - nx, middle[1] - ny), ANNOTATION, small, gap=gap, **ids)


def _guide_sides(mech, at) -> dict:
    """Point name -> unit normal to the left of its fixed guide (the side without hatching)."""
    sides = {}
    for slide in mech.slides.values():
        if slide.guide == GROUND:
            (ex, ey), (fx, fy) = at[slide.line[0]], at[slide.line[1]]
            length = math.hypot(fx - ex, fy - ey) or 1.0
            for name in (*slide.line, slide.point):
                sides[name] = (-(fy - ey) / length, (fx - ex) / length)
    return sides


def _draw_joints(rec: Recorder, mech, at, centre, size: Symbols, view: str) -> None:
    """Pins, fixed-pivot marks and point labels."""
    sliding = {slide.point for slide in mech.slides.values()}
    sides = _guide_sides(mech, at)
    lines = [] if rec.draft else symbols.lines_near(_segments(rec.primitives, view), size.dot)
    for name, where in at.items():
        ids = {"view": view, "ref": ref_of("point", name)}
        bodies = mech.bodies_of(name)
        # A fixed point on no link only marks where a guide runs: no pivot symbol for it.
        pivot = GROUND in bodies and len(bodies) > 1
        if pivot:
            symbols.fixed_pivot(rec, where, SPACE_GROUND, size, floor=_guide_floor(mech, at, where, size), **ids)
        symbols.pin(rec, where, SPACE_LINK, size, joint=len(bodies) > 1, **ids)
        # A label clears the fixed-pivot mark under its pin, or the slider block round it;
        # on a fixed guide it goes to the side without hatching, elsewhere away from the middle.
        gap = 5.0 * size.pin if pivot else 4.0 * size.pin if name in sliding else size.pin
        side = sides.get(name)
        away_from = (where[0] - side[0], where[1] - side[1]) if side is not None and not pivot else centre
        avoid = symbols.directions_at(where, lines)
        if pivot:
            avoid.append(-0.5 * math.pi)  # the fixed-pivot mark hangs below the pin
        symbols.label(rec, where, name, away_from, SPACE_LINK, size, gap=gap, avoid=avoid, **ids)


FLOOR_SLOPE = 0.2  # a guide this near level (rise over run) can carry a fixed pivot's mark


def _guide_floor(mech, at, where, size: Symbols) -> float | None:
    """The height (sheet mm) of a near-level fixed guide line under the pivot at ``where``, when
    the pivot's own mark would reach it (its hatching would run into the guide's): the mark then
    stands on the guide. None where no guide is that close below."""
    x, y = where
    reach = symbols.pivot_reach(size)
    found = None
    for slide in mech.slides.values():
        if slide.guide != GROUND:
            continue
        (ex, ey), (fx, fy) = at[slide.line[0]], at[slide.line[1]]
        if fx == ex or abs((fy - ey) / (fx - ex)) > FLOOR_SLOPE or not min(ex, fx) <= x <= max(ex, fx):
            continue
        under = ey + (fy - ey) * (x - ex) / (fx - ex)
        if 2.0 * size.pin < y - under <= reach and (found is None or under > found):
            found = under
    return found


def _draw_rod(rec: Recorder, slide, at, ids) -> None:
    """A cylinder's rod: from the barrel's end (the line's second point) out to the rod's end, where
    the rod stands out of the barrel; a rod end inside the barrel's length shows no rod."""
    (ex, ey), (fx, fy), (dx, dy) = (at[n] for n in (*slide.line, slide.point))
    barrel = math.hypot(fx - ex, fy - ey)
    if barrel > 0.0 and ((dx - ex) * (fx - ex) + (dy - ey) * (fy - ey)) / barrel > barrel:
        rec.add(Line(start=(fx, fy), end=(dx, dy), pen=SPACE_LINK, **ids))


def _draw_slide(rec: Recorder, slide, at, size: Symbols, ids) -> None:
    """The slider block on its line; a fixed guide also as a hatched line past the block's reach."""
    (ex, ey), (fx, fy), (dx, dy) = (at[n] for n in (*slide.line, slide.point))
    length = math.hypot(fx - ex, fy - ey)
    if length == 0.0:
        return
    ux, uy = (fx - ex) / length, (fy - ey) / length
    if slide.guide == GROUND:
        along = (0.0, length, (dx - ex) * ux + (dy - ey) * uy)
        reach = 4.0 * size.pin  # the guide runs a little past the block's travel shown
        lo, hi = min(along) - reach, max(along) + reach
        rec.add(Line(start=(ex + lo * ux, ey + lo * uy), end=(ex + hi * ux, ey + hi * uy), pen=SPACE_GROUND, **ids))
        # Hatching on the guide's right-hand side marks it as fixed: strokes at 45° back along it.
        # One band along the guide, as deep as a stroke 2 pin radii long at 45° reaches.
        depth = 2.0 * size.pin * math.sqrt(0.5)
        down_x, down_y = depth * uy, -depth * ux  # to the guide's right
        band = ((ex + lo * ux, ey + lo * uy), (ex + hi * ux, ey + hi * uy),
                (ex + hi * ux + down_x, ey + hi * uy + down_y), (ex + lo * ux + down_x, ey + lo * uy + down_y))
        angle = math.degrees(math.atan2(-ux - uy, uy - ux))
        rec.add(ground_hatch(band, angle, 3.0 * size.pin * math.sqrt(0.5), SPACE_GROUND, **ids))
    symbols.slider_block(rec, (dx, dy), (ux, uy), SPACE_LINK, size, **ids)


# Where the driver's sense arrow may sit round its pivot: every 10°.
_ARC_STEP = math.radians(10.0)
_TURN = 2.0 * math.pi


def _draw_driver_sense(rec: Recorder, mech, at, centre, size: Symbols, ids) -> None:
    """A curved arrow round the driver's pivot in the sense it turns, set where
    it is clearest of the lines meeting at the pivot and of the pivot's label."""
    driver = mech.driver
    if driver.speed_rad_s == 0.0:
        return
    cx, cy = at[driver.pivot]
    busy = [math.atan2(at[n][1] - cy, at[n][0] - cx) for names in mech.links.values() if driver.pivot in names
            for n in names if n != driver.pivot]
    busy.append(math.atan2(cy - centre[1], cx - centre[0]))  # the label sits away from the middle
    busy.append(-0.5 * math.pi)  # the fixed-pivot mark hangs below
    # In the middle of the widest gap between the busy directions, on the 10° grid.
    busy = sorted(b % _TURN for b in busy)
    widest, start = max(((busy[(i + 1) % len(busy)] - b) % _TURN or _TURN, b) for i, b in enumerate(busy))
    middle = round((start + 0.5 * widest) / _ARC_STEP) * _ARC_STEP
    sense = 1.0 if driver.speed_rad_s > 0 else -1.0
    radius = 5.5 * size.pin
    angles = [middle + sense * math.radians(-45 + 5 * k) for k in range(19)]  # 90° of arc
    points = tuple((cx + radius * math.cos(a), cy + radius * math.sin(a)) for a in angles)
    rec.add(Polyline(points=points[:-8], pen=ANNOTATION, **ids))
    symbols.arrow(rec, points[-9], points[-1], ANNOTATION, size, **ids)
