"""The window's cycle sweeps run off its thread: a drag frame never waits for one, and a sweep that
a newer design overtook is never shown."""

import threading

from PySide6.QtCore import QPointF, Qt
from PySide6.QtTest import QTest

import app.document as document_module
from kinematics import move_point
from tests.designs import CLAW_FEED

HOLD_S = 10.0  # a slow sweep's longest hold: far beyond a frame, short enough not to hang the suite


def _slow_cycle(monkeypatch):
    """Make every sweep wait for ``release`` (set by the test); ``started`` is set as one begins."""
    started, release, swept = threading.Event(), threading.Event(), []
    real = document_module.cycle

    def slow(mechanism):
        started.set()
        release.wait(HOLD_S)
        swept.append(mechanism)  # a sweep the window's thread waited for would be here when it returns
        return real(mechanism)

    monkeypatch.setattr(document_module, "cycle", slow)
    return started, release, swept


def test_a_drag_frame_returns_while_a_slow_sweep_runs(make_window, monkeypatch, qtbot):
    window = make_window(CLAW_FEED)
    doc = window.document
    window.snapping.setChecked(False)
    started, release, swept = _slow_cycle(monkeypatch)
    view = window.drawings.space_view
    start = window.drawings.space_scene.joint_pos("B")
    QTest.mousePress(view.viewport(), Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier,
                     view.mapFromScene(start))
    before = doc.mechanism
    QTest.mouseMove(view.viewport(), view.mapFromScene(start + QPointF(0.5, -0.3)))
    assert doc.mechanism is not before, "the frame moved the design"
    assert started.wait(HOLD_S), "the frame asked for a sweep"
    assert not swept and doc.sweep_behind, "the frame returned while its sweep was still running"
    QTest.mouseMove(view.viewport(), view.mapFromScene(start + QPointF(1.0, -0.6)))
    QTest.mouseRelease(view.viewport(), Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier,
                       view.mapFromScene(start + QPointF(1.0, -0.6)))
    assert not swept, "the drag's end did not wait for the sweep to finish either"
    release.set()
    final = doc.mechanism
    qtbot.waitUntil(lambda: not doc.sweep_behind, timeout=int(HOLD_S * 1000))
    assert doc.sweep.mechanism is final, "the sweep shown at last is the final design's"


def test_a_sweep_overtaken_by_a_newer_design_is_dropped(make_window, monkeypatch, qtbot):
    window = make_window(CLAW_FEED)
    doc = window.document
    started, release, swept = _slow_cycle(monkeypatch)
    shown = []
    doc.swept.connect(lambda: shown.append(doc.sweep.mechanism if doc.sweep is not None else None))
    first = move_point(doc.mechanism, "B", _nudged(doc.mechanism, "B", 0.2))
    doc.set_mechanism(first, live=True)
    assert started.wait(HOLD_S)
    second = move_point(first, "B", _nudged(first, "B", 0.2))
    doc.set_mechanism(second)  # not a drag frame: waited for a moment, then left to come
    assert doc.sweep_behind and doc.sweep.mechanism is not second
    release.set()
    qtbot.waitUntil(lambda: not doc.sweep_behind, timeout=int(HOLD_S * 1000))
    assert doc.sweep.mechanism is second
    assert first in swept, "the first design's sweep ran to its end ..."
    assert first not in shown and doc.sweep.mechanism is not first, "... and was never shown"


def _nudged(mechanism, name, dx):
    x, y = mechanism.points[name]
    return (x + dx, y)


def test_a_document_deleted_while_its_sweep_runs_gets_nothing_sent(monkeypatch, qtbot):
    """The worker finishing a sweep for a document the window's thread has just deleted must not emit on
    the deleted object (that crashed the process now and then): closing the sweeper shuts its gate."""
    import shiboken6

    from kinematics import load_mechanism

    started, release, _ = _slow_cycle(monkeypatch)
    doc = document_module.Document(load_mechanism(CLAW_FEED))  # asks for its sweep as it opens
    future = doc._pending
    assert started.wait(HOLD_S)
    gate = doc._sweeper._gate
    shiboken6.delete(doc)
    assert not gate.open, "deleting the document closed the gate before the sweep ended"
    release.set()
    ticket, result = future.result(HOLD_S)
    assert result is not None  # the sweep itself ended normally; only its sending was stopped
