"""Force polygon speed: the graphical force construction of one pose.

Run: python bench/bench_force_polygon.py

On the Stephenson six-bar sample with every link of steel bars (tests/masses.py), gravity and a
process force at the transfer point: ``force_polygon(construction, numeric)`` with the
construction and the numeric forces made beforehand (the construction alone, as a drag frame would
redo it after the kinematic polygons), and with the numeric forces computed inside for the
cross-check. Target: a few ms, well inside a drag frame's budget.
"""

from __future__ import annotations

import statistics
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

import kinematics  # noqa: E402
from kinematics.dynamics import forces  # noqa: E402
from kinematics.forcepolygon import force_polygon  # noqa: E402
from tests.masses import Load, steel  # noqa: E402


def best_of(function, repeats):
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
    construction = kinematics.construct(solution)
    numeric = forces(solution)
    made = force_polygon(construction, numeric)
    best, median = best_of(lambda: force_polygon(construction, numeric), 200)
    print(f"force polygon (Stephenson, 5 steel links, {len(made.polygon.steps)} steps): best {best * 1e3:.3f} ms, "
          f"median {median * 1e3:.3f} ms")
    best, median = best_of(lambda: force_polygon(construction), 200)
    print(f"  with the numeric forces for the cross-check: best {best * 1e3:.3f} ms, median {median * 1e3:.3f} ms")
    print(f"  cross-check: largest relative difference {made.max_relative_difference:.2e} at {made.where}")


if __name__ == "__main__":
    main()
