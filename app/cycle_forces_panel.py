"""The forces over the cycle, in the Cycle tab: the turning-moment diagram (the drive torque
over the driver's turn, its mean line, the areas above and below the mean shaded, whose
largest swing of energy is ΔE), the magnitudes of the joint forces over the same axis, a chosen
joint force as a polar diagram (the tip of its vector over the cycle, in the frame's axes or in
the link's own), and the drive summary beside them.

Every number is the core's: the document's :class:`app.forces_data.CycleForces`, made on the
sweep's worker thread (:mod:`app.document`); a new coefficient of speed fluctuation asks the
core for the summary again. The shading only fills between the plotted torque and the mean.
"""

from __future__ import annotations

import numpy as np
import pyqtgraph as pg
from PySide6.QtCore import Qt, Signal
from PySide6.QtWidgets import QComboBox, QDoubleSpinBox, QHBoxLayout, QLabel, QVBoxLayout, QWidget

from kinematics.dynamics import FRICTIONLESS, CylinderSummary

from . import cycle_series as series
from .cycle_panel import AXIS_WIDTH_PX, CURSOR_COLOUR, PALETTE, ZERO_COLOUR
from .forces_data import CycleForces, with_summary

# Okabe & Ito colours again: energy given to the machine (torque above the mean) and taken back.
ABOVE_BRUSH = (0, 158, 115, 90)
BELOW_BRUSH = (213, 94, 0, 90)
MEAN_COLOUR = "#000000"
OTHER_COLOUR = "#9a9a9a"  # the joints not chosen, among the force magnitudes


def _plot(widget: pg.GraphicsLayoutWidget, left: str, bottom: str, **place) -> pg.PlotItem:
    plot = widget.addPlot(**place)
    plot.setMenuEnabled(False)
    plot.hideButtons()
    plot.showGrid(x=True, y=True, alpha=0.25)
    plot.setLabel("left", left, **{"font-size": "9pt"})
    if bottom:
        plot.setLabel("bottom", bottom, **{"font-size": "9pt"})
    for side in ("left", "bottom"):
        axis = plot.getAxis(side)
        axis.enableAutoSIPrefix(False)
        axis.setTextPen("k")
        axis.setPen("#555555")
    plot.getAxis("left").setWidth(AXIS_WIDTH_PX)
    return plot


