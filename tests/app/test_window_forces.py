"""The forces in the window: mass data entered and refused in the Masses and loads tab, the forces
at the pose under the results, and the turning-moment and polar diagrams of the Cycle tab.

The window shows the core's numbers (``kinematics.forces``, ``sweep_forces``, ``drive_summary``,
checked against outside references in tests/kinematics); here the numbers shown are compared with
the core's, and one with a textbook formula."""

import json
import math

import numpy as np
import pytest
from PySide6.QtCore import QPointF, Qt
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QAbstractItemView, QApplication

import kinematics
from app import forces_data
from app.forces_data import NO_MASS_DATA
from tests.designs import CLAW_FEED, SAMPLES, slider_crank

CAP_PRESS = SAMPLES / "cap-press-feeder.json"


def _open(make_window, path):
    window = make_window(CLAW_FEED)
    assert window.open_path(str(path))
    return window


def _show_tab(window, text):
    tabs = window.side_tabs
    tabs.setCurrentIndex(next(i for i in range(tabs.count()) if tabs.tabText(i) == text))


def _type_in_cell(qtbot, grid, row, column, text):
    """Click the cell, type over it and press Enter, as a user does."""
    rect = grid.visualRect(grid.model().index(row, column))
    QTest.mouseClick(grid.viewport(), Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier, rect.center())
    qtbot.keyClicks(grid, text[0])  # any key starts editing with what was typed
    editor = QApplication.focusWidget()
    assert editor is not grid, "typing opened the cell's editor"
    qtbot.keyClicks(editor, text[1:])
    qtbot.keyClick(editor, Qt.Key.Key_Return)
    # The view commits a Return on its next turn of the event loop, the grid takes it on the one after.
    qtbot.waitUntil(lambda: grid.state() != QAbstractItemView.State.EditingState and not grid.pending)


def _row(grid, key):
    return next(r for r in range(grid.rowCount()) if grid.item(r, 0).data(Qt.ItemDataRole.UserRole) == key)


def _force_cell(window, title):
    model = window.forces_table.model
    row = next(r for r in range(model.rowCount()) if model.item(r, 0).text() == title)
    return model.item(row, 1).data(Qt.ItemDataRole.UserRole), model.item(row, 2).data(Qt.ItemDataRole.UserRole)


def test_a_design_without_mass_data_says_so_in_plain_words(make_window):
    window = make_window(CLAW_FEED)
    assert window.document.mechanism.mass_data is None
    assert window.forces_table.message.text() == NO_MASS_DATA
    assert not window.forces_table.view.isVisible()


def test_a_point_mass_typed_in_the_grid_gives_the_centripetal_pin_force_undoes_and_saves_format_2(
        make_window, qtbot, tmp_path):
    r_mm, rpm, mass_kg = 50.0, 120.0, 2.0
    window = make_window(slider_crank(r_mm, 200.0, 0.0, 30.0, rpm=rpm))
    _show_tab(window, "Masses and loads")
    grid = window.masses.points
    _type_in_cell(qtbot, grid, _row(grid, "A"), 1, "2")
    data = window.document.mechanism.mass_data
    assert data.point_masses["A"].mass_kg == 2.0
    # Only the crank pin has mass; the rod and the frictionless, massless block carry nothing, so the
    # frame holds the pin on its circle: |F| = m·r·ω², towards O2 (the centripetal force of uniform
    # circular motion; Meriam & Kraige, Engineering Mechanics: Dynamics, 7th ed., eq. 3/8).
    # Tolerance 1e-9 relative: the solver's and the linear solve's rounding only.
    omega = rpm * 2 * math.pi / 60
    size, direction = _force_cell(window, "on crank at O2")
    assert size == pytest.approx(mass_kg * r_mm * 1e-3 * omega ** 2, rel=1e-9)
    assert direction == pytest.approx((30.0 + 180.0) % 360.0, abs=1e-6)
    torque, _ = _force_cell(window, "drive torque on crank")
    assert torque == pytest.approx(0.0, abs=1e-9)  # at constant speed the crank's mass needs no torque
    path = tmp_path / "with-mass.json"
    assert window.save_to(path)
    assert json.loads(path.read_text())["kinepoly"] == 2
    qtbot.keyClick(window, Qt.Key.Key_Z, Qt.KeyboardModifier.ControlModifier)
    assert window.document.mechanism.mass_data is None, "the edit undoes; no mass data is left"
    assert window.forces_table.message.text() == NO_MASS_DATA
    assert grid.item(_row(grid, "A"), 1).text() == ""
    assert window.save_to(path)
    assert json.loads(path.read_text())["kinepoly"] == 1, "without mass data the file stays format 1"


