"""Named test mechanisms, built from their defining dimensions (mm, degrees)."""

import math
import os

SAMPLES = __import__("pathlib").Path(__file__).resolve().parents[2] / "samples"
# KINEPOLY_FULL=1 runs every property test on ten times as many cases (randomised, see tests/conftest.py).
CASE_FACTOR = 10 if os.environ.get("KINEPOLY_FULL") else 1


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
