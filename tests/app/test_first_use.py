"""What a first-time user meets when building and opening designs: a new joint or link becomes the
current one in the Design tab, and a file dropped on any of the three drawings opens."""

import json

import pytest
from PySide6.QtCore import QMimeData, QPoint, QPointF, Qt, QUrl
from PySide6.QtGui import QDragEnterEvent, QDropEvent
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication

from tests.designs import CARTON_PUSHER, CLAW_FEED


def click_at(window, x_mm, y_mm):
    view = window.drawings.space_view
    QTest.mouseClick(view.viewport(), Qt.LeftButton, Qt.NoModifier, view.mapFromScene(QPointF(x_mm, -y_mm)))


def test_a_new_joint_and_a_new_link_become_the_current_ones_in_the_design_tab(make_window):
    window = make_window(CLAW_FEED)
    window.side_tabs.setCurrentWidget(window.properties)
    window.use_tool("joint")
    click_at(window, 100.0, 20.0)
    new = (set(window.document.mechanism.points) - set(CLAW_FEED["points"])).pop()
    assert window.properties.point.currentText() == new
    assert window.properties.point_name.text() == new
    window.use_tool("link")
    click_at(window, 100.0, 20.0)
    view = window.drawings.space_view
    at = view.mapFromScene(window.drawings.space_scene.joint_pos("P"))
    QTest.mouseClick(view.viewport(), Qt.LeftButton, Qt.NoModifier, at)
    QTest.keyClick(view, Qt.Key_Return)
    link = (set(window.document.mechanism.links) - set(CLAW_FEED["links"])).pop()
    assert window.properties.link.currentText() == link
    assert window.properties.link_name.text() == link


@pytest.mark.parametrize("pane", ["space_view", "velocity_view", "acceleration_view"])
def test_a_file_dropped_on_a_drawing_opens(make_window, tmp_path, pane):
    window = make_window(CLAW_FEED)
    path = tmp_path / "dropped.json"
    path.write_text(json.dumps(CARTON_PUSHER), encoding="utf-8")
    viewport = getattr(window.drawings, pane).viewport()
    data = QMimeData()
    data.setUrls([QUrl.fromLocalFile(str(path))])
    enter = QDragEnterEvent(QPoint(60, 60), Qt.CopyAction, data, Qt.LeftButton, Qt.NoModifier)
    QApplication.sendEvent(viewport, enter)
    assert enter.isAccepted(), "the drawing takes the file"
    drop = QDropEvent(QPointF(60, 60), Qt.CopyAction, data, Qt.LeftButton, Qt.NoModifier)
    QApplication.sendEvent(viewport, drop)
    assert window.document.path == str(path)


def test_help_gives_the_version_the_caution_the_guide_and_the_shortcuts(make_window, monkeypatch):
    from importlib import metadata

    import kinematics
    from app import menus

    window = make_window(CLAW_FEED)
    shown = []
    monkeypatch.setattr("PySide6.QtWidgets.QMessageBox.about", lambda parent, title, text: shown.append(text))
    window.about()
    assert metadata.version("kinepoly") in shown[0] and kinematics.CAUTION in shown[0]
    guide = menus.show_guide(window)
    text = guide.findChild(menus.QTextBrowser).toPlainText()
    assert "Build one from nothing" in text and "Caution" in text
    shortcuts = menus.show_shortcuts(window)
    page = shortcuts.findChild(menus.QTextBrowser).toPlainText()
    assert "Ctrl+Z" in page and "nudge" in page
    # A page left open under the pointer would keep the next test's hover from reaching its window.
    guide.close()
    shortcuts.close()
    help_menu = next(a.menu() for a in window.menuBar().actions() if a.text() == "&Help")
    assert [a.text() for a in help_menu.actions() if not a.isSeparator()] == [
        "&User guide", "&Keyboard shortcuts", "&About Kinepoly"]


def test_the_status_line_says_agrees_to_rounding_for_a_figure_doubles_cannot_resolve(qtbot):
    from app.window import MainWindow
    from kinematics.groups.steps import ROUNDING_FLOOR
    from tests.designs import SAMPLE_FILES

    quick = next(p for p in SAMPLE_FILES if "quick-return" in p.name)
    window = MainWindow()
    qtbot.addWidget(window)
    assert window.open_path(quick)
    assert window.document.construction.max_relative_difference < ROUNDING_FLOOR
    text = window.status.text()
    assert "agrees to rounding" in text and "e-" not in text


def test_one_loose_joint_leaves_the_polygons_table_and_steps_and_is_named(make_window):
    window = make_window(CLAW_FEED)
    steps_before = window.steps.count()
    window.use_tool("joint")
    click_at(window, 100.0, 20.0)
    doc = window.document
    loose = (set(doc.mechanism.points) - set(CLAW_FEED["points"])).pop()
    assert doc.construction is not None and doc.solution is not None
    assert window.steps.count() == steps_before, "the loose joint adds no step and takes none away"
    assert window.table.model().rowCount() > 0
    assert window.drawings.velocity_scene.items() and window.drawings.acceleration_scene.items()
    text = window.status.text()
    assert f"point {loose} is on no link" in text and "holds it where it is" in text
    # The rest moves as before: the coupler point's velocity equals the design's without the loose joint.
    from app.document import analyse
    from tests.designs import load

    alone = analyse(load(CLAW_FEED), None).solution
    assert doc.solution.velocity("P") == pytest.approx(alone.velocity("P"), rel=1e-12)  # same arithmetic


