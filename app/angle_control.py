"""The driver-angle control: a typed value, a slider, play/pause and the play speed."""

from __future__ import annotations

from PySide6.QtCore import Qt, QTimer, Signal
from PySide6.QtWidgets import QComboBox, QDoubleSpinBox, QHBoxLayout, QLabel, QSlider, QToolButton, QWidget

from .icons import icon

SLIDER_STEPS_PER_DEGREE = 10
ANIMATION_STEP_DEG = 2.0
ANIMATION_INTERVAL_MS = 33  # about 30 frames a second
PLAY_SPEEDS = {"¼×": 0.25, "½×": 0.5, "1×": 1.0, "2×": 2.0, "4×": 4.0}  # times ANIMATION_STEP_DEG a frame


class AngleControl(QWidget):
    """Asks for driver angles (degrees CCW from +x) through ``angle_requested``."""

    angle_requested = Signal(float)
    playing_changed = Signal(bool)

    def __init__(self, parent=None):
        super().__init__(parent)
        self.spin = QDoubleSpinBox()
        self.spin.setRange(0.0, 360.0)
        self.spin.setWrapping(True)
        self.spin.setDecimals(1)
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
        self.direction = 1.0
        self.timer = QTimer(self)
        self.timer.setInterval(ANIMATION_INTERVAL_MS)
        layout = QHBoxLayout(self)
        layout.setContentsMargins(4, 0, 4, 0)
        layout.addWidget(QLabel("driver angle"))
        layout.addWidget(self.spin)
        layout.addWidget(self.slider, 1)
        layout.addWidget(self.play)
        layout.addWidget(self.play_speed)
        self.spin.valueChanged.connect(self.angle_requested.emit)
        self.slider.valueChanged.connect(lambda v: self.angle_requested.emit(v / SLIDER_STEPS_PER_DEGREE))
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
        """One animation frame: the driver turns on by a step, or rocks between its dead points."""
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
