"""The open design: one Mechanism, its Solution and Construction at the
current driver angle, and the undo history of its edits.

Views connect once to :attr:`Document.changed` and read the public fields;
nothing else recomputes kinematics.
"""

from __future__ import annotations

import weakref
from dataclasses import dataclass

from PySide6.QtCore import QObject, Signal
from PySide6.QtGui import QUndoCommand, QUndoStack

import kinematics
from kinematics import KinematicsError, Mechanism

from .throttle import Throttle

SWEEP_STEPS = 180  # 2° apart: smooth paths at drawing size, about 2 ms for a six-bar


@dataclass(frozen=True)
class Analysis:
    """What the core made of one mechanism at one angle (a failure keeps ``problem``)."""

    solution: object = None
    construction: object = None
    findings: tuple = ()
    problem: str = ""


def cycle(mechanism: Mechanism):
    """The core's sweep of one driver cycle (paths, driver range), or None where it has none.

    Sweeps are for dyad chains only; anything else is drawn without paths.
    """
    try:
        return kinematics.sweep(mechanism, steps=SWEEP_STEPS)
    except KinematicsError:
        return None


def analyse(mechanism: Mechanism, angle_deg: float | None) -> Analysis:
    """Solve and construct, turning every refusal of the core into words."""
    findings = tuple(kinematics.diagnose(mechanism))
    if findings:
        return Analysis(findings=findings, problem="; ".join(str(f) for f in findings))
    try:
        solution = kinematics.solve(mechanism, angle_deg)
        construction = kinematics.construct(solution)
    except KinematicsError as error:
        return Analysis(problem=str(error))
    return Analysis(solution=solution, construction=construction)


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
    analysis : :class:`Analysis` of the mechanism at that angle.
    sweep : the core's :class:`kinematics.Sweep` of one cycle, or None (unfinished, no dyad chain);
        during a drag it may be up to a tenth of a second behind ``mechanism`` (see
        :attr:`sweep_behind`); ``swept`` says it has caught up.
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
        self.path = path
        self.analysis = analyse(mechanism, None)
        self.sweep = None
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
        self.analysis = analysis or analyse(mechanism, self.angle_deg)
        if self.analysis.solution is None and self.angle_deg is not None:
            # Undoing may bring back a design that cannot reach the angle shown: show its reference pose.
            reference = analyse(mechanism, None)
            if reference.solution is not None:
                self.angle_deg, self.analysis = None, reference
        self._sweeps(live)
        self.changed.emit()

    @property
    def sweep_behind(self) -> bool:
        """True while a drag has left :attr:`sweep` behind the design."""
        return self._sweeps.held

    def _sweep(self):
        self.sweep = cycle(self.mechanism) if self.analysis.solution is not None else None

    def catch_up_sweep(self):
        """Bring a sweep that a drag left behind up to the design (the drag ended)."""
        self._sweeps.flush()

    def replace(self, mechanism: Mechanism, path=None):
        """Start over with another design (New, Open): the history is cleared."""
        self.undo_stack.clear()
        self.path = path
        self.angle_deg = None
        self.set_mechanism(mechanism)
        self.undo_stack.setClean()

    def set_angle(self, angle_deg: float | None) -> str:
        """Turn the driver (not an edit). Returns "" or why the pose was kept."""
        analysis = analyse(self.mechanism, angle_deg)
        if analysis.solution is None and self.solution is not None:
            return analysis.problem
        self.angle_deg = angle_deg
        self.analysis = analysis
        self.changed.emit()
        return ""

    def edit(self, after: Mechanism, text: str, drag: int | None = None, check: bool = True) -> str:
        """Push an undoable edit.

        With ``check`` (drags), the edit is refused unless its result can be analysed at the
        current angle; the reason is returned and the design left as it was. Building steps pass
        ``check=False``: an unfinished design is a normal stage of building one.
        """
        analysis = analyse(after, self.angle_deg)
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
