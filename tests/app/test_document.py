"""The Document: one ``changed`` per recompute, edits as undoable commands, one command a drag."""

import gc

from app.document import Document, EditCommand
from kinematics import Mechanism, move_point
from tests.designs import CLAW_FEED, UNFINISHED, load


def test_set_mechanism_recomputes_and_emits_changed_once(qtbot):
    doc = Document(load(CLAW_FEED))
    moved = move_point(doc.mechanism, "B", (141.0, 110.0))
    with qtbot.waitSignal(doc.changed, timeout=1000):
        doc.set_mechanism(moved)
    calls = []
    doc.changed.connect(lambda: calls.append(1))
    doc.set_mechanism(moved)
    assert calls == [1]
    assert doc.solution.mechanism is moved
    assert doc.construction.solution is doc.solution


def test_edits_undo_and_redo_as_mechanism_values(qtbot):
    doc = Document(load(CLAW_FEED))
    start = doc.mechanism
    after = move_point(start, "P", (75.0, 140.0))
    assert doc.edit(after, "move P") == ""
    assert doc.mechanism is after
    doc.undo_stack.undo()
    assert doc.mechanism is start
    doc.undo_stack.redo()
    assert doc.mechanism is after


def test_the_moves_of_one_drag_are_one_command_and_two_drags_two(qtbot):
    doc = Document(load(CLAW_FEED))
    start = doc.mechanism
    for x in (71.0, 72.0, 73.0):
        doc.edit(move_point(doc.mechanism, "P", (x, 140.0)), "move P", drag=1)
    assert doc.undo_stack.count() == 1
    command = doc.undo_stack.command(0)
    assert isinstance(command, EditCommand)
    assert command.before is start and command.after.points["P"] == (73.0, 140.0)
    doc.edit(move_point(doc.mechanism, "P", (74.0, 140.0)), "move P", drag=2)
    assert doc.undo_stack.count() == 2
    doc.undo_stack.undo()
    doc.undo_stack.undo()
    assert doc.mechanism is start
    doc.edit(move_point(doc.mechanism, "P", (75.0, 140.0)), "move P", drag=2)  # undone: a new command
    assert doc.undo_stack.count() == 1 and doc.undo_stack.command(0).after.points["P"] == (75.0, 140.0)


def test_a_long_drag_keeps_no_design_of_its_frames_alive(qtbot):
    """Every frame's design is dropped once the next one replaces it (a drag of many minutes must
    not grow the memory): only the last one is added to what was alive, and the one the cycle sweep
    was last made of while the drag holds it back."""
    doc = Document(load(CLAW_FEED))
    gc.collect()
    alive = sum(type(o) is Mechanism for o in gc.get_objects())
    for i in range(200):
        doc.edit(move_point(doc.mechanism, "P", (70.0 + 0.01 * i, 140.0)), "move P", drag=9)
    gc.collect()
    assert sum(type(o) is Mechanism for o in gc.get_objects()) <= alive + 2


def test_an_edit_that_cannot_be_analysed_is_refused_with_its_reason(qtbot):
    doc = Document(load(CLAW_FEED))
    start = doc.mechanism
    # B onto A: the coupler's first two points coincide, which the core refuses.
    reason = doc.edit(move_point(start, "B", (30.0, 40.0)), "move B")
    assert reason
    assert doc.mechanism is start and doc.undo_stack.count() == 0


def test_turning_the_driver_is_not_an_edit(qtbot):
    doc = Document(load(CLAW_FEED))
    assert doc.set_angle(100.0) == ""
    assert doc.solution.driver_angle_deg == 100.0 and doc.undo_stack.count() == 0


def test_an_unfinished_design_reports_what_is_missing(qtbot):
    doc = Document(load(UNFINISHED))
    assert doc.solution is None
    assert any(f.location == "driver" for f in doc.analysis.findings)
