"""The list of construction steps, in the order a draftsman would draw them."""

from __future__ import annotations

from PySide6.QtCore import Qt, Signal
from PySide6.QtWidgets import QListWidget, QListWidgetItem

from kinematics.reports.shown_units import in_units


def step_text(step, length_unit: str = "m", speed_unit: str = "rad/s") -> str:
    """A step's line: its id, its sentence with lengths in ``length_unit`` and speeds in
    ``speed_unit`` (the window's choice), its equation, and a flag when it is ill-conditioned."""
    flag = "  ⚠" if step.flagged else ""
    equation = f"   [{step.equation}]" if step.equation else ""
    return f"{step.id}  {in_units(step.text, length_unit, speed_unit)}{equation}{flag}"


class StepsPanel(QListWidget):
    """Both polygons' steps, then the force polygon's while it is shown; selecting one emits
    ``step_selected(step id)`` ("" when cleared)."""

    step_selected = Signal(str)

    def __init__(self, parent=None):
        super().__init__(parent)
        self.structure = None
        self.units = ("m", "rad/s")  # lengths and angular speeds as the window shows them
        # One line a step, all of one height: a drag rewrites every value each frame, and a list of
        # wrapped rows of differing heights would be laid out anew each time. The whole sentence is
        # the row's tooltip.
        self.setUniformItemSizes(True)
        self.setTextElideMode(Qt.TextElideMode.ElideRight)
        self.currentItemChanged.connect(self._current_changed)

    def show_construction(self, construction, forces=None):
        """List the steps of ``construction`` and of ``forces`` (the Polygon of its force polygon, or None)."""
        steps = [] if construction is None else [*construction.velocity.steps, *construction.acceleration.steps]
        steps += forces.steps if forces is not None else []
        structure = tuple(s.id for s in steps)
        if structure != self.structure:
            self.blockSignals(True)
            self.clear()
            for step in steps:
                item = QListWidgetItem()
                item.setData(Qt.ItemDataRole.UserRole, step.id)
                self.addItem(item)
            self.blockSignals(False)
            self.structure = structure
        for row, step in enumerate(steps):
            text = step_text(step, *self.units)
            item = self.item(row)
            if item.text() != text:
                item.setText(text)
                item.setToolTip(text)

    def select_step(self, step_id: str):
        """Make step ``step_id`` current (as if clicked in the list) and bring it into sight ("" or a
        step not listed: none is current)."""
        for row in range(self.count()):
            if self.item(row).data(Qt.ItemDataRole.UserRole) == step_id:
                self.setCurrentRow(row)
                self.scrollToItem(self.item(row))
                return
        self.setCurrentRow(-1)

    def _current_changed(self, current, _previous):
        self.step_selected.emit(current.data(Qt.ItemDataRole.UserRole) if current is not None else "")
