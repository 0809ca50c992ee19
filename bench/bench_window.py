"""Time the drafting window: per drag frame, start-up, and memory.

Run: ``QT_QPA_PLATFORM=offscreen python bench/bench_window.py [FILE] [--frames N] [--rounds R] [--forces]``

A frame is what the window does for one mouse move, as it does for a user: the
move is handled (solve, construct, the scene items moved in place, the table,
and, at most ten times a second, the cycle sweep for the paths), then the event
loop runs until it is idle, which repaints each of the three views once at
1600x1000. Prints median and 95th-percentile milliseconds per frame, with the
phases apart, for a joint drag (a design edit) and a driver turn, round after
round: the machine is shared, so the rounds show how much a figure varies, and
the quickest round's median is the figure to compare with the target.
Then the memory after a minute of dragging, and after a second minute. With ``--forces`` the
third pane shows the force polygon (built by construction and cross-checked with the numeric
forces every frame) in place of the acceleration polygon: the frame cost of the forces, live.
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

from PySide6.QtCore import QEvent, QObject, QPointF, Qt  # noqa: E402
from PySide6.QtTest import QTest  # noqa: E402
from PySide6.QtWidgets import QApplication  # noqa: E402

import app.document  # noqa: E402
from app.window import MainWindow  # noqa: E402

ROOT = Path(__file__).resolve().parent.parent
DEFAULT_FILE = ROOT / "samples" / "stacker-transfer-stephenson.json"
LEFT, NONE = Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier
PHASES = {"core": [], "sweep": [], "window update": [], "event loop (updates, one repaint)": []}  # ms per call


def _timed(phase, function):
    def timed(*args, **kwargs):
        began = time.perf_counter()
        try:
            return function(*args, **kwargs)
        finally:
            PHASES[phase].append(1e3 * (time.perf_counter() - began))
    return timed


# The core (diagnose + solve + construct; the cycle sweep) and the window's refresh (scene
# items, table, fields), timed apart from the whole frame.
app.document.analyse = _timed("core", app.document.analyse)
app.document.cycle = _timed("sweep", app.document.cycle)
MainWindow.refresh = _timed("window update", MainWindow.refresh)


class PaintCounter(QObject):
    """Counts the paint events of the three views' viewports."""

    def __init__(self, viewports):
        super().__init__()
        self.viewports = set(viewports)
        self.count = 0

    def eventFilter(self, watched, event):
        if event.type() == QEvent.Type.Paint:
            self.count += 1
        return False


def percentile(values, fraction):
    ordered = sorted(values)
    return ordered[min(len(ordered) - 1, int(round(fraction * (len(ordered) - 1))))]


def timed_drag(window, name, frames, radius_mm, counter):
    """Drag joint ``name`` round a circle, one mouse move per frame; ms per frame, paints per frame,
    and the share of frames whose move was refused (the linkage could not assemble there)."""
    qt = QApplication.instance()
    view = window.drawings.space_view
    start = window.drawings.space_scene.joint_pos(name)
    QTest.mousePress(view.viewport(), LEFT, NONE, view.mapFromScene(start))
    qt.processEvents()
    for values in PHASES.values():
        values.clear()
    times, counter.count, refused = [], 0, 0
    for i in range(frames):
        angle = 2.0 * math.pi * i / frames
        offset = QPointF(radius_mm * (1 - math.cos(angle)), radius_mm * math.sin(angle))
        began = time.perf_counter()
        QTest.mouseMove(view.viewport(), view.mapFromScene(start + offset))
        handled = time.perf_counter()
        qt.processEvents()  # what the event loop does next: deliver the updates, paint once
        ended = time.perf_counter()
        PHASES["event loop (updates, one repaint)"].append(1e3 * (ended - handled))
        times.append(1e3 * (ended - began))
        refused += "cannot" in window.note
    QTest.mouseRelease(view.viewport(), LEFT, NONE, view.mapFromScene(start))
    qt.processEvents()
    return times, counter.count / frames, refused / frames


def report(label, times, paints, refused) -> float:
    """Print a drag's figures; returns its median frame, ms."""
    print(f"{label}: median {statistics.median(times):.1f} ms, p95 {percentile(times, 0.95):.1f} ms "
          f"per frame over {len(times)} frames ({paints:.2f} paints of the three views a frame, "
          f"{100 * refused:.0f}% of moves refused)")
    for phase, values in PHASES.items():
        if values:
            share = len(values) / len(times)
            print(f"    {phase}: median {statistics.median(values):.2f} ms, p95 {percentile(values, 0.95):.2f} ms"
                  + ("" if abs(share - 1.0) < 1e-9 else f", in {100 * share:.0f}% of frames"))
    return statistics.median(times)


