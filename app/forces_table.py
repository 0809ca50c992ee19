"""The forces at the pose on screen, under the results table: the drive torque (a cylinder's
axial force), the force on
every link at every joint (size and direction), the guide force of every slide, the shaking
force and moment, and the power-balance check; or one plain sentence saying why there are none.

Every number is the core's :class:`kinematics.dynamics.Forces` (read, never recomputed). The
cells are rewritten in place while the pose follows a drag; rows are made again only when
the joints or links change. Each numeric cell also answers ``Qt.ItemDataRole.UserRole`` with
the number shown, so tests compare values, not text.
"""

from __future__ import annotations

import math

from PySide6.QtCore import Qt
from PySide6.QtGui import QStandardItem, QStandardItemModel
from PySide6.QtWidgets import QAbstractItemView, QHeaderView, QLabel, QTableView, QVBoxLayout, QWidget

from kinematics.dynamics import FRICTIONLESS
from kinematics.groups.vectors import direction_deg
from kinematics.reports.cylinder_forces import push_or_pull
from kinematics.reports.forces_tables import shown_value

from .display_units import sense

HEADERS = ["forces at this pose", "size", "direction"]


def _number(value: float) -> str:
    return f"{value:.5g}"


def force_rows(found) -> list:
    """Rows of three (text, value) cells from a Forces: what the table shows, in SI units
    (N, N·m), directions in degrees counter-clockwise from +x."""
    joints = [(point, link, tuple(map(float, force))) for point, by_link in found.joints_n.items()
              for link, force in by_link.items()]
    drive = found.drive_torque_n_m if found.drive_force_n is None else found.drive_force_n
    largest = max([math.hypot(*f) for _, _, f in joints] + [abs(float(drive))], default=0.0)

    def clean(value: float) -> float:
        return shown_value(value, largest)

    driver = found.mechanism.driver
    if found.drive_force_n is not None:
        # A cylinder drives by its axial force, push positive: the row gives it with its sign.
        force = clean(float(found.drive_force_n))
        rows = [[(f"drive force of {driver.cylinder_words}", None), (f"{_number(force)} N", force),
                 (push_or_pull(force), None)]]
    else:
        torque = clean(float(found.drive_torque_n_m))
        rows = [[(f"drive torque on {driver.link}", None), (f"{_number(abs(torque))} N·m", abs(torque)),
                 (sense(torque, zero="none"), None)]]
    for point, link, (x, y) in joints:
        x, y = clean(x), clean(y)
        size, direction = math.hypot(x, y), direction_deg(x, y)
        rows.append([(f"on {link} at {point}", None), (f"{_number(size)} N", size),
                     ("—" if direction is None else f"{direction:.1f}°", direction)])
    for name, slide in found.slides.items():
        normal = clean(float(slide.normal_n))
        line = found.mechanism.slides[name].line
        rows.append([(f"guide on block, slide {name}", None), (f"{_number(normal)} N", normal),
                     (f"+ = left of {line[0]}→{line[1]}", None)])
    sx, sy = (float(v) for v in found.shaking_force_n)
    shaking = math.hypot(sx, sy)
    direction = direction_deg(sx, sy)
    moment = float(found.shaking_moment_n_m)
    rows.append([("shaking force", None), (f"{_number(shaking)} N", shaking),
                 ("—" if direction is None else f"{direction:.1f}°", direction)])
    rows.append([("shaking moment", None), (f"{_number(abs(moment))} N·m", abs(moment)), (sense(moment, "none"), None)])
    check = float(found.power_balance.relative_difference)
    rows.append([("power balance check", None), (f"{check:.1e}", check), ("relative difference", None)])
    return rows


class ForcesTable(QWidget):
    """A sentence (why there are no forces, or that they are frictionless) over a table of the forces."""

    def __init__(self, parent=None):
        super().__init__(parent)
        self.message = QLabel()
        self.message.setWordWrap(True)
        self.message.setAlignment(Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignTop)
        self.model = QStandardItemModel(0, len(HEADERS), self)
        self.model.setHorizontalHeaderLabels(HEADERS)
        self.view = QTableView()
        self.view.setModel(self.model)
        self.view.verticalHeader().setVisible(False)
        self.view.setEditTriggers(QAbstractItemView.EditTrigger.NoEditTriggers)
        self.view.setAlternatingRowColors(True)
        self.view.setShowGrid(False)
        self.view.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.Interactive)
        self.view.horizontalHeader().setStretchLastSection(True)
        layout = QVBoxLayout(self)
        layout.setContentsMargins(0, 0, 0, 0)
        layout.addWidget(self.message)
        layout.addWidget(self.view, 1)
        self.shown = []
        self.layout_key = ()

    def show_forces(self, found, problem: str = ""):
        """Show the Forces ``found`` at the pose, or ``problem`` when there are none."""
        if found is None:
            self.message.setText(problem)
            self.view.setVisible(False)
            self.shown, self.layout_key = [], ()
            self.model.setRowCount(0)
            return
        self.message.setText(f"At the pose shown; {FRICTIONLESS}.")
        self.view.setVisible(True)
        rows = force_rows(found)
        key = tuple(row[0][0] for row in rows)
        if key != self.layout_key:
            self.model.setRowCount(0)
            for row in rows:
                items = []
                for column, (text, value) in enumerate(row):
                    item = QStandardItem(text)
                    item.setData(value, Qt.ItemDataRole.UserRole)
                    item.setTextAlignment((Qt.AlignmentFlag.AlignRight if column else Qt.AlignmentFlag.AlignLeft)
                                          | Qt.AlignmentFlag.AlignVCenter)
                    items.append(item)
                self.model.appendRow(items)
            self.layout_key, self.shown = key, rows
            self.view.resizeColumnsToContents()
            return
        # Only the cells whose words changed are written: a drag frame repaints what moved.
        self.model.blockSignals(True)
        changed = []
        for r, (row, before) in enumerate(zip(rows, self.shown, strict=True)):
            for column, (cell, old) in enumerate(zip(row, before, strict=True)):
                if cell != old:
                    item = self.model.item(r, column)
                    item.setText(cell[0])
                    item.setData(cell[1], Qt.ItemDataRole.UserRole)
                    changed.append(r)
        self.model.blockSignals(False)
        self.shown = rows
        if changed:
            self.model.dataChanged.emit(self.model.index(min(changed), 0),
                                        self.model.index(max(changed), len(HEADERS) - 1))
