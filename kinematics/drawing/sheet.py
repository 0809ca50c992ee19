"""The Sheet: a drawing recorded once as plain primitives in sheet millimetres.

Coordinates are millimetres on the sheet, x to the right and y up, origin at
the lower-left corner of the sheet (or of the model, for a DXF drawing). Each
primitive carries the pen (:mod:`kinematics.drawing.style`) that gives its role, the
view it belongs to and a :class:`Ref` to what it draws (a point, a link, a
construction step ...), so a backend can put it on a layer and a window can
lead a click back to the model. Backends (DXF writer, Qt painter, the window's
scenes) replay the primitives and compute no geometry of their own.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from functools import lru_cache
from typing import TYPE_CHECKING, NamedTuple

from .style import ANNOTATION, Pen

if TYPE_CHECKING:  # hatching builds Strokes: a run-time import would go round in a circle
    from .hatching import Pattern

# Dash patterns of ISO 128 line types in multiples of the line width: dashed
# (type 02: 12 dash, 3 gap), dotted (type 07 as dots 0.5, gap 3), long
# dash-dotted (type 04: 24 dash, 3 gap, 0.5 dot, 3 gap).  # from memory
DASHES = {"dashed": (12.0, 3.0), "dotted": (0.5, 3.0), "dashdot": (24.0, 3.0, 0.5, 3.0)}

# The sheet frame takes the heaviest ISO 128 weight so the page reads as bounded.
FRAME = Pen(ANNOTATION.colour, 0.7, "solid", "SHEET-FRAME", "sheet frame and title block rules")


class Ref(NamedTuple):
    """What a primitive draws: ``kind`` is "point", "link", "slide", "step", "driver",
    "image" (a link's image figure on a polygon), "path" (a point's path over the
    cycle), "centre" (an instantaneous centre, named by its pair "a|b") or a part of the sheet ("scale bar",
    "frame", "title block", "results table", "legend", "note"); ``name`` names the
    point, link, slide or step id (the view's name for a scale bar, "" for the
    sheet's own parts). A backend keeps it with what it makes, so a window leads a
    click or a hover back to the model and moves the same item from pose to pose."""

    kind: str
    name: str = ""


# A view records a Ref for every step, point and link at every frame of a drag: the same ones
# each time, so they are made once (one object per Ref, which also makes comparing them cheap).
ref_of = lru_cache(maxsize=4096)(Ref)


# The primitives are named tuples, not dataclasses: a window records its views at every frame
# of a drag, and a tuple is made in two thirds of the time of a frozen dataclass.
class Line(NamedTuple):
    """A straight line from ``start`` to ``end`` (sheet mm)."""

    start: tuple
    end: tuple
    pen: Pen
    view: str = ""
    ref: Ref | None = None


class Polyline(NamedTuple):
    """A polyline through ``points`` (sheet mm), ``closed`` back to its first point."""

    points: tuple
    pen: Pen
    closed: bool = False
    view: str = ""
    ref: Ref | None = None


class Strokes(NamedTuple):
    """Separate straight strokes in one pen (hatching, ticks): ``points`` taken in pairs,
    each pair one stroke. Hatching says its :class:`~kinematics.drawing.hatching.Pattern`
    (a CAD file writes it as one hatch); a painter draws the strokes alike."""

    points: tuple
    pen: Pen
    view: str = ""
    ref: Ref | None = None
    pattern: Pattern | None = None


class Arrow(NamedTuple):
    """A vector: shaft from ``start`` to ``end`` and a filled ``head`` triangle
    (its three corners, tip first) at ``end``."""

    start: tuple
    end: tuple
    head: tuple
    pen: Pen
    view: str = ""
    ref: Ref | None = None


class Circle(NamedTuple):
    """A circle about ``centre`` of ``radius`` (sheet mm), outlined or ``filled``."""

    centre: tuple
    radius: float
    pen: Pen
    filled: bool = False
    view: str = ""
    ref: Ref | None = None


class Text(NamedTuple):
    """One line of text. ``height`` is the capital height (ISO 3098 h) in mm;
    ``align`` is "left", "centre" or "right" and ``anchor`` is "baseline",
    "middle" (half the capital height) or "top" (top of the capitals).
    ``mono`` asks for a fixed-pitch face, for text laid out in columns of characters."""

    position: tuple
    text: str
    height: float
    pen: Pen
    align: str = "left"
    anchor: str = "baseline"
    view: str = ""
    ref: Ref | None = None
    mono: bool = False


class Hatch(NamedTuple):
    """A solid-filled closed outline."""

    points: tuple
    pen: Pen
    view: str = ""
    ref: Ref | None = None


class Note(NamedTuple):
    """A paragraph: ``lines`` from ``position`` (left end of the first line's
    capitals' top) downwards, ``pitch`` mm apart, capital height ``height``."""

    position: tuple
    lines: tuple
    height: float
    pitch: float
    pen: Pen
    view: str = ""
    ref: Ref | None = None


@dataclass(frozen=True)
class View:
    """Where one view sits: ``box`` (x0, y0, x1, y1) in sheet mm, ``origin`` the
    sheet position of the model's zero, and ``mm_per_unit`` sheet mm per model
    unit (per metre for the space diagram, per m/s or m/s² for a polygon).
    ``scale_text`` is the scale as printed ("1:2", "1 mm = 0.01 m/s"); ``significant``
    the digits a true-size view rounds its points to (0: none; see :meth:`place`)."""

    name: str
    box: tuple
    origin: tuple
    mm_per_unit: float
    unit: str
    scale_text: str

    significant: int = 0

    def place(self, xy) -> tuple:
        """Sheet position of model point ``xy`` (model units); to ``significant`` digits where set.

        The solver works in metres: a joint at 470 mm in the file comes back as 0.47 m and would
        be drawn at 470.00000000000006 mm. A true-size drawing rounds to 15 significant digits
        (a double holds 15 to 17; the last are the noise of the unit conversions) and carries
        the file's own numbers.
        """
        (ox, oy), k = self.origin, self.mm_per_unit
        x, y = ox + xy[0] * k, oy + xy[1] * k  # plain floats in, plain floats out (every caller gives floats)
        if self.significant:
            x, y = float(f"{x:.{self.significant}g}"), float(f"{y:.{self.significant}g}")
        return (x, y)


# The space diagram laid over a window's own at true size: sheet mm = machine mm, the file's origin
# kept (the overlays of centres, centrodes, dimensions and forces, and the window's space pane).
TRUE_SIZE_SPACE = View("space", (0.0, 0.0, 0.0, 0.0), (0.0, 0.0), 1000.0, "m", "1:1")


@dataclass(frozen=True)
class Sheet:
    """A finished drawing: size in mm (0 × 0 for an unbounded model drawing),
    its views by name, and the primitives in drawing order."""

    width: float
    height: float
    views: dict
    primitives: tuple
    title: str = ""

    def of_view(self, name: str) -> tuple:
        """The primitives drawn in view ``name``."""
        return tuple(p for p in self.primitives if p.view == name)

    def of_step(self, step_id: str) -> tuple:
        """The primitives that draw construction step ``step_id``."""
        return self.of_ref(Ref("step", step_id))

    def of_ref(self, ref: Ref) -> tuple:
        """The primitives that draw what ``ref`` names."""
        return tuple(p for p in self.primitives if p.ref == ref)


@dataclass
class Recorder:
    """The collector backend the drawing code writes to; ``sheet()`` freezes it.

    ``labels`` and ``marks`` are what :func:`~kinematics.drawing.declutter.declutter` works
    from: each label placed so far (its primitive's index and how it was placed) and the boxes
    of the marks a label must keep clear of, per view. A ``draft`` (a window's drawing while
    the pose follows the mouse) sets labels where they face, without searching for the side
    clearest of the lines through their point; they are still kept apart from each other and
    from the marks.
    """

    primitives: list = field(default_factory=list)
    views: dict = field(default_factory=dict)
    labels: list = field(default_factory=list)
    marks: list = field(default_factory=list)
    draft: bool = False

    def add(self, primitive) -> None:
        """Record one primitive."""
        self.primitives.append(primitive)

    def add_view(self, view: View) -> None:
        """Record a view's frame and scale."""
        self.views[view.name] = view

    def sheet(self, width: float, height: float, title: str = "") -> Sheet:
        """The recording so far as a frozen Sheet of ``width`` × ``height`` mm."""
        return Sheet(width=width, height=height, views=dict(self.views), primitives=tuple(self.primitives),
                     title=title)