def test_a_loose_joint_with_something_else_missing_still_says_both(make_window):
    from tests.designs import UNFINISHED

    window = make_window(UNFINISHED)
    window.use_tool("joint")
    click_at(window, 100.0, 20.0)
    text = window.status.text()
    assert "not ready to analyse" in text and "no driver" in text and "is on no link" in text


def test_the_status_line_forgets_an_undone_edit_and_says_the_state(make_window):
    window = make_window(CLAW_FEED)
    window.use_tool("joint")
    click_at(window, 100.0, 20.0)
    new = (set(window.document.mechanism.points) - set(CLAW_FEED["points"])).pop()
    assert f"joint {new} placed" in window.status.text()
    window.document.undo_stack.undo()
    window._show_readouts.flush()
    text = window.status.text()
    assert "placed" not in text and text.startswith("driver at"), text


def test_every_control_has_a_tooltip(make_window):
    from PySide6.QtWidgets import QAbstractButton, QAbstractSpinBox, QComboBox, QLineEdit, QSlider

    window = make_window(CLAW_FEED)
    bare = []
    for kind in (QAbstractButton, QAbstractSpinBox, QComboBox, QLineEdit, QSlider):
        for widget in window.findChildren(kind):
            inner = isinstance(widget, QLineEdit) and isinstance(widget.parent(), (QComboBox, QAbstractSpinBox))
            if not inner and not widget.toolTip() and widget.isVisibleTo(window):
                bare.append(f"{type(widget).__name__} {getattr(widget, 'text', lambda: '')()}")
    assert bare == []


def test_the_results_table_exports_as_csv_in_si_at_full_precision(make_window, tmp_path, monkeypatch):
    import csv

    from PySide6.QtWidgets import QFileDialog

    window = make_window(CLAW_FEED)
    window.length_units.setCurrentText("in")  # the window's units never reach the file
    target = tmp_path / "table"
    monkeypatch.setattr(QFileDialog, "getSaveFileName", lambda *a: (str(target), a[3].split(";;")[0]))
    file_menu = next(a.menu() for a in window.menuBar().actions() if a.text() == "&File")
    next(a for a in file_menu.actions() if a.text() == "Export results table as &CSV…").trigger()
    rows = list(csv.reader((tmp_path / "table.csv").open(encoding="utf-8")))
    assert rows[0][:4] == ["row", "vx [m/s]", "vy [m/s]", "|v| [m/s]"]
    solution = window.document.solution
    by_name = {r[0]: r for r in rows[1:]}
    vx, vy = solution.velocity("P").tolist()
    assert float(by_name["point P"][1]) == vx and float(by_name["point P"][2]) == vy, "every digit kept"
    assert float(by_name["link crank"][7]) == solution.angular_velocity["crank"]
    assert any(r[0].startswith("radial") for r in rows), "the acceleration components too"


def test_the_play_speed_scales_the_turn_of_each_frame(make_window):
    from app.angle_control import ANIMATION_STEP_DEG

    window = make_window(CLAW_FEED)
    angle = window.angle
    angle.play_speed.setCurrentText("4×")
    asked = []
    angle.angle_requested.connect(asked.append)
    start = angle.angle_deg
    angle.advance()
    assert asked[-1] == pytest.approx((start + 4 * ANIMATION_STEP_DEG) % 360.0, abs=1e-12)


def test_a_new_design_opens_at_a_machinery_scale_and_fit_fits_an_unfinished_one(make_window):
    from kinematics.drawing import Text

    window = make_window()
    window.new_design()
    QApplication.processEvents()
    view = window.drawings.space_view
    across = view.mapToScene(view.viewport().rect()).boundingRect().width()
    assert 200.0 <= across <= 2000.0, across  # some hundreds of mm across, before anything is drawn
    window.builder.tool = "pivot"
    window.builder.pick(None, (0.0, 0.0))
    QApplication.processEvents()
    bar = [p.text for p in window.drawings.space_scene.sheet.primitives
           if isinstance(p, Text) and p.ref and p.ref.kind == "scale bar" and p.text.endswith(" mm")]
    assert bar and float(bar[0].split()[0]) >= 10.0, bar  # not a bar of 0.2 mm over one pivot
    window.builder.pick(None, (900.0, 0.0))
    view.zoom(8.0)  # the user zoomed in: the second pivot is off the view
    QTest.keyClick(window, Qt.Key_0, Qt.ControlModifier)  # Fit to window, with no link or driver yet
    QApplication.processEvents()
    seen = view.mapToScene(view.viewport().rect()).boundingRect()
    assert seen.contains(0.0, 0.0) and seen.contains(900.0, 0.0)
