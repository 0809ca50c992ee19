"""Time the drafting window: per drag frame (solve + construct + scene update +
repaint of the three views at 1600x1000), start-up, and memory.

Run: ``QT_QPA_PLATFORM=offscreen python bench/bench_window.py [FILE] [--frames N]``
Prints median and 95th-percentile milliseconds per frame, for a joint drag (a
design edit) and for a driver turn.
"""

from __future__ import annotations

import argparse
import math
import os
import resource
import statistics
import sys
import time
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
START = time.perf_counter()

from PySide6.QtCore import QPointF, Qt  # noqa: E402
from PySide6.QtTest import QTest  # noqa: E402
from PySide6.QtWidgets import QApplication  # noqa: E402

import app.document  # noqa: E402
import kinematics  # noqa: E402
from app.window import MainWindow  # noqa: E402

PHASES = {"core": [], "sweep": [], "window update": [], "repaint": []}  # ms per call


def _timed(phase, function):
    def timed(*args, **kwargs):
        began = time.perf_counter()
        try:
            return function(*args, **kwargs)
        finally:
            PHASES[phase].append(1e3 * (time.perf_counter() - began))
    return timed


# The core (diagnose + solve + construct, and the cycle sweep) and the window's refresh
# (scene items, table, steps, fields), timed apart from the whole frame.
app.document.analyse = _timed("core", app.document.analyse)
app.document.cycle = _timed("sweep", app.document.cycle)
MainWindow.refresh = _timed("window update", MainWindow.refresh)

ROOT = Path(__file__).resolve().parent.parent
DEFAULT_FILE = ROOT / "samples" / "baler-tamper-watt.json"


def percentile(values, fraction):
    ordered = sorted(values)
    return ordered[min(len(ordered) - 1, int(round(fraction * (len(ordered) - 1))))]


def repaint(window):
    began = time.perf_counter()
    for view in (window.drawings.space_view, window.drawings.velocity_view, window.drawings.acceleration_view):
        view.viewport().repaint()
    window.table.viewport().repaint()
    PHASES["repaint"].append(1e3 * (time.perf_counter() - began))


def timed_drag(window, name, frames, radius_mm):
    """Drag joint ``name`` round a small circle, one mouse move per frame; ms per frame."""
    view = window.drawings.space_view
    start = window.drawings.space_scene.joints[name].dot.pos()
    QTest.mousePress(view.viewport(), Qt.LeftButton, Qt.NoModifier, view.mapFromScene(start))
    times = []
    for values in PHASES.values():
        values.clear()
    for i in range(frames):
        angle = 6.283185307179586 * i / frames
        offset = QPointF(radius_mm * (1 - math.cos(angle)), radius_mm * math.sin(angle))
        began = time.perf_counter()
        QTest.mouseMove(view.viewport(), view.mapFromScene(start + offset))
        repaint(window)
        times.append(1e3 * (time.perf_counter() - began))
    QTest.mouseRelease(view.viewport(), Qt.LeftButton, Qt.NoModifier, view.mapFromScene(start))
    return times


def report(label, times):
    print(f"{label}: median {statistics.median(times):.1f} ms, p95 {percentile(times, 0.95):.1f} ms "
          f"per frame over {len(times)} frames")
    for phase, values in PHASES.items():
        if values:
            print(f"    {phase}: median {statistics.median(values):.1f} ms, p95 {percentile(values, 0.95):.1f} ms")


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("file", nargs="?", default=str(DEFAULT_FILE))
    parser.add_argument("--frames", type=int, default=120)
    options = parser.parse_args(argv)
    app = QApplication.instance() or QApplication(["bench"])
    window = MainWindow()
    window.open_path(options.file)
    window.resize(1600, 1000)
    window.show()
    app.processEvents()
    print(f"start-up (imports, window, open, first paint): {1e3 * (time.perf_counter() - START):.0f} ms")
    mech = window.document.mechanism
    size_mm = 1e3 * mech.size * mech.metres_per_unit
    moving = [p for p in mech.points if p not in mech.ground and p not in mech.links[mech.driver.link]]
    report(f"joint drag ({moving[0]}, design edit)", timed_drag(window, moving[0], options.frames, 0.03 * size_mm))
    crank_pin = next(p for p in mech.links[mech.driver.link] if p != mech.driver.pivot)
    report(f"driver turn ({crank_pin})", timed_drag(window, crank_pin, options.frames, 0.2 * size_mm))
    rss = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024.0
    print(f"peak memory (max RSS): {rss:.0f} MB; kinematics {kinematics.__name__}, Qt platform "
          f"{QApplication.platformName()}")
    window.document.undo_stack.setClean()
    window.close()
    return 0


if __name__ == "__main__":
    sys.exit(main())