class CycleForcesPanel(QWidget):
    """The turning-moment diagram, the joint force magnitudes and a polar diagram of one cycle, with
    the drive summary.

    Signals
    -------
    angle_picked(float) : driver angle in [0°, 360°) the user clicked on the turning-moment diagram.
    """

    angle_picked = Signal(float)

    def __init__(self, parent=None):
        super().__init__(parent)
        self.sweep = None
        self.found = self.source = CycleForces()
        self.axis = None
        self.angle_deg = None
        self.note = QLabel()
        self.note.setWordWrap(True)
        self.summary = QLabel()
        self.summary.setTextFormat(Qt.TextFormat.RichText)
        self.summary.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        self.summary.setWordWrap(True)
        self.fluctuation = QDoubleSpinBox()
        self.fluctuation.setDecimals(3)
        self.fluctuation.setRange(0.001, 0.5)
        self.fluctuation.setSingleStep(0.005)
        self.fluctuation.setValue(0.02)
        self.fluctuation.setKeyboardTracking(False)
        self.fluctuation.setToolTip("coefficient of speed fluctuation C_s = (ω_max − ω_min)/ω the flywheel allows")
        self.joint = QComboBox()
        self.joint.setToolTip("the joint force drawn as a polar diagram and emphasised among the magnitudes")
        # The joint's name must stay readable in a narrow panel ("force on rod at A").
        self.joint.setSizeAdjustPolicy(QComboBox.SizeAdjustPolicy.AdjustToMinimumContentsLengthWithIcon)
        self.joint.setMinimumContentsLength(18)
        self.axes = QComboBox()
        self.axes.addItem("frame axes", "frame")
        self.axes.addItem("link axes", "link")
        self.axes.setToolTip("the polar diagram in the frame's x, y or in axes fixed in the link the force acts on "
                             "(x from the link's first point to its second)")
        self.graphics = pg.GraphicsLayoutWidget()
        self.graphics.setBackground("w")
        self.torque_plot = _plot(self.graphics, "drive T (N·m)", "", row=0, col=0)
        self.torque_plot.setMouseEnabled(x=True, y=False)
        self.torque_plot.getAxis("bottom").setTickSpacing(major=60.0, minor=30.0)
        self.magnitude_plot = _plot(self.graphics, "joint |F| (N)", "driver angle (°)", row=1, col=0)
        self.magnitude_plot.setMouseEnabled(x=True, y=False)
        self.magnitude_plot.setXLink(self.torque_plot)
        self.magnitude_curves: dict = {}  # (point, link) -> curve, one per distinct magnitude at a pin
        self.polar_plot = _plot(self.graphics, "Fy (N)", "Fx (N)", row=0, col=1, rowspan=2)
        # The plots over the cycle share the x axis (one label, under the lower) and most of the width.
        self.graphics.ci.layout.setColumnStretchFactor(0, 3)
        self.graphics.ci.layout.setColumnStretchFactor(1, 2)
        self.polar_plot.setAspectLocked(True)
        self.torque_curve = self.torque_plot.plot(pen=pg.mkPen(PALETTE[0], width=2), antialias=True)
        self.mean_curve = self.torque_plot.plot(pen=pg.mkPen(MEAN_COLOUR, width=1, style=Qt.PenStyle.DashLine))
        self._above_edge, self._below_edge = pg.PlotCurveItem(), pg.PlotCurveItem()
        self.above = pg.FillBetweenItem(self._above_edge, self.mean_curve, brush=ABOVE_BRUSH)
        self.below = pg.FillBetweenItem(self._below_edge, self.mean_curve, brush=BELOW_BRUSH)
        for item in (self.above, self.below):
            self.torque_plot.addItem(item)
        self.torque_plot.addItem(pg.InfiniteLine(0.0, angle=0, pen=pg.mkPen(ZERO_COLOUR)), ignoreBounds=True)
        self.cursor = pg.InfiniteLine(angle=90, pen=pg.mkPen(CURSOR_COLOUR, width=1.5, style=Qt.PenStyle.DashLine))
        self.torque_plot.addItem(self.cursor, ignoreBounds=True)
        self.magnitude_cursor = pg.InfiniteLine(angle=90, pen=self.cursor.pen)
        self.magnitude_plot.addItem(self.magnitude_cursor, ignoreBounds=True)
        self.polar_curve = self.polar_plot.plot(pen=pg.mkPen(PALETTE[1], width=2), antialias=True)
        self.polar_origin = pg.ScatterPlotItem([0.0], [0.0], symbol="+", size=12, pen=pg.mkPen("k"))
        self.polar_now = pg.ScatterPlotItem(symbol="o", size=9, brush=pg.mkBrush(CURSOR_COLOUR), pen=pg.mkPen("k"))
        self.polar_plot.addItem(self.polar_origin)
        self.polar_plot.addItem(self.polar_now)
        self._lay_out()
        self.fluctuation.valueChanged.connect(self._fluctuation_changed)
        self.joint.currentIndexChanged.connect(lambda _index: self._fill_joint())
        self.axes.currentIndexChanged.connect(lambda _index: self._fill_polar())
        self.graphics.scene().sigMouseClicked.connect(self._clicked)
        self.source = None
        self.show_cycle(None, CycleForces())

    def _lay_out(self):
        controls = QHBoxLayout()
        controls.addWidget(QLabel("speed fluctuation C_s"))
        controls.addWidget(self.fluctuation)
        controls.addSpacing(12)
        controls.addWidget(QLabel("polar diagram of"))
        controls.addWidget(self.joint, 1)
        controls.addWidget(QLabel("in the"))
        controls.addWidget(self.axes)
        layout = QVBoxLayout(self)
        layout.setContentsMargins(4, 4, 4, 4)
        layout.addWidget(self.note)
        layout.addLayout(controls)
        layout.addWidget(self.graphics, 1)
        layout.addWidget(self.summary)

    # what the window calls --------------------------------------------------
    def show_cycle(self, sweep, found: CycleForces):
        """Plot the forces ``found`` over ``sweep`` (the same Sweep they were made from); the same
        ``found`` again (the window refreshes on every turn of the driver) keeps what is shown."""
        if found is self.source and sweep is self.sweep:
            return
        self.source = found
        if found.sweep_forces is not None and found.fluctuation != self.fluctuation.value():
            found = with_summary(found, self.fluctuation.value())
        self.sweep, self.found = sweep, found
        result = found.sweep_forces
        self.axis = None if result is None else series.cycle_axis(sweep, "angle")
        if self.axis is not None:
            ticks = self.axis.kind == "angle"
            self.magnitude_plot.setLabel("bottom", f"{self.axis.label} ({self.axis.unit})", **{"font-size": "9pt"})
            for plot in (self.torque_plot, self.magnitude_plot):
                plot.getAxis("bottom").setTickSpacing(*((60.0, 30.0) if ticks else ()))
        self.graphics.setVisible(result is not None)
        self.joint.setEnabled(result is not None)
        self.axes.setEnabled(result is not None)
        # A cylinder has no flywheel: the coefficient of speed fluctuation is not asked for.
        self.fluctuation.setEnabled(result is not None and result.drive_force_n is None)
        self.note.setText(found.problem or f"Over the cycle; {FRICTIONLESS}; no strength or fatigue check.")
        self._offer_joints()
        self._fill_torque()
        self._fill_magnitudes()
        self._fill_joint()

    def set_angle(self, angle_deg: float | None):
        """Put the cursor and the polar diagram's marker at driver angle ``angle_deg`` (None hides them)."""
        self.angle_deg = angle_deg
        self._place_cursor()

    # showing ----------------------------------------------------------------
    def _joints(self) -> list:
        result = self.found.sweep_forces
        if result is None:
            return []
        return [(point, link) for point, by_link in result.joints_n.items() for link in by_link]

    def _offer_joints(self):
        joints = self._joints()
        listed = [self.joint.itemData(i, Qt.ItemDataRole.UserRole) for i in range(self.joint.count())]
        if listed == joints:
            return
        chosen = self.joint.currentData(Qt.ItemDataRole.UserRole)
        self.joint.blockSignals(True)
        self.joint.clear()
        for point, link in joints:
            self.joint.addItem(f"force on {link} at {point}", (point, link))
        if chosen in joints:
            self.joint.setCurrentIndex(joints.index(chosen))
        elif joints:
            # The most loaded pin first: the one a designer sizes the bearing for.
            summary = self.found.summary
            if summary is not None:
                loads = [summary.joints[p][k].peak_n for p, k in joints]
                self.joint.setCurrentIndex(int(np.argmax(loads)))
        self.joint.blockSignals(False)

    def _fill_torque(self):
        result, axis, summary = self.found.sweep_forces, self.axis, self.found.summary
        if result is None:
            for curve in (self.torque_curve, self.mean_curve, self._above_edge, self._below_edge):
                curve.setData([], [])
            return
        cylinder = result.drive_force_n is not None
        # A cylinder's drive is its axial force: the diagram plots it, with no mean line (no turn to average).
        self.torque_plot.setLabel("left", "cylinder F (N), push +" if cylinder else "drive T (N·m)",
                                  **{"font-size": "9pt"})
        torque = np.asarray(result.drive_force_n if cylinder else result.drive_torque_n_m)[axis.order]
        self.torque_curve.setData(axis.x, torque)
        if summary is None or cylinder:
            for curve in (self.mean_curve, self._above_edge, self._below_edge):
                curve.setData([], [])
        else:
            mean = np.full_like(torque, summary.mean_torque_n_m)
            self.mean_curve.setData(axis.x, mean)
            self._above_edge.setData(axis.x, np.maximum(torque, mean))
            self._below_edge.setData(axis.x, np.minimum(torque, mean))
        self.torque_plot.setXRange(*axis.span, padding=0.0)
        low, high = min(float(torque.min()), 0.0), max(float(torque.max()), 0.0)
        margin = 0.06 * ((high - low) or 1.0)
        self.torque_plot.setYRange(low - margin, high + margin, padding=0.0)
        self._place_cursor()

    def _chosen_force(self):
        """The chosen joint's force over the sweep, (N, 2) in N, in the chosen axes."""
        chosen = self.joint.currentData(Qt.ItemDataRole.UserRole)
        result = self.found.sweep_forces
        if result is None or chosen is None:
            return None
        point, link = chosen
        force = np.asarray(result.joints_n[point][link])
        if self.axes.currentData() != "link":
            return force
        # The link's own axes: x along the link's line (its first point to its second), y 90° CCW from it.
        turn = np.radians(self.sweep.link_angle_deg[link])
        cos, sin = np.cos(turn), np.sin(turn)
        return np.column_stack([cos * force[:, 0] + sin * force[:, 1], cos * force[:, 1] - sin * force[:, 0]])

    def _fill_magnitudes(self):
        """|F| of every joint force over the cycle, one curve per distinct load at a pin (at a plain
        pin the two links' forces are equal and opposite: one curve for both)."""
        for curve in self.magnitude_curves.values():
            self.magnitude_plot.removeItem(curve)
        self.magnitude_curves = {}
        result, axis = self.found.sweep_forces, self.axis
        if result is None:
            return
        for point, by_link in result.joints_n.items():
            drawn = []
            for link, force in by_link.items():
                size = np.linalg.norm(np.asarray(force), axis=1)[axis.order]
                if any(np.allclose(size, other, rtol=1e-9, atol=1e-9) for other in drawn):
                    continue
                drawn.append(size)
                curve = self.magnitude_plot.plot(axis.x, size, antialias=True)
                curve.setToolTip(f"force on {link} at {point}")
                self.magnitude_curves[(point, link)] = curve
        top = max((float(curve.getData()[1].max()) for curve in self.magnitude_curves.values()), default=0.0)
        self.magnitude_plot.setYRange(0.0, 1.06 * top or 1.0, padding=0.0)

    def _fill_joint(self):
        """The chosen joint: emphasised among the magnitudes, drawn as the polar diagram, summarised."""
        chosen = self.joint.currentData(Qt.ItemDataRole.UserRole)
        shown = chosen if chosen in self.magnitude_curves else self._same_load(chosen)
        for key, curve in self.magnitude_curves.items():
            curve.setPen(pg.mkPen(PALETTE[1], width=2.5) if key == shown else pg.mkPen(OTHER_COLOUR, width=1))
            curve.setZValue(1 if key == shown else 0)
        self._fill_polar()

    def _same_load(self, chosen):
        """The drawn curve that stands for ``chosen`` (the other link of a plain pin)."""
        if chosen is None:
            return None
        return next((key for key in self.magnitude_curves if key[0] == chosen[0]), None)

    def _fill_polar(self):
        force = self._chosen_force()
        if force is None:
            self.polar_curve.setData([], [])
            self.polar_now.setData([], [])
            return
        link = self.joint.currentData(Qt.ItemDataRole.UserRole)[1]
        if self.axes.currentData() == "link":
            first, second = self.sweep.mechanism.links[link][:2]
            self.polar_plot.setLabel("bottom", f"F along {link}, {first}→{second} (N)", **{"font-size": "9pt"})
            self.polar_plot.setLabel("left", f"F across {link} (N)", **{"font-size": "9pt"})
        else:
            self.polar_plot.setLabel("bottom", "Fx (N)", **{"font-size": "9pt"})
            self.polar_plot.setLabel("left", "Fy (N)", **{"font-size": "9pt"})
        closed = np.vstack([force, force[:1]]) if self.found.sweep_forces.full_turn else force
        self.polar_curve.setData(closed[:, 0], closed[:, 1])
        self.polar_plot.autoRange()
        self._place_cursor()
        self._fill_summary()

    def _place_cursor(self):
        visible = self.axis is not None and self.angle_deg is not None
        self.cursor.setVisible(visible)
        self.magnitude_cursor.setVisible(visible)
        force = self._chosen_force()
        if not visible:
            self.polar_now.setData([], [])
            return
        self.cursor.setValue(self.axis.x_of_angle(self.angle_deg))
        self.magnitude_cursor.setValue(self.cursor.value())
        if force is not None:
            # The sample of the sweep nearest the pose on screen.
            along = self.axis.along
            off = along - self.axis.x_of_angle(self.angle_deg)
            if self.axis.kind == "angle":
                off = (off + 180.0) % 360.0 - 180.0
            k = int(np.argmin(np.abs(off)))
            self.polar_now.setData([force[k, 0]], [force[k, 1]])

    def _fill_summary(self):
        found = self.found
        summary = found.summary
        if found.sweep_forces is None:
            self.summary.setText("")
            return
        if summary is None:
            self.summary.setText(found.summary_problem)
            return
        if isinstance(summary, CylinderSummary):
            self.summary.setText(_cylinder_text(summary))
            return
        mean_torque = _against(summary.mean_torque_n_m, summary.peak_torque_n_m)
        mean_power = _against(summary.mean_power_w, summary.peak_power_w)
        text = (f"<b>drive</b> peak T {series.readable(summary.peak_torque_n_m)} N·m at "
                f"{summary.peak_torque_angle_deg % 360.0:.1f}°, mean {mean_torque} N·m, "
                f"RMS {series.readable(summary.rms_torque_n_m)} N·m; mean power {mean_power}"
                f" W, peak {series.readable(summary.peak_power_w)} W<br>"
                f"<b>flywheel</b> ΔE {series.readable(summary.energy_fluctuation_j)} J (shaded: "
                f"<span style='color:#009E73'>■</span> above the mean, <span style='color:#D55E00'>■</span> below); "
                f"I = ΔE/(C_s·ω²) = {series.readable(summary.flywheel_inertia_kg_m2)} kg·m² at C_s "
                f"{summary.fluctuation:g}")
        chosen = self.joint.currentData(Qt.ItemDataRole.UserRole)
        if chosen is not None:
            point, link = chosen
            joint = summary.joints[point][link]
            text += (f"<br><b>force on {link} at {point}</b> peak {series.readable(joint.peak_n)} N at "
                     f"{joint.peak_angle_deg % 360.0:.1f}°, mean {series.readable(joint.mean_n)} N, RMS "
                     f"{series.readable(joint.rms_n)} N")
        self.summary.setText(text)

    def _fluctuation_changed(self, value: float):
        if self.found.sweep_forces is not None:
            self.found = with_summary(self.found, value)
            self._fill_summary()

    def _clicked(self, event):
        """A click on the turning-moment diagram turns the driver there; one on the magnitudes also
        chooses the joint whose curve passes nearest the click."""
        if event.button() != Qt.MouseButton.LeftButton or self.axis is None:
            return
        for plot in (self.torque_plot, self.magnitude_plot):
            box = plot.getViewBox()
            if box.sceneBoundingRect().contains(event.scenePos()):
                at = box.mapSceneToView(event.scenePos())
                x = float(np.clip(at.x(), *self.axis.span))
                if plot is self.magnitude_plot and self.magnitude_curves:
                    self._choose_nearest(x, at.y())
                self.angle_picked.emit(self.axis.angle_of_x(x))
                return

    def _choose_nearest(self, x: float, y: float):
        def off(curve):
            xs, ys = curve.getData()
            return abs(float(np.interp(x, xs, ys)) - y)

        key = min(self.magnitude_curves, key=lambda k: off(self.magnitude_curves[k]))
        listed = [self.joint.itemData(i, Qt.ItemDataRole.UserRole) for i in range(self.joint.count())]
        self.joint.setCurrentIndex(listed.index(key))  # findData cannot compare a tuple


def _against(value: float, peak: float) -> str:
    """``value`` as read beside ``peak``: a mean that is rounding away from zero (a cycle with no
    net work) reads 0, not 8e-17."""
    return series.readable(0.0 if abs(value) <= 1e-9 * abs(peak) else value)


def _cylinder_text(summary: CylinderSummary) -> str:
    """The stroke's drive summary: peak push and pull with their lengths, work and power."""
    def at(force_n: float, length_m: float) -> str:
        return f"{series.readable(force_n)} N at {length_m * 1e3:.1f} mm" if force_n else "none"

    return (f"<b>cylinder</b> peak push {at(summary.peak_push_n, summary.peak_push_length_m)}, peak pull "
            f"{at(summary.peak_pull_n, summary.peak_pull_length_m)}; work over the stroke "
            f"{series.readable(summary.work_j)} J, mean power {series.readable(summary.mean_power_w)} W, peak "
            f"{series.readable(summary.peak_power_w)} W")
