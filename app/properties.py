"""The Design tab: the title, the chosen joint's name, place and whether it is fixed,
the chosen link's name, and the driver's speed. Each change is one undoable edit."""

from __future__ import annotations

import math
from contextlib import contextmanager
from dataclasses import replace

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QCheckBox, QComboBox, QDoubleSpinBox, QFormLayout, QLabel, QLineEdit, QWidget

from kinematics import KinematicsError, move_point, rename_link, rename_point, rename_slide
from kinematics.files.fileschema import MAX_COORDINATE, MAX_RATE
from kinematics.model.mechanism import GROUND
from kinematics.model.units import M_S_PER_LINEAR_SPEED_UNIT, metres_per

from . import building
from .building import BuildError

# The place fields show a joint to this resolution whatever the file's unit (1 µm: 3 decimals in mm,
# 6 in m, 5 in inches), across the whole range the file format holds.
PLACE_RESOLUTION_M = 1e-6
CYLINDER_SPEED_UNITS = {unit: M_S_PER_LINEAR_SPEED_UNIT[unit] for unit in ("mm/s", "m/s")}  # as listed, m/s each


def _spin(low: float, high: float, decimals: int) -> QDoubleSpinBox:
    spin = QDoubleSpinBox()
    spin.setRange(low, high)
    spin.setDecimals(decimals)
    spin.setKeyboardTracking(False)  # one edit when the value is entered, not one per keystroke
    return spin


def _refill(combo: QComboBox, names: list):
    """List ``names`` in ``combo``, keeping the chosen one; a name renamed in place stays chosen."""
    listed = [combo.itemText(i) for i in range(combo.count())]
    if listed == names:  # not on every drag frame
        return
    chosen, index = combo.currentText(), combo.currentIndex()
    combo.clear()
    combo.addItems(names)
    if chosen in names:
        combo.setCurrentText(chosen)
    elif len(listed) == len(names) and index >= 0:
        combo.setCurrentIndex(index)  # a rename keeps its place in the file's order


def _refusal_label() -> QLabel:
    label = QLabel()
    label.setWordWrap(True)
    label.setStyleSheet("color: #b00020")
    label.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
    label.hide()
    return label


def _say_beside(label: QLabel, text: str):
    label.setText(text)
    label.setVisible(bool(text))


def _show_text(field: QLineEdit, text: str):
    """Show ``text`` unless the user is typing in ``field`` (a driver turning refreshes the tab)."""
    if not field.isModified():
        field.setText(text)


