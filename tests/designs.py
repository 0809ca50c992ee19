"""Named test mechanisms for every test package, in one place: the sample files, fixed designs
(our own invented machines, mm, rpm) and builders from defining dimensions (mm, degrees).

Two four-bars and two slider-cranks stand here on purpose: the window tests' expected numbers come
from CLAW_FEED and CARTON_PUSHER, the drawing tests' from GATE_LIFTER and BOTTLE_PUSHER."""

import copy
import math
from pathlib import Path

import kinematics

SAMPLES = Path(__file__).resolve().parents[1] / "samples"
SAMPLE_FILES = sorted(SAMPLES.glob("*.json"))


def stroke_length_m(mech, angle_deg):
    """The cylinder length as far along the stroke as ``angle_deg`` is along a turn (None stays
    None: the reference pose), so that a test's list of driver angles poses a cylinder-driven
    design too."""
    if angle_deg is None:
        return None
    from kinematics.cycle.stroke import stroke_limits_m
    from kinematics.groups.decompose import decompose

    low, high = stroke_limits_m(mech, decompose(mech))
    return low + (high - low) * ((float(angle_deg) % 360.0) / 360.0)


def solve_at(mech, angle_deg=None):
    """``kinematics.solve`` at driver angle ``angle_deg``; a cylinder-driven design at the length
    :func:`stroke_length_m` gives for it."""
    if mech.driver is not None and mech.driver.is_actuator:
        return kinematics.solve(mech, length=stroke_length_m(mech, angle_deg))
    return kinematics.solve(mech, angle_deg)


def solve_swept(mech, result, k):
    """``kinematics.solve`` at the parameter of a sweep's pose ``k`` (its angle, or its length)."""
    if result.driver_length_m is not None:
        return kinematics.solve(mech, length=float(result.driver_length_m[k]))
    return kinematics.solve(mech, float(result.driver_angle_deg[k]))

# A crank-rocker with a coupler point, like a film-advance claw: crank O2A 50 mm at 53.13°, 120 rpm.
CLAW_FEED = {
    "kinepoly": 1, "title": "claw feed four-bar", "length_unit": "mm",
    "points": {"O2": [0, 0], "A": [30, 40], "B": [140, 110], "O4": [170, 0], "P": [70, 140]},
    "ground": ["O2", "O4"],
    "links": {"crank": ["O2", "A"], "coupler": ["A", "B", "P"], "rocker": ["O4", "B"]},
    "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 120, "unit": "rpm"},
               "angular_acceleration": {"value": 5, "unit": "rad/s^2"}},
}

# The claw feed without its driver: an unfinished design.
UNFINISHED = {k: v for k, v in CLAW_FEED.items() if k != "driver"}

# A crank-rocker with a coupler point: crank O2A 40 mm (24, 32, a 3-4-5 triangle), 90 rpm.
GATE_LIFTER = {
    "kinepoly": 1, "title": "Gate lifter linkage", "length_unit": "mm",
    "points": {"O2": [0, 0], "A": [24, 32], "B": [150, 95], "O4": [180, 0], "P": [85, 130]},
    "ground": ["O2", "O4"],
    "links": {"crank": ["O2", "A"], "coupler": ["A", "B", "P"], "rocker": ["O4", "B"]},
    "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 90, "unit": "rpm"},
               "angular_acceleration": {"value": 3, "unit": "rad/s^2"}},
}

# An offset slider-crank pushing a carton along a fixed guide: 40 mm crank, the slide "guide", 300 rpm.
CARTON_PUSHER = {
    "kinepoly": 1, "title": "carton pusher", "length_unit": "mm",
    "points": {"O2": [0, 0], "A": [0, 40], "D": [150, -15], "E": [-60, -15], "F": [260, -15]},
    "ground": ["O2", "E", "F"],
    "links": {"crank": ["O2", "A"], "rod": ["A", "D"]},
    "slides": {"guide": {"point": "D", "guide": "ground", "line": ["E", "F"]}},
    "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 300, "unit": "rpm"}},
}

# Offset slider-crank: 35 mm crank, the block's line 15 mm below the crank pivot, the slide "block", 200 rpm.
BOTTLE_PUSHER = {
    "kinepoly": 1, "title": "Bottle pusher", "length_unit": "mm",
    "points": {"O2": [0, 0], "A": [0, 35], "D": [150, -15], "E": [-60, -15], "F": [260, -15]},
    "ground": ["O2", "E", "F"],
    "links": {"crank": ["O2", "A"], "rod": ["A", "D"]},
    "slides": {"block": {"point": "D", "guide": "ground", "line": ["E", "F"]}},
    "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 200, "unit": "rpm"}},
}

