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
    QFrame,
    QLabel,
    QMainWindow,
    QMessageBox,
    QScrollArea,
    QSplitter,
    QTabWidget,
    QToolBar,
    QWidget,
)

from kinematics import Mechanism
from kinematics.model.units import angle_text

from .angle_control import AngleControl
from .build_tools import HINTS, Builder
from .building import empty
from .cycle_series import length_at_angle_mm
from .design_actions import DesignActions, grid_step_mm
from .document import Document
from .editing import CentreDrag, JointDrag
from .exports import SheetOutputs, add_sheet_contents
from .file_actions import FileActions, save_path
from .file_names import suggested_name
from .forces_table import ForcesTable
from .icons import icon
from .mass_editor import MassEditor
from .menus import about_text, add_help_menu, add_tool_menu, drawing_key
from .pane_events import PaneEvents
from .panels import DrawingsPanel
from .properties import PropertiesPanel
from .recovery import Autosave, offer_recovery
from .results import ResultsTable
from .status import status_text
from .steps_panel import StepsPanel
from .table_csv import export_table
from .throttle import Throttle

CYCLE_TAB = "Cycle"
CSV_FILTER = "Comma-separated values (*.csv);;All files (*)"
MASSES_TAB = "Masses and loads"
TOOL_NAMES = {"select": "Select", "pivot": "Pivot", "joint": "Joint", "link": "Link", "slide": "Slide",
              "driver": "Driver", "cylinder": "Cylinder", "delete": "Delete"}


