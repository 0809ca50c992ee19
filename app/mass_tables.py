"""The tables of the Masses and loads tab: one editable grid per family, each cell one field.

A cell's text is read back into the one field it shows (the others keep the file's exact
numbers); the grid turns the text into a new Mechanism through :mod:`app.mass_edits` and
hands it to the editor, or a refusal naming its place, shown under the grid with the cell
marked.
"""

from __future__ import annotations

import re
from dataclasses import replace

from PySide6.QtCore import Qt, QTimer, Signal
from PySide6.QtGui import QBrush, QColor
from PySide6.QtWidgets import QAbstractItemView, QHeaderView, QTableWidget, QTableWidgetItem

from kinematics import FileFormatError, LinkMass, PointMass
from kinematics.model.units import KG_M2_PER_INERTIA_UNIT, KG_PER_MASS_UNIT

from . import mass_edits

REFUSED = QColor("#f6d0cc")
MASS_UNITS = tuple(KG_PER_MASS_UNIT)
INERTIA_UNITS = tuple(KG_M2_PER_INERTIA_UNIT)


def shown(value) -> str:
    """A number as the designer typed it (whole numbers without a point), blank for None."""
    if value is None:
        return ""
    return f"{value:.12g}"


def parse_number(text: str, where: str, what: str) -> float:
    """The number in ``text``; a refusal at ``where`` otherwise."""
    try:
        value = float(text.strip().replace(",", "."))
    except ValueError:
        raise FileFormatError(f'{what} must be a number, not "{text.strip()}"', where) from None
    return int(value) if value.is_integer() and abs(value) < 1e15 and "." not in text and "e" not in text.lower() \
        else value


def parse_interval(text: str, where: str):
    """``"200 – 320"`` as (200, 320); blank as None (the load acts at every angle)."""
    numbers = re.findall(r"[-+]?\d+(?:[.,]\d*)?(?:[eE][-+]?\d+)?", text)
    if not text.strip():
        return None
    if len(numbers) != 2:
        raise FileFormatError(f'the interval must be two driver angles "start – end" in degrees, not "{text.strip()}" '
                              "(leave it blank for a load that acts at every angle)", where)
    return tuple(parse_number(n, where, "an angle") for n in numbers)


def interval_text(over) -> str:
    return "" if over is None else f"{shown(over[0])} – {shown(over[1])}"


class MassGrid(QTableWidget):
    """One family's grid. ``edited(mechanism, text)`` carries an accepted edit; ``refused(text)`` a
    refusal (already shown under the grid by the editor)."""

    edited = Signal(object, str)

    def __init__(self, columns, parent=None):
        super().__init__(0, len(columns), parent)
        self.setHorizontalHeaderLabels(columns)
        self.verticalHeader().setVisible(False)
        self.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.ResizeToContents)
        self.setSelectionMode(QAbstractItemView.SelectionMode.SingleSelection)
        self.setEditTriggers(QAbstractItemView.EditTrigger.DoubleClicked | QAbstractItemView.EditTrigger.EditKeyPressed
                             | QAbstractItemView.EditTrigger.AnyKeyPressed)
        self.mechanism = None
        self.refusal = None  # (row, column, text) of the last refused cell, kept through a refill
        self.pending = False  # a typed value waits to be taken (see _changed)
        self.itemChanged.connect(self._changed)

    def fill(self, mechanism, rows):
        """Rows of (key, [cell text or None for a cell that cannot be edited]) of ``mechanism``."""
        self.mechanism = mechanism
        self.blockSignals(True)
        self.setRowCount(len(rows))
        for r, (key, cells) in enumerate(rows):
            for c, text in enumerate(cells):
                item = QTableWidgetItem("" if text is None else text)
                item.setData(Qt.ItemDataRole.UserRole, key)
                if text is None or c == 0:
                    item.setFlags(item.flags() & ~Qt.ItemFlag.ItemIsEditable)
                self.setItem(r, c, item)
        if self.refusal is not None and self.refusal[0] < self.rowCount():
            row, column, text = self.refusal
            self.item(row, column).setBackground(QBrush(REFUSED))
            self.item(row, column).setToolTip(text)
        self.blockSignals(False)

    def fit_height(self, most_rows: int = 8):
        """As tall as its rows (up to ``most_rows``, then it scrolls): the tab reads as one form."""
        rows = sum(self.rowHeight(r) for r in range(min(self.rowCount(), most_rows)))
        # Room for the horizontal scroll bar too: a narrow tab scrolls the columns, never hides a row.
        self.setFixedHeight(self.horizontalHeader().sizeHint().height() + rows + 2 * self.frameWidth() + 2
                            + self.horizontalScrollBar().sizeHint().height())

    def _changed(self, item):
        # Handled once the view has finished writing the cell: the edit refills the grid, which
        # must not delete the item Qt is still setting.
        place = (item.data(Qt.ItemDataRole.UserRole), item.row(), item.column(), item.text())
        self.pending = True
        QTimer.singleShot(0, self, lambda: self._typed(*place))

    def _typed(self, key, row: int, column: int, typed: str):
        self.pending = False
        try:
            after, text = self.apply(key, column, typed)
        except FileFormatError as error:
            self.refusal = (row, column, str(error))
            self.edited.emit(None, str(error))
            return
        self.refusal = None
        self.edited.emit(after, text)

    def apply(self, key, column: int, text: str):
        """(the edited Mechanism, the undo text) of ``text`` typed in ``column`` of row ``key``."""
        raise NotImplementedError