def test_a_refused_value_is_shown_under_its_grid_naming_the_place(make_window, qtbot):
    window = _open(make_window, CAP_PRESS)
    _show_tab(window, "Masses and loads")
    before = window.document.mechanism
    grid = window.masses.links
    _type_in_cell(qtbot, grid, _row(grid, "rod"), 5, "-1")
    label = window.masses.refusals[grid]
    assert label.isVisible()
    assert label.text() == "masses.rod.inertia: a moment of inertia cannot be negative (-1)"
    assert window.document.mechanism is before, "the design is left as it was"
    assert grid.item(_row(grid, "rod"), 5).text() == "972.1"
    _type_in_cell(qtbot, grid, _row(grid, "rod"), 2, "lb")
    assert label.text() == 'masses.rod.mass: unknown mass unit "lb" (use kg, g)'
    _type_in_cell(qtbot, grid, _row(grid, "rod"), 1, "0.4")
    assert not label.isVisible(), "an accepted edit clears the refusal"
    assert window.document.mechanism.mass_data.masses["rod"].mass_value == 0.4
    assert window.document.mechanism.mass_data.masses["rod"].inertia_value == 972.1, "other fields kept exactly"


def test_a_load_and_gravity_are_entered_and_refused_by_name(make_window, qtbot):
    window = _open(make_window, CAP_PRESS)
    _show_tab(window, "Masses and loads")
    editor = window.masses
    QTest.mouseClick(editor.add_torque, Qt.MouseButton.LeftButton)
    loads = window.document.mechanism.mass_data.loads
    assert loads["torque"].link == "rod" and loads["torque"].torque_value == 0
    grid = editor.loads
    _type_in_cell(qtbot, grid, _row(grid, "torque"), 5, "-2.5")
    assert window.document.mechanism.mass_data.loads["torque"].torque_n_m == -2.5
    _type_in_cell(qtbot, grid, _row(grid, "torque"), 2, "frame")
    assert editor.refusals[grid].text() == 'loads.torque.link: unknown link "frame"'
    _type_in_cell(qtbot, grid, _row(grid, "pressing"), 6, "200")
    assert editor.refusals[grid].text().startswith("loads.pressing.over_deg: the interval must be two driver angles")
    _type_in_cell(qtbot, grid, _row(grid, "pressing"), 6, "200 - 320")
    assert window.document.mechanism.mass_data.loads["pressing"].over_deg == (200, 320)
    had_gravity = window.document.mechanism.mass_data.gravity_value is not None
    QTest.mouseClick(editor.gravity, Qt.MouseButton.LeftButton)
    assert (window.document.mechanism.mass_data.gravity_value is not None) != had_gravity
    qtbot.keyClick(window, Qt.Key.Key_Z, Qt.KeyboardModifier.ControlModifier)
    assert (window.document.mechanism.mass_data.gravity_value is not None) == had_gravity


def test_the_forces_follow_the_driver_while_the_crank_pin_is_dragged(make_window):
    window = _open(make_window, CAP_PRESS)
    doc = window.document
    view = window.drawings.space_view
    start = window.drawings.space_scene.joint_pos("A")
    QTest.mousePress(view.viewport(), Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier,
                     view.mapFromScene(start))
    for step in range(1, 4):
        QTest.mouseMove(view.viewport(), view.mapFromScene(start + QPointF(-8.0 * step, 6.0 * step)))
        assert window.live
        expected = kinematics.forces(kinematics.solve(doc.mechanism, doc.shown_angle_deg))
        size, _ = _force_cell(window, "on rod at A")
        torque, _ = _force_cell(window, "drive torque on crank")
        # The same core call on the same pose: equal to rounding of the table's cleaning (none here).
        assert torque == pytest.approx(abs(expected.drive_torque_n_m), rel=1e-12)
        assert size == pytest.approx(math.hypot(*expected.joints_n["A"]["rod"]), rel=1e-12)
    QTest.mouseRelease(view.viewport(), Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier,
                       view.mapFromScene(start + QPointF(-24.0, 18.0)))


def test_undetermined_forces_get_a_plain_message(make_window, monkeypatch):
    def refuse(solution):
        raise kinematics.ForcesUndetermined("the joint forces are not determined by statics", "joints")

    monkeypatch.setattr(forces_data.kinematics, "forces", refuse)
    window = _open(make_window, CAP_PRESS)
    assert window.forces_table.message.text() == ("No forces at this pose: joints: the joint forces are not "
                                                  "determined by statics")


