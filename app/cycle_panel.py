"""The cycle plot: chosen velocities and accelerations over one driver cycle,
a cursor at the pose on screen, a click to turn the driver there, the peaks,
and a fine sweep computed off the window's thread.

The panel plots what the core's :class:`kinematics.Sweep` holds. Plot rows
(one per unit) and curves are made when the choice of quantities, units or
x axis changes; a new sweep only moves data into the existing curves
(``setData``), so the plot follows a dragged joint.
"""

from __future__ import annotations

import numpy as np
import pyqtgraph as pg
from PySide6.QtCore import QCoreApplication, Qt, QThread, Signal
from PySide6.QtWidgets import (
    QComboBox,
    QHBoxLayout,
    QLabel,
    QListWidget,
    QListWidgetItem,
    QProgressBar,
    QPushButton,
    QVBoxLayout,
    QWidget,
)

import kinematics
from kinematics import KinematicsError
from kinematics.cycle.measures import DEAD_POINT_SHARE, clear_of_dead_points
from kinematics.errors import SweepCancelled

from . import cycle_series as series

# Okabe & Ito, "Color Universal Design" (2008): told apart with the common colour-vision deficiencies.
PALETTE = ("#0072B2", "#D55E00", "#009E73", "#CC79A7", "#E69F00", "#56B4E9", "#000000")
CURSOR_COLOUR = "#7f7f7f"
GRID_COLOUR = "#d2d2d2"
ZERO_COLOUR = "#8c8c8c"
AXIS_WIDTH_PX = 64  # the same for every row, so their x axes line up
FINE_STEPS = (3_600, 36_000, 100_000)  # 100 000 steps of the six-bar sample: 0.2-0.4 s, ~130 MB peak
NO_CYCLE = "No cycle to plot: the design is unfinished or its driver cannot be swept."
_RUNNING: set = set()  # jobs kept alive until their thread ends, even past a closed panel


class FineSweepJob(QThread):
    """``kinematics.sweep(mechanism, steps)`` on a worker thread.

    The core sweeps by chunks and reports after each; a cancelled job stops at
    the next chunk and its result is dropped (it never reaches ``done``).
    """

    progressed = Signal(int)
    done = Signal(object)
    failed = Signal(str)

    def __init__(self, mechanism, steps: int):
        super().__init__()
        self.mechanism, self.steps = mechanism, steps

    def run(self):
        self.progressed.emit(0)

        def report(done: float) -> bool:
            self.progressed.emit(int(round(100 * done)))
            return not self.isInterruptionRequested()

        try:
            result = kinematics.sweep(self.mechanism, self.steps, progress=report)
        except SweepCancelled:
            return
        except KinematicsError as error:
            if not self.isInterruptionRequested():
                self.failed.emit(f"fine sweep of {self.steps} steps: {error}")
            return
        if not self.isInterruptionRequested():
            self.progressed.emit(100)
            self.done.emit(result)


