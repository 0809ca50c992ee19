"""The checks a designer runs before trusting a layout: Grashof class of each
four-bar loop, rotatability of slide loops, transmission angles, dead points,
limit positions of the output, swing or stroke, and time ratio."""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..errors import KinematicsError
from ..groups.decompose import decompose
from ..model.mechanism import GROUND, Mechanism
from .sweep import Sweep, sweep


@dataclass(frozen=True)
class LoopCheck:
    """One loop's rotatability verdict, in words, with the lengths it used (mm of the file unit)."""

    loop: str
    verdict: str
    turns_fully: str | None
    lengths: dict


def grashof_class(frame: float, input_: float, coupler: float, output: float) -> tuple[str, str | None]:
    """(class, which link turns fully) of a four-bar with the given link lengths.

    >>> grashof_class(140, 40, 122, 107)
    ('crank-rocker', 'input')
    """
    lengths = {"frame": frame, "input": input_, "coupler": coupler, "output": output}
    ordered = sorted(lengths.values())
    s, p, q, l_ = ordered
    margin = (s + l_) - (p + q)
    if abs(margin) <= 1e-9 * l_:
        return "change point (s + l = p + q)", None
    if margin > 0:
        return "non-Grashof triple rocker", None
    shortest = min(lengths, key=lengths.get)
    return {"frame": ("double-crank", "input and output"), "input": ("crank-rocker", "input"),
            "output": ("crank-rocker", "output"), "coupler": ("double-rocker", "coupler")}[shortest]


def _ground_pivot(mech, link):
    return next((p for p in mech.links[link] if p in mech.ground), None)


def _length(mech, p, q):
    (x1, y1), (x2, y2) = mech.points[p], mech.points[q]
    return math.hypot(float(x2) - float(x1), float(y2) - float(y1))


def _distance_from_line(mech, point, line) -> float:
    """Distance (file units) of ``point`` from the line through the two points of ``line``."""
    (ex, ey), (fx, fy) = (mech.points[p] for p in line)
    px, py = mech.points[point]
    return abs((px - ex) * (fy - ey) - (py - ey) * (fx - ex)) / math.hypot(fx - ex, fy - ey)


def loop_checks(mech: Mechanism) -> list:
    """Rotatability of each loop closed by a dyad whose input link is pivoted on ground."""
    checks = []
    for group in decompose(mech).groups:
        if group.form == "numeric":
            continue
        r = dict(group.roles)
        links = tuple(group.links)
        if group.form == "RRR" and r["A"] in mech.ground and r["C"] not in mech.ground:
            # The file listed the rocker first: read the loop from the crank's side.
            r["A"], r["C"], links = r["C"], r["A"], links[::-1]
        pin = r["A"] if group.form != "RPR" else r["D"]
        carrier = next((b for b in mech.bodies_of(pin) if b not in group.links and b != GROUND), None)
        pivot = _ground_pivot(mech, carrier) if carrier else None
        if pivot is None or pivot == pin:
            continue
        crank = _length(mech, pivot, pin)
        if group.form == "RRR" and r["C"] in mech.ground:
            frame, coupler, output = _length(mech, pivot, r["C"]), _length(mech, r["A"], r["B"]), \
                _length(mech, r["C"], r["B"])
            verdict, turns = grashof_class(frame, crank, coupler, output)
            names = {"input": carrier, "output": links[1], "coupler": links[0], "frame": "ground",
                     "input and output": f"{carrier} and {links[1]}"}
            checks.append(LoopCheck(f"four-bar {carrier}-{links[0]}-{links[1]}", verdict,
                                    names.get(turns) if turns else None,
                                    {"frame": frame, carrier: crank, links[0]: coupler, links[1]: output}))
            continue
        slide = mech.slides[group.slide] if group.slide else None
        if slide is None or slide.guide != GROUND and group.form == "RRP":
            continue
        if group.form == "RRP":
            offset = _distance_from_line(mech, pivot, slide.line)
            rod = _length(mech, pin, r["D"])
            turns = crank + offset < rod
            checks.append(LoopCheck(f"slider-crank {carrier}-{links[0]}",
                                    f"r + |e| {'<' if turns else '≥'} l: {crank:.4g} + {offset:.4g} vs {rod:.4g}",
                                    carrier if turns else None, {carrier: crank, "offset": offset,
                                                                 links[0]: rod}))
        elif r["C"] in mech.ground:
            lever = links[0]
            offset = _distance_from_line(mech, r["C"], slide.line)
            centres = _length(mech, pivot, r["C"])
            # The slot must pass the crank pin at every crank angle: |C - pin| stays ≥ |e|, and it
            # ranges over [|d - r|, d + r]. Below d the lever rocks; beyond, it turns too (Whitworth).
            if crank + offset < centres:
                verdict = f"r + |e| < d: {crank:.4g} + {offset:.4g} < {centres:.4g}, the lever rocks"
            elif crank - offset > centres:
                verdict = f"r − |e| > d: {crank:.4g} − {offset:.4g} > {centres:.4g}, the lever turns fully too"
            else:
                verdict = f"|d − r| < |e| or the pin passes the pivot: {crank:.4g}, {offset:.4g}, {centres:.4g}"
            turns = crank + offset < centres or crank - offset > centres
            checks.append(LoopCheck(f"crank and slotted lever {carrier}-{lever}", verdict,
                                    carrier if turns else None, {carrier: crank, "offset": offset,
                                                                 "centre distance": centres}))
    return checks