class MainWindow(FileActions, SheetOutputs, QMainWindow):
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
        side.addTab(_scrolled(self.properties), "Design")  # its rows outgrow a 1024×700 window
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
        self.length_units.setToolTip("The length system of every number the window shows: the table, the steps, "
                                     "the Design tab, the scale bars (velocities in it per second)")
        self.speed_units.setToolTip("The unit of ω in the table, the steps and the cycle plot")
        self.design_actions = DesignActions(self)
        self._build_toolbar()
        self._build_menus()
        self.pane_events = PaneEvents(self)
        self.builder.made.connect(self.design_actions.select)
        self.design_actions.selection_changed.connect(lambda: self._show_readouts(live=self.live))
        self.setAcceptDrops(True)
        self.setWindowIcon(icon("kinepoly"))
        self.document.changed.connect(self.refresh)
        self.document.swept.connect(self._show_sweep)
        self.document.undo_stack.cleanChanged.connect(self._update_title)
        # A sentence about an edit goes when the history moves (undo, redo, the next edit): the status
        # line then says the state of the design as it is, never of one undone.
        self.document.undo_stack.indexChanged.connect(self._forget_note)
        self.angle.angle_requested.connect(self.turn_driver)
        self.angle.length_requested.connect(self.run_cylinder)
        self.angle.playing_changed.connect(lambda _playing: self._settle())
        self.length_units.currentTextChanged.connect(self._units_changed)
        self.speed_units.currentTextChanged.connect(self._units_changed)
        self.steps.step_selected.connect(self.drawings.select_step)
        self.drawings.space_view.hovered.connect(self.table.mark_point)
        self.table.point_chosen.connect(self.drawings.mark_point)
        for polygon_view in (self.drawings.velocity_view, self.drawings.acceleration_view):
            polygon_view.step_clicked.connect(self.show_step)
        # After the force pane took the click (a second click on a step lets it go): the list follows.
        self.drawings.force_view.step_clicked.connect(lambda _step: self.show_step(self.drawings.force_step))
        self.drawings.third.currentChanged.connect(lambda _index: self._readouts())
        view = self.drawings.space_view
        view.drag_started.connect(self.begin_drag)
        view.centre_drag_started.connect(self.begin_centre_drag)
        view.dragged.connect(self.continue_drag)
        view.drag_finished.connect(self.end_drag)
        view.picked.connect(self.builder.pick)
        view.finished.connect(self.builder.finish)
        view.cancelled.connect(self.builder.cancel)
        self.resize(1600, 1000)
        self._units_changed()  # every pane in the units the tool bar shows
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

    def _toggle(self, menu, text: str, shortcut: str, tip: str, slot) -> QAction:
        """A checkable action in ``menu`` with its key and tooltip; ``slot`` takes the new state."""
        action = QAction(text, self)
        action.setCheckable(True)
        action.setShortcut(QKeySequence(shortcut))
        if tip:
            action.setToolTip(tip)
        action.toggled.connect(slot)
        menu.addAction(action)
        return action

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
        self._action(files, "&Print preview…", self.print_dialog, QKeySequence.StandardKey.Print)
        self._action(files, "Export sheet as P&DF…", self.export_pdf_dialog)
        self._action(files, "Export drawing as D&XF…", lambda: self._export("DXF drawing (*.dxf)", self.export_dxf))
        self.review_action = self._action(files, "Re&view report…", self.review_dialog)
        self._action(files, "Export results table as &CSV…", self.export_table_dialog)
        add_sheet_contents(self, files)
        files.addSeparator()
        self._action(files, "&Quit", self.close, QKeySequence.StandardKey.Quit)
        edit = self.menuBar().addMenu("&Edit")
        stack = self.document.undo_stack
        undo, redo = stack.createUndoAction(self, "&Undo"), stack.createRedoAction(self, "&Redo")
        undo.setShortcut(QKeySequence.StandardKey.Undo)
        redo.setShortcut(QKeySequence.StandardKey.Redo)
        edit.addActions([undo, redo])
        edit.addSeparator()
        drawing_key(self, self._action(edit, "&Delete the selected joint or link", self.design_actions.delete_selected,
                                       QKeySequence.StandardKey.Delete))
        add_tool_menu(self, self.menuBar().addMenu("&Tools"))
        view = self.menuBar().addMenu("&View")
        space = self.drawings.space_view
        self._action(view, "Zoom &in", lambda: space.zoom(1.25), QKeySequence.StandardKey.ZoomIn)
        self._action(view, "Zoom &out", lambda: space.zoom(0.8), QKeySequence.StandardKey.ZoomOut)
        fit = self._action(view, "&Fit to window", self.drawings.fit_all, QKeySequence("Ctrl+0"), "fit")
        self.driver_bar.addAction(fit)
        self.snapping = self._toggle(view, "&Snap to grid", "Ctrl+G", "", self._snapping_changed)
        self.centres_action = self._toggle(  # K for Kennedy's theorem
            view, "Instantaneous &centres", "Ctrl+K",
            "the instantaneous centres over the space diagram, each named by its two bodies",
            self.drawings.show_centres)
        self.centrodes_action = self._toggle(
            view, "Centro&des of the coupler", "Ctrl+Shift+K",
            "the paths of the coupler's instantaneous centre over the cycle: on the frame (fixed centrode) and on "
            "the coupler, in its pose (moving centrode)", lambda on: self.say(self.drawings.show_centrodes(on)))
        self.dimensions_action = self._toggle(
            view, "Link &lengths", "Ctrl+Shift+L", "every link's length, joint to joint, as a dimension on the space "
            "diagram (in the tool bar's length unit)", self.drawings.show_dimensions)
        self.space_forces_action = self._toggle(
            view, "&Forces on the space diagram", "Ctrl+Shift+F",
            "the pose's inertia forces on their offset lines, weights, loads and the joint forces the force polygon "
            "found, as arrows where they act", lambda on: self.say(self.drawings.show_space_forces(on)))
        add_help_menu(self, self.menuBar().addMenu("&Help"))
        self._fill_recent()

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
        self._set_driver_range(doc.sweep)
        self._show_readouts(live=self.live)
        self._update_title()

    def _show_sweep(self):
        """The cycle sweep caught up with a drag: its paths, the driver's range and the plot."""
        self.drawings.show_paths()
        self._set_driver_range(self.document.sweep)
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

    def _forget_note(self, *_):
        self.note = ""
        self._show_readouts(live=self.live)

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
        self.angle.show_length(self.document.shown_length_mm)
        made = self.drawings.force_polygon() if self.drawings.showing_forces() else None
        self.steps.show_construction(self.document.construction, made and made.polygon)
        text = status_text(self.document.analysis, self.note or self.design_actions.describe())
        self.status.setText(text)
        self.status.setToolTip(text)

    def _units_changed(self, *_):
        """One choice of units for every number the window shows (files and exports stay SI)."""
        units = (self.length_units.currentText(), self.speed_units.currentText())
        self.table.set_units(*units)
        if self.cycle is not None:
            self.cycle.set_units(*units)
        self.steps.units = units
        self.properties.set_length_unit(units[0])
        self.drawings.set_units(units[0])
        self._show_readouts(live=False)

    # building -------------------------------------------------------------
    def use_tool(self, tool: str):
        """Pick a building tool ("select" drags; the others pick joints and places)."""
        self.tool_actions[tool].setChecked(True)
        self.drawings.space_view.building = tool != "select"
        self.builder.set_tool(tool)

    def back_to_select(self):
        """Escape: drop a chain half built and return to the Select tool."""
        dropped = bool(self.builder.picks)
        self.use_tool("select")
        if dropped:
            self.say("cancelled — back to Select")

    def grid_mm(self) -> float:
        """The snapping step in mm (0 while snapping is off): see :func:`design_actions.grid_step_mm`."""
        return grid_step_mm(self.document.mechanism) if self.snapping.isChecked() else 0.0

    def _snapping_changed(self, *_):
        self.drawings.space_view.grid_mm = self.grid_mm()
        self.drawings.space_view.viewport().update()

    # turning and dragging -------------------------------------------------
    def turn_driver(self, angle_deg: float):
        """Turn the driver to ``angle_deg``; a cylinder (a click on its plots) to the length there."""
        sweep = self.document.sweep
        if sweep is not None and sweep.driver_length_m is not None:
            self.run_cylinder(length_at_angle_mm(sweep, angle_deg))
            return
        problem = self.document.set_angle(angle_deg)
        if problem:
            self.angle.stop()
            self.angle.show_angle(self.document.shown_angle_deg)
        self.say(f"the driver cannot turn to {angle_text(angle_deg)}: {problem}" if problem else "")

    def run_cylinder(self, length_mm: float):
        """Extend or retract a cylinder-driven design's cylinder to ``length_mm``."""
        problem = self.document.set_length(length_mm / 1e3)
        if problem:
            self.angle.stop()
            self.angle.show_length(self.document.shown_length_mm)
        self.say(f"the cylinder cannot reach {length_mm:.1f} mm: {problem}" if problem else "")

    def _set_driver_range(self, sweep):
        """The driver control's range from the core's sweep: a turning driver's dead points, or a
        cylinder's stroke (the part of it where the linkage assembles) in mm."""
        self.angle.set_range(sweep)
        lengths = None if sweep is None else sweep.driver_length_m
        if lengths is None:
            self.angle.set_stroke(None)
        else:
            self.angle.length_mm = self.document.shown_length_mm or self.angle.length_mm
            self.angle.set_stroke((float(lengths.min()) * 1e3, float(lengths.max()) * 1e3))

    def begin_drag(self, name: str, at_mm: tuple):
        self.angle.stop()
        self.drag = JointDrag(self.document, name, at_mm, self.grid_mm())
        self.properties.show_point(name)  # a joint pressed in the space diagram is the one the Design tab shows
        self.say(self.drag.message)

    def begin_centre_drag(self, link: str, at_mm: tuple):
        self.angle.stop()
        self.drag = CentreDrag(self.document, link, at_mm, self.grid_mm())
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

    def export_table_dialog(self):
        doc = self.document
        path = save_path(self, "Export the results table", suggested_name(doc.path, doc.mechanism.title, ".csv"),
                         CSV_FILTER)
        if path:
            export_table(self, path)

    # help ----------------------------------------------------------------
    def about(self):
        QMessageBox.about(self, "About Kinepoly", about_text())

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


def _scrolled(widget: QWidget) -> QScrollArea:
    """``widget`` in a frameless scroll area, so a tall form scrolls rather than makes the window grow."""
    area = QScrollArea()
    area.setWidget(widget)
    area.setWidgetResizable(True)
    area.setFrameShape(QFrame.Shape.NoFrame)
    return area


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