class CyclePanel(QWidget):
    """Curves of one cycle against driver angle or time.

    Signals
    -------
    angle_picked(float) : driver angle in [0°, 360°) the user clicked on the plot.
    """

    angle_picked = Signal(float)

    def __init__(self, parent=None):
        super().__init__(parent)
        self.units = series.Units()
        self.coarse = None  # the sweep the window gave
        self.sweep = None  # the sweep plotted: the coarse one or a fine one of the same design
        self.axis = None
        self.angle_deg = None
        self.job = None
        self.offered: list = []
        self.chosen: list = []
        self.layout_key = None
        # One plot row per family, one curve per chosen quantity, one cursor per row; the x span shown.
        self.plots, self.curves, self.cursors, self.span = {}, {}, [], None
        self.reason = NO_CYCLE
        self.message = None  # the pyqtgraph label in place of the plot, when there is nothing to plot
        self.choices = QListWidget()
        self.choices.setToolTip("Tick the quantities to plot")
        self.x_choice = QComboBox()
        self.x_choice.addItems(["driver angle (°)", "time (s)"])
        self.x_choice.setItemData(1, "offered at constant driver speed only", Qt.ItemDataRole.ToolTipRole)
        self.graphics = pg.GraphicsLayoutWidget()
        self.graphics.setBackground("w")
        self.note = QLabel()
        self.note.setWordWrap(True)
        self.peaks = QLabel()
        self.peaks.setTextFormat(Qt.TextFormat.RichText)
        self.peaks.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        self.peaks.setWordWrap(True)
        self.fine_steps = QComboBox()
        self.fine_steps.addItems([series.steps_text(n) for n in FINE_STEPS])
        self.fine_steps.setCurrentIndex(1)
        self.compute = QPushButton("Fine sweep")
        self.compute.setToolTip("Sweep the cycle again with many more steps, off the window's thread")
        self.progress = QProgressBar()
        self.progress.setMaximumWidth(140)
        self.cancel = QPushButton("Cancel")
        self.shown_steps = QLabel()
        self._lay_out()
        self.choices.itemChanged.connect(lambda _item: (self._read_choices(), self._rebuild()))
        self.x_choice.currentIndexChanged.connect(self._rebuild)
        self.graphics.scene().sigMouseClicked.connect(self._clicked)
        self.compute.clicked.connect(self.start_fine_sweep)
        self.cancel.clicked.connect(self.cancel_fine_sweep)
        self._set_running(False)
        self.set_sweep(None)

    def _lay_out(self):
        side = QVBoxLayout()
        side.addWidget(QLabel("plot"))
        side.addWidget(self.choices, 1)
        side.addWidget(QLabel("x axis"))
        side.addWidget(self.x_choice)
        fine = QHBoxLayout()
        for widget in (self.fine_steps, self.compute, self.progress, self.cancel, self.shown_steps):
            fine.addWidget(widget)
        fine.addStretch(1)
        main = QVBoxLayout()
        main.addWidget(self.note)
        main.addWidget(self.graphics, 1)
        main.addWidget(self.peaks)
        main.addLayout(fine)
        layout = QHBoxLayout(self)
        layout.setContentsMargins(4, 4, 4, 4)
        layout.addLayout(side, 0)
        layout.addLayout(main, 1)
        self.choices.setMaximumWidth(170)

    # what the window calls --------------------------------------------------
    def set_sweep(self, sweep, reason: str = NO_CYCLE):
        """Plot ``sweep`` (a :class:`kinematics.Sweep`); None clears the plot and says ``reason``.

        The same sweep again (the window refreshes on every turn of the driver) keeps a fine
        sweep on show; a new one drops it and any fine sweep still running.
        """
        if sweep is self.coarse and sweep is not None:
            return
        self.cancel_fine_sweep()
        self.coarse = sweep
        self._show(sweep, reason)

    def set_angle(self, angle_deg: float | None):
        """Put the cursor at driver angle ``angle_deg`` (degrees; None hides it)."""
        self.angle_deg = angle_deg
        self._place_cursor()

    def set_units(self, length_unit: str, speed_unit: str):
        """Show lengths per s in ``length_unit`` (mm, m, in) and ω in ``speed_unit`` (rad/s, rpm)."""
        self.units = series.Units(length_unit, speed_unit)
        self._rebuild()

    def _read_choices(self):
        # ``chosen``: the ticked quantities in list order, read once per change, not per frame.
        items = (self.choices.item(i) for i in range(self.choices.count()))
        self.chosen = [item.data(Qt.ItemDataRole.UserRole) for item in items
                       if item.checkState() == Qt.CheckState.Checked]

    def choose(self, quantities):
        """Tick exactly ``quantities`` (those the design offers)."""
        wanted = set(quantities)
        self.choices.blockSignals(True)
        for i in range(self.choices.count()):
            item = self.choices.item(i)
            chosen = item.data(Qt.ItemDataRole.UserRole) in wanted
            item.setCheckState(Qt.CheckState.Checked if chosen else Qt.CheckState.Unchecked)
        self.choices.blockSignals(False)
        self._read_choices()
        self._rebuild()

    # showing ----------------------------------------------------------------
    def _show(self, sweep, reason: str = ""):
        self.sweep = sweep
        offered = series.available(sweep.mechanism) if sweep is not None else []
        if offered != self.offered:
            self._offer(offered, [q for q in self.chosen if q in offered] or
                        (series.default_choice(sweep.mechanism) if sweep is not None else []))
        timed = sweep is not None and sweep.time_s is not None
        cylinder = sweep is not None and sweep.driver_length_m is not None
        self.x_choice.setItemText(0, "cylinder length (mm)" if cylinder else "driver angle (°)")
        self.x_choice.model().item(1).setEnabled(timed)
        if not timed and self.x_choice.currentIndex() == 1:
            self.x_choice.blockSignals(True)
            self.x_choice.setCurrentIndex(0)
            self.x_choice.blockSignals(False)
        self.compute.setEnabled(sweep is not None and self.job is None)
        self.reason = reason
        self.note.setText("" if sweep is None else "; ".join(sweep.warnings))
        self.note.setVisible(bool(self.note.text()))
        self.shown_steps.setText("" if sweep is None else f"showing {series.steps_text(len(sweep.driver_angle_deg))}")
        kind = "time" if self.x_choice.currentIndex() else "angle"
        self.axis = None if sweep is None else series.cycle_axis(sweep, kind)
        key = (tuple(self.chosen), self.units, self.axis.kind if self.axis else reason)
        if key != self.layout_key:
            self._build_rows()
            self.layout_key = key
        self._fill()

    def _offer(self, offered, ticked):
        self.choices.blockSignals(True)
        self.choices.clear()
        for quantity in offered:
            item = QListWidgetItem(quantity.label)
            item.setData(Qt.ItemDataRole.UserRole, quantity)
            item.setToolTip(quantity.description)
            item.setCheckState(Qt.CheckState.Checked if quantity in ticked else Qt.CheckState.Unchecked)
            self.choices.addItem(item)
        self.choices.blockSignals(False)
        self.offered = offered
        self._read_choices()

    def _rebuild(self, *_):
        self._show(self.sweep, self.reason)

    def _build_rows(self):
        """One plot row per unit among the ticked quantities, x linked, labels with units."""
        self.graphics.clear()
        self.plots, self.curves, self.cursors, self.span = {}, {}, [], None
        chosen = self.chosen if self.axis is not None else []
        families = [f for f in series.FAMILIES if any(q.family == f for q in chosen)]
        for row, family in enumerate(families):
            plot = self.graphics.addPlot(row=row, col=0)
            symbols = ", ".join(dict.fromkeys(q.symbol for q in chosen if q.family == family))
            plot.setLabel("left", f"{symbols} ({self.units.unit(family)})", **{"font-size": "9pt"})
            plot.setMenuEnabled(False)
            plot.hideButtons()
            # The y range follows the data (see _fit_rows); the user zooms and pans the angle only.
            plot.setMouseEnabled(x=True, y=False)
            plot.getViewBox().disableAutoRange()
            self._add_grid(plot)
            plot.addItem(pg.InfiniteLine(0.0, angle=0, pen=pg.mkPen(ZERO_COLOUR)), ignoreBounds=True)
            cursor = pg.InfiniteLine(angle=90, pen=pg.mkPen(CURSOR_COLOUR, width=1.5, style=Qt.PenStyle.DashLine))
            plot.addItem(cursor, ignoreBounds=True)
            self.cursors.append(cursor)
            for side in ("left", "bottom"):
                plot.getAxis(side).enableAutoSIPrefix(False)  # the unit is in the label: no "(x0.001)"
                plot.getAxis(side).setTextPen("k")
                plot.getAxis(side).setPen("#555555")
            plot.getAxis("left").setWidth(AXIS_WIDTH_PX)
            last = row == len(families) - 1
            # Rows share the x axis: its numbers and name once, under the bottom row.
            plot.getAxis("bottom").setStyle(showValues=last)
            if last:
                plot.setLabel("bottom", f"{self.axis.label} ({self.axis.unit})")
            if self.axis.kind == "angle":
                plot.getAxis("bottom").setTickSpacing(major=30.0, minor=10.0)
            if row:
                plot.setXLink(self.plots[families[0]])
            self.plots[family] = plot
        for index, quantity in enumerate(chosen):
            pen = pg.mkPen(PALETTE[index % len(PALETTE)], width=2)
            self.curves[quantity] = self.plots[quantity.family].plot(name=quantity.label, pen=pen, antialias=True,
                                                                     skipFiniteCheck=True)
        self.message = None
        if not families:
            self.message = self.graphics.addLabel(
                self.reason if self.axis is None else "tick a quantity on the left to plot it", color="k", size="11pt")

    def _fill(self):
        """Data of the plotted sweep into the existing curves, the x range, the cursor and the peaks."""
        axis, sweep = self.axis, self.sweep
        if axis is None:
            self.peaks.setText("")
            return
        lines, extents = [], {family: [] for family in self.plots}
        clear = clear_of_dead_points(sweep)
        for index, (quantity, curve) in enumerate(self.curves.items()):
            values = self.units.shown(quantity.family, series.si_values(sweep, quantity))
            curve.setData(axis.x, values[axis.order])
            extents[quantity.family].append((float(values[clear].min()), float(values[clear].max())))
            lines.append(f"<span style='color:{PALETTE[index % len(PALETTE)]}'>■</span> "
                         + series.peak_text(quantity, values, axis, self.units.unit(quantity.family), clear))
        if not clear.all() and lines:
            lines.append(f"(the outer {DEAD_POINT_SHARE:.0%} of the range at each dead point "
                         "is left out of the scale and the peaks)")
        self.peaks.setText("&nbsp;&nbsp;&nbsp; ".join(lines))
        if self.plots and axis.span != self.span:
            # Only when the range itself changes, so a zoom the user made survives a drag.
            self._show_whole_cycle()
        self._fit_rows(extents)
        self._place_cursor()

    def _show_whole_cycle(self):
        next(iter(self.plots.values())).setXRange(*self.axis.span, padding=0.0)
        self.span = self.axis.span

    def _fit_rows(self, extents):
        for family, plot in self.plots.items():
            low, high = min(e[0] for e in extents[family]), max(e[1] for e in extents[family])
            current = tuple(plot.getViewBox().viewRange()[1])
            wanted = series.steady_range(current, low, high)
            if wanted != current:
                plot.setYRange(*wanted, padding=0.0)

    def _add_grid(self, plot):
        """Light lines at the major ticks, as one path redrawn only when the view moves or resizes
        (pyqtgraph's own grid costs about 12 ms a repaint here, the curves about 1 ms)."""
        grid = pg.PlotCurveItem(pen=pg.mkPen(GRID_COLOUR), connect="pairs", antialias=False)
        grid.setZValue(-10)
        plot.addItem(grid, ignoreBounds=True)
        box = plot.getViewBox()

        def place(*_):
            (x0, x1), (y0, y1) = box.viewRange()
            xs = series.major_ticks(plot.getAxis("bottom"), x0, x1, box.width())
            ys = series.major_ticks(plot.getAxis("left"), y0, y1, box.height())
            grid.setData(*series.grid_segments(xs, ys, (x0, x1), (y0, y1)))

        box.sigRangeChanged.connect(place)
        box.sigResized.connect(place)

    def _place_cursor(self):
        visible = self.axis is not None and self.angle_deg is not None
        for cursor in self.cursors:
            cursor.setVisible(visible)
            if visible:
                cursor.setValue(self.axis.x_of_angle(self.angle_deg))

    def _clicked(self, event):
        if event.button() != Qt.MouseButton.LeftButton or self.axis is None:
            return
        for plot in self.plots.values():
            box = plot.getViewBox()
            if box.sceneBoundingRect().contains(event.scenePos()):
                if event.double():  # back to the whole cycle after a zoom
                    self._show_whole_cycle()
                    return
                x = float(np.clip(box.mapSceneToView(event.scenePos()).x(), *self.axis.span))
                self.angle_picked.emit(self.axis.angle_of_x(x))
                return

    # the fine sweep -----------------------------------------------------------
    def start_fine_sweep(self, steps: int | None = None) -> FineSweepJob | None:
        """Sweep the plotted design with ``steps`` (default: the chosen count) on a worker thread."""
        if self.coarse is None or self.job is not None:
            return None
        steps = steps or FINE_STEPS[self.fine_steps.currentIndex()]
        job = FineSweepJob(self.coarse.mechanism, int(steps))
        job.progressed.connect(self._progressed)
        job.done.connect(self._fine_done)
        job.failed.connect(self._fine_failed)
        job.finished.connect(self._job_ended)
        self.job = job
        _RUNNING.add(job)
        QCoreApplication.instance().aboutToQuit.connect(job.wait)  # a thread must end before Qt does
        self.progress.setRange(0, 0)  # busy until the first chunk reports
        self._set_running(True)
        job.start()
        return job

    def cancel_fine_sweep(self):
        """Stop waiting for the running fine sweep: the plot keeps what it shows."""
        if self.job is not None:
            self.job.requestInterruption()
            self.job = None
        self._set_running(False)

    def _set_running(self, running: bool):
        self.progress.setVisible(running)
        self.cancel.setVisible(running)
        self.compute.setEnabled(not running and self.coarse is not None)
        self.fine_steps.setEnabled(not running)

    def _progressed(self, percent: int):
        if self.sender() is self.job and percent > 0:
            self.progress.setRange(0, 100)
            self.progress.setValue(percent)

    def _fine_done(self, result):
        if self.sender() is self.job:
            self.job = None
            self._set_running(False)
            self._show(result)

    def _fine_failed(self, message: str):
        if self.sender() is self.job:
            self.job = None
            self._set_running(False)
            self.note.setText(message)
            self.note.setVisible(True)

    def _job_ended(self):
        _RUNNING.discard(self.sender())