def transmission_angles(mech: Mechanism, result: Sweep) -> dict:
    """RRR group -> (N,) transmission angle in degrees (0–180°) at its joint B."""
    angles = {}
    index = result.point_names.index
    for group in decompose(mech).groups:
        if group.form != "RRR":
            continue
        r = group.roles
        b = result.positions[:, index(r["B"])]
        to_a = result.positions[:, index(r["A"])] - b
        to_c = result.positions[:, index(r["C"])] - b
        cosine = np.sum(to_a * to_c, axis=1) / (np.linalg.norm(to_a, axis=1) * np.linalg.norm(to_c, axis=1))
        angles[f"{group.links[0]}/{group.links[1]} at {r['B']}"] = np.degrees(np.arccos(np.clip(cosine, -1, 1)))
    return angles


def output_coordinate(mech: Mechanism, result: Sweep):
    """(name, values (N,), unit, rate (N,), rate of rate (N,)) of the output's motion along the cycle:
    a link's angle (°) with its ω (rad/s) and α (rad/s²), or a point's travel (mm) along its guide (or
    its path's principal direction) with its velocity (m/s) and acceleration (m/s²) along it."""
    out = mech.output
    if out is None:
        return None
    if "link" in out:
        link = out["link"]
        angle = np.degrees(np.unwrap(np.radians(result.link_angle_deg[link])))
        return f"link {link}", angle, "°", result.angular_velocity[link], result.angular_acceleration[link]
    point = out["point"]
    i = result.point_names.index(point)
    path = result.positions[:, i]
    slide = next((s for s in mech.slides.values() if s.point == point and s.guide == GROUND), None)
    if slide is not None:
        e, f = (np.array(mech.position_m(p)) for p in slide.line)
        u = (f - e) / np.linalg.norm(f - e)
    else:  # the path's principal direction
        centred = path - path.mean(axis=0)
        u = np.linalg.svd(centred, full_matrices=False)[2][0]
    return f"point {point}", (path @ u) * 1000.0, "mm", result.velocities[:, i] @ u, result.accelerations[:, i] @ u


def output_motion(mech: Mechanism, result: Sweep) -> dict | None:
    """Limit positions, swing or stroke, and time ratio of the output named in the file."""
    found = output_coordinate(mech, result)
    if found is None:
        return None
    name, values, unit, rate, _ = found
    angles = result.driver_angle_deg
    following = np.roll(rate, -1)
    turn = np.flatnonzero(np.sign(rate) != np.sign(following))
    if not result.full_turn:
        turn = turn[turn < len(rate) - 1]
    # Where the output's rate crosses zero, by linear interpolation between swept poses.
    step = np.diff(angles, append=angles[0] + (angles[1] - angles[0]) * len(angles))
    limits = [float(angles[i] + step[i] * rate[i] / (rate[i] - following[i])) for i in turn]
    hi, lo = int(np.argmax(values)), int(np.argmin(values))
    motion = {"output": name, "unit": unit, "travel": float(values[hi] - values[lo]),
              "limit_positions_deg": [float(angles[lo]), float(angles[hi])],
              "rate_reversals_deg": limits}
    if result.full_turn and len(turn) == 2:
        between = abs(limits[1] - limits[0])
        rising = values[turn[1]] > values[turn[0]]
        out_stroke = between if rising else 360.0 - between  # driver turn from lowest to highest
        back = 360.0 - out_stroke
        slow, fast = (("forward (towards the highest)", out_stroke), ("return", back)) if out_stroke >= back \
            else (("return", back), ("forward (towards the highest)", out_stroke))
        motion.update(time_ratio=max(out_stroke, back) / min(out_stroke, back),
                      slow_stroke=slow[0], slow_stroke_driver_deg=slow[1], fast_stroke_driver_deg=fast[1])
    return motion


def report(mech: Mechanism, steps: int = 3600) -> dict:
    """Everything ``kinepoly check`` prints, as data. A cycle that cannot be swept (a change
    point on the way, a group that is no dyad) leaves the loop checks and says why in ``cycle``."""
    from .peaks import peaks

    loops = loop_checks(mech)
    try:
        table = peaks(sweep(mech, steps))
    except KinematicsError as err:
        return {"loops": loops, "cycle": str(err)}
    return {"loops": loops, "cycle": "", "transmission": table["transmission"], "full_turn": table["full_turn"],
            "range_deg": table["range_deg"], "output": table["output"], "warnings": table["warnings"]}
