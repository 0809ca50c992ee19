"""The driver control: a typed value, a slider, play/pause and the play speed, in driver angle,
or for a cylinder-driven design in the cylinder's length (mm) over its stroke."""

from __future__ import annotations

from PySide6.QtCore import Qt, QTimer, Signal
from PySide6.QtWidgets import QComboBox, QDoubleSpinBox, QHBoxLayout, QLabel, QSlider, QToolButton, QWidget

from kinematics.model.units import ANGLE_DECIMALS

from .icons import icon

SLIDER_STEPS_PER_DEGREE = 10
ANIMATION_STEP_DEG = 2.0
ANIMATION_INTERVAL_MS = 33  # about 30 frames a second
PLAY_SPEEDS = {"¼×": 0.25, "½×": 0.5, "1×": 1.0, "2×": 2.0, "4×": 4.0}  # times ANIMATION_STEP_DEG a frame
STROKE_SLIDER_STEPS = 1000  # a cylinder's slider: its stroke in a thousand steps
STROKE_ANIMATION_STEPS = 180  # play runs the stroke one way in as many frames as a half turn


class AngleControl(QWidget):
    """Asks for driver angles (degrees CCW from +x) through ``angle_requested``, or, after
    :meth:`set_stroke`, for a cylinder's lengths (mm) through ``length_requested``."""

    angle_requested = Signal(float)
    length_requested = Signal(float)
    playing_changed = Signal(bool)

    def __init__(self, parent=None):
        super().__init__(parent)
        self.spin = QDoubleSpinBox()
        self.spin.setRange(0.0, 360.0)
        self.spin.setWrapping(True)
        self.spin.setDecimals(ANGLE_DECIMALS)  # as every output says a driver angle
        self.spin.setSuffix(" °")
        self.spin.setKeyboardTracking(False)
        self.slider = QSlider(Qt.Orientation.Horizontal)
        self.slider.setRange(0, 360 * SLIDER_STEPS_PER_DEGREE)
        self.play = QToolButton()
        self.play.setCheckable(True)
        self.play.setIcon(icon("play"))
        self.play.setToolTip("Play / pause the driver turning")
        self.play_speed = QComboBox()
        self.play_speed.addItems(list(PLAY_SPEEDS))
        self.play_speed.setCurrentText("1×")
        self.play_speed.setToolTip("How fast play turns the driver (1×: one turn in "
                                   f"{360.0 / ANIMATION_STEP_DEG * ANIMATION_INTERVAL_MS / 1000.0:g} s)")
        self.spin.setToolTip("The driver angle, degrees counter-clockwise from +x: type a value")
        self.slider.setToolTip("The driver angle: drag to turn the driver")
        self.rocking = None  # (low, high) dead points of a driver that cannot turn fully
        self.angle_deg = 0.0  # the pose's angle, [0, 360)
        self.stroke_mm = None  # (shortest, longest) length of a cylinder driver, mm
        self.length_mm = 0.0  # the pose's cylinder length
        self.direction = 1.0
        self.timer = QTimer(self)
        self.timer.setInterval(ANIMATION_INTERVAL_MS)
        layout = QHBoxLayout(self)
        layout.setContentsMargins(4, 0, 4, 0)
        self.caption = QLabel("driver angle")
        layout.addWidget(self.caption)
        layout.addWidget(self.spin)
        layout.addWidget(self.slider, 1)
        layout.addWidget(self.play)
        layout.addWidget(self.play_speed)
        self.spin.valueChanged.connect(self._typed)
        self.slider.valueChanged.connect(self._slid)
        self.play.toggled.connect(self._play)
        self.play.toggled.connect(self.playing_changed)
        self.timer.timeout.connect(self.advance)

    def follow(self, angle_deg: float | None):
        """The angle of the pose on screen, for play to turn on from (shown by :meth:`show_angle`,
        which a drag calls less often)."""
        if angle_deg is not None:
            self.angle_deg = angle_deg % 360.0

    def show_angle(self, angle_deg: float | None):
        """Show the pose's angle without asking for it again."""
        if angle_deg is None:
            return
        self.follow(angle_deg)
        angle = angle_deg % 360.0
        for widget, value in ((self.spin, round(angle, self.spin.decimals())),
                              (self.slider, round(angle * SLIDER_STEPS_PER_DEGREE))):
            if widget.value() != value:  # setting the same value still repaints it, and the bar behind it
                widget.blockSignals(True)
                widget.setValue(value)
                widget.blockSignals(False)

    def set_range(self, sweep):
        """Let play rock between the dead points of a driver that cannot turn fully (from the core's sweep)."""
        self.rocking = None if sweep is None or sweep.full_turn else tuple(sweep.range_deg)

    def set_stroke(self, stroke_mm: tuple | None):
        """Ask for a cylinder's lengths over ``stroke_mm`` (shortest, longest), or (None) for angles again."""
        if stroke_mm == self.stroke_mm:
            return
        self.stroke_mm = stroke_mm
        for widget in (self.spin, self.slider):
            widget.blockSignals(True)
        if stroke_mm is None:
            self.caption.setText("driver angle")
            self.spin.setRange(0.0, 360.0)
            self.spin.setWrapping(True)
            self.spin.setSuffix(" °")
            self.slider.setRange(0, 360 * SLIDER_STEPS_PER_DEGREE)
            self.play.setToolTip("Play / pause the driver turning")
        else:
            self.caption.setText("cylinder length")
            self.spin.setWrapping(False)
            self.spin.setRange(*stroke_mm)
            self.spin.setSuffix(" mm")
            self.slider.setRange(0, STROKE_SLIDER_STEPS)
            self.play.setToolTip("Play / pause the cylinder running over its stroke")
        for widget in (self.spin, self.slider):
            widget.blockSignals(False)
        if stroke_mm is not None:
            self.show_length(self.length_mm)

    def show_length(self, length_mm: float | None):
        """Show a cylinder's length in the pose on screen without asking for it again."""
        if length_mm is None or self.stroke_mm is None:
            return
        self.length_mm = length_mm
        low, high = self.stroke_mm
        along = 0.0 if high <= low else (length_mm - low) / (high - low)
        for widget, value in ((self.spin, round(length_mm, self.spin.decimals())),
                              (self.slider, round(min(max(along, 0.0), 1.0) * STROKE_SLIDER_STEPS))):
            if widget.value() != value:
                widget.blockSignals(True)
                widget.setValue(value)
                widget.blockSignals(False)

    def _typed(self, value: float):
        (self.angle_requested if self.stroke_mm is None else self.length_requested).emit(value)

    def _slid(self, value: int):
        if self.stroke_mm is None:
            self.angle_requested.emit(value / SLIDER_STEPS_PER_DEGREE)
            return
        low, high = self.stroke_mm
        self.length_requested.emit(low + (high - low) * value / STROKE_SLIDER_STEPS)

    def _play(self, on: bool):
        self.play.setIcon(icon("pause" if on else "play"))
        if on:
            self.timer.start()
        else:
            self.timer.stop()

    @property
    def step_deg(self) -> float:
        """The turn of one animation frame at the chosen play speed."""
        return ANIMATION_STEP_DEG * PLAY_SPEEDS[self.play_speed.currentText()]

    def advance(self):
        """One animation frame: the driver turns on by a fixed step, or rocks between its dead points;
        a cylinder runs to one end of its stroke and back."""
        if self.stroke_mm is not None:
            low, high = self.stroke_mm
            step = self.direction * (high - low) / STROKE_ANIMATION_STEPS * PLAY_SPEEDS[self.play_speed.currentText()]
            if not low <= self.length_mm + step <= high:
                self.direction = -self.direction
                step = -step
            self.length_requested.emit(min(max(self.length_mm + step, low), high))
            return
        if self.rocking is None:
            self.angle_requested.emit((self.angle_deg + self.step_deg) % 360.0)
            return
        low, high = self.rocking
        # The shown angle unwrapped into the range, so a range across 0° rocks the right way.
        angle = low + (self.angle_deg - low) % 360.0
        step = self.direction * self.step_deg
        if not low <= angle + step <= high:
            self.direction = -self.direction
            step = -step
        self.angle_requested.emit((min(max(angle + step, low), high)) % 360.0)

    @property
    def playing(self) -> bool:
        return self.play.isChecked()

    def stop(self):
        self.play.setChecked(False)
