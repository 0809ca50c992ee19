"""What the user does to one joint or link of the space diagram: select it, delete it, nudge it with
the arrow keys, rename it, fix it to the frame, make its link the driver; the right-click menus offer
the same. Each change is one undoable edit of the Document."""

from __future__ import annotations

from PySide6.QtCore import QObject, Signal
from PySide6.QtWidgets import QInputDialog, QMenu, QMessageBox

from kinematics import KinematicsError, move_point, rename_link, rename_point
from kinematics.groups.scales import series_at_most

from . import building
from .building import BuildError
from .panels import EMPTY_VIEW_MM

FINE_STEPS_PER_GRID = 10  # Shift + arrow moves a tenth of a grid step


def grid_step_mm(mechanism) -> float:
    """The grid's step in mm: a 1-2-5 length near a twentieth of the design, at least 10 mm (a small or
    new design is laid out on a 200 mm sheet). Snapping lands on it; an arrow key moves a joint by it."""
    return series_at_most(max(1e3 * mechanism.size * mechanism.metres_per_unit, EMPTY_VIEW_MM) / 20.0)


def driver_choices(mechanism, link_names) -> list[tuple[str, str, str]]:
    """(link, fixed pivot, other joint) for each of ``link_names`` that could turn about one of its
    fixed points (a link on two fixed points never moves, and is left out)."""
    choices = []
    for link in link_names:
        members = mechanism.links[link]
        pivots = [p for p in members if p in mechanism.ground]
        moving = [p for p in members if p not in mechanism.ground]
        if len(pivots) == 1 and moving:
            choices.append((link, pivots[0], moving[0]))
    return choices


class DesignActions(QObject):
    """The selection of the window's space diagram and the edits made to it.

    ``selected`` is ``("point", name)``, ``("link", name)`` or None; ``selection_changed`` says it moved.
    """

    selection_changed = Signal()

    def __init__(self, window):
        super().__init__(window)
        self.window = window
        self.document = window.document
        self.selected = None
        self.document.changed.connect(self._forget_gone)

    # selecting ------------------------------------------------------------
    def select(self, kind: str | None, name: str | None = None):
        """Make joint or link ``name`` the selection (kind None clears it) and the Design tab's current one."""
        self.selected = (kind, name) if kind in ("point", "link") else None
        if self.selected is not None:
            show = self.window.properties.show_point if kind == "point" else self.window.properties.show_link
            show(name)
        self.selection_changed.emit()

    def _forget_gone(self):
        if self.selected is None:
            return
        kind, name = self.selected
        present = self.document.mechanism.points if kind == "point" else self.document.mechanism.links
        if name not in present:
            self.selected = None
            self.selection_changed.emit()

    def describe(self) -> str:
        """The selection in words for the status line ("" for none)."""
        if self.selected is None:
            return ""
        kind, name = self.selected
        if kind == "point":
            return f"joint {name} selected (arrow keys nudge it, Shift for a fine step; Delete removes it)"
        return f"link {name} selected (Delete removes it)"

    # edits ----------------------------------------------------------------
    def _edit(self, mechanism, text: str):
        self.document.edit(mechanism, text, check=False)

    def delete_selected(self):
        """Edit > Delete: remove the selected joint (and what cannot stand without it) or link."""
        if self.selected is None:
            self.window.say("nothing is selected: click a joint or link first, then press Delete")
            return
        kind, name = self.selected
        self.delete(kind, name)

    def delete(self, kind: str, name: str):
        mech = self.document.mechanism
        after = building.delete_point(mech, name) if kind == "point" else building.delete_link(mech, name)
        self.select(None)
        self._edit(after, f"delete {name}")
        self.window.say(f"{'joint' if kind == 'point' else 'link'} {name} deleted (Ctrl+Z brings it back)")

    def nudge(self, dx: int, dy: int, fine: bool = False):
        """Move the selected joint by (dx, dy) arrow-key steps: one undo step per press."""
        if self.selected is None or self.selected[0] != "point":
            return False
        name = self.selected[1]
        doc = self.document
        mech = doc.mechanism
        step_mm = grid_step_mm(mech) / (FINE_STEPS_PER_GRID if fine else 1)
        if name not in mech.ground and doc.angle_deg is not None:
            doc.set_angle(None)  # a moving joint is edited where the design states it: in the reference pose
        step = step_mm / (1e3 * mech.metres_per_unit)
        x, y = mech.points[name]
        try:
            after = building.keep_slides_on_guides(move_point(mech, name, (x + dx * step, y + dy * step)))
        except KinematicsError as error:
            self.window.say(f"{name} stays: {error}")
            return True
        problem = doc.edit(after, f"nudge {name}")
        unit = mech.length_unit
        self.window.say(f"{name} cannot move there: {problem}" if problem else
                        f"{name} nudged to ({after.points[name][0]:.6g}, {after.points[name][1]:.6g}) {unit}")
        return True

    def rename(self, kind: str, name: str):
        word = "joint" if kind == "point" else "link"
        new, accepted = QInputDialog.getText(self.window, f"Rename {word} {name}", f"New name of {word} {name}:",
                                             text=name)
        new = new.strip()
        if not accepted or not new or new == name:
            return
        rename = rename_point if kind == "point" else rename_link
        try:
            renamed = rename(self.document.mechanism, name, new)
        except KinematicsError as error:
            QMessageBox.warning(self.window, f"Cannot rename {word} {name}", str(error))
            return
        self._edit(renamed, f"rename {word} {name} to {new}")
        self.select(kind, new)

    def set_fixed(self, name: str, fixed: bool):
        self._edit(building.set_fixed(self.document.mechanism, name, fixed), f"{'fix' if fixed else 'free'} {name}")

    def make_driver(self, link: str, pivot: str, point: str):
        try:
            after = building.set_driver(self.document.mechanism, pivot, point)
        except BuildError as error:
            QMessageBox.warning(self.window, "Cannot make the driver", str(error))
            return
        self._edit(after, "choose the driver")
        self.window.say(f"driver: {link} about {pivot} (set its speed in the Design tab)")

    # the right-click menu -------------------------------------------------
    def context_menu(self, kind: str | None, name: str | None, at_mm: tuple) -> QMenu:
        """The menu for a right click on joint or link ``name`` (kind None: empty space at ``at_mm``)."""
        menu = QMenu(self.window)
        mech = self.document.mechanism
        if kind is None:
            builder = self.window.builder
            menu.addAction("Add a fixed pivot here", lambda: builder.place_at(at_mm, fixed=True))
            menu.addAction("Add a joint here", lambda: builder.place_at(at_mm, fixed=False))
            menu.addSeparator()
            menu.addAction("Fit to window", self.window.drawings.fit_all)
            return menu
        self.select(kind, name)
        menu.addAction(f"Delete {name}", lambda: self.delete(kind, name))
        menu.addAction(f"Rename {name}…", lambda: self.rename(kind, name))
        if kind == "point":
            fixed = name in mech.ground
            menu.addAction(f"Free {name} from the frame" if fixed else f"Fix {name} to the frame",
                           lambda: self.set_fixed(name, not fixed))
            links = [n for n, members in mech.links.items() if name in members]
        else:
            links = [name]
        for link, pivot, point in driver_choices(mech, links):
            menu.addAction(f"Make {link} the driver (about {pivot})",
                           lambda link=link, pivot=pivot, point=point: self.make_driver(link, pivot, point))
        return menu