class PropertiesPanel(QWidget):
    """Reads the Document on :meth:`refresh`; writes it through ``document.edit``."""

    def __init__(self, document, say, parent=None):
        super().__init__(parent)
        self.document, self.say = document, say
        self.shown_unit = None  # the length unit the place and stroke fields show (None: the file's)
        self.title = QLineEdit()
        self.point = QComboBox()
        self.point_name = QLineEdit()
        self.x, self.y = _spin(-MAX_COORDINATE, MAX_COORDINATE, 3), _spin(-MAX_COORDINATE, MAX_COORDINATE, 3)
        self.fixed = QCheckBox("fixed to the frame")
        self.link = QComboBox()
        self.link_name = QLineEdit()
        self.link_points = QLabel()
        self.link_length = _spin(0.0, MAX_COORDINATE, 3)
        self.slide = QComboBox()
        self.slide_name = QLineEdit()
        self.slide_from, self.slide_to = QComboBox(), QComboBox()
        self.slide_about = QLabel()
        self.driver = QLabel()
        self.speed = _spin(-MAX_RATE, MAX_RATE, 3)
        self.speed_unit = QComboBox()
        self.speed_unit.addItems(["rpm", "rad/s"])
        self.alpha = _spin(-MAX_RATE, MAX_RATE, 3)
        self.alpha.setSuffix(" rad/s²")
        # A cylinder's stroke: its least and greatest length; the lowest value, 0, is "no limit".
        self.stroke_min, self.stroke_max = _spin(0.0, MAX_COORDINATE, 3), _spin(0.0, MAX_COORDINATE, 3)
        for field in (self.stroke_min, self.stroke_max):
            field.setSpecialValueText("no limit")
        for widget, tip in ((self.title, "The design's title (printed on the sheet)"),
                            (self.point, "The joint shown below (or click one in the space diagram)"),
                            (self.point_name, "Type a new name and press Enter to rename the joint everywhere"),
                            (self.x, "The joint's x in the reference pose, in the file's unit"),
                            (self.y, "The joint's y in the reference pose, in the file's unit"),
                            (self.fixed, "Fix the joint to the frame (a fixed pivot), or free it"),
                            (self.link, "The link shown below (or click one in the space diagram)"),
                            (self.link_name, "Type a new name and press Enter to rename the link everywhere"),
                            (self.link_length, "A bar's length, joint to joint: type one to move its free end "
                                               "along the bar"),
                            (self.slide, "The slide shown below"),
                            (self.slide_name, "Type a new name and press Enter to rename the slide everywhere"),
                            (self.slide_from, "The first point of the slide's line (both fixed: a fixed guide; "
                                              "both on one link: a slot in it)"),
                            (self.slide_to, "The second point of the slide's line"),
                            (self.speed, "The driver's speed, counter-clockwise positive"),
                            (self.speed_unit, "The unit of the driver's speed"),
                            (self.alpha, "The driver's angular acceleration, counter-clockwise positive"),
                            (self.stroke_min, "The cylinder's least length (fully retracted), pivot to rod end"),
                            (self.stroke_max, "The cylinder's greatest length (fully extended), pivot to rod end")):
            widget.setToolTip(tip)
        # A refusal is said beside the field it is about, and stays until the next edit or choice.
        self.point_refusal, self.link_refusal, self.slide_refusal = (_refusal_label(), _refusal_label(),
                                                                     _refusal_label())
        form = QFormLayout(self)
        form.addRow("title", self.title)
        form.addRow("joint", self.point)
        form.addRow("joint name", self.point_name)
        form.addRow("x", self.x)
        form.addRow("y", self.y)
        form.addRow("", self.fixed)
        form.addRow("", self.point_refusal)
        form.addRow("link", self.link)
        form.addRow("link name", self.link_name)
        form.addRow("", self.link_points)
        form.addRow("length", self.link_length)
        form.addRow("", self.link_refusal)
        form.addRow("slide", self.slide)
        form.addRow("slide name", self.slide_name)
        form.addRow("line from", self.slide_from)
        form.addRow("line to", self.slide_to)
        form.addRow("", self.slide_about)
        form.addRow("", self.slide_refusal)
        form.addRow("driver", self.driver)
        form.addRow("speed", self.speed)
        form.addRow("speed unit", self.speed_unit)
        form.addRow("angular acceleration", self.alpha)
        form.addRow("stroke from", self.stroke_min)
        form.addRow("stroke to", self.stroke_max)
        self.form = form
        self.title.editingFinished.connect(self.apply_title)
        self.point.currentTextChanged.connect(self.show_point)
        self.point_name.editingFinished.connect(self.apply_point_name)
        self.link.currentTextChanged.connect(self.show_link)
        self.link_name.editingFinished.connect(self.apply_link_name)
        self.link_length.valueChanged.connect(self.apply_link_length)
        self.slide.currentTextChanged.connect(self.show_slide)
        self.slide_name.editingFinished.connect(self.apply_slide_name)
        for combo in (self.slide_from, self.slide_to):
            combo.currentTextChanged.connect(self.apply_slide_line)
        self.x.valueChanged.connect(lambda value: self.apply_place(0, value))
        self.y.valueChanged.connect(lambda value: self.apply_place(1, value))
        self.fixed.toggled.connect(self.apply_fixed)
        for widget in (self.speed, self.alpha, self.stroke_min, self.stroke_max):
            widget.valueChanged.connect(self.apply_driver)
        self.speed_unit.currentTextChanged.connect(self.apply_driver)
        self.refresh()

    @contextmanager
    def _quiet(self):
        """Fill the fields without their change signals writing the values back as edits."""
        widgets = (self.title, self.point, self.point_name, self.x, self.y, self.fixed, self.link, self.link_name,
                   self.link_length,
                   self.slide, self.slide_name, self.slide_from, self.slide_to,
                   self.speed, self.speed_unit, self.alpha, self.stroke_min, self.stroke_max)
        for widget in widgets:
            widget.blockSignals(True)
        try:
            yield
        finally:
            for widget in widgets:
                widget.blockSignals(False)

    def set_length_unit(self, unit: str):
        """Show places and strokes in ``unit`` (the window's choice; the file keeps its own)."""
        self.shown_unit = unit
        self.refresh()

    def _shown_unit(self) -> str:
        """The length unit the fields show: the window's choice, else the file's."""
        return self.shown_unit or self.document.mechanism.length_unit

    def _per_file_unit(self) -> float:
        """Shown units in one of the file's length units."""
        file_unit = self.document.mechanism.length_unit
        if self.shown_unit is None or self.shown_unit == file_unit:
            return 1.0
        return metres_per(file_unit) / metres_per(self.shown_unit)

    def _in_file_unit(self, shown: float, field: QDoubleSpinBox, stated: float | None = None) -> float:
        """A value typed in ``field`` (shown units) in the file's unit; a value that shows as the
        ``stated`` one does (to the field's decimals) is that value, not its rounding."""
        ratio = self._per_file_unit()
        if stated is not None and round(stated * ratio, field.decimals()) == round(shown, field.decimals()):
            return stated
        return shown / ratio

    def refresh(self):
        """Show the Document's values without writing them back."""
        with self._quiet():
            self._fill()

    def _fill(self):
        mech = self.document.mechanism
        _show_text(self.title, mech.title)
        _refill(self.point, list(mech.points))
        _refill(self.link, list(mech.links))
        unit = self._shown_unit()
        decimals = max(0, math.ceil(-math.log10(PLACE_RESOLUTION_M / metres_per(unit)) - 1e-9))
        limit = MAX_COORDINATE * self._per_file_unit()
        for field in (self.x, self.y, self.link_length, self.stroke_min, self.stroke_max):
            field.setDecimals(decimals)
        for field in (self.x, self.y, self.link_length):
            field.setSuffix(f" {unit}")
            field.setRange(-limit, limit)
        self.link_length.setMinimum(0.0)
        for field in (self.stroke_min, self.stroke_max):
            field.setRange(0.0, limit)
        self._fill_point(self.point.currentText())
        self._fill_link(self.link.currentText())
        _refill(self.slide, list(mech.slides))
        self._fill_slide(self.slide.currentText())
        self._fill_driver(mech)

    def _fill_driver(self, mech):
        """The driver's rows: a crank's speed and angular acceleration, or a cylinder's extension speed,
        its acceleration (in the speed's length unit) and its stroke."""
        driver = mech.driver
        cylinder = driver is not None and driver.is_actuator
        if cylinder:
            self.driver.setText(f"{driver.cylinder_words}, barrel pivoted at {driver.pivot}")
        else:
            self.driver.setText(f"{driver.link} about {driver.pivot}" if driver else "none yet (Driver tool)")
        for widget in (self.speed, self.speed_unit, self.alpha):
            widget.setEnabled(driver is not None)
        self.form.labelForField(self.speed).setText("extension speed" if cylinder else "speed")
        self.form.labelForField(self.alpha).setText("extension acceleration" if cylinder else "angular acceleration")
        for field in (self.stroke_min, self.stroke_max):
            self.form.setRowVisible(field, cylinder)
        _refill(self.speed_unit, list(CYLINDER_SPEED_UNITS) if cylinder else ["rpm", "rad/s"])
        self.speed.setToolTip("The cylinder's extension speed (negative: it retracts)" if cylinder
                              else "The driver's speed, counter-clockwise positive")
        if driver is None:
            return
        if not cylinder:
            self.speed.setValue(driver.speed_value)
            self.speed_unit.setCurrentText(driver.speed_unit)
            self.alpha.setSuffix(" rad/s²")
            self.alpha.setValue(driver.angular_acceleration_rad_s2)
            return
        unit = driver.linear_speed_unit
        self.speed.setValue(driver.linear_speed_value)
        self.speed_unit.setCurrentText(unit)
        self.alpha.setSuffix(f" {unit}²")
        self.alpha.setValue(driver.linear_acceleration_m_s2 / CYLINDER_SPEED_UNITS[unit])
        for field, value in ((self.stroke_min, driver.stroke_min), (self.stroke_max, driver.stroke_max)):
            field.setSuffix(f" {self._shown_unit()}")
            field.setValue((value or 0.0) * self._per_file_unit())

    def _fill_point(self, name: str):
        mech = self.document.mechanism
        present = name in mech.points
        for widget in (self.point_name, self.x, self.y, self.fixed):
            widget.setEnabled(present)
        _show_text(self.point_name, name if present else "")
        if present:
            self.x.setValue(float(mech.points[name][0]) * self._per_file_unit())
            self.y.setValue(float(mech.points[name][1]) * self._per_file_unit())
            self.fixed.setChecked(name in mech.ground)

    def _show(self, chooser: QComboBox, name_field: QLineEdit, refusal: QLabel, fill, name: str):
        """Make ``name`` the one ``chooser`` shows and fill its rows with ``fill``, quietly; a name
        typed for another one is not this one's, and an earlier refusal goes."""
        with self._quiet():
            if chooser.currentText() != name:
                chooser.setCurrentText(name)
            name_field.setModified(False)
            _say_beside(refusal, "")
            fill(name)

    def show_point(self, name: str):
        """Show joint ``name`` (chosen in the list, or clicked in the space diagram)."""
        self._show(self.point, self.point_name, self.point_refusal, self._fill_point, name)

    def _fill_link(self, name: str):
        points = self.document.mechanism.links.get(name)
        self.link_name.setEnabled(points is not None)
        _show_text(self.link_name, name if points is not None else "")
        self.link_points.setText(f"joins {', '.join(points)}" if points else "no links yet (Link tool)")
        bar = points is not None and len(points) == 2
        self.link_length.setEnabled(bar)
        if bar:
            (x0, y0), (x1, y1) = (self.document.mechanism.points[n] for n in points)
            self.link_length.setValue(math.hypot(x1 - x0, y1 - y0) * self._per_file_unit())

    def show_link(self, name: str):
        """Show link ``name`` (chosen in the list, clicked or just made in the space diagram)."""
        self._show(self.link, self.link_name, self.link_refusal, self._fill_link, name)

    def _fill_slide(self, name: str):
        mech = self.document.mechanism
        slide = mech.slides.get(name)
        for widget in (self.slide_name, self.slide_from, self.slide_to):
            widget.setEnabled(slide is not None)
        _show_text(self.slide_name, name if slide is not None else "")
        if slide is None:
            self.slide_about.setText("no slides yet (Slide tool)")
            return
        for combo, end in ((self.slide_from, slide.line[0]), (self.slide_to, slide.line[1])):
            _refill(combo, list(mech.points))
            combo.setCurrentText(end)
        where = "the frame (a fixed guide)" if slide.guide == GROUND else f"link {slide.guide} (a slot in it)"
        self.slide_about.setText(f"{slide.point} slides on {where}")

    def show_slide(self, name: str):
        """Show slide ``name`` (chosen in the list)."""
        self._show(self.slide, self.slide_name, self.slide_refusal, self._fill_slide, name)

    def apply_link_length(self, value: float):
        """Make the shown bar ``value`` long (shown units); its free end moves along it."""
        name, mech = self.link.currentText(), self.document.mechanism
        points = mech.links.get(name)
        if points is None or len(points) != 2:
            return
        (x0, y0), (x1, y1) = (mech.points[n] for n in points)
        now = math.hypot(x1 - x0, y1 - y0)
        length = self._in_file_unit(value, self.link_length, now)
        if length == now:
            return
        try:
            resized = building.set_link_length(mech, name, length)
        except (BuildError, KinematicsError) as error:
            self.refresh()
            _say_beside(self.link_refusal, str(error))
            return
        self._edit(resized, f"make {name} {value:g} {self._shown_unit()} long")

    def apply_slide_name(self):
        self._apply_name(self.slide_name, self.slide.currentText(), "slide", rename_slide, self.slide_refusal)

    def apply_slide_line(self, *_):
        """Run the shown slide along the line through the two points chosen."""
        name, mech = self.slide.currentText(), self.document.mechanism
        if name not in mech.slides:
            return
        e, f = self.slide_from.currentText(), self.slide_to.currentText()
        if (e, f) == tuple(mech.slides[name].line):
            return
        try:
            moved = building.set_slide_line(mech, name, e, f)
        except BuildError as error:
            self.refresh()  # the choosers show the slide's line again
            _say_beside(self.slide_refusal, str(error))
            return
        self._edit(moved, f"run {name} along {e}–{f}")

    def _edit(self, mechanism, text):
        _say_beside(self.point_refusal, "")
        _say_beside(self.link_refusal, "")
        _say_beside(self.slide_refusal, "")
        self.document.edit(mechanism, text, check=False)

    def apply_title(self):
        self.title.setModified(False)
        if self.title.text() != self.document.mechanism.title:
            self._edit(replace(self.document.mechanism, title=self.title.text()), "rename the design")

    def apply_point_name(self):
        self._apply_name(self.point_name, self.point.currentText(), "joint", rename_point, self.point_refusal)

    def apply_link_name(self):
        self._apply_name(self.link_name, self.link.currentText(), "link", rename_link, self.link_refusal)

    def _apply_name(self, field: QLineEdit, old: str, kind: str, rename, refusal: QLabel):
        """Rename ``kind`` ``old`` to the text of ``field``; a name the core refuses is said and not kept."""
        new = field.text().strip()
        field.setModified(False)
        if not old or new == old:
            field.setText(old)
            return
        try:
            renamed = rename(self.document.mechanism, old, new)
        except KinematicsError as error:
            field.setText(old)
            _say_beside(refusal, str(error))
            return
        self._edit(renamed, f"rename {kind} {old} to {new}")

    def apply_place(self, axis: int, value: float):
        """Set coordinate ``axis`` (0 x, 1 y) of the shown joint; the other one stays exactly as it is
        (the field showing it may hold fewer digits than the file)."""
        name, mech = self.point.currentText(), self.document.mechanism
        if name not in mech.points:
            return
        value = self._in_file_unit(value, (self.x, self.y)[axis], float(mech.points[name][axis]))
        if value == mech.points[name][axis]:
            return
        xy = list(mech.points[name])
        xy[axis] = value
        try:
            moved = building.keep_slides_on_guides(move_point(mech, name, xy))
        except KinematicsError as error:
            self.refresh()
            _say_beside(self.point_refusal, str(error))
            return
        self._edit(moved, f"place {name}")

    def apply_fixed(self, on: bool):
        name = self.point.currentText()
        if name in self.document.mechanism.points:
            self._edit(building.set_fixed(self.document.mechanism, name, on), f"{'fix' if on else 'free'} {name}")

    def apply_driver(self, *_):
        mech = self.document.mechanism
        try:
            if mech.driver is not None and mech.driver.is_actuator:
                low, high = self.stroke_min.value(), self.stroke_max.value()
                if low and high and not low < high:
                    unit = self._shown_unit()
                    raise BuildError(f"the stroke from {low:g} {unit} must be below the stroke to {high:g} {unit}")
                stated = (mech.driver.stroke_min, mech.driver.stroke_max)
                stroke = tuple(self._in_file_unit(field.value(), field, value) or None
                               for field, value in zip((self.stroke_min, self.stroke_max), stated, strict=True))
                mech = building.set_cylinder_motion(mech, self.speed.value(), self.speed_unit.currentText(),
                                                    self.alpha.value(), stroke)
            else:
                mech = building.set_speed(mech, self.speed.value(), self.speed_unit.currentText(), self.alpha.value())
        except (BuildError, KinematicsError) as error:
            self.say(str(error))
            self.refresh()  # the fields show the design's values again
            return
        self._edit(mech, "set the driver's speed")
