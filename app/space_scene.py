"""The space diagram: the linkage to scale in the pose the core solved, as
:func:`kinematics.drawing.panes.space_pane` records it, shown through the
scene backend (items made once, moved in place for each pose).

Scene units are millimetres of the machine, y down. The symbols (pins, marks,
blocks, labels) are recorded at the size they take on screen at the view's
zoom, so the view records again when it zooms.
"""

from __future__ import annotations

from PySide6.QtCore import QPointF, QRectF
from PySide6.QtWidgets import QGraphicsScene

from kinematics import centres
from kinematics.cycle.centrodes import centrodes
from kinematics.drawing import Circle, Ref, Text
from kinematics.drawing.centres_overlay import centres_pane, kennedy_pane
from kinematics.drawing.declutter import text_box
from kinematics.drawing.dimensions import dimensions_pane
from kinematics.drawing.panes import centrodes_pane, paths_pane, space_pane
from kinematics.drawing.symbols import Symbols
from kinematics.errors import KinematicsError

from .scene_backend import SceneBackend

# The window's symbols, in millimetres of a sheet drawn at PIXELS_PER_SYMBOL_MM on screen: the
# sheet's proportions, pins and arrowheads a little larger than on paper (a screen is read from
# further away, and a pin is picked with the mouse).
SCREEN_SYMBOLS = Symbols(text=2.5, small_text=1.9, pin=1.1, dot=0.7, arrow=4.5)
PIXELS_PER_SYMBOL_MM = 4.0
FIT_PAD = 0.06  # room round the drawing when fitting, as a fraction of its size


def screen_symbols(mm_per_pixel: float) -> Symbols:
    """The window's symbols in scene millimetres at a zoom of ``mm_per_pixel``."""
    return SCREEN_SYMBOLS.scaled(PIXELS_PER_SYMBOL_MM * mm_per_pixel)


def scene_rect(box: tuple) -> QRectF:
    """A sheet box (x0, y0, x1, y1), y up, as a scene rectangle (y down)."""
    x0, y0, x1, y1 = box
    return QRectF(x0, -y1, x1 - x0, y1 - y0)


