"""The results table: every point's velocity and acceleration, every link's
ω and α, every slide's sliding rates, in the units the user picked.

A table model refreshed with one ``dataChanged`` per pose (per-cell widget
items cost several milliseconds a frame). Each numeric cell also answers
``Qt.UserRole`` with the number shown, so tests compare values, not text.
"""

from __future__ import annotations

import math

from PySide6.QtCore import Qt, Signal
from PySide6.QtGui import QStandardItem, QStandardItemModel
from PySide6.QtWidgets import QAbstractItemView, QHeaderView, QTableView

from .display_units import LENGTH_SYSTEMS, angular_speed, direction_deg, sense


def _number(value: float) -> str:
    return f"{value:.5g}"


def _angle(value: float | None) -> str:
    return "—" if value is None else f"{value:.1f}°"


class ResultsModel(QStandardItemModel):
    """Rows: points, then links, then slides; each row five (text, value) cells.

    The cells live in Qt's own item model so painting never calls back into
    Python; a new pose is written with signals blocked and announced with a
    single ``dataChanged``.
    """

    layout_reset = Signal()

    def __init__(self, parent=None):
        super().__init__(0, 5, parent)
        self.length = LENGTH_SYSTEMS["mm"]
        self.speed_unit = "rad/s"
        self.solution = None
        self.layout_key = ()
        self.rows: dict[str, int] = {}
        self._headers()

    def _headers(self):
        self.setHorizontalHeaderLabels(["", f"velocity ({self.length.velocity_unit}) / ω ({self.speed_unit})",
                                        "direction", f"acceleration ({self.length.acceleration_unit}) / α (rad/s²)",
                                        "direction"])

    def set_units(self, length_unit: str, speed_unit: str):
        self.length, self.speed_unit = LENGTH_SYSTEMS[length_unit], speed_unit
        self._headers()
        self.show_solution(self.solution)

    def show_solution(self, solution):
        """Fill the rows from ``solution`` (None empties the table)."""
        self.solution = solution
        if solution is None:
            rows = []
        else:
            mech = solution.mechanism
            rows = ([("point", p) for p in mech.points] + [("link", n) for n in mech.links]
                    + [("slide", n) for n in mech.slides])
        cells = [getattr(self, f"_{kind}_cells")(name, solution) for kind, name in rows]
        if tuple(rows) != self.layout_key:
            self.setRowCount(0)
            for row in cells:
                items = []
                for column, (text, value) in enumerate(row):
                    item = QStandardItem(text)
                    item.setData(value, Qt.UserRole)
                    item.setTextAlignment(Qt.AlignRight | Qt.AlignVCenter if column else Qt.AlignLeft | Qt.AlignVCenter)
                    item.setEditable(False)
                    items.append(item)
                self.appendRow(items)
            self.layout_key = tuple(rows)
            self.rows = {name: i for i, (kind, name) in enumerate(rows) if kind == "point"}
            self.layout_reset.emit()
            return
        if not cells:
            return
        self.blockSignals(True)
        for r, row in enumerate(cells):
            for column, (text, value) in enumerate(row):
                item = self.item(r, column)
                item.setText(text)
                item.setData(value, Qt.UserRole)
        self.blockSignals(False)
        self.dataChanged.emit(self.index(0, 0), self.index(len(cells) - 1, 4))

    def _point_cells(self, name, solution):
        v, a = solution.velocity(name), solution.acceleration(name)
        speed = self.length.velocity(math.hypot(*v))
        accel = self.length.acceleration(math.hypot(*a))
        return [(f"point {name}", None), (_number(speed), speed), (_angle(direction_deg(*v)), direction_deg(*v)),
                (_number(accel), accel), (_angle(direction_deg(*a)), direction_deg(*a))]

    def _link_cells(self, name, solution):
        omega = solution.angular_velocity[name]
        alpha = solution.angular_acceleration[name]
        shown = angular_speed(abs(omega), self.speed_unit)
        return [(f"link {name}", None), (f"ω {_number(shown)}", shown), (sense(omega), None),
                (f"α {_number(abs(alpha))}", abs(alpha)), (sense(alpha, zero="none"), None)]

    def _slide_cells(self, name, solution):
        slide = solution.mechanism.slides[name]
        velocity = self.length.velocity(solution.sliding_velocity[name])
        accel = self.length.acceleration(solution.sliding_acceleration[name])
        towards = (f"+ = {slide.line[0]}→{slide.line[1]}", None)
        return [(f"slide {name} ({slide.point} on {slide.guide})", None), (f"sliding {_number(velocity)}", velocity),
                towards, (f"sliding {_number(accel)}", accel), towards]


class ResultsTable(QTableView):
    """The view of a :class:`ResultsModel`."""

    def __init__(self, parent=None):
        super().__init__(parent)
        self.results = ResultsModel(self)
        self.setModel(self.results)
        self.setEditTriggers(QAbstractItemView.NoEditTriggers)
        self.setSelectionBehavior(QAbstractItemView.SelectRows)
        self.setSelectionMode(QAbstractItemView.SingleSelection)
        self.verticalHeader().setVisible(False)
        # Sized to the contents when the rows change, not on every frame (that reads every cell).
        self.horizontalHeader().setSectionResizeMode(QHeaderView.Interactive)
        self.setAlternatingRowColors(True)
        self.results.layout_reset.connect(self.resizeColumnsToContents)
        self.results.headerDataChanged.connect(self.resizeColumnsToContents)

    def show_solution(self, solution):
        self.results.show_solution(solution)

    def set_units(self, length_unit: str, speed_unit: str):
        self.results.set_units(length_unit, speed_unit)

    def mark_point(self, name: str | None):
        """Select the row of joint ``name`` (hovering in the space diagram)."""
        if name in self.results.rows:
            self.selectRow(self.results.rows[name])
        else:
            self.clearSelection()