def test_the_cycle_tab_draws_the_turning_moment_and_polar_diagrams_from_the_core(make_window, qtbot):
    window = _open(make_window, CAP_PRESS)
    doc = window.document
    _show_tab(window, "Cycle")
    window.cycle_pages.setCurrentWidget(window.cycle_forces)
    panel = window.cycle_forces
    qtbot.waitUntil(lambda: doc.cycle_forces.sweep_forces is not None and panel.source is doc.cycle_forces)
    found = doc.cycle_forces.sweep_forces
    assert found.mechanism is doc.mechanism
    x, torque = panel.torque_curve.getData()
    assert sorted(torque.tolist()) == sorted(found.drive_torque_n_m.tolist())
    summary = kinematics.drive_summary(found, 0.02)
    _, mean = panel.mean_curve.getData()
    assert mean[0] == summary.mean_torque_n_m
    assert f"ΔE {panel_readable(summary.energy_fluctuation_j)} J" in panel.summary.text()
    point, link = panel.joint.currentData()
    fx, fy = panel.polar_curve.getData()
    assert fx[:-1].tolist() == found.joints_n[point][link][:, 0].tolist()
    panel.fluctuation.lineEdit().selectAll()
    qtbot.keyClicks(panel.fluctuation.lineEdit(), "0.04")
    qtbot.keyClick(panel.fluctuation.lineEdit(), Qt.Key.Key_Return)
    assert panel.found.summary.flywheel_inertia_kg_m2 == kinematics.drive_summary(found, 0.04).flywheel_inertia_kg_m2
    box = panel.torque_plot.getViewBox()
    at = box.mapViewToScene(QPointF(90.0, 0.0))
    QTest.mouseClick(panel.graphics.viewport(), Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier,
                     panel.graphics.mapFromScene(at))
    assert doc.shown_angle_deg == pytest.approx(90.0, abs=1.0)
    assert panel.cursor.value() == pytest.approx(doc.shown_angle_deg % 360.0)


def test_the_cycle_tab_says_why_there_are_no_forces(make_window):
    window = make_window(CLAW_FEED)
    _show_tab(window, "Cycle")
    assert window.cycle_forces.note.text() == NO_MASS_DATA
    assert not window.cycle_forces.graphics.isVisible()


def panel_readable(value):
    from app.cycle_series import readable

    return readable(value)


def test_the_cycle_tab_plots_every_joint_load_and_the_polar_diagram_in_the_link_axes(make_window, qtbot):
    window = _open(make_window, CAP_PRESS)
    doc = window.document
    _show_tab(window, "Cycle")
    window.cycle_pages.setCurrentWidget(window.cycle_forces)
    panel = window.cycle_forces
    qtbot.waitUntil(lambda: doc.cycle_forces.sweep_forces is not None and panel.source is doc.cycle_forces)
    found, sweep = doc.cycle_forces.sweep_forces, doc.sweep
    # One curve per distinct load at a pin: at a plain pin the two links' forces are equal and
    # opposite (Newton's third law), so |F| is drawn once for both.
    for (point, link), curve in panel.magnitude_curves.items():
        _, size = curve.getData()
        assert sorted(size.tolist()) == sorted(np.linalg.norm(found.joints_n[point][link], axis=1).tolist())
    for point, by_link in found.joints_n.items():
        drawn = [link for p, link in panel.magnitude_curves if p == point]
        assert drawn, f"no curve for the pin at {point}"
        for link in by_link:
            assert any(np.allclose(np.linalg.norm(by_link[link], axis=1), np.linalg.norm(by_link[d], axis=1))
                       for d in drawn)
    # A click on a curve of the magnitudes chooses its joint and turns the driver there.
    key = next(k for k in panel.magnitude_curves if k != panel.joint.currentData())
    xs, ys = panel.magnitude_curves[key].getData()
    at = int(np.argmax(np.abs(ys - np.interp(xs, *panel.magnitude_curves[panel.joint.currentData()].getData()))))
    box = panel.magnitude_plot.getViewBox()
    scene_at = box.mapViewToScene(QPointF(float(xs[at]), float(ys[at])))
    QTest.mouseClick(panel.graphics.viewport(), Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier,
                     panel.graphics.mapFromScene(scene_at))
    assert panel.joint.currentData() == key
    assert doc.shown_angle_deg % 360.0 == pytest.approx(xs[at], abs=1.0)
    assert panel.magnitude_curves[key].opts["pen"].widthF() > 2.0
    # In the link axes: x along the link's line from its first point to its second (its unit vector
    # taken from the swept positions, not from the sweep's link angle), y across it.
    point, link = key
    panel.axes.setFocus()
    QTest.keyClick(panel.axes, Qt.Key.Key_Down)  # frame axes -> link axes, as a user steps a list
    assert panel.axes.currentData() == "link"
    first, second = doc.mechanism.links[link][:2]
    names = sweep.point_names
    line = sweep.positions[:, names.index(second)] - sweep.positions[:, names.index(first)]
    unit = line / np.linalg.norm(line, axis=1)[:, None]
    force = found.joints_n[point][link]
    along = np.einsum("ij,ij->i", force, unit)
    across = unit[:, 0] * force[:, 1] - unit[:, 1] * force[:, 0]
    fx, fy = panel.polar_curve.getData()
    np.testing.assert_allclose(fx[:-1], along, rtol=1e-12, atol=1e-9)
    np.testing.assert_allclose(fy[:-1], across, rtol=1e-12, atol=1e-9)
    assert panel.polar_plot.getAxis("bottom").labelText.startswith(f"F along {link}")