class LinkGrid(MassGrid):
    """Per moving link: mass, its unit, centre x and y (file length unit), inertia about it, its unit."""

    def __init__(self, parent=None):
        super().__init__(["link", "mass", "unit", "centre x", "centre y", "inertia about centre", "unit"], parent)

    def show_design(self, mechanism):
        unit = mechanism.length_unit
        self.setHorizontalHeaderLabels(["link", "mass", "unit", f"centre x ({unit})", f"centre y ({unit})",
                                        "inertia about centre", "unit"])
        masses = mechanism.mass_data.masses if mechanism.mass_data else {}
        rows = []
        for link in mass_edits.moving_links(mechanism):
            m = masses.get(link)
            rows.append((link, [link, shown(m and m.mass_value), m.mass_unit if m else "kg",
                                shown(m and m.centre[0]), shown(m and m.centre[1]), shown(m and m.inertia_value),
                                m.inertia_unit if m else "kg*m^2"]))
        self.fill(mechanism, rows)

    def apply(self, link, column, text):
        mech = self.mechanism
        existing = mech.mass_data.masses.get(link) if mech.mass_data else None
        where = f"masses.{link}"
        if column == 1 and not text.strip():
            return mass_edits.with_link_mass(mech, link, None), f"make {link} massless"
        entry = existing or LinkMass(link, 0, mass_edits.centroid(mech, link))
        if column == 1:
            entry = replace(entry, mass_value=parse_number(text, f"{where}.mass", "a mass"))
        elif column == 2:
            entry = replace(entry, mass_unit=text.strip())
        elif column in (3, 4):
            value = parse_number(text, f"{where}.centre", "the centre of mass")
            centre = (value, entry.centre[1]) if column == 3 else (entry.centre[0], value)
            entry = replace(entry, centre=centre)
        elif column == 5:
            entry = replace(entry, inertia_value=parse_number(text or "0", f"{where}.inertia", "a moment of inertia"))
        else:
            entry = replace(entry, inertia_unit=text.strip())
        return mass_edits.with_link_mass(mech, link, entry), f"set the mass data of {link}"


class PointGrid(MassGrid):
    """Per moving point: a particle's mass (a block, a piston, a tool, a counterweight) and its unit."""

    def __init__(self, parent=None):
        super().__init__(["point", "point mass", "unit"], parent)

    def show_design(self, mechanism):
        masses = mechanism.mass_data.point_masses if mechanism.mass_data else {}
        rows = [(p, [p, shown(masses[p].value) if p in masses else "", masses[p].unit if p in masses else "kg"])
                for p in mass_edits.moving_points(mechanism)]
        self.fill(mechanism, rows)

    def apply(self, point, column, text):
        mech = self.mechanism
        existing = mech.mass_data.point_masses.get(point) if mech.mass_data else None
        if column == 1 and not text.strip():
            return mass_edits.with_point_mass(mech, point, None), f"remove the point mass at {point}"
        entry = existing or PointMass(point, 0)
        if column == 1:
            entry = replace(entry, value=parse_number(text, f"point_masses.{point}", "a mass"))
        else:
            entry = replace(entry, unit=text.strip())
        return mass_edits.with_point_mass(mech, point, entry), f"set the point mass at {point}"


class LoadGrid(MassGrid):
    """Per load: its name, the point it acts at, the one link it acts on (blank: the pin or block
    there), the force's x and y or the torque, and the driver angles it acts over."""

    COLUMNS = ["load", "at point", "on link", "Fx (N)", "Fy (N)", "torque (N·m, CCW +)", "acts over driver angle (°)"]

    def __init__(self, parent=None):
        super().__init__(self.COLUMNS, parent)

    def fill(self, mechanism, rows):
        super().fill(mechanism, rows)
        # The name is the load's own field: unlike a link's or a point's row, it can be edited.
        self.blockSignals(True)
        for r in range(self.rowCount()):
            item = self.item(r, 0)
            item.setFlags(item.flags() | Qt.ItemFlag.ItemIsEditable)
        self.blockSignals(False)

    def show_design(self, mechanism):
        loads = mechanism.mass_data.loads if mechanism.mass_data else {}
        rows = []
        for name, load in loads.items():
            force = load.force_value is not None
            rows.append((name, [name, (load.point or "") if force else None, load.link or "",
                                shown(load.force_value[0]) if force else None,
                                shown(load.force_value[1]) if force else None,
                                None if force else shown(load.torque_value), interval_text(load.over_deg)]))
        self.fill(mechanism, rows)

    def apply(self, name, column, text):
        mech = self.mechanism
        load = mech.mass_data.loads[name]
        where = f"loads.{name}"
        text = text.strip()
        if column == 0:
            if not text:
                raise FileFormatError("a load needs a name", where)
            load = replace(load, name=text)
        elif column == 1:
            load = replace(load, point=text or None)
        elif column == 2:
            load = replace(load, link=text or None)
        elif column in (3, 4):
            value = parse_number(text, f"{where}.force", "a force")
            x, y = load.force_value
            load = replace(load, force_value=(value, y) if column == 3 else (x, value))
        elif column == 5:
            load = replace(load, torque_value=parse_number(text, f"{where}.torque", "a torque"))
        else:
            load = replace(load, over_deg=parse_interval(text, f"{where}.over_deg"))
        return mass_edits.with_load(mech, name, load), f"change load {name}"
