"""Link lengths on demand: View > Link lengths draws each link side's length, joint to joint, as a
dimension parallel to it, in the tool bar's length unit, following the pose and the edits."""

import json
import math
from pathlib import Path

import pytest
from PySide6.QtCore import Qt
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication

from kinematics.drawing import Arrow, Ref, Text
from kinematics.drawing.dimensions import dimensions_pane
from kinematics.drawing.symbols import Symbols

SAMPLE = Path(__file__).resolve().parents[2] / "samples" / "baler-tamper-watt.json"


def _items(window):
    return [item for item in window.drawings.space_scene.items()
            if isinstance(item.data(0), Ref) and item.data(0).kind == "dimension"]


def test_ctrl_shift_l_shows_every_bar_length_in_the_chosen_unit(make_window):
    window = make_window(json.loads(SAMPLE.read_text(encoding="utf-8")))
    assert not _items(window)
    QTest.keyClick(window, Qt.Key_L, Qt.ControlModifier | Qt.ShiftModifier)
    QApplication.processEvents()
    assert window.dimensions_action.isChecked() and _items(window)
    mech, solution = window.document.mechanism, window.document.solution
    sheet = dimensions_pane(mech, solution, Symbols(), "in")
    texts = {p.ref.name: p.text for p in sheet.primitives if isinstance(p, Text)}
    # The crank O2-A joint to joint, from the file's points (a rigid link keeps its length in every
    # pose); 1 in = 25.4 mm exactly.  # common practice
    (x0, y0), (x1, y1) = mech.points["O2"], mech.points["A"]
    crank = next(v for k, v in texts.items() if k.startswith("crank:"))
    assert float(crank.split()[0]) == pytest.approx(math.hypot(x1 - x0, y1 - y0) / 25.4, rel=5e-4)
    assert crank.endswith(" in")
    # Each dimension's arrows run parallel to the side they measure.
    for name in texts:
        link, joints = name.split(":")
        p, q = joints.split("-")
        (ax, ay), (bx, by) = solution.position(p), solution.position(q)
        for arrow in (a for a in sheet.primitives if isinstance(a, Arrow) and a.ref.name == name):
            (sx, sy), (ex, ey) = arrow.start, arrow.end
            assert abs((ex - sx) * (by - ay) - (ey - sy) * (bx - ax)) <= 1e-9 * math.hypot(ex - sx, ey - sy)
    QTest.keyClick(window, Qt.Key_L, Qt.ControlModifier | Qt.ShiftModifier)
    QApplication.processEvents()
    assert not _items(window)
