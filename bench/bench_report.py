"""Review-report speed: prints the figure the README quotes.

Run: QT_QPA_PLATFORM=offscreen python bench/bench_report.py

- the design-review report of the Stephenson six-bar sample with three analysis angles and a
  3,600-step cycle, assembled, painted and bound into a PDF (target < 5 s), with its stages apart.
"""

from __future__ import annotations

import os
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))
os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

from PySide6.QtGui import QGuiApplication  # noqa: E402

import kinematics  # noqa: E402
from app.review import _bound, _painted, write_review  # noqa: E402
from kinematics.review import build_report  # noqa: E402

SAMPLE = ROOT / "samples" / "stacker-transfer-stephenson.json"
ANGLES = (30.0, 150.0, 270.0)
STEPS = 3600
TARGET_S = 5.0


def main() -> int:
    application = QGuiApplication([])
    mechanism, source = kinematics.load_mechanism(SAMPLE), SAMPLE.read_bytes()
    with tempfile.TemporaryDirectory() as folder:
        write_review(mechanism, source, Path(folder) / "warm-up.pdf", steps=360, angles_deg=ANGLES)
        times = []
        for _ in range(3):
            start = time.perf_counter()
            write_review(mechanism, source, Path(folder) / "review.pdf", file_name=SAMPLE.name, steps=STEPS,
                         angles_deg=ANGLES)
            times.append(time.perf_counter() - start)
        start = time.perf_counter()
        report = build_report(mechanism, source, SAMPLE.name, steps=STEPS, angles_deg=ANGLES)
        assembled = time.perf_counter()
        painted = _painted(report, "A4", None)
        painting = time.perf_counter()
        _bound(report, painted, str(Path(folder) / "bound.pdf"))
        bound = time.perf_counter()
        size = (Path(folder) / "review.pdf").stat().st_size
    best = min(times)
    print(f"review report, Stephenson six-bar, {len(ANGLES)} angles, {STEPS:,}-step cycle, {len(report.sheets)} pages, "
          f"{size / 1e6:.2f} MB: best {best:.2f} s of {len(times)} (target < {TARGET_S:g} s) "
          f"{'OK' if best < TARGET_S else 'SLOW'}")
    print(f"  assembly {assembled - start:.2f} s, painting {painting - assembled:.2f} s, "
          f"outline and metadata {bound - painting:.2f} s")
    del application
    return 0 if best < TARGET_S else 1


if __name__ == "__main__":
    sys.exit(main())
