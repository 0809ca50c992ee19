"""The output's mechanical advantage in the window: a row of the results table, and a series the
Cycle tab plots (ticked with a real click)."""

import math

import numpy as np
from PySide6.QtCore import Qt
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication

import kinematics
from app.cycle_panel import CyclePanel
from app.cycle_series import ADVANTAGE_SHOWN_UP_TO, Quantity
from kinematics.cycle.advantage import advantage_over_cycle
from kinematics.instantaneous.advantage import advantage
from tests.designs import load, slider_crank, slotted_lever

SHOTS = "/work/notes/shots-centres"


def advantage_row(window):
    model = window.table.results
    row = next(r for r in range(model.rowCount()) if model.item(r, 0).text().startswith("mechanical advantage"))
    return [model.item(row, c) for c in range(5)]


def test_the_results_table_shows_the_advantage_the_centres_give(make_window):
    window = make_window(slotted_lever(40.0, 110.0, 65.0))
    cells = advantage_row(window)
    expected = advantage(kinematics.centres(window.document.solution))
    # The table reads the solver's rates, the centres find their own: agreement within the centres'
    # velocity cross-check (≤ 1e-9 relative).
    assert math.isclose(cells[3].data(Qt.ItemDataRole.UserRole), expected.mechanical_advantage, rel_tol=1e-9)
    assert cells[0].text() == "mechanical advantage, link lever"
    assert cells[2].text() == "rad/rad" and cells[4].text() == "N·m/N·m"
    window.table.grab().save(f"{SHOTS}/results-table-advantage.png")


def test_the_results_table_says_when_the_output_locks(make_window):
    window = make_window(slider_crank(30.0, 110.0, 0.0, 0.0))  # inner dead centre (common practice)
    cells = advantage_row(window)
    assert cells[3].text() == "MA ∞ (locks)" and cells[4].text() == "N/(N·m)"


def test_the_cycle_tab_plots_the_advantage_held_near_a_toggle(qtbot):
    panel = CyclePanel()
    qtbot.addWidget(panel)
    panel.resize(1100, 420)
    panel.show()
    qtbot.waitExposed(panel)
    result = kinematics.sweep(load(slider_crank(30.0, 110.0, 0.0, 20.0)), 720)
    panel.set_sweep(result)
    wanted = Quantity("mechanical advantage (force)", "output", "D")
    item = next(panel.choices.item(i) for i in range(panel.choices.count())
                if panel.choices.item(i).data(Qt.ItemDataRole.UserRole) == wanted)
    panel.choices.scrollToItem(item)
    box = panel.choices.visualItemRect(item)
    # A click on the item's check box ticks it.
    QTest.mouseClick(panel.choices.viewport(), Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier,
                     box.topLeft() + (box.bottomLeft() - box.topLeft()) / 2 + type(box.topLeft())(8, 0))
    QApplication.processEvents()
    assert wanted in panel.curves and "mechanical advantage (force)" in panel.plots
    cycle = advantage_over_cycle(result)
    cap = ADVANTAGE_SHOWN_UP_TO * cycle.least_advantage
    order = np.argsort(result.driver_angle_deg % 360.0, kind="stable")
    y = np.asarray(panel.curves[wanted].getData()[1])
    assert np.array_equal(y, np.clip(cycle.mechanical_advantage, -cap, cap)[order])
    assert np.isfinite(y).all() and np.abs(y).max() == cap
    assert "MA D</b> least" in panel.peaks.text()
    panel.grab().save(f"{SHOTS}/cycle-tab-advantage.png")