class SpaceScene(QGraphicsScene):
    """The space diagram of a Document's mechanism in its solved pose, with the paths of its
    coupler points over the cycle."""

    def __init__(self, parent=None):
        super().__init__(parent)
        # Every item moves with each pose: a spatial index would be rebuilt each frame for nothing.
        self.setItemIndexMethod(QGraphicsScene.ItemIndexMethod.NoIndex)
        self.linkage = SceneBackend(self)
        self.paths = SceneBackend(self)
        self.centres = SceneBackend(self)
        self.centres_sheet = None  # the centres drawn over the linkage, None when not shown
        self.found_centres = None  # the Centres drawn, None when not shown
        self.kennedy = SceneBackend(self)  # the lines of Kennedy's theorem of the centre under the pointer
        self.centrodes = SceneBackend(self)
        self.dimensions = SceneBackend(self)  # the links' lengths, when asked for
        self.centrodes_found = (None, None, "")  # (the sweep they are of, its Centrodes or None, why none)
        self.kennedy_of = ""
        self.overlay = SceneBackend(self)  # a force's line of action, over the linkage
        self.forces = SceneBackend(self)  # the pose's forces where they act, when asked for
        self.forces_sheet = None
        self.topology = None
        self.length_unit = "mm"  # the length system its scale bar is stated in (the window's choice)
        self.sheet = None
        self.swept = None
        self.motion_box = None  # where every joint goes over the cycle (sheet box), None without a sweep

    def show(self, mechanism, solution, mm_per_pixel: float, draft: bool = False):
        """Draw ``mechanism`` in the pose of ``solution`` (as the file places it when None), its
        symbols sized for a zoom of ``mm_per_pixel`` (a ``draft`` while the pose follows the mouse)."""
        self.topology = (tuple(mechanism.points), tuple(mechanism.links.items()), mechanism.ground,
                         tuple(mechanism.slides.values()))
        self.sheet = space_pane(mechanism, solution, screen_symbols(mm_per_pixel), draft, self.length_unit)
        self.linkage.show(self.sheet, 1.0 / mm_per_pixel)

    def show_paths(self, mechanism, sweep):
        """Draw the paths of the coupler points over the cycle ``sweep`` (None: none), unless drawn already."""
        if sweep is self.swept:
            return
        self.swept = sweep
        if sweep is None:
            self.paths.clear()
            self.motion_box = None
            return
        sheet = paths_pane(mechanism, sweep)
        self.paths.show(sheet, 1.0)
        self.motion_box = sheet.views["space"].box

    def show_overlay(self, sheet, mm_per_pixel: float):
        """Lay ``sheet`` (recorded in the space view's true-size millimetres) over the diagram
        (None clears it)."""
        if sheet is None:
            self.overlay.clear()
        else:
            self.overlay.show(sheet, 1.0 / mm_per_pixel)

    def show_forces(self, sheet, mm_per_pixel: float):
        """Draw the forces of ``sheet`` (:func:`kinematics.drawing.space_forces.space_forces_pane`)
        where they act (None: none)."""
        self.forces_sheet = sheet
        if sheet is None:
            self.forces.clear()
        else:
            self.forces.show(sheet, 1.0 / mm_per_pixel)

    def show_centres(self, solution, construction, mm_per_pixel: float, shown: bool):
        """Draw the instantaneous centres of ``solution`` over the linkage when ``shown`` (and
        there is a pose), sized for a zoom of ``mm_per_pixel``; else none."""
        found = None
        if shown and solution is not None:
            try:
                found = centres(solution, construction)
            except KinematicsError:
                found = None  # a pose the centres cannot be found for: the linkage alone
        self.found_centres = found
        if found is None:
            self.centres.clear()
            self.centres_sheet = None
            self.show_kennedy("", mm_per_pixel)
            return
        self.centres_sheet = centres_pane(found, screen_symbols(mm_per_pixel))
        self.centres.show(self.centres_sheet, 1.0 / mm_per_pixel)
        self.show_kennedy(self.kennedy_of, mm_per_pixel)  # the lines under the pointer follow the pose

    def show_centrodes(self, sweep, solution, mm_per_pixel: float, shown: bool) -> str:
        """Draw the coupler's fixed and moving centrodes over the cycle ``sweep`` when ``shown``, the
        moving one in the pose of ``solution``; returns why there are none ("" when drawn or not
        asked for). They are worked out once per sweep."""
        if not shown or sweep is None or solution is None:
            self.centrodes.clear()
            return "" if not shown else "no centrodes until the design sweeps its cycle"
        if self.centrodes_found[0] is not sweep:
            try:
                self.centrodes_found = (sweep, centrodes(sweep), "")
            except KinematicsError as error:
                self.centrodes_found = (sweep, None, f"no centrodes: {error}")
        found, why = self.centrodes_found[1:]
        if found is not None and (found.link not in solution.mechanism.links
                                  or sweep.point_names != solution.point_names):
            self.centrodes.clear()  # the sweep is of the design before an edit: it catches up soon
            return "the centrodes wait for the cycle's sweep to catch up with the edit"
        if found is None or not (found.fixed or found.moving):
            self.centrodes.clear()
            return why or "no centrodes: the coupler's centre stays at infinity or far off over the cycle"
        self.centrodes.show(centrodes_pane(found, solution, screen_symbols(mm_per_pixel), self.marks()),
                            1.0 / mm_per_pixel)
        return ""

    def show_dimensions(self, mechanism, solution, mm_per_pixel: float, shown: bool):
        """Draw every link's length as a dimension when ``shown`` (in the scale bar's unit)."""
        if not shown:
            self.dimensions.clear()
            return
        sheet = dimensions_pane(mechanism, solution, screen_symbols(mm_per_pixel), self.length_unit, self.marks())
        self.dimensions.show(sheet, 1.0 / mm_per_pixel)

    def show_kennedy(self, name: str, mm_per_pixel: float):
        """Draw faintly the lines of Kennedy's theorem that found centre ``name`` (and those sharing
        its mark) while the pointer is on it; none for "" or a centre no longer drawn."""
        found = self.found_centres
        self.kennedy_of = name if found is not None and name in found.centres else ""
        if not self.kennedy_of:
            self.kennedy.clear()
            return
        self.kennedy.show(kennedy_pane(found, self.kennedy_of), 1.0 / mm_per_pixel)

    def marks(self) -> list:
        """The boxes (sheet mm) of the diagram's labels and pins, for what is laid over it to keep clear of."""
        found = []
        for primitive in self.sheet.primitives if self.sheet is not None else ():
            if isinstance(primitive, Text):
                found.append(text_box(primitive))
            elif isinstance(primitive, Circle):
                (x, y), r = primitive.centre, primitive.radius
                found.append((x - r, y - r, x + r, y + r))
        return found

    def joint_pos(self, name: str) -> QPointF:
        """Scene position of joint ``name``'s pin, as drawn."""
        pin = next(p for p in self.linkage.primitives_of(Ref("point", name)) if isinstance(p, Circle))
        return QPointF(pin.centre[0], -pin.centre[1])

    def drawing_rect(self) -> QRectF:
        """The area the mechanism, its scale bar and its paths cover, with a margin for signs and
        labels (empty for a design without points)."""
        if self.sheet is None or not self.sheet.primitives:
            return QRectF()
        rect = scene_rect(self.sheet.views["space"].box)
        centres_box = self.centres_sheet.views["space"].box if self.centres_sheet is not None else None
        forces_box = self.forces_sheet.views["space"].box if self.forces_sheet is not None else None
        for box in (self.motion_box, centres_box, forces_box):
            if box is not None:
                rect = rect.united(scene_rect(box))
        pad = FIT_PAD * max(rect.width(), rect.height(), 1.0)
        return rect.adjusted(-pad, -pad, pad, pad)

    def emphasise(self, links=(), point: str | None = None):
        """Draw the links ``links`` emphasised and light up joint ``point``."""
        self.linkage.emphasise({Ref("link", name) for name in links} | ({Ref("point", point)} if point else set()))
