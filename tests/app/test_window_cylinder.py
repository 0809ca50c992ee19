"""A cylinder-driven design in the window: the forces at the pose name the cylinder's axial force."""

from pathlib import Path

import pytest
from PySide6.QtCore import Qt

import kinematics
from tests.designs import CLAW_FEED

TABLE = Path(__file__).resolve().parents[2] / "samples" / "crate-tipping-table.json"


def test_the_forces_pane_gives_the_cylinder_force_not_a_torque(make_window):
    window = make_window(CLAW_FEED)
    assert window.open_path(str(TABLE))
    model = window.forces_table.model
    titles = [model.item(r, 0).text() for r in range(model.rowCount())]
    assert "drive force of cylinder cylinder" in titles
    assert not any(t.startswith("drive torque") for t in titles)
    row = titles.index("drive force of cylinder cylinder")
    shown = model.item(row, 1).data(Qt.ItemDataRole.UserRole)
    # The core's force at the pose on screen (the window reads it, never recomputes it).
    found = kinematics.dynamics.forces(window.document.solution)
    assert shown == pytest.approx(found.drive_force_n, rel=1e-12)
    assert model.item(row, 2).text() == "push"
