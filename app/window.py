"""The drafting window: drawings, results table, construction steps,
driver-angle control, status line, and the File / Edit / View / Help menus."""

from __future__ import annotations

import sys
from pathlib import Path

from PySide6.QtCore import Qt
from PySide6.QtGui import QAction, QActionGroup, QFont, QKeySequence
from PySide6.QtWidgets import (
    QApplication,
    QComboBox,
    QFileDialog,
    QLabel,
    QMainWindow,
    QMessageBox,
    QSplitter,
    QTabWidget,
    QToolBar,
    QWidget,
)

import kinematics
from kinematics import KinematicsError, Mechanism
from kinematics.files.storage import remove_stale_temporaries
from kinematics.groups.scales import series_at_most

from .angle_control import AngleControl
from .build_tools import HINTS, Builder
from .building import empty
from .document import Document
from .editing import JointDrag
from .exports import SheetOutputs
from .files import recent_files, remember, save_asking
from .forces_table import ForcesTable
from .icons import icon
from .mass_editor import MassEditor
from .panels import EMPTY_VIEW_MM, DrawingsPanel
from .properties import PropertiesPanel
from .recovery import Autosave, offer_recovery
from .results import ResultsTable
from .status import status_text
from .steps_panel import StepsPanel
from .throttle import Throttle

FILE_FILTER = "Kinepoly mechanism (*.json);;All files (*)"
CYCLE_TAB = "Cycle"
MASSES_TAB = "Masses and loads"
TOOL_NAMES = {"select": "Select", "pivot": "Pivot", "joint": "Joint", "link": "Link", "slide": "Slide",
              "driver": "Driver", "delete": "Delete"}


