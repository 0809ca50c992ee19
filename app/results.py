"""The results table: every point's velocity and acceleration, every link's
ω and α, every slide's sliding rates, and the radial, tangential and Coriolis
components of each relative acceleration (as the acceleration polygon lays
them), in the units the user picked; and, for a file that names its output, the
output's velocity ratio and mechanical advantage against the driver.

A table model refreshed with one ``dataChanged`` per pose (per-cell widget
items cost several milliseconds a frame). Each numeric cell also answers
``Qt.ItemDataRole.UserRole`` with the number shown, so tests compare values, not text.
"""

from __future__ import annotations

import math

from PySide6.QtCore import Qt, Signal
from PySide6.QtGui import QStandardItem, QStandardItemModel
from PySide6.QtWidgets import QAbstractItemView, QHeaderView, QTableView

from kinematics import acceleration_components
from kinematics.errors import KinematicsError
from kinematics.groups.vectors import direction_deg, negligible
from kinematics.instantaneous.advantage import solver_advantage

from .display_units import LENGTH_SYSTEMS, angular_speed, sense


def _clean(value: float, scale: float) -> float:
    """``value`` set to 0 when it is negligible against ``scale`` (see :mod:`kinematics.groups.vectors`)."""
    return 0.0 if negligible(value, scale) else value


def _number(value: float) -> str:
    return f"{value:.5g}"


def _angle(value: float | None) -> str:
    return "—" if value is None else f"{value:.1f}°"


class ResultsModel(QStandardItemModel):
    """Rows: points, links, slides, acceleration components, then the output's advantage; each row
    five (text, value) cells.

    The cells live in Qt's own item model so painting never calls back into
    Python; a new pose is written with signals blocked and announced with a
    single ``dataChanged``.
    """

    layout_reset = Signal()

    def __init__(self, parent=None):
        super().__init__(0, 5, parent)
        self.length = LENGTH_SYSTEMS["mm"]
        self.speed_unit = "rad/s"
        self.solution = self.construction = None
        self.layout_key = ()
        self.rows: dict[str, int] = {}
        self.shown = []  # the (text, value) cells on show, row by row
        self.scale = {}  # the pose's largest |v|, |a|, |ω|, |α|: see _scales
        self._v, self._a = {}, {}  # point name -> (x, y) velocity, acceleration of the pose shown
        self._components = {}  # (point, about, component) -> kinematics.RelativeComponent of the pose shown
        self._headers()

    def _headers(self):
        # Two lines a heading, so the columns are as narrow as their numbers.
        self.setHorizontalHeaderLabels(["", f"velocity ({self.length.velocity_unit})\nω ({self.speed_unit})",
                                        "direction", f"acceleration ({self.length.acceleration_unit})\nα (rad/s²)",
                                        "direction"])

    def set_units(self, length_unit: str, speed_unit: str):
        self.length, self.speed_unit = LENGTH_SYSTEMS[length_unit], speed_unit
        self._headers()
        self.show_pose(self.solution, self.construction)

    def show_pose(self, solution, construction=None):
        """Fill the rows from ``solution`` and the components from its ``construction`` (None empties
        the table; no construction, no component rows)."""
        self.solution, self.construction = solution, construction
        self._components = {(c.point, c.about, c.component): c for c in acceleration_components(construction)} \
            if solution is not None and construction is not None else {}
        if solution is None:
            rows = []
        else:
            mech = solution.mechanism
            rows = ([("point", p) for p in mech.points] + [("link", n) for n in mech.links]
                    + [("slide", n) for n in mech.slides] + [("component", key) for key in self._components]
                    + ([("advantage", "output")] if mech.output is not None else []))
        if solution is not None:
            # Plain floats, read once: numpy scalars one at a time cost more than the formatting.
            self._v = dict(zip(solution.point_names, solution.velocities.tolist(), strict=True))
            self._a = dict(zip(solution.point_names, solution.accelerations.tolist(), strict=True))
            self._scales(solution)
        cells = [getattr(self, f"_{kind}_cells")(name, solution) for kind, name in rows]
        if tuple(rows) != self.layout_key:
            self.setRowCount(0)
            for row in cells:
                items = []
                for column, (text, value) in enumerate(row):
                    item = QStandardItem(text)
                    item.setData(value, Qt.ItemDataRole.UserRole)
                    item.setTextAlignment((Qt.AlignmentFlag.AlignRight if column else Qt.AlignmentFlag.AlignLeft)
                                          | Qt.AlignmentFlag.AlignVCenter)
                    item.setEditable(False)
                    items.append(item)
                self.appendRow(items)
            self.layout_key = tuple(rows)
            self.shown = cells
            self.rows = {name: i for i, (kind, name) in enumerate(rows) if kind == "point"}
            self.layout_reset.emit()
            return
        # Only the cells whose words change are written and announced, so only they are repainted
        # (a fixed pivot's row and the names stay as they are through a whole drag). Neighbouring
        # rows changed in the same columns are announced as one block (each announcement costs).
        spans = []  # (first row, last row, first changed column, last)
        self.blockSignals(True)
        for r, (row, before) in enumerate(zip(cells, self.shown, strict=True)):
            columns = [column for column, (cell, old) in enumerate(zip(row, before, strict=True)) if cell != old]
            for column in columns:
                text, value = row[column]
                item = self.item(r, column)
                item.setText(text)
                item.setData(value, Qt.ItemDataRole.UserRole)
            if not columns:
                continue
            if spans and spans[-1][1] == r - 1 and spans[-1][2:] == (columns[0], columns[-1]):
                spans[-1] = (spans[-1][0], r, columns[0], columns[-1])
            else:
                spans.append((r, r, columns[0], columns[-1]))
        self.blockSignals(False)
        self.shown = cells
        for top, bottom, first, last in spans:
            self.dataChanged.emit(self.index(top, first), self.index(bottom, last))

    def _scales(self, solution):
        """The largest speed, acceleration, ω and α of the pose: what "negligible" is measured against."""
        self.scale = {
            "v": max((math.hypot(*v) for v in self._v.values()), default=0.0),
            "a": max((math.hypot(*a) for a in self._a.values()), default=0.0),
            "omega": max((abs(w) for w in solution.angular_velocity.values()), default=0.0),
        }
        # α is compared with ω² too: at constant speed every α may be solver noise alone.
        self.scale["alpha"] = max([abs(x) for x in solution.angular_acceleration.values()]
                                  + [self.scale["omega"] ** 2], default=0.0)

    def _vector_cells(self, xy, kind: str) -> tuple:
        """The size and direction cells of a velocity ("v") or acceleration ("a") vector (x, y) in SI."""
        x, y = (_clean(c, self.scale[kind]) for c in xy)
        size = (self.length.velocity if kind == "v" else self.length.acceleration)(math.hypot(x, y))
        direction = direction_deg(x, y)
        return (_number(size), size), (_angle(direction), direction)

    def _point_cells(self, name, solution):
        return [(f"point {name}", None), *self._vector_cells(self._v[name], "v"),
                *self._vector_cells(self._a[name], "a")]

    def _link_cells(self, name, solution):
        omega = _clean(float(solution.angular_velocity[name]), self.scale["omega"])
        alpha = _clean(float(solution.angular_acceleration[name]), self.scale["alpha"])
        shown = angular_speed(abs(omega), self.speed_unit)
        return [(f"link {name}", None), (f"ω {_number(shown)}", shown), (sense(omega), None),
                (f"α {_number(abs(alpha))}", abs(alpha)), (sense(alpha, zero="none"), None)]

    def _slide_cells(self, name, solution):
        slide = solution.mechanism.slides[name]
        velocity = self.length.velocity(_clean(float(solution.sliding_velocity[name]), self.scale["v"]))
        accel = self.length.acceleration(_clean(float(solution.sliding_acceleration[name]), self.scale["a"]))
        towards = (f"+ = {slide.line[0]}→{slide.line[1]}", None)
        return [(f"slide {name} ({slide.point} on {slide.guide})", None), (f"sliding {_number(velocity)}", velocity),
                towards, (f"sliding {_number(accel)}", accel), towards]

    def _component_cells(self, key, solution):
        part = self._components[key]
        return [(part.title, None), ("", None), ("", None), *self._vector_cells(part.vector, "a")]

    def _advantage_cells(self, _key, solution):
        # From the solver's rates, as every other row: the centres give the same within 1e-9.
        try:
            found = solver_advantage(solution)
        except KinematicsError as err:
            return [("mechanical advantage", None), ("—", None), (str(err), None), ("", None), ("", None)]
        shown = "∞ (locks)" if found.locked else _number(found.mechanical_advantage)
        return [(f"mechanical advantage, {found.output}", None),
                (f"ratio {_number(found.velocity_ratio)}", found.velocity_ratio), (found.unit, None),
                (f"MA {shown}", found.mechanical_advantage), (found.advantage_unit, None)]


