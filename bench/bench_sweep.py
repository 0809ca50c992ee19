"""Cycle-sweep speed: prints the figures the README quotes.

Run: python bench/bench_sweep.py   (needs the [test] extra for scipy)

- 3,600-step sweep of the Stephenson six-bar sample (target < 20 ms, goal 2 ms);
- a four-bar sweep through the general path against the bare closed-form four-bar
  equations in numpy over the same angles (target within 3×);
- the numeric cross-check of a whole 3,600-step cycle (target < 1 s);
- per-step ratio against scipy.optimize.fsolve on the same constraint equations
  with finite-difference derivatives (target ≥ 200×, goal 500×).
"""

from __future__ import annotations

import math
import statistics
import sys
import time
from pathlib import Path

import numpy as np
from scipy.optimize import fsolve

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

import kinematics  # noqa: E402
from kinematics.cycle.sweep import sweep, verify_sweep  # noqa: E402
from kinematics.solver.constraints import build_system  # noqa: E402
from kinematics.solver.solve import DrivenSystem  # noqa: E402
from tests.designs import four_bar  # noqa: E402


def best_of(function, repeats=15):
    times = []
    for _ in range(repeats):
        start = time.perf_counter()
        function()
        times.append(time.perf_counter() - start)
    return min(times), statistics.median(times)


def bare_four_bar(a, b, c, d, theta, omega):
    """Freudenstein's closed form for θ3, θ4, then ω3, ω4, α3, α4 (Norton, Design of Machinery), numpy."""
    k1, k2, k3 = d / a, d / c, (a * a - b * b + c * c + d * d) / (2 * a * c)
    k4, k5 = d / b, (c * c - d * d - a * a - b * b) / (2 * a * b)
    cos2, sin2 = np.cos(theta), np.sin(theta)
    big_a, big_b, big_c = cos2 - k1 - k2 * cos2 + k3, -2 * sin2, k1 - (k2 + 1) * cos2 + k3
    big_d, big_f = cos2 - k1 + k4 * cos2 + k5, k1 + (k4 - 1) * cos2 + k5
    t4 = 2 * np.arctan2(-big_b - np.sqrt(big_b ** 2 - 4 * big_a * big_c), 2 * big_a)
    t3 = 2 * np.arctan2(-big_b - np.sqrt(big_b ** 2 - 4 * big_d * big_f), 2 * big_d)
    w3 = a * omega / b * np.sin(t4 - theta) / np.sin(t3 - t4)
    w4 = a * omega / c * np.sin(theta - t3) / np.sin(t4 - t3)
    ca, cb, cd, ce = c * np.sin(t4), b * np.sin(t3), c * np.cos(t4), b * np.cos(t3)
    cc = a * omega ** 2 * cos2 + b * w3 ** 2 * np.cos(t3) - c * w4 ** 2 * np.cos(t4)
    cf = -a * omega ** 2 * sin2 - b * w3 ** 2 * np.sin(t3) + c * w4 ** 2 * np.sin(t4)
    den = ca * ce - cb * cd
    return t3, t4, w3, w4, (cc * cd - ca * cf) / den, (cc * ce - cb * cf) / den


def fsolve_per_step(mech, angles_deg):
    """A straightforward per-angle root-finder on the same equations (finite-difference Jacobian)."""
    driven = DrivenSystem(build_system(mech))
    q = driven.system.x0.reshape(-1)[driven.columns]
    for angle in angles_deg:
        theta = math.radians(angle)
        q = fsolve(lambda z, t=theta: driven.residual(driven.full(z), t), q, xtol=1e-12)
    return q


def main():
    six = kinematics.load_mechanism(ROOT / "samples" / "stacker-transfer-stephenson.json")
    best, median = best_of(lambda: sweep(six, 3600))
    print(f"Stephenson six-bar, 3,600-step sweep: {median * 1e3:.2f} ms median ({best * 1e3:.2f} ms best); "
          f"target < 20 ms, goal 2 ms")
    per_step_sweep = median / 3600

    a, b, c, d = 40.0, 120.0, 100.0, 140.0
    bar = kinematics.load_mechanism(four_bar(a, b, c, d, 30.0))
    angles = np.radians(30.0 + np.arange(3600) * 0.1)
    _, general = best_of(lambda: sweep(bar, 3600))
    _, bare = best_of(lambda: bare_four_bar(a, b, c, d, angles, bar.driver.speed_rad_s))
    print(f"four-bar, 3,600 steps: general path {general * 1e3:.2f} ms, bare closed form {bare * 1e3:.2f} ms, "
          f"ratio {general / bare:.1f}× (target within 3×)")

    result = sweep(six, 3600)
    _, check = best_of(lambda: verify_sweep(result), repeats=3)
    print(f"numeric cross-check of the 3,600-step six-bar cycle: {check:.3f} s (target < 1 s); "
          f"largest difference {max(verify_sweep(result).values()):.1e}")

    sample = result.driver_angle_deg[:200]
    start = time.perf_counter()
    fsolve_per_step(six, sample)
    per_step_fsolve = (time.perf_counter() - start) / len(sample)
    print(f"scipy.optimize.fsolve per step: {per_step_fsolve * 1e6:.0f} µs; sweep per step "
          f"{per_step_sweep * 1e6:.2f} µs; ratio {per_step_fsolve / per_step_sweep:.0f}× (target ≥ 200×, goal 500×)")


if __name__ == "__main__":
    main()
