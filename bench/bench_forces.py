"""Forces speed: prints the figures the README quotes.

Run: python bench/bench_forces.py

On the Stephenson six-bar sample with every link of steel bars (tests/masses.py), gravity and a
process force at the transfer point:
- one pose's forces, ``forces(solve(...))`` less the solve (target < 0.5 ms, so a drag frame
  keeps its budget), also on a new Mechanism each call as a drag makes (the layout is cached
  by the names, the mass arrays are made again);
- the forces of a 3,600-step cycle against its kinematic sweep (target ≤ 2×).
"""

from __future__ import annotations

import statistics
import sys
import time
from dataclasses import replace
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

import kinematics  # noqa: E402
from kinematics.dynamics import drive_summary, forces, sweep_forces  # noqa: E402
from tests.masses import Load, steel  # noqa: E402


def best_of(function, repeats=15):
    times = []
    for _ in range(repeats):
        start = time.perf_counter()
        function()
        times.append(time.perf_counter() - start)
    return min(times), statistics.median(times)


def main():
    bare = kinematics.load_mechanism(ROOT / "samples" / "stacker-transfer-stephenson.json")
    mech = steel(bare, gravity=(0.0, -9.80665), loads=[Load("transfer", point="P", force_value=(-40.0, -25.0),
                                                            over_deg=(60.0, 200.0))])
    solution = kinematics.solve(mech, 75.0)
    forces(solution)
    best, median = best_of(lambda: forces(solution), repeats=200)
    print(f"one pose's forces (Stephenson, 5 steel links): best {best * 1e3:.3f} ms, median {median * 1e3:.3f} ms "
          "(target < 0.5 ms)")

    # A drag makes a new Mechanism every frame: the forces of each one's first solution, the
    # mass arrays made anew (the layout and the block plan come from their caches).
    frames = [kinematics.solve(replace(mech, points={**mech.points, "P": (240.0 + 0.01 * k, 290.0)}), 75.0)
              for k in range(60)]
    times = []
    for frame in frames:
        start = time.perf_counter()
        forces(frame)
        times.append(time.perf_counter() - start)
    print(f"  on a new Mechanism each time (a drag frame): best {min(times) * 1e3:.3f} ms, "
          f"median {statistics.median(times) * 1e3:.3f} ms")

    cycle = kinematics.sweep(mech, 3600)
    sweep_best, sweep_median = best_of(lambda: kinematics.sweep(mech, 3600))
    force_best, force_median = best_of(lambda: sweep_forces(cycle))
    result = sweep_forces(cycle)
    print(f"3,600-step cycle: kinematic sweep best {sweep_best * 1e3:.2f} ms, forces best {force_best * 1e3:.2f} ms "
          f"= {force_best / sweep_best:.2f}× (target ≤ 2×; medians {sweep_median * 1e3:.2f} / "
          f"{force_median * 1e3:.2f} ms)")
    print(f"  power balance over the cycle: largest relative difference {result.max_relative_difference:.2e}")
    summary = drive_summary(result)
    print(f"  peak torque {summary.peak_torque_n_m:.3f} N·m at {summary.peak_torque_angle_deg:.1f}°, "
          f"ΔE {summary.energy_fluctuation_j:.4f} J, flywheel {summary.flywheel_inertia_kg_m2:.4f} kg·m² (C_s 0.02)")


if __name__ == "__main__":
    main()