def drag_for(window, name, seconds, radius_mm):
    """Keep dragging joint ``name`` for ``seconds`` (the memory test)."""
    qt = QApplication.instance()
    view = window.drawings.space_view
    start = window.drawings.space_scene.joint_pos(name)
    QTest.mousePress(view.viewport(), LEFT, NONE, view.mapFromScene(start))
    ends, i = time.perf_counter() + seconds, 0
    while time.perf_counter() < ends:
        angle = 2.0 * math.pi * i / 120
        QTest.mouseMove(view.viewport(), view.mapFromScene(
            start + QPointF(radius_mm * (1 - math.cos(angle)), radius_mm * math.sin(angle))))
        qt.processEvents()
        i += 1
    QTest.mouseRelease(view.viewport(), LEFT, NONE, view.mapFromScene(start))
    qt.processEvents()


def resident_mb() -> float:
    """Resident memory now (Linux /proc), or the peak where /proc is not there."""
    try:
        with open("/proc/self/statm") as statm:
            return int(statm.read().split()[1]) * os.sysconf("SC_PAGE_SIZE") / 2**20
    except OSError:
        return resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024.0


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("file", nargs="?", default=str(DEFAULT_FILE))
    parser.add_argument("--frames", type=int, default=240)
    parser.add_argument("--rounds", type=int, default=5)
    parser.add_argument("--forces", action="store_true",
                        help="show the force polygon in the third pane while dragging (a design with mass data)")
    parser.add_argument("--memory-minutes", type=float, default=2.0,
                        help="minutes of dragging for the memory figures (0: skip)")
    options = parser.parse_args(argv)
    qt = QApplication.instance() or QApplication(["bench"])
    window = MainWindow()
    window.open_path(options.file)
    window.resize(1600, 1000)
    window.show()
    qt.processEvents()
    # Free dragging: with snapping on, most mouse moves stay on one grid node and change nothing.
    window.snapping.setChecked(False)
    if options.forces:
        window.drawings.show_forces(True)
        qt.processEvents()
        if window.drawings.force_polygon() is None:
            parser.error(f"{options.file}: no force polygon at this pose ({window.drawings.force[2]})")
    print(f"start-up (imports, window, open, first paint): {1e3 * (time.perf_counter() - START):.0f} ms")
    drawings = window.drawings
    third = drawings.force_view if options.forces else drawings.acceleration_view
    counter = PaintCounter(v.viewport() for v in (drawings.space_view, drawings.velocity_view, third))
    for viewport in counter.viewports:  # on the viewports alone: an application-wide filter slows every event
        viewport.installEventFilter(counter)
    mech = window.document.mechanism
    size_mm = 1e3 * mech.size * mech.metres_per_unit
    moving = [p for p in mech.points if p not in mech.ground and p not in mech.links[mech.driver.link]]
    crank_pin = next(p for p in mech.links[mech.driver.link] if p != mech.driver.pivot)
    # A circle long enough that every frame's mouse move is a pixel or more (as a real one is).
    mm_per_pixel = 1.0 / drawings.space_view.transform().m11()
    radius_mm = max(0.03 * size_mm, 2.0 * options.frames / (2.0 * math.pi) * mm_per_pixel)
    drags, turns = [], []
    for round_ in range(1, options.rounds + 1):
        print(f"round {round_} of {options.rounds}, {Path(options.file).name}"
              f"{' with the force polygon' if options.forces else ''}:")
        drags.append(report(f"  joint drag ({moving[0]}, design edit)",
                            *timed_drag(window, moving[0], options.frames, radius_mm, counter)))
        turns.append(report(f"  driver turn ({crank_pin})",
                            *timed_drag(window, crank_pin, options.frames, 0.2 * size_mm, counter)))
    # Other work on a shared machine only ever slows a round down: the quickest round is the closest
    # to what the program itself costs.
    print(f"median frame, quickest round of {options.rounds}: joint drag {min(drags):.1f} ms, "
          f"driver turn {min(turns):.1f} ms (slowest round: {max(drags):.1f} ms, {max(turns):.1f} ms)")
    if options.memory_minutes > 0:
        half = 30.0 * options.memory_minutes
        drag_for(window, moving[0], half, radius_mm)
        first = resident_mb()
        drag_for(window, moving[0], half, radius_mm)
        print(f"resident memory after {half:.0f} s of dragging: {first:.0f} MB; after {2 * half:.0f} s: "
              f"{resident_mb():.0f} MB")
    window.document.undo_stack.setClean()
    window.close()
    return 0


if __name__ == "__main__":
    sys.exit(main())