# Crank pin A slides along the lever C-T, which turns about C: crank O2(0, 90)-A(40, 90).
SWING_LEVER = {
    "kinepoly": 1, "title": "Swing lever feeder", "length_unit": "mm",
    "points": {"C": [0, 0], "O2": [0, 90], "A": [40, 90], "T": [80, 180]},
    "ground": ["C", "O2"],
    "links": {"crank": ["O2", "A"], "lever": ["C", "T"]},
    "slides": {"slot": {"point": "A", "guide": "lever", "line": ["C", "T"]}},
    "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 60, "unit": "rpm"}},
}

# A triple rocker (Grashof: s + l = 50 + 120 > 100 + 60): the input link cannot turn fully,
# so some driver angles (180° among them) cannot be assembled.
TRIPLE_ROCKER = {
    "kinepoly": 1, "title": "gate rocker", "length_unit": "mm",
    "points": {"O2": [0, 0], "A": [86.60254037844388, 50.0], "B": [135.98543038577725, 57.831358408578566],
               "O4": [120, 0]},
    "ground": ["O2", "O4"],
    "links": {"input": ["O2", "A"], "coupler": ["A", "B"], "output": ["O4", "B"]},
    "driver": {"link": "input", "pivot": "O2", "speed": {"value": 30, "unit": "rpm"}},
}

# The crank drives a three-link group (ternary link B-C-D held by rockers O4-C and O6-D): no dyad
# fits, so its polygon points come from the numeric solver.
TRIAD_PRESS = {
    "kinepoly": 1, "title": "Triad press", "length_unit": "mm",
    "points": {"O2": [0, 0], "A": [30, 30], "B": [110, 90], "C": [170, 120], "D": [150, 40],
               "O4": [230, 160], "O6": [200, -30]},
    "ground": ["O2", "O4", "O6"],
    "links": {"crank": ["O2", "A"], "rod": ["A", "B"], "plate": ["B", "C", "D"],
              "upper": ["O4", "C"], "lower": ["O6", "D"]},
    "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 100, "unit": "rpm"}},
}

# The designs every sheet and DXF test runs over (the keys name the test cases).
SHEET_DESIGNS = {"gate lifter": GATE_LIFTER, "bottle pusher": BOTTLE_PUSHER, "swing lever": SWING_LEVER,
                 "triad press": TRIAD_PRESS}


def load(design: dict):
    """The Mechanism of a design, leaving the shared dictionary untouched."""
    return kinematics.load_mechanism(copy.deepcopy(design))


def construction(design: dict, angle_deg=None):
    """The Construction of a design at a driver angle (None: the reference pose)."""
    return kinematics.construct(kinematics.solve(load(design), angle_deg))


def driver(link="crank", pivot="O2", rpm=120.0, alpha=0.0):
    return {"link": link, "pivot": pivot, "speed": {"value": rpm, "unit": "rpm"},
            "angular_acceleration": {"value": alpha, "unit": "rad/s^2"}}


def four_bar(a, b, c, d, theta_deg, rpm=120.0, alpha=0.0, open_branch=True, coupler_point=None):
    """Crank a = O2A, coupler b = AB, rocker c = O4B, frame d = O2O4 on the x axis.

    ``open_branch`` puts B above the line A-O4 (the open circuit for a crank above the frame)."""
    t = math.radians(theta_deg)
    ax, ay = a * math.cos(t), a * math.sin(t)
    ex, ey = d - ax, -ay
    dist = math.hypot(ex, ey)
    cos_beta = (b * b + dist * dist - c * c) / (2 * b * dist)
    beta = math.acos(cos_beta)
    phi = math.atan2(ey, ex) + (beta if open_branch else -beta)
    bx, by = ax + b * math.cos(phi), ay + b * math.sin(phi)
    points = {"O2": [0.0, 0.0], "A": [ax, ay], "B": [bx, by], "O4": [float(d), 0.0]}
    coupler = ["A", "B"]
    if coupler_point is not None:
        # A point at distance p from A, at angle delta from AB (CCW).
        p, delta = coupler_point
        ang = phi + math.radians(delta)
        points["P"] = [ax + p * math.cos(ang), ay + p * math.sin(ang)]
        coupler.append("P")
    return {"kinepoly": 1, "length_unit": "mm", "points": points, "ground": ["O2", "O4"],
            "links": {"crank": ["O2", "A"], "coupler": coupler, "rocker": ["O4", "B"]},
            "driver": driver(rpm=rpm, alpha=alpha), "output": {"link": "rocker"}}


def slider_crank(r, rod, e, theta_deg, rpm=120.0, alpha=0.0):
    """Crank r, rod length ``rod``, the slide line y = −e (offset e), piston right of the crank."""
    t = math.radians(theta_deg)
    ax, ay = r * math.cos(t), r * math.sin(t)
    dx = ax + math.sqrt(rod * rod - (ay + e) ** 2)
    return {"kinepoly": 1, "length_unit": "mm",
            "points": {"O2": [0.0, 0.0], "A": [ax, ay], "D": [dx, -e], "E": [-2 * (r + rod), -e],
                       "F": [2 * (r + rod), -e]},
            "ground": ["O2", "E", "F"], "links": {"crank": ["O2", "A"], "rod": ["A", "D"]},
            "slides": {"piston": {"point": "D", "guide": "ground", "line": ["E", "F"]}},
            "driver": driver(rpm=rpm, alpha=alpha), "output": {"point": "D"}}


