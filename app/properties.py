"""The Design tab: the title, the chosen joint's place and whether it is fixed,
and the driver's speed. Each change is one undoable edit."""

from __future__ import annotations

from contextlib import contextmanager
from dataclasses import replace

from PySide6.QtWidgets import QCheckBox, QComboBox, QDoubleSpinBox, QFormLayout, QLabel, QLineEdit, QWidget

from kinematics import move_point

from . import building
from .building import BuildError


def _spin(low: float, high: float, decimals: int) -> QDoubleSpinBox:
    spin = QDoubleSpinBox()
    spin.setRange(low, high)
    spin.setDecimals(decimals)
    spin.setKeyboardTracking(False)  # one edit when the value is entered, not one per keystroke
    return spin


class PropertiesPanel(QWidget):
    """Reads the Document on :meth:`refresh`; writes it through ``document.edit``."""

    def __init__(self, document, say, parent=None):
        super().__init__(parent)
        self.document, self.say = document, say
        self.title = QLineEdit()
        self.point = QComboBox()
        self.x, self.y = _spin(-1e6, 1e6, 3), _spin(-1e6, 1e6, 3)
        self.fixed = QCheckBox("fixed to the frame")
        self.driver = QLabel()
        self.speed = _spin(-1e5, 1e5, 3)
        self.speed_unit = QComboBox()
        self.speed_unit.addItems(["rpm", "rad/s"])
        self.alpha = _spin(-1e6, 1e6, 3)
        self.alpha.setSuffix(" rad/s²")
        form = QFormLayout(self)
        form.addRow("title", self.title)
        form.addRow("joint", self.point)
        form.addRow("x", self.x)
        form.addRow("y", self.y)
        form.addRow("", self.fixed)
        form.addRow("driver", self.driver)
        form.addRow("speed", self.speed)
        form.addRow("speed unit", self.speed_unit)
        form.addRow("angular acceleration", self.alpha)
        self.title.editingFinished.connect(self.apply_title)
        self.point.currentTextChanged.connect(self.show_point)
        self.x.valueChanged.connect(self.apply_place)
        self.y.valueChanged.connect(self.apply_place)
        self.fixed.toggled.connect(self.apply_fixed)
        for widget in (self.speed, self.alpha):
            widget.valueChanged.connect(self.apply_driver)
        self.speed_unit.currentTextChanged.connect(self.apply_driver)
        self.refresh()

    @contextmanager
    def _quiet(self):
        """Fill the fields without their change signals writing the values back as edits."""
        widgets = (self.title, self.point, self.x, self.y, self.fixed, self.speed, self.speed_unit, self.alpha)
        for widget in widgets:
            widget.blockSignals(True)
        try:
            yield
        finally:
            for widget in widgets:
                widget.blockSignals(False)

    def refresh(self):
        """Show the Document's values without writing them back."""
        with self._quiet():
            self._fill()

    def _fill(self):
        mech = self.document.mechanism
        self.title.setText(mech.title)
        names = list(mech.points)
        if [self.point.itemText(i) for i in range(self.point.count())] != names:  # not on every drag frame
            chosen = self.point.currentText()
            self.point.clear()
            self.point.addItems(names)
            if chosen in mech.points:
                self.point.setCurrentText(chosen)
        suffix = f" {mech.length_unit}"
        self.x.setSuffix(suffix)
        self.y.setSuffix(suffix)
        self._fill_point(self.point.currentText())
        driver = mech.driver
        self.driver.setText(f"{driver.link} about {driver.pivot}" if driver else "none yet (Driver tool)")
        for widget in (self.speed, self.speed_unit, self.alpha):
            widget.setEnabled(driver is not None)
        if driver is not None:
            self.speed.setValue(driver.speed_value)
            self.speed_unit.setCurrentText(driver.speed_unit)
            self.alpha.setValue(driver.angular_acceleration_rad_s2)

    def _fill_point(self, name: str):
        mech = self.document.mechanism
        present = name in mech.points
        for widget in (self.x, self.y, self.fixed):
            widget.setEnabled(present)
        if present:
            self.x.setValue(float(mech.points[name][0]))
            self.y.setValue(float(mech.points[name][1]))
            self.fixed.setChecked(name in mech.ground)

    def show_point(self, name: str):
        """Show joint ``name`` (chosen in the list, or clicked in the space diagram)."""
        with self._quiet():
            if self.point.currentText() != name:
                self.point.setCurrentText(name)
            self._fill_point(name)

    def _edit(self, mechanism, text):
        self.document.edit(mechanism, text, check=False)

    def apply_title(self):
        if self.title.text() != self.document.mechanism.title:
            self._edit(replace(self.document.mechanism, title=self.title.text()), "rename the design")

    def apply_place(self, *_):
        name, mech = self.point.currentText(), self.document.mechanism
        if name in mech.points and (self.x.value(), self.y.value()) != tuple(mech.points[name]):
            moved = building.keep_slides_on_guides(move_point(mech, name, (self.x.value(), self.y.value())))
            self._edit(moved, f"place {name}")

    def apply_fixed(self, on: bool):
        name = self.point.currentText()
        if name in self.document.mechanism.points:
            self._edit(building.set_fixed(self.document.mechanism, name, on), f"{'fix' if on else 'free'} {name}")

    def apply_driver(self, *_):
        try:
            mech = building.set_speed(self.document.mechanism, self.speed.value(), self.speed_unit.currentText(),
                                      self.alpha.value())
        except BuildError as error:
            self.say(str(error))
            return
        self._edit(mech, "set the driver's speed")