class ResultsTable(QTableView):
    """The view of a :class:`ResultsModel`; choosing a point's row emits ``point_chosen(name)``."""

    point_chosen = Signal(object)

    def __init__(self, parent=None):
        super().__init__(parent)
        self.results = ResultsModel(self)
        self.setModel(self.results)
        self.selectionModel().currentRowChanged.connect(self._row_changed)
        self.setEditTriggers(QAbstractItemView.EditTrigger.NoEditTriggers)
        self.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
        self.setSelectionMode(QAbstractItemView.SelectionMode.SingleSelection)
        self.verticalHeader().setVisible(False)
        # Sized to the contents when the rows change, not on every frame (that reads every cell).
        self.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.Interactive)
        # Rows told apart by their shading alone: grid lines cost a fifth of each repaint of the table.
        self.setAlternatingRowColors(True)
        self.setShowGrid(False)
        self.results.layout_reset.connect(self.resizeColumnsToContents)
        self.results.headerDataChanged.connect(self.resizeColumnsToContents)

    def show_pose(self, solution, construction=None):
        self.results.show_pose(solution, construction)

    def set_units(self, length_unit: str, speed_unit: str):
        self.results.set_units(length_unit, speed_unit)

    def _row_changed(self, current, _previous):
        names = {row: name for name, row in self.results.rows.items()}
        self.point_chosen.emit(names.get(current.row()))

    def mark_point(self, name: str | None):
        """Select the row of joint ``name`` (hovering in the space diagram)."""
        if name in self.results.rows:
            self.selectRow(self.results.rows[name])
        else:
            self.clearSelection()
