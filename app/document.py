"""The open design: one Mechanism, its Solution and Construction at the
current driver angle, and the undo history of its edits.

Views connect once to :attr:`Document.changed` and read the public fields;
nothing else recomputes kinematics.
"""

from __future__ import annotations

import threading
import weakref
from concurrent.futures import Future, ThreadPoolExecutor
from concurrent.futures import TimeoutError as NotYet
from dataclasses import dataclass

from PySide6.QtCore import QObject, Signal
from PySide6.QtGui import QUndoCommand, QUndoStack

import kinematics
from kinematics import KinematicsError, Mechanism
from kinematics.solver.mobility import hold_loose_points

from .forces_data import CycleForces, cycle_forces, pose_forces
from .throttle import Throttle

SWEEP_STEPS = 180  # 2° apart: smooth paths at drawing size, about 2 ms for a six-bar
# A sweep asked for outside a drag (opening, undo, the drag's end) is waited for this long, so that a
# quick one is on screen with its design; a slower one is shown when it is done (``Document.swept``).
SWEEP_WAIT_S = 0.2


@dataclass(frozen=True)
class Analysis:
    """What the core made of one mechanism at one angle (a failure keeps ``problem``)."""

    solution: object = None
    construction: object = None
    findings: tuple = ()
    problem: str = ""
    forces: object = None
    forces_problem: str = ""
    held: tuple = ()  # findings about loose points the analysis held where they are (it went on without them)


def cycle(mechanism: Mechanism):
    """The core's sweep of one driver cycle (paths, driver range), or None where it has none.

    Sweeps are for dyad chains only; anything else is drawn without paths. Loose points are held
    where they are, as in :func:`analyse`.
    """
    try:
        return kinematics.sweep(hold_loose_points(mechanism)[0], steps=SWEEP_STEPS)
    except KinematicsError:
        return None


def analyse(mechanism: Mechanism, angle_deg: float | None, length_m: float | None = None) -> Analysis:
    """Solve and construct, turning every refusal of the core into words: at driver angle
    ``angle_deg``, or a cylinder-driven design at length ``length_m`` (None: the reference pose). A joint
    on no link yet (a design being built) stops nothing: it is held where it is, and ``held`` says so."""
    held_mechanism, held = hold_loose_points(mechanism)
    held = tuple(held)
    if kinematics.diagnose(held_mechanism):
        findings = tuple(kinematics.diagnose(mechanism))  # the rest is not ready either: say all as it is
        return Analysis(findings=findings, problem="; ".join(str(f) for f in findings))
    try:
        if held_mechanism.driver is not None and held_mechanism.driver.is_actuator:
            solution = kinematics.solve(held_mechanism, length=length_m)
        else:
            solution = kinematics.solve(held_mechanism, angle_deg)
        construction = kinematics.construct(solution)
    except KinematicsError as error:
        return Analysis(problem=str(error), held=held)
    forces, forces_problem = pose_forces(solution)
    return Analysis(solution=solution, construction=construction, forces=forces, forces_problem=forces_problem,
                    held=held)


class Sweeper(QObject):
    """Cycle sweeps on one worker thread, off the window's; only the latest request's result counts.

    :meth:`request` returns a Future of ``(ticket, (sweep, cycle forces))``; every result is also sent back to the
    window's thread by ``arrived(ticket, sweep)``. A request overtaken before its turn is not swept.
    """

    arrived = Signal(int, object)

    def __init__(self, parent=None):
        super().__init__(parent)
        pool = self._pool = ThreadPoolExecutor(max_workers=1, thread_name_prefix="kinepoly-sweep")
        gate = self._gate = _Gate()

        def close(*_):
            # Queued requests go with the document; one already running ends on its own, and its result
            # is not sent: the worker must never emit on an object the window's thread is deleting.
            with gate.lock:
                gate.open = False
            pool.shutdown(wait=False, cancel_futures=True)

        self.destroyed.connect(close)
        self.latest = 0

    def request(self, mechanism: Mechanism) -> Future:
        self.latest += 1
        future = self._pool.submit(self._run, self.latest, mechanism)
        future.add_done_callback(self._send)
        return future

    def drop(self):
        """Make every request so far stale (the design has nothing to sweep)."""
        self.latest += 1

    def _run(self, ticket: int, mechanism: Mechanism):
        if ticket != self.latest:
            return ticket, None
        # The cycle's forces ride with its sweep, on the same thread: the window never waits for them.
        result = cycle(mechanism)
        return ticket, (result, cycle_forces(result))

    def _send(self, future: Future):
        if future.cancelled() or future.exception() is not None:
            return
        with self._gate.lock:
            if not self._gate.open:
                return
            try:
                self.arrived.emit(*future.result())
            except RuntimeError:  # the document, and this object with it, is gone
                pass