class MainWindow(SheetOutputs, QMainWindow):
    """One window drafting one Document."""

    def __init__(self, mechanism: Mechanism | None = None, path=None):
        super().__init__()
        # The window's words are Latin letters, digits and simple signs: laid out without text
        # shaping, the table and lists repaint in two thirds of the time on every drag frame.
        font = self.font()
        font.setStyleStrategy(QFont.StyleStrategy.PreferNoShaping)
        self.setFont(font)
        self.document = Document(mechanism or empty(), path, self)
        self.autosave = Autosave(self.document, parent=self)
        self.note = ""
        self.drag = None
        self._show_readouts = Throttle(self._readouts, parent=self)
        self.drawings = DrawingsPanel(self.document)
        self.table = ResultsTable()
        self.forces_table = ForcesTable()
        self.steps = StepsPanel()
        self.properties = PropertiesPanel(self.document, self.say)
        self.masses = MassEditor(self.document, self.say)
        self.builder = Builder(self.document, self.say, self.grid_mm)
        # The results stay in sight beside the steps or the design fields.
        side = QTabWidget()
        side.addTab(self.steps, "Construction steps")
        side.addTab(self.properties, "Design")
        side.addTab(self.masses, MASSES_TAB)
        # Made when their tab is first opened: pyqtgraph takes most of a second to import.
        self.cycle = self.cycle_forces = None
        side.addTab(QWidget(), CYCLE_TAB)
        side.currentChanged.connect(self._open_cycle_tab)
        self.side_tabs = side
        results = QSplitter(Qt.Orientation.Vertical)
        results.addWidget(self.table)
        results.addWidget(self.forces_table)
        results.setSizes([600, 400])
        lower = QSplitter(Qt.Orientation.Horizontal)
        lower.addWidget(results)
        lower.addWidget(side)
        lower.setSizes([800, 800])
        splitter = QSplitter(Qt.Orientation.Vertical)
        splitter.addWidget(self.drawings)
        splitter.addWidget(lower)
        splitter.setSizes([620, 300])
        self.setCentralWidget(splitter)
        self.status = QLabel()
        # One line only: a status bar that grew with its text would resize the views under a drag.
        self.status.setWordWrap(False)
        self.status.setMinimumWidth(1)
        self.status.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        self.statusBar().addWidget(self.status, 1)
        self.angle = AngleControl()
        self.length_units = QComboBox()
        self.length_units.addItems(["mm", "m", "in"])
        self.speed_units = QComboBox()
        self.speed_units.addItems(["rad/s", "rpm"])
        self._build_toolbar()
        self._build_menus()
        self.setAcceptDrops(True)
        self.setWindowIcon(icon("kinepoly"))
        self.document.changed.connect(self.refresh)
        self.document.swept.connect(self._show_sweep)
        self.document.undo_stack.cleanChanged.connect(self._update_title)
        self.angle.angle_requested.connect(self.turn_driver)
        self.angle.playing_changed.connect(lambda _playing: self._settle())
        self.length_units.currentTextChanged.connect(self._units_changed)
        self.speed_units.currentTextChanged.connect(self._units_changed)
        self.steps.step_selected.connect(self.drawings.select_step)
        self.drawings.space_view.hovered.connect(self.table.mark_point)
        self.table.point_chosen.connect(self.drawings.mark_point)
        for polygon_view in (self.drawings.velocity_view, self.drawings.acceleration_view):
            polygon_view.step_clicked.connect(self.show_step)
        view = self.drawings.space_view
        view.drag_started.connect(self.begin_drag)
        view.dragged.connect(self.continue_drag)
        view.drag_finished.connect(self.end_drag)
        view.picked.connect(self.builder.pick)
        view.finished.connect(self.builder.finish)
        view.cancelled.connect(self.builder.cancel)
        self.resize(1600, 1000)
        self.refresh()
        self.drawings.fit_all()

    # building -----------------------------------------------------------
    def _build_toolbar(self):
        bar = self.driver_bar = QToolBar("Driver")
        bar.setObjectName("driver")
        bar.addWidget(self.angle)
        bar.addSeparator()
        bar.addWidget(QLabel(" lengths "))
        bar.addWidget(self.length_units)
        bar.addWidget(QLabel(" ω in "))
        bar.addWidget(self.speed_units)
        self.addToolBar(bar)
        tools = QToolBar("Build")
        tools.setObjectName("build")
        self.tools = QActionGroup(self)
        self.tool_actions = {}
        for tool, text in TOOL_NAMES.items():
            action = QAction(text, self.tools)
            action.setCheckable(True)
            action.setToolTip(HINTS[tool])
            action.triggered.connect(lambda _checked=False, t=tool: self.use_tool(t))
            tools.addAction(action)
            self.tool_actions[tool] = action
        self.tool_actions["select"].setChecked(True)
        self.addToolBar(Qt.ToolBarArea.LeftToolBarArea, tools)

    def _action(self, menu, text, slot, shortcut=None, icon_name=None):
        action = QAction(text, self)
        if shortcut is not None:
            action.setShortcut(shortcut)
        if icon_name:
            action.setIcon(icon(icon_name))
        action.triggered.connect(slot)
        menu.addAction(action)
        return action

    def _build_menus(self):
        files = self.menuBar().addMenu("&File")
        self._action(files, "&New", self.new_design, QKeySequence.StandardKey.New)
        self._action(files, "&Open…", self.open_dialog, QKeySequence.StandardKey.Open)
        self.recent_menu = files.addMenu("Open &recent")
        self._action(files, "&Save", self.save, QKeySequence.StandardKey.Save)
        self._action(files, "Save &as…", self.save_as, QKeySequence.StandardKey.SaveAs)
        files.addSeparator()
        self._action(files, "&Print…", self.print_dialog, QKeySequence.StandardKey.Print)
        self._action(files, "Export sheet as P&DF…", lambda: self._export("PDF sheet (*.pdf)", self.export_pdf))
        self._action(files, "Export drawing as D&XF…", lambda: self._export("DXF drawing (*.dxf)", self.export_dxf))
        self.review_action = self._action(files, "Re&view report…", self.review_dialog)
        files.addSeparator()
        self._action(files, "&Quit", self.close, QKeySequence.StandardKey.Quit)
        edit = self.menuBar().addMenu("&Edit")
        stack = self.document.undo_stack
        undo, redo = stack.createUndoAction(self, "&Undo"), stack.createRedoAction(self, "&Redo")
        undo.setShortcut(QKeySequence.StandardKey.Undo)
        redo.setShortcut(QKeySequence.StandardKey.Redo)
        edit.addActions([undo, redo])
        view = self.menuBar().addMenu("&View")
        space = self.drawings.space_view
        self._action(view, "Zoom &in", lambda: space.zoom(1.25), QKeySequence.StandardKey.ZoomIn)
        self._action(view, "Zoom &out", lambda: space.zoom(0.8), QKeySequence.StandardKey.ZoomOut)
        fit = self._action(view, "&Fit to window", self.drawings.fit_all, QKeySequence("Ctrl+0"), "fit")
        self.driver_bar.addAction(fit)
        self.snapping = QAction("&Snap to grid", self)
        self.snapping.setCheckable(True)
        self.snapping.setShortcut(QKeySequence("Ctrl+G"))
        self.snapping.toggled.connect(self._snapping_changed)
        view.addAction(self.snapping)
        self.centres_action = QAction("Instantaneous &centres", self)
        self.centres_action.setCheckable(True)
        self.centres_action.setShortcut(QKeySequence("Ctrl+K"))  # K for Kennedy's theorem
        self.centres_action.setToolTip("the instantaneous centres over the space diagram, each named by its two bodies")
        self.centres_action.toggled.connect(self.drawings.show_centres)
        view.addAction(self.centres_action)
        helps = self.menuBar().addMenu("&Help")
        self._action(helps, "&About Kinepoly", self.about)
        self._fill_recent()

    def _fill_recent(self):
        self.recent_menu.clear()
        for path in recent_files():
            self.recent_menu.addAction(path, lambda p=path: self.open_path(p, ask=True))
        self.recent_menu.setEnabled(bool(self.recent_menu.actions()))

    # showing ------------------------------------------------------------
    def refresh(self):
        doc = self.document
        self.drawings.set_draft(self.live)
        self.drawings.refresh()
        self.table.show_pose(doc.solution, doc.construction)
        self.forces_table.show_forces(doc.analysis.forces, doc.analysis.forces_problem or doc.analysis.problem)
        self.masses.refresh()
        if self.properties.isVisible() or not self.live:  # a hidden Design tab catches up when the drag ends
            self.properties.refresh()
        if self.cycle is not None:
            self._update_cycle()
        self.drawings.space_view.grid_mm = self.grid_mm()
        self.angle.follow(doc.shown_angle_deg)
        self.angle.setEnabled(doc.solution is not None)
        self.angle.set_range(doc.sweep)
        self._show_readouts(live=self.live)
        self._update_title()

    def _show_sweep(self):
        """The cycle sweep caught up with a drag: its paths, the driver's range and the plot."""
        self.drawings.show_paths()
        self.angle.set_range(self.document.sweep)
        if self.cycle is not None:
            self._update_cycle()

    def show_step(self, step_id: str):
        """A click on a polygon's drawing: its step in the list, emphasised."""
        self.side_tabs.setCurrentWidget(self.steps)
        self.steps.select_step(step_id)

    def _open_cycle_tab(self, index: int):
        if self.cycle is not None or self.side_tabs.tabText(index) != CYCLE_TAB:
            return
        from .cycle_forces_panel import CycleForcesPanel
        from .cycle_panel import CyclePanel  # pyqtgraph loads here, when the plot is first wanted

        self.cycle = CyclePanel()
        self.cycle.angle_picked.connect(self.turn_driver)
        self.cycle_forces = CycleForcesPanel()
        self.cycle_forces.angle_picked.connect(self.turn_driver)
        pages = self.cycle_pages = QTabWidget()
        pages.setTabPosition(QTabWidget.TabPosition.South)
        pages.addTab(self.cycle, "Motion")
        pages.addTab(self.cycle_forces, "Forces and drive")
        self.side_tabs.removeTab(index)
        self.side_tabs.insertTab(index, pages, CYCLE_TAB)
        self.side_tabs.setCurrentIndex(index)
        self.cycle.set_units(self.length_units.currentText(), self.speed_units.currentText())
        self._update_cycle()

    def _update_cycle(self):
        # The panel keeps its curves (and a fine sweep) while the same sweep comes again.
        doc = self.document
        if doc.solution is None:
            self.cycle.set_sweep(None, f"not ready to plot — {doc.analysis.problem}")
            self.cycle.set_angle(None)
        else:
            self.cycle.set_sweep(doc.sweep)
            self.cycle.set_angle(doc.shown_angle_deg)
        self.cycle_forces.show_cycle(doc.sweep, doc.cycle_forces)
        self.cycle_forces.set_angle(doc.shown_angle_deg if doc.solution is not None else None)

    def _update_title(self, *_):
        doc = self.document
        name = Path(doc.path).name if doc.path else (doc.mechanism.title or "untitled")
        self.setWindowTitle(f"{name}{' *' if not doc.undo_stack.isClean() else ''} — Kinepoly")

    def say(self, note: str):
        """Put a plain sentence at the head of the status line."""
        self.note = note
        self._show_readouts(live=self.live)

    @property
    def live(self) -> bool:
        """True while the pose follows the mouse or the play button, frame after frame."""
        return self.drag is not None or self.angle.playing

    def _readouts(self):
        """The step list, the status line and the driver angle's number and slider: read, not
        watched, so a drag rewrites them at most ten times a second (text is costly to lay out),
        and the last frame's always."""
        self.angle.show_angle(self.document.shown_angle_deg)
        self.steps.show_construction(self.document.construction)
        text = status_text(self.document.analysis, self.note)
        self.status.setText(text)
        self.status.setToolTip(text)

    def _units_changed(self, *_):
        self.table.set_units(self.length_units.currentText(), self.speed_units.currentText())
        if self.cycle is not None:
            self.cycle.set_units(self.length_units.currentText(), self.speed_units.currentText())

    # building -------------------------------------------------------------
    def use_tool(self, tool: str):
        """Pick a building tool ("select" drags; the others pick joints and places)."""
        self.tool_actions[tool].setChecked(True)
        self.drawings.space_view.building = tool != "select"
        self.builder.set_tool(tool)

    def grid_mm(self) -> float:
        """The snapping step in mm: a 1-2-5 length near a twentieth of the design, at least 10 mm
        (a small or new design is laid out on a 200 mm sheet)."""
        if not self.snapping.isChecked():
            return 0.0
        mech = self.document.mechanism
        return series_at_most(max(1e3 * mech.size * mech.metres_per_unit, EMPTY_VIEW_MM) / 20.0)

    def _snapping_changed(self, *_):
        self.drawings.space_view.grid_mm = self.grid_mm()
        self.drawings.space_view.viewport().update()

    # turning and dragging -------------------------------------------------
    def turn_driver(self, angle_deg: float):
        problem = self.document.set_angle(angle_deg)
        if problem:
            self.angle.stop()
            self.angle.show_angle(self.document.shown_angle_deg)
        self.say(f"the driver cannot turn to {angle_deg:.1f}°: {problem}" if problem else "")

    def begin_drag(self, name: str, at_mm: tuple):
        self.angle.stop()
        self.drag = JointDrag(self.document, name, at_mm, self.grid_mm())
        self.properties.show_point(name)  # a joint pressed in the space diagram is the one the Design tab shows
        self.say(self.drag.message)

    def continue_drag(self, at_mm: tuple):
        if self.drag is not None:
            self.say(self.drag.to(at_mm) or self.drag.message)

    def end_drag(self):
        self.drag = None
        self._settle()

    def _settle(self):
        """The pose stopped following the mouse or the play button: bring everything held back up to it."""
        if self.live:
            return
        self.document.catch_up_sweep()
        self._show_readouts.flush()
        self.properties.refresh()
        self.drawings.set_draft(False)

    # files ----------------------------------------------------------------
    def ask_to_save(self) -> bool:
        """True when it is fine to drop the current design (saved, discarded, or unchanged)."""
        if self.document.undo_stack.isClean():
            return True
        button = QMessageBox.StandardButton
        answer = QMessageBox.question(self, "Unsaved changes", "The design has changes that are not saved. "
                                      "Save them first?", button.Save | button.Discard | button.Cancel, button.Save)
        if answer == button.Save:
            return self.save()
        return answer == button.Discard

    def new_design(self):
        if self.ask_to_save():
            self.note = ""
            self.document.replace(empty())
            self.drawings.fit_all()

    def open_dialog(self):
        path, _ = QFileDialog.getOpenFileName(self, "Open a mechanism", "", FILE_FILTER)
        if path:
            self.open_path(path, ask=True)

    def open_path(self, path, ask: bool = False) -> bool:
        """Load ``path``; a bad file shows its message and leaves the current design as it is."""
        if ask and not self.ask_to_save():
            return False
        try:
            mechanism = kinematics.load_mechanism(path)
        except (KinematicsError, OSError) as error:
            self.show_error("Cannot open the file", f"{path}:\n{error}")
            return False
        remove_stale_temporaries(path)  # what saves of this design cut short left beside it
        self.note = "; ".join(mechanism.warnings)
        self.document.replace(mechanism, path)
        self.drawings.fit_all()
        remember(path)
        self._fill_recent()
        return True

    def save(self) -> bool:
        if not self.document.path:
            return self.save_as()
        return self.save_to(self.document.path)

    def save_as(self) -> bool:
        path, _ = QFileDialog.getSaveFileName(self, "Save the mechanism", self.document.path or "", FILE_FILTER)
        return bool(path) and self.save_to(path)

    def save_to(self, path) -> bool:
        try:
            if not save_asking(self, self.document.mechanism, path):
                self.say(f"not saved: {path} was left as it was")
                return False
        except (KinematicsError, OSError) as error:
            self.show_error("Cannot save", f"{path}:\n{error}")
            return False
        self.document.path = str(path)
        self.document.undo_stack.setClean()
        remember(path)
        self._fill_recent()
        self._update_title()
        return True

    def show_error(self, title: str, text: str):
        self.say(text.replace("\n", " "))
        QMessageBox.warning(self, title, text)

    def about(self):
        QMessageBox.about(self, "About Kinepoly",
                          "<b>Kinepoly</b> — velocity and acceleration polygons of planar linkages, built by "
                          "exact graphical construction and checked against a numeric solver.<br><br>"
                          f"{kinematics.CAUTION}")

    # Qt overrides ---------------------------------------------------------------
    def dragEnterEvent(self, event):
        if event.mimeData().hasUrls() and any(u.isLocalFile() for u in event.mimeData().urls()):
            event.acceptProposedAction()

    def dropEvent(self, event):
        local = [u.toLocalFile() for u in event.mimeData().urls() if u.isLocalFile()]
        if local:
            self.open_path(local[0], ask=True)
            event.acceptProposedAction()

    def restore(self, mechanism: Mechanism, path=None):
        """Take back a recovered design: shown as unsaved, its file name kept for Save."""
        self.document.replace(mechanism, path)
        self.document.undo_stack.resetClean()
        self.drawings.fit_all()
        self._update_title()

    def closeEvent(self, event):
        self.angle.stop()
        if self.ask_to_save():
            if self.cycle is not None:
                self.cycle.cancel_fine_sweep()  # the plot's worker thread need not outlive its window
            self.autosave.discard()  # a clean exit leaves no recovery copy
            event.accept()
        else:
            event.ignore()


def open_window(argv) -> MainWindow:
    """The shown window for ``kinepoly [FILE]`` (a bad FILE leaves an empty design and says why)."""
    window = MainWindow()
    files = [a for a in argv if not a.startswith("-")]
    if files:
        window.open_path(files[0])
    window.show()
    return window


def run(argv) -> int:
    """``kinepoly [FILE]``: open the window, with FILE if given, and run until it closes."""
    app = QApplication.instance() or QApplication([sys.argv[0], *[a for a in argv if a.startswith("-")]])
    app.setApplicationName("Kinepoly")
    window = open_window(argv)
    offer_recovery(window)
    return app.exec()
