"""Holding back slow, secondary work while the user drags.

A drag asks for a new frame many times a second; the drawings and the table
follow every frame, while the cycle sweep, the step list, the status line and
the driver angle's number follow at most ten times a second and catch up as
soon as the drag stops.
"""

from __future__ import annotations

import weakref

from PySide6.QtCore import QObject, QTimer, Signal

# Ten times a second: the eye follows the paths and the list, and a frame is spared their cost.
LIVE_INTERVAL_MS = 100


class Throttle(QObject):
    """Runs ``job`` when called, but a ``live`` call within ``interval_ms`` of the last live run is
    held: it runs when the interval is over (or at :meth:`flush`), then emits ``ran_late``. The last
    call is never lost."""

    ran_late = Signal()

    def __init__(self, job, interval_ms: int = LIVE_INTERVAL_MS, parent=None):
        super().__init__(parent)
        # A bound method is held weakly: its object is usually this throttle's parent, and a strong
        # reference would tie the two in a cycle that the garbage collector, not Qt, takes apart.
        self._job = weakref.WeakMethod(job) if hasattr(job, "__self__") else (lambda: job)
        self.held = False
        self.timer = QTimer(self, singleShot=True, interval=interval_ms)
        self.timer.timeout.connect(self._interval_over)

    def __call__(self, live: bool = False):
        if live and self.timer.isActive():
            self.held = True
            return
        self.held = False
        if live:
            self.timer.start()
        else:
            self.timer.stop()
        self._run()

    def _interval_over(self):
        if self.held:
            self.timer.start()  # the drag goes on: hold off the next run again
            self._run_held()

    def flush(self):
        """Run a held call now (the drag ended)."""
        self.timer.stop()
        if self.held:
            self._run_held()

    def _run_held(self):
        self.held = False
        self._run()
        self.ran_late.emit()

    def _run(self):
        job = self._job()
        if job is not None:  # a job whose object is gone has nothing left to do
            job()