class _Gate:
    """Whether a sweeper may still send, and the lock that makes closing wait for a send under way."""

    def __init__(self):
        self.lock = threading.Lock()
        self.open = True


class EditCommand(QUndoCommand):
    """One edit of the design, kept as the Mechanism before and after.

    A drag is one command whose ``after`` follows the mouse (see :meth:`Document.edit`): no command
    is made and merged per frame (Qt deletes a merged command behind Python's back, and its
    wrapper, holding both designs, is never freed).
    """

    def __init__(self, document: Document, before: Mechanism, after: Mechanism, text: str, drag: int | None = None,
                 analysis: Analysis | None = None):
        super().__init__(text)
        # Weakly: Qt owns the command, and a command holding its Document strongly makes a cycle the
        # garbage collector would break in an order that leaves Qt objects half deleted.
        self._document = weakref.ref(document)
        self.before, self.after, self.drag = before, after, drag
        # The analysis already made of ``after``, spent by the first redo so a drag frame solves once.
        self._fresh = analysis

    def redo(self):
        fresh, self._fresh = self._fresh, None
        # A drag's own first frame (fresh, not a later redo) may leave the cycle sweep for a moment.
        self._document().set_mechanism(self.after, fresh, live=fresh is not None and self.drag is not None)

    def undo(self):
        self._document().set_mechanism(self.before)


