"""The Masses and loads tab: per link its mass, centre of mass and moment of inertia about it;
point masses; external loads with the driver angles they act over; gravity on or off.

Every change is one undoable edit of the Document (``document.edit``), saved with the design
(format 2 only while there is mass data). A refusal is shown under the grid it came from,
naming its place (``masses.rod.inertia: a moment of inertia cannot be negative``), and the
design is left as it was.
"""

from __future__ import annotations

from PySide6.QtWidgets import (
    QCheckBox,
    QHBoxLayout,
    QLabel,
    QLineEdit,
    QPushButton,
    QScrollArea,
    QVBoxLayout,
    QWidget,
)

from kinematics import FileFormatError, KinematicsError, Load
from kinematics.dynamics import FRICTIONLESS

from . import mass_edits
from .mass_tables import LinkGrid, LoadGrid, PointGrid, parse_number, shown

REFUSAL_STYLE = "color: #a0221a;"


def _refusal_label() -> QLabel:
    label = QLabel()
    label.setWordWrap(True)
    label.setStyleSheet(REFUSAL_STYLE)
    label.setVisible(False)
    return label


class MassEditor(QScrollArea):
    """Reads the Document on :meth:`refresh`; writes it through ``document.edit``."""

    def __init__(self, document, say, parent=None):
        super().__init__(parent)
        self.document, self.say = document, say
        self.links, self.points, self.loads = LinkGrid(), PointGrid(), LoadGrid()
        self.refusals = {grid: _refusal_label() for grid in (self.links, self.points, self.loads)}
        self.add_force = QPushButton("Add force")
        self.add_force.setToolTip("A force at a moving point (on the pin or block there, or on one link named)")
        self.add_torque = QPushButton("Add torque")
        self.add_torque.setToolTip("A torque on a moving link, counter-clockwise positive")
        self.remove_load = QPushButton("Remove load")
        self.gravity = QCheckBox("gravity")
        self.gravity.setToolTip("Off for a machine that moves in a horizontal plane")
        self.gravity_x, self.gravity_y = QLineEdit(), QLineEdit()
        for field, name in ((self.gravity_x, "x"), (self.gravity_y, "y")):
            field.setMaximumWidth(90)
            field.setToolTip(f"the {name} component of gravity in the drawing's axes, m/s²")
        self.gravity_refusal = _refusal_label()
        self._key = None
        self._lay_out()
        for grid in self.refusals:
            grid.edited.connect(lambda after, text, grid=grid: self._edited(grid, after, text))
        self.add_force.clicked.connect(self.new_force)
        self.add_torque.clicked.connect(self.new_torque)
        self.remove_load.clicked.connect(self.remove_chosen_load)
        self.gravity.toggled.connect(self.apply_gravity)
        for field in (self.gravity_x, self.gravity_y):
            field.editingFinished.connect(self.apply_gravity)
        self.refresh()

    def _lay_out(self):
        inner = QWidget()
        column = QVBoxLayout(inner)
        note = QLabel(f"Masses and loads for the forces; {FRICTIONLESS}. A blank mass is none.")
        note.setWordWrap(True)
        column.addWidget(note)
        for title, grid in (("Links", self.links), ("Point masses", self.points), ("Loads", self.loads)):
            column.addWidget(QLabel(f"<b>{title}</b>"))
            column.addWidget(grid)
            column.addWidget(self.refusals[grid])
            if grid is self.loads:
                buttons = QHBoxLayout()
                for button in (self.add_force, self.add_torque, self.remove_load):
                    buttons.addWidget(button)
                buttons.addStretch(1)
                column.addLayout(buttons)
        row = QHBoxLayout()
        row.addWidget(self.gravity)
        for label, field in (("x", self.gravity_x), ("y", self.gravity_y)):
            row.addWidget(QLabel(label))
            row.addWidget(field)
        row.addWidget(QLabel("m/s²"))
        row.addStretch(1)
        column.addLayout(row)
        column.addWidget(self.gravity_refusal)
        column.addStretch(1)
        self.setWidget(inner)
        self.setWidgetResizable(True)

    # showing ----------------------------------------------------------------
    def refresh(self):
        """Show the design's mass data; a drag of the pose alone (same links, points, mass data) costs nothing."""
        mech = self.document.mechanism
        key = (tuple(mech.links), tuple(mech.points), mech.ground, mech.length_unit, mech.mass_data)
        if key == self._key:
            return
        self._key = key
        for grid in self.refusals:
            grid.show_design(mech)
            grid.fit_height()
        gravity = mech.mass_data.gravity_value if mech.mass_data else None
        for widget in (self.gravity, self.gravity_x, self.gravity_y):
            widget.blockSignals(True)
        self.gravity.setChecked(gravity is not None)
        shown_value = gravity if gravity is not None else mass_edits.STANDARD_GRAVITY_M_S2
        self.gravity_x.setText(shown(shown_value[0]))
        self.gravity_y.setText(shown(shown_value[1]))
        for widget in (self.gravity, self.gravity_x, self.gravity_y):
            widget.blockSignals(False)
        has_points = bool(mass_edits.moving_points(mech))
        self.add_force.setEnabled(has_points)
        self.add_torque.setEnabled(bool(mass_edits.moving_links(mech)))
        self.remove_load.setEnabled(self.loads.rowCount() > 0)

    def _show_refusal(self, label: QLabel, text: str):
        label.setText(text)
        label.setVisible(bool(text))
        if text:
            self.say(text)

    # editing ----------------------------------------------------------------
    def _edited(self, grid, after, text: str):
        if after is None:  # refused: the design is kept, the grid shows it again with the cell marked
            self._show_refusal(self.refusals[grid], text)
            self._key = None
            self.refresh()
            return
        self._show_refusal(self.refusals[grid], "")
        self._push(after, text, self.refusals[grid])

    def _push(self, after, text: str, label: QLabel):
        try:
            problem = self.document.edit(after, text, check=False)
        except KinematicsError as error:
            problem = str(error)
        self._show_refusal(label, problem)
        self._key = None
        self.refresh()

    def _try(self, make, text: str, label: QLabel):
        try:
            after = make()
        except FileFormatError as error:
            self._show_refusal(label, str(error))
            return
        self._show_refusal(label, "")
        self._push(after, text, label)

    def new_force(self):
        """A new load: a zero force at the last moving point (the tool end, as a rule), to fill in."""
        mech = self.document.mechanism
        name = mass_edits.new_load_name(mech, "force")
        point = mass_edits.moving_points(mech)[-1]
        self._try(lambda: mass_edits.with_load(mech, name, Load(name, point=point, force_value=(0, 0))),
                  f"add load {name}", self.refusals[self.loads])

    def new_torque(self):
        """A new load: a zero torque on the last moving link, to fill in."""
        mech = self.document.mechanism
        name = mass_edits.new_load_name(mech, "torque")
        link = mass_edits.moving_links(mech)[-1]
        self._try(lambda: mass_edits.with_load(mech, name, Load(name, link=link, torque_value=0)),
                  f"add load {name}", self.refusals[self.loads])

    def remove_chosen_load(self):
        row = self.loads.currentRow()
        if not 0 <= row < self.loads.rowCount():
            row = self.loads.rowCount() - 1
        if row < 0:
            return
        name = self.loads.item(row, 0).text()
        mech = self.document.mechanism
        self._try(lambda: mass_edits.with_load(mech, name, None), f"remove load {name}", self.refusals[self.loads])

    def apply_gravity(self, *_):
        mech = self.document.mechanism
        if not self.gravity.isChecked():
            if mech.mass_data is not None and mech.mass_data.gravity_value is not None:
                self._try(lambda: mass_edits.with_gravity(mech, None), "turn gravity off", self.gravity_refusal)
            return

        def make():
            value = (parse_number(self.gravity_x.text(), "gravity", "gravity"),
                     parse_number(self.gravity_y.text(), "gravity", "gravity"))
            return mass_edits.with_gravity(mech, value)

        current = mech.mass_data.gravity_value if mech.mass_data else None
        try:
            wanted = make().mass_data.gravity_value
        except FileFormatError as error:
            self._show_refusal(self.gravity_refusal, str(error))
            return
        if wanted != current:
            self._try(make, "set gravity" if current is not None else "turn gravity on", self.gravity_refusal)
