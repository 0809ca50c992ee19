"""What a swept cycle measures besides its peaks: the transmission angle of each
group that has one, the output's limit positions, travel and time ratio, and
which samples lie clear of a rocking driver's dead points (shared by the peaks
table and the window's cycle plot, so both leave out the same samples)."""

from __future__ import annotations

import numpy as np

from ..groups.decompose import decompose
from ..model.mechanism import GROUND, Mechanism
from .sweep import Sweep

# Speeds grow without bound towards a dead point of the driver: a rocking driver's peaks and plot
# scale leave out this share of its swept samples at each end.
DEAD_POINT_SHARE = 0.03


def dead_point_trim(count: int, full_turn: bool) -> int:
    """How many of a sweep's ``count`` samples at each end lie too near a dead point of the driver:
    none for a full turn or a sweep too short to trim, else DEAD_POINT_SHARE of them, at least one.

    >>> [dead_point_trim(n, False) for n in (2, 3, 100, 360)]
    [0, 1, 3, 11]
    """
    end = max(1, round(DEAD_POINT_SHARE * count))
    return 0 if full_turn or count <= 2 * end else end


def clear_of_dead_points(result: Sweep) -> np.ndarray:
    """(N,) True for the samples :func:`dead_point_trim` keeps."""
    clear = np.ones(len(result.driver_angle_deg), bool)
    end = dead_point_trim(len(clear), result.full_turn)
    if end:
        clear[:end] = clear[-end:] = False
    return clear


def transmission_angles(mech: Mechanism, result: Sweep) -> dict:
    """Label -> (N,) transmission angle in degrees (0–180°), for each group that has one (RRR: at B)."""
    angles = {}
    for group in decompose(mech).groups:
        angles.update(group.transmission_angles(result))
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


def rate_zeros(angles_deg: np.ndarray, rate: np.ndarray, full_turn: bool) -> tuple:
    """Where a swept rate passes through zero: (indices of the sample at or before each zero, its
    driver angle in degrees by linear interpolation between the two swept poses either side).

    A sample exactly at zero is one zero (at its own angle), not two crossings; a full turn runs on
    from its last sample to its first.

    >>> rate_zeros(np.array([0.0, 90.0, 180.0, 270.0]), np.array([1.0, -1.0, 0.0, 1.0]), True)
    ([0, 2], [45.0, 180.0])
    """
    rate = np.asarray(rate, float)
    following = np.roll(rate, -1)
    crossing = rate * following < 0.0
    if not full_turn:
        crossing[-1] = False
    zero = rate == 0.0
    before = np.roll(zero, 1)
    if not full_turn:
        before[0] = False
    at_zero = zero & ~before  # a run of exact zeros is one zero, at its start
    last_step = angles_deg[1] - angles_deg[0] if len(angles_deg) > 1 else 0.0
    step = np.diff(angles_deg, append=angles_deg[0] + last_step * len(angles_deg))
    indices = [int(i) for i in np.flatnonzero(crossing | at_zero)]
    return indices, [float(angles_deg[i]) if at_zero[i] else
                     float(angles_deg[i] + step[i] * rate[i] / (rate[i] - following[i])) for i in indices]


def output_motion(mech: Mechanism, result: Sweep) -> dict | None:
    """Limit positions, swing or stroke, and time ratio of the output named in the file."""
    found = output_coordinate(mech, result)
    if found is None:
        return None
    name, values, unit, rate, _ = found
    angles = result.driver_angle_deg
    turn, limits = rate_zeros(angles, rate, result.full_turn)
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