class Document(QObject):
    """The design being drafted.

    Attributes
    ----------
    mechanism : the current Mechanism (file units).
    angle_deg : the driver angle shown, degrees, or None for the reference pose.
    length_m : a cylinder-driven design's length shown, m, or None for the reference pose.
    analysis : :class:`Analysis` of the mechanism at that angle.
    sweep : the core's :class:`kinematics.Sweep` of one cycle, or None (unfinished, no dyad chain);
        during a drag it may be up to a tenth of a second behind ``mechanism`` (see
        :attr:`sweep_behind`); ``swept`` says it has caught up.
    cycle_forces : :class:`app.forces_data.CycleForces` of that sweep (made with it, on the worker thread).
    path : the file it was read from or saved to, or None.
    undo_stack : QUndoStack of :class:`EditCommand`.
    """

    changed = Signal()
    swept = Signal()

    def __init__(self, mechanism: Mechanism, path=None, parent=None):
        super().__init__(parent)
        self.undo_stack = QUndoStack(self)
        self.mechanism = mechanism
        self.angle_deg = None
        self.length_m = None
        self.path = path
        self.analysis = analyse(mechanism, None)
        self.sweep = None
        self.cycle_forces = CycleForces()
        self._sweeper = Sweeper(self)
        self._sweeper.arrived.connect(self._arrived)
        self._shown = 0  # the ticket of the sweep in ``sweep``
        self._pending: Future | None = None
        self._dragging = False
        self._sweeps = Throttle(self._sweep, parent=self)
        self._sweeps.ran_late.connect(self.swept)
        self._sweep()

    @property
    def solution(self):
        return self.analysis.solution

    @property
    def construction(self):
        return self.analysis.construction

    @property
    def shown_angle_deg(self) -> float | None:
        """The driver angle of the pose on screen (None when nothing is solved)."""
        return self.solution.driver_angle_deg if self.solution is not None else self.angle_deg

    def set_mechanism(self, mechanism: Mechanism, analysis: Analysis | None = None, live: bool = False):
        """Make ``mechanism`` current, recompute, and emit ``changed`` once.

        ``live`` (a frame of a drag) sweeps the cycle at most ten times a second: a frame soon
        after the last sweep leaves it behind, caught up when that tenth of a second is over or
        the drag ends (:meth:`catch_up_sweep`).
        """
        self.mechanism = mechanism
        self.analysis = analysis or analyse(mechanism, self.angle_deg, self.length_m)
        if self.analysis.solution is None and (self.angle_deg is not None or self.length_m is not None):
            # Undoing may bring back a design that cannot reach the pose shown: show its reference pose.
            reference = analyse(mechanism, None)
            if reference.solution is not None:
                self.angle_deg, self.length_m, self.analysis = None, None, reference
        self._dragging = live
        self._sweeps(live)
        self.changed.emit()

    @property
    def sweep_behind(self) -> bool:
        """True while :attr:`sweep` is behind the design (a drag held it back, or it is being made)."""
        return self._sweeps.held or self._shown != self._sweeper.latest

    def _sweep(self):
        """Ask for the design's sweep on the worker thread; outside a drag, wait a moment for it."""
        if self.analysis.solution is None:
            self._sweeper.drop()
            self._shown, self.sweep, self._pending = self._sweeper.latest, None, None
            self.cycle_forces = CycleForces()
            return
        self._pending = self._sweeper.request(self.mechanism)
        if not self._dragging:
            self._settle()

    def _settle(self) -> bool:
        """Show the pending sweep if it comes within SWEEP_WAIT_S; True if it was shown."""
        try:
            ticket, result = self._pending.result(timeout=SWEEP_WAIT_S)
        except NotYet:
            return False
        return self._show(ticket, result)

    def _show(self, ticket: int, result) -> bool:
        if ticket != self._sweeper.latest or ticket == self._shown:
            return False  # stale (a newer design was asked for) or already shown
        self._shown = ticket
        self.sweep, self.cycle_forces = result if result is not None else (None, CycleForces())
        return True

    def _arrived(self, ticket: int, result):
        if self._show(ticket, result):
            self.swept.emit()

    def catch_up_sweep(self):
        """Bring a sweep that a drag left behind up to the design (the drag ended)."""
        self._dragging = False
        if self._sweeps.held:
            self._sweeps.flush()
        elif self._pending is not None and self._settle():
            self.swept.emit()

    def replace(self, mechanism: Mechanism, path=None):
        """Start over with another design (New, Open): the history is cleared."""
        self.undo_stack.clear()
        self.path = path
        self.angle_deg = self.length_m = None
        self.set_mechanism(mechanism)
        self.undo_stack.setClean()

    def set_angle(self, angle_deg: float | None) -> str:
        """Turn the driver (not an edit). Returns "" or why the pose was kept."""
        analysis = analyse(self.mechanism, angle_deg)
        if analysis.solution is None and self.solution is not None:
            return analysis.problem
        self.angle_deg, self.length_m = angle_deg, None
        self.analysis = analysis
        self.changed.emit()
        return ""

    def set_length(self, length_m: float | None) -> str:
        """Extend or retract a cylinder-driven design's cylinder to ``length_m`` (m; not an edit).
        Returns "" or why the pose was kept."""
        analysis = analyse(self.mechanism, None, length_m)
        if analysis.solution is None and self.solution is not None:
            return analysis.problem
        self.angle_deg, self.length_m = None, length_m
        self.analysis = analysis
        self.changed.emit()
        return ""

    @property
    def shown_length_mm(self) -> float | None:
        """A cylinder-driven design's length in the pose on screen, mm (None for a rotary driver)."""
        solution = self.solution
        return None if solution is None or solution.driver_length_m is None else solution.driver_length_m * 1e3

    def edit(self, after: Mechanism, text: str, drag: int | None = None, check: bool = True) -> str:
        """Push an undoable edit.

        With ``check`` (drags), the edit is refused unless its result can be analysed at the
        current angle; the reason is returned and the design left as it was. Building steps pass
        ``check=False``: an unfinished design is a normal stage of building one.
        """
        analysis = analyse(after, self.angle_deg, self.length_m)
        if check and analysis.solution is None and self.solution is not None:
            return analysis.problem
        stack = self.undo_stack
        # Read from the stack, never kept: Qt deletes the commands it drops, behind Python's back.
        last = stack.command(stack.index() - 1) if drag is not None and stack.index() == stack.count() > 0 else None
        if isinstance(last, EditCommand) and last.drag == drag:
            # The same drag goes on, its command still the last one done: it follows the mouse.
            last.after = after
            self.set_mechanism(after, analysis, live=True)
            return ""
        stack.push(EditCommand(self, self.mechanism, after, text, drag, analysis))
        return ""
