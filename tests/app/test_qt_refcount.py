"""Regression guard for the PySide6 6.12.0 crash (see PITFALLS.md and the pin in pyproject.toml).

With that release every call of a Qt method returning nothing dropped one
reference to None; a few thousand calls later Python aborted with
"Fatal Python error: none_dealloc". Measured on 6.11.3: no change over
400,000 calls. This test makes 100,000 such calls; with the bug the count
would fall by 100,000, so a small allowance for the interpreter's own
traffic cannot hide it.
"""

import sys

from PySide6.QtCore import QLineF
from PySide6.QtWidgets import QGraphicsLineItem, QGraphicsRectItem, QGraphicsScene

CALLS = 100_000


def test_void_qt_calls_keep_the_reference_count_of_none(qapp):
    scene = QGraphicsScene()
    rect, line = QGraphicsRectItem(0, 0, 1, 1), QGraphicsLineItem()
    scene.addItem(rect)
    scene.addItem(line)
    segment = QLineF(0, 0, 1, 1)
    rect.setPos(0.0, 0.0)  # warm up: first calls may cache wrappers
    before = sys.getrefcount(None)
    for i in range(CALLS // 4):
        rect.setPos(float(i), 0.0)
        rect.setVisible(True)
        line.setLine(segment)
        rect.update()
    after = sys.getrefcount(None)
    assert abs(after - before) < 100, f"None's reference count moved by {after - before} over {CALLS} void calls"
