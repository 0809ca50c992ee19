"""The three drawings side by side: space diagram, velocity polygon, and the acceleration
polygon or the force polygon (tabs); shared by the window and ``kinepoly render``."""

from __future__ import annotations

from PySide6.QtCore import QRectF, Qt
from PySide6.QtGui import QPainter
from PySide6.QtWidgets import QSplitter, QTabWidget

from kinematics.drawing.forces import line_of_action_pane
from kinematics.drawing.panes import BAR_ROOM
from kinematics.drawing.space_forces import space_forces_pane

from .force_scene import ForceScene, ForceView
from .forces_data import pose_force_polygon
from .polygon_scene import PolygonScene
from .space_scene import PIXELS_PER_SYMBOL_MM, SCREEN_SYMBOLS, SpaceScene, screen_symbols
from .views import PolygonView, SpaceView

EMPTY_VIEW_MM = 200.0
REFITS = 3


class DrawingsPanel(QSplitter):
    """Draws a Document: call :meth:`refresh` after each ``changed``."""

    def __init__(self, document, parent=None):
        super().__init__(Qt.Orientation.Horizontal, parent)
        self.document = document
        self.draft = False
        self.centres_shown = False
        self.centrodes_shown = False
        self.dimensions_shown = False
        self.forces_shown = False
        self.space_scene = SpaceScene()
        self.velocity_scene = PolygonScene("velocity")
        self.acceleration_scene = PolygonScene("acceleration")
        self.space_view = SpaceView(self.space_scene)
        self.velocity_view = PolygonView(self.velocity_scene, "velocity polygon")
        self.acceleration_view = PolygonView(self.acceleration_scene, "acceleration polygon")
        self.force_scene = ForceScene()
        self.force_view = ForceView(self.force_scene)
        self.force = (None, None, "")  # (the construction it is of, its ForcePolygon or None, words)
        self.force_step = ""  # the force step clicked, whose line of action stays on the space diagram
        self.third = QTabWidget()
        self.third.setDocumentMode(True)
        self.third.addTab(self.acceleration_view, "Acceleration polygon")
        self.third.addTab(self.force_view, "Force polygon")
        for view in (self.space_view, self.velocity_view, self.third):
            self.addWidget(view)
        for view in (self.space_view, self.velocity_view, self.acceleration_view, self.force_view):
            view.bottom_pixels = BAR_ROOM * SCREEN_SYMBOLS.small_text * PIXELS_PER_SYMBOL_MM  # the bar's words
        self.setSizes([620, 490, 490])
        self.third.currentChanged.connect(lambda _index: self._show_force(fit=True))
        self.force_view.step_hovered.connect(self._force_line)
        self.force_view.step_clicked.connect(self.select_force_step)
        self.space_view.hovered.connect(self.mark_point)
        self.space_view.centre_hovered.connect(
            lambda name: self.space_scene.show_kennedy(name, self._mm_per_pixel(self.space_view)))
        # A zoom changes the size the symbols must be drawn at to keep their size on screen, and so
        # the room they take: a view that fits its drawing (it was resized) fits it again.
        self.space_view.rescaled.connect(self._space_rescaled)
        for view in (self.velocity_view, self.acceleration_view, self.force_view):
            view.rescaled.connect(lambda view=view: self._draw_polygon(view, fit=view.auto_fit))
        self.refresh()
        self.fit_space()

    def refresh(self):
        topology = self.space_scene.topology
        self._draw_space()
        self.show_paths()
        if self.space_scene.topology != topology and self.space_view.auto_fit:
            self.fit_space()  # a joint or link was added or removed: keep the whole design in view
        for view in (self.velocity_view, self.acceleration_view):
            self._draw_polygon(view, fit=True)
        self._show_force(fit=True)
        self.space_view.hover_again()

    # the force polygon --------------------------------------------------------
    def showing_forces(self) -> bool:
        return self.third.currentWidget() is self.force_view

    def show_forces(self, on: bool = True):
        """Show the force polygon (or the acceleration polygon) in the third pane."""
        self.third.setCurrentWidget(self.force_view if on else self.acceleration_view)

    def force_polygon(self):
        """The ForcePolygon of the pose shown (None where there is none), made once per construction."""
        construction = self.document.construction
        if self.force[0] is not construction or construction is None:
            self.force = (construction, *pose_force_polygon(construction, self.document.analysis.forces))
        return self.force[1]

    def _show_force(self, fit: bool = False):
        """Draw the force polygon and its line of action, while its tab is shown (it is made
        only then: a drag frame pays for it only when it is looked at)."""
        if not self.showing_forces():
            self.space_scene.show_overlay(None, 1.0)
            return
        self.force_polygon()
        self.force_view.set_message(self.force[2])
        self._draw_polygon(self.force_view, fit=fit)
        self._force_line(self.force_step)

    def _force_line(self, step_id: str):
        """Lay the line of action of force step ``step_id`` over the space diagram ("": the clicked
        step's, if any)."""
        made = self.force[1] if self.showing_forces() else None
        step_id = step_id or self.force_step
        if made is None or not step_id:
            self.space_scene.show_overlay(None, 1.0)
            return
        zoom = self._mm_per_pixel(self.space_view)
        self.space_scene.show_overlay(line_of_action_pane(made, step_id, screen_symbols(zoom)), zoom)

    def select_force_step(self, step_id: str):
        """A click on a force step: emphasised, its line of action kept on the space diagram
        ("" clears; a second click on it too)."""
        self.force_step = "" if step_id == self.force_step else step_id
        self.force_scene.select_step(self.force_step or None)
        self._force_line(self.force_step)

    def _space_rescaled(self):
        self._draw_space()
        self._force_line(self.force_step)
        if self.space_view.auto_fit:
            self.fit_space()

    def _draw_space(self):
        doc = self.document
        zoom = self._mm_per_pixel(self.space_view)
        self.space_scene.show(doc.mechanism, doc.solution, zoom, self.draft)
        self.space_scene.show_centres(doc.solution, doc.construction, zoom, self.centres_shown)
        self.space_scene.show_dimensions(doc.mechanism, doc.solution, zoom, self.dimensions_shown)
        self._draw_centrodes()
        made = self.force_polygon() if self.forces_shown else None
        self.space_scene.show_forces(made and space_forces_pane(made, screen_symbols(zoom), self.space_scene.marks()),
                                     zoom)

    def show_space_forces(self, on: bool) -> str:
        """Draw the pose's forces where they act on the space diagram (or not), the view refitted
        to take them in; returns why there are none to draw ("" when drawn or not asked for)."""
        self.forces_shown = on
        self._draw_space()
        if self.space_view.auto_fit:
            self.fit_space()
        return self.force[2] if on and self.force[1] is None else ""

    def set_units(self, length_unit: str):
        """State the scale bars (and the polygons' scales) in ``length_unit``: the drawings stay as they are."""
        self.space_scene.length_unit = length_unit
        for scene in (self.velocity_scene, self.acceleration_scene):
            scene.length_unit = length_unit
        self.refresh()

    def show_dimensions(self, on: bool):
        """Draw the links' lengths as dimensions on the space diagram (or not)."""
        self.dimensions_shown = on
        self._draw_space()

    def show_centrodes(self, on: bool) -> str:
        """Draw the coupler's centrodes over the space diagram (or not); returns why there are none
        ("" when drawn or not asked for)."""
        self.centrodes_shown = on
        return self._draw_centrodes()

    def _draw_centrodes(self) -> str:
        doc = self.document
        return self.space_scene.show_centrodes(doc.sweep, doc.solution, self._mm_per_pixel(self.space_view),
                                               self.centrodes_shown)

    def show_centres(self, on: bool):
        """Draw the instantaneous centres over the space diagram (or not), the view refitted to
        take them in."""
        self.centres_shown = on
        self._draw_space()
        if self.space_view.auto_fit:
            self.fit_space()

    def _draw_polygon(self, view, fit: bool = False):
        """Draw the polygon of ``view``; ``fit`` lets the view refit it first, so that it is drawn
        once, with its symbols for the zoom the fit makes."""
        doc, scene = self.document, view.scene()
        construction = doc.construction
        if scene.kind == "force":
            made = self.force_polygon()
            polygon = made and made.polygon
        else:
            polygon = construction and getattr(construction, scene.kind)
        if fit and polygon is not None:
            view.show_rect(scene.rect_for(polygon))
        scene.show(polygon, doc.solution, self._mm_per_pixel(view), self.draft)
        if fit and polygon is not None and scene.kind == "force":
            # The force polygon's labels take a room of their own: fitted to them as drawn, then
            # drawn again at the zoom that fit made (their place depends on it), until it holds.
            for _ in range(REFITS):
                zoom = self._mm_per_pixel(view)
                view.show_rect(scene.fit_rect(polygon))
                if self._mm_per_pixel(view) == zoom:
                    break
                scene.show(polygon, doc.solution, self._mm_per_pixel(view), self.draft)

    def set_draft(self, on: bool):
        """Draw without antialiasing, and labels as a draft (see kinematics.drawing.Recorder), while
        the pose follows the mouse (nearly half the cost of a repaint, a third of the recording);
        the finished pose is drawn in full again."""
        if on == self.draft:
            return
        self.draft = on
        for view in (self.space_view, self.velocity_view, self.acceleration_view, self.force_view):
            view.setRenderHint(QPainter.RenderHint.Antialiasing, not on)
        if not on:
            self.refresh()

    def show_paths(self):
        """Redraw the coupler paths and the centrodes alone (the document's sweep caught up with a drag)."""
        self.space_scene.show_paths(self.document.mechanism, self.document.sweep)
        self._draw_centrodes()

    @staticmethod
    def _mm_per_pixel(view) -> float:
        return 1.0 / max(view.transform().m11(), 1e-12)

    def fit_space(self):
        """Fit the space diagram, with room for the links to turn."""
        self.space_view.auto_fit = True
        # As for a polygon: a refit changes the room the symbols take, so fitted again at the new zoom.
        for _ in range(REFITS):
            zoom = self._mm_per_pixel(self.space_view)
            self.space_view.show_rect(self._space_rect())
            if self._mm_per_pixel(self.space_view) == zoom:
                break
            self._draw_space()

    def _space_rect(self) -> QRectF:
        rect = self.space_scene.drawing_rect()
        mech = self.document.mechanism
        # At least the design's own size across (a 200 mm sheet for one point or none), so a
        # lone pivot is not blown up to fill the view.
        least = 1e3 * mech.size * mech.metres_per_unit or EMPTY_VIEW_MM
        if rect.isEmpty():
            rect = QRectF(-0.5 * least, -0.5 * least, least, least)
        grow = 0.05 * max(rect.width(), rect.height())
        rect = rect.adjusted(-grow, -grow, grow, grow)
        if rect.width() < least and rect.height() < least:
            centre = rect.center()
            rect = QRectF(centre.x() - 0.5 * least, centre.y() - 0.5 * least, least, least)
        return rect

    def fit_all(self):
        self.fit_space()
        self.velocity_view.fit_to_window()
        self.acceleration_view.fit_to_window()
        self.force_view.fit_to_window()

    def mark_point(self, name):
        """Light up joint ``name`` and its image points (None clears)."""
        self.space_scene.emphasise(links=self._selected_links(), point=name)
        self.velocity_scene.mark_point(name)
        self.acceleration_scene.mark_point(name)
        self.force_scene.mark_point(name)

    def _selected_links(self):
        construction = self.document.construction
        for scene, polygon in ((self.velocity_scene, construction and construction.velocity),
                               (self.acceleration_scene, construction and construction.acceleration)):
            if polygon is not None and scene.selected_step:
                return next((s.links for s in polygon.steps if s.id == scene.selected_step), ())
        return ()

    def select_step(self, step_id: str):
        """Emphasise step ``step_id`` in its polygon and the links it concerns ("" clears); a force
        step also keeps its line of action on the space diagram."""
        for scene in (self.velocity_scene, self.acceleration_scene):
            scene.select_step(step_id if scene.has_step(step_id) else None)
        self.space_scene.emphasise(links=self._selected_links())
        self.force_step = step_id if self.force_scene.has_step(step_id) else ""
        self.force_scene.select_step(self.force_step or None)
        self._force_line(self.force_step)
