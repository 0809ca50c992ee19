"""Count the instructions of a window frame, a figure the host's load does not change.

Run (valgrind installed)::

    PYTHONHASHSEED=0 QT_QPA_PLATFORM=offscreen valgrind --tool=callgrind --instr-atstart=no \\
        python bench/bench_window_instructions.py drag|turn

Drags joint B of the Stephenson sample (``drag``, a design edit) or the crank pin A (``turn``, a driver
turn) round a circle at 1600x1000 for 70 frames, the cycle sweeps held back, and switches callgrind's
instrumentation on for frames 10 to 70 only (start-up and the first frames' caches left out). Divide
callgrind's "Collected" figure by 60 for the instructions of one frame. A fixed hash seed keeps runs
within a few tenths of a percent of each other; without it they vary by about 2.5 %.
"""

from __future__ import annotations

import math
import os
import subprocess
import sys
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import app.throttle  # noqa: E402

FRAMES, COUNTED_FROM = 70, 10
SAMPLE = Path(__file__).resolve().parents[1] / "samples" / "stacker-transfer-stephenson.json"


def _held_sweeps():
    """Throttles that never fire in the run: the frame measured is the drag's, not the sweep's."""
    plain = app.throttle.Throttle.__init__

    def held(self, *args, **kwargs):
        kwargs["interval_ms"] = 10 ** 8
        plain(self, *args, **kwargs)

    app.throttle.Throttle.__init__ = held


def _instrument(on: bool) -> None:
    subprocess.run(["callgrind_control", "-i", "on" if on else "off", str(os.getpid())], capture_output=True)


def main(which: str) -> None:
    _held_sweeps()
    from PySide6.QtCore import QPointF, Qt
    from PySide6.QtTest import QTest
    from PySide6.QtWidgets import QApplication

    from app.window import MainWindow

    qt = QApplication.instance() or QApplication([])
    window = MainWindow()
    window.open_path(str(SAMPLE))
    window.resize(1600, 1000)
    window.show()
    for _ in range(5):
        qt.processEvents()
    window.snapping.setChecked(False)
    view = window.drawings.space_view
    mech = window.document.mechanism
    size_mm = 1e3 * mech.size * mech.metres_per_unit
    name, radius = ("B", 0.03 * size_mm) if which == "drag" else ("A", 0.2 * size_mm)
    start = window.drawings.space_scene.joint_pos(name)
    QTest.mousePress(view.viewport(), Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier,
                     view.mapFromScene(start))
    qt.processEvents()
    for i in range(FRAMES):
        if i == COUNTED_FROM:
            _instrument(True)
        turn = 2 * math.pi * i / FRAMES
        offset = QPointF(radius * (1 - math.cos(turn)), radius * math.sin(turn))
        QTest.mouseMove(view.viewport(), view.mapFromScene(start + offset))
        qt.processEvents()
    _instrument(False)
    window.document.undo_stack.setClean()  # no question about saving on the way out
    print(f"{which}: divide callgrind's Collected figure by {FRAMES - COUNTED_FROM}")
    sys.stdout.flush()
    os._exit(0)


if __name__ == "__main__":
    main(sys.argv[1] if len(sys.argv) > 1 else "drag")
