"""The Sheet: a drawing recorded once as plain primitives in sheet millimetres.

Coordinates are millimetres on the sheet, x to the right and y up, origin at
the lower-left corner of the sheet (or of the model, for a DXF drawing). Each
primitive carries the pen (:mod:`kinematics.drawing.style`) that gives its role, the
view it belongs to and the id of the construction step it draws ("" when it
draws no step), so a backend can put it on a layer and a window can lead a
click back to the step; ``part`` names the point or link a space-diagram
primitive draws. Backends (DXF writer, Qt painter) replay the
primitives and compute no geometry of their own.
"""

from __future__ import annotations

from dataclasses import dataclass, field

from .style import ANNOTATION, Pen

# Dash patterns of ISO 128 line types in multiples of the line width: dashed
# (type 02: 12 dash, 3 gap), dotted (type 07 as dots 0.5, gap 3), long
# dash-dotted (type 04: 24 dash, 3 gap, 0.5 dot, 3 gap).  # from memory
DASHES = {"dashed": (12.0, 3.0), "dotted": (0.5, 3.0), "dashdot": (24.0, 3.0, 0.5, 3.0)}

# The sheet frame takes the heaviest ISO 128 weight so the page reads as bounded.
FRAME = Pen(ANNOTATION.colour, 0.7, "solid", "SHEET-FRAME", "sheet frame and title block rules")


@dataclass(frozen=True)
class Line:
    start: tuple
    end: tuple
    pen: Pen
    view: str = ""
    step: str = ""
    part: str = ""


@dataclass(frozen=True)
class Polyline:
    points: tuple
    pen: Pen
    closed: bool = False
    view: str = ""
    step: str = ""
    part: str = ""


@dataclass(frozen=True)
class Arrow:
    """A vector: shaft from ``start`` to ``end`` and a filled ``head`` triangle
    (its three corners, tip first) at ``end``."""

    start: tuple
    end: tuple
    head: tuple
    pen: Pen
    view: str = ""
    step: str = ""
    part: str = ""


@dataclass(frozen=True)
class Circle:
    centre: tuple
    radius: float
    pen: Pen
    filled: bool = False
    view: str = ""
    step: str = ""
    part: str = ""


@dataclass(frozen=True)
class Text:
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
    step: str = ""
    part: str = ""
    mono: bool = False


@dataclass(frozen=True)
class Hatch:
    """A solid-filled closed outline."""

    points: tuple
    pen: Pen
    view: str = ""
    step: str = ""
    part: str = ""


@dataclass(frozen=True)
class Note:
    """A paragraph: ``lines`` from ``position`` (left end of the first line's
    capitals' top) downwards, ``pitch`` mm apart, capital height ``height``."""

    position: tuple
    lines: tuple
    height: float
    pitch: float
    pen: Pen
    view: str = ""
    step: str = ""
    part: str = ""


@dataclass(frozen=True)
class View:
    """Where one view sits: ``box`` (x0, y0, x1, y1) in sheet mm, ``origin`` the
    sheet position of the model's zero, and ``mm_per_unit`` sheet mm per model
    unit (per metre for the space diagram, per m/s or m/s² for a polygon).
    ``scale_text`` is the scale as printed ("1:2", "1 mm = 0.01 m/s")."""

    name: str
    box: tuple
    origin: tuple
    mm_per_unit: float
    unit: str
    scale_text: str

    def place(self, xy) -> tuple:
        """Sheet position of model point ``xy`` (model units)."""
        return (self.origin[0] + float(xy[0]) * self.mm_per_unit, self.origin[1] + float(xy[1]) * self.mm_per_unit)


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
        return tuple(p for p in self.primitives if p.view == name)

    def of_step(self, step_id: str) -> tuple:
        return tuple(p for p in self.primitives if p.step == step_id)


@dataclass
class Recorder:
    """The collector backend the drawing code writes to; ``sheet()`` freezes it."""

    primitives: list = field(default_factory=list)
    views: dict = field(default_factory=dict)

    def add(self, primitive) -> None:
        self.primitives.append(primitive)

    def add_view(self, view: View) -> None:
        self.views[view.name] = view

    def sheet(self, width: float, height: float, title: str = "") -> Sheet:
        return Sheet(width=width, height=height, views=dict(self.views), primitives=tuple(self.primitives),
                     title=title)