def slotted_lever(r, d, theta_deg, rpm=60.0, alpha=0.0, offset=0.0):
    """Crank O2A of radius r with O2 at distance d above the lever pivot C; crank pin A slides in
    the lever's slot, a line passing at ``offset`` from C (E is C's foot on it)."""
    t = math.radians(theta_deg)
    ax, ay = r * math.cos(t), d + r * math.sin(t)
    psi = math.atan2(ay, ax) + math.asin(offset / math.hypot(ax, ay))
    ux, uy = math.cos(psi), math.sin(psi)
    along = ax * ux + ay * uy
    ex, ey = ax - along * ux, ay - along * uy
    reach = 2.5 * (r + d)
    points = {"C": [0.0, 0.0], "O2": [0.0, float(d)], "A": [ax, ay], "E": [ex, ey],
              "T": [ex + reach * ux, ey + reach * uy]}
    lever = ["C", "T", "E"]
    if not offset:
        del points["E"]
        lever = ["C", "T"]
    return {"kinepoly": 1, "length_unit": "mm", "points": points, "ground": ["C", "O2"],
            "links": {"crank": ["O2", "A"], "lever": lever},
            "slides": {"slot": {"point": "A", "guide": "lever", "line": [lever[-1] if offset else "C", "T"]}},
            "driver": driver(rpm=rpm, alpha=alpha), "output": {"link": "lever"}}


def block_on_rotating_guide(theta_deg, rpm=100.0, alpha=0.0, share=0.6):
    """Four-bar O2-A-B-O4 whose rocker carries a straight arm O4-G through B; a rod A-D from the
    crank pin ends in a block D sliding on that arm (the Coriolis component appears)."""
    base = four_bar(40.0, 150.0, 110.0, 160.0, theta_deg, rpm=rpm, alpha=alpha)
    p = base["points"]
    (ox, oy), (bx, by) = p["O4"], p["B"]
    length = math.hypot(bx - ox, by - oy)
    ux, uy = (bx - ox) / length, (by - oy) / length
    p["D"] = [ox + share * length * ux, oy + share * length * uy]
    p["G"] = [ox + 3 * length * ux, oy + 3 * length * uy]
    base["links"]["rocker"] = ["O4", "B", "G"]
    base["links"]["rod"] = ["A", "D"]
    base["slides"] = {"block": {"point": "D", "guide": "rocker", "line": ["O4", "G"]}}
    return base


def _crank_rocker_60():
    """The base of the designs of any size (bench/bench_sizes.py, the size limit's tests): crank 20,
    coupler 60, rocker 45, frame 55 (mm), crank at 60°, a crank-rocker (20 + 60 < 45 + 55)."""
    a, b, c, d, t = 20.0, 60.0, 45.0, 55.0, math.radians(60.0)
    ax, ay = a * math.cos(t), a * math.sin(t)
    ex, ey = d - ax, -ay
    dist = math.hypot(ex, ey)
    phi = math.atan2(ey, ex) + math.acos((b * b + dist * dist - c * c) / (2 * b * dist))
    points = {"O2": [0.0, 0.0], "A": [ax, ay], "B": [ax + b * math.cos(phi), ay + b * math.sin(phi)], "O4": [d, 0.0]}
    return {"kinepoly": 1, "length_unit": "mm", "points": points, "ground": ["O2", "O4"],
            "links": {"crank": ["O2", "A"], "coupler": ["A", "B"], "rocker": ["O4", "B"]},
            "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 60, "unit": "rpm"}}}


def one_link(size: int) -> dict:
    design = _crank_rocker_60()
    for i in range(size - 4):
        angle = 2 * math.pi * i / max(size - 4, 1)
        design["points"][f"P{i}"] = [30 + 15 * math.cos(angle), 60 + 15 * math.sin(angle)]
        design["links"]["coupler"].append(f"P{i}")
    return design


def many_links(size: int) -> dict:
    design = _crank_rocker_60()
    last = "B"
    for i in range((size - 4) // 2):
        lx, ly = design["points"][last]
        # A long binary link to the right and a long one down to a pivot: the chain assembles all turn.
        design["points"][f"D{i}"] = [lx + 200.0, ly]
        design["points"][f"G{i}"] = [lx + 200.0, ly - 200.0]
        design["ground"].append(f"G{i}")
        design["links"][f"r{i}"] = [last, f"D{i}"]
        design["links"][f"s{i}"] = [f"G{i}", f"D{i}"]
        last = f"D{i}"
    return design
