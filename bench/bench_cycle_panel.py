"""Time the cycle plot panel: per new sweep (a joint dragged), the data update
alone and with a repaint of the plot; and how long the window's thread waits
while a fine sweep runs on the worker.

Run: ``QT_QPA_PLATFORM=offscreen python bench/bench_cycle_panel.py [FILE] [--frames N] [--steps N]``
Prints median and 95th-percentile milliseconds per update.
"""

from __future__ import annotations

import argparse
import os
import statistics
import sys
import time
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import numpy as np  # noqa: E402
from PySide6.QtCore import QElapsedTimer, QTimer  # noqa: E402
from PySide6.QtWidgets import QApplication  # noqa: E402

import kinematics  # noqa: E402
from app.cycle_panel import CyclePanel  # noqa: E402
from app.cycle_series import Quantity  # noqa: E402

ROOT = Path(__file__).resolve().parent.parent
DEFAULT_FILE = ROOT / "samples" / "stacker-transfer-stephenson.json"
TICK_MS = 5


def percentile(values, fraction):
    ordered = sorted(values)
    return ordered[min(len(ordered) - 1, int(round(fraction * (len(ordered) - 1))))]


def dragged_sweeps(mech, frames, steps):
    """Sweeps of the design with its first moving non-crank joint led round a small circle."""
    name = next(p for p in mech.points if p not in mech.ground and p not in mech.links[mech.driver.link])
    x0, y0 = mech.points[name]
    radius = 0.01 * mech.size
    sweeps = []
    for i in range(frames):
        angle = 2 * np.pi * i / frames
        moved = kinematics.move_point(mech, name, (x0 + radius * (1 - np.cos(angle)), y0 + radius * np.sin(angle)))
        sweeps.append(kinematics.sweep(moved, steps))
    return name, sweeps


def timed_updates(app, panel, sweeps, paint):
    times = []
    for result in sweeps:
        began = time.perf_counter()
        panel.set_sweep(result)
        panel.set_angle(float(result.driver_angle_deg[len(result.driver_angle_deg) // 3]))
        if paint:
            panel.graphics.viewport().repaint()
            panel.peaks.repaint()
        times.append(1e3 * (time.perf_counter() - began))
    return times


def longest_wait_ms(app, panel, steps):
    """Longest gap between 5 ms timer ticks on the window's thread while a fine sweep of ``steps`` runs."""
    gaps, clock = [], QElapsedTimer()
    ticker = QTimer()
    ticker.setInterval(TICK_MS)
    ticker.timeout.connect(lambda: (gaps.append(clock.restart())))
    clock.start()
    ticker.start()
    began = time.perf_counter()
    job = panel.start_fine_sweep(steps)
    while job.isRunning() or panel.job is not None:
        app.processEvents()
    took = 1e3 * (time.perf_counter() - began)
    ticker.stop()
    return took, max(gaps[1:] or [0])


def report(label, times):
    print(f"{label}: median {statistics.median(times):.2f} ms, p95 {percentile(times, 0.95):.2f} ms "
          f"over {len(times)} updates")


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("file", nargs="?", default=str(DEFAULT_FILE))
    parser.add_argument("--frames", type=int, default=200)
    parser.add_argument("--steps", type=int, default=360)
    parser.add_argument("--fine", type=int, default=36_000)
    options = parser.parse_args(argv)
    app = QApplication.instance() or QApplication(["bench"])
    mech = kinematics.load_mechanism(options.file)
    name, sweeps = dragged_sweeps(mech, options.frames, options.steps)
    panel = CyclePanel()
    panel.resize(1100, 420)
    panel.show()
    panel.set_sweep(sweeps[-1])
    app.processEvents()
    print(f"{Path(options.file).name}, {options.steps} steps, joint {name} dragged; panel 1100x420, "
          f"Qt platform {QApplication.platformName()}")
    for chosen in (panel.chosen, [Quantity(f, "magnitude", p) for p in mech.points if p not in mech.ground
                                  for f in ("velocity", "acceleration")]):
        panel.choose(chosen)
        app.processEvents()
        labels = f"{len(chosen)} curves in {len(panel.plots)} rows"
        report(f"new sweep, data only ({labels})", timed_updates(app, panel, sweeps, paint=False))
        report(f"new sweep + repaint ({labels})", timed_updates(app, panel, sweeps, paint=True))
    took, gap = longest_wait_ms(app, panel, options.fine)
    print(f"fine sweep of {options.fine} steps on the worker: {took:.0f} ms, longest wait of the window's "
          f"thread meanwhile {gap} ms (timer every {TICK_MS} ms)")
    return 0


if __name__ == "__main__":
    sys.exit(main())
