"""The building tools of the space diagram: place pivots and joints, join them
into links, add slides, choose the driver, delete. Each finished step is one
undoable edit; an unfinished design is allowed while building."""

from __future__ import annotations

from PySide6.QtCore import QObject, Signal

from . import building
from .building import BuildError

HINTS = {
    "select": "Select: drag a joint to edit the design, a point of the driver link to turn it",
    "pivot": "Fixed pivot: click where it goes",
    "joint": "Joint: click where it goes",
    "link": "Link: click its joints in turn (a click on empty space adds a joint there); click the last "
            "one again or press Enter to finish, Esc to cancel",
    "slide": "Slide: click the sliding joint, then two points that set its line (both fixed, or both on one link)",
    "driver": "Driver: click the fixed pivot, then a joint of the link it turns (or a cylinder's: its barrel's "
              "pivot, then its rod's end, the slide's joint)",
    "cylinder": "Cylinder: click its barrel's fixed pivot, then the joint its rod is pinned to; it becomes the driver",
    "delete": "Delete: click a joint to remove it and whatever cannot stand without it",
}


class Builder(QObject):
    """Turns the space view's picks into building edits of a Document.

    ``say`` shows a sentence in the status line; ``grid_mm`` returns the snapping step
    in millimetres (0 for no snapping). ``made(kind, name)`` announces each new joint ("point") or link.
    """

    made = Signal(str, str)

    def __init__(self, document, say, grid_mm, parent=None):
        super().__init__(parent)
        self.document, self.say, self.grid_mm = document, say, grid_mm
        self.tool = "select"
        self.picks: list[str] = []

    def set_tool(self, tool: str):
        self.tool, self.picks = tool, []
        self.say(HINTS[tool])

    def file_xy(self, at_mm) -> tuple:
        """A click in machine mm as a snapped point in the file's unit."""
        mm_per_unit = 1e3 * self.document.mechanism.metres_per_unit
        snapped = building.snap(at_mm, self.grid_mm())
        return (snapped[0] / mm_per_unit, snapped[1] / mm_per_unit)

    def _apply(self, mechanism, text: str):
        self.document.edit(mechanism, text, check=False)

    def pick(self, name, at_mm):
        """A click of the current tool on joint ``name`` (None: empty space) at ``at_mm``."""
        try:
            getattr(self, f"_{self.tool}")(name, at_mm)
        except BuildError as error:
            self.picks = []
            self.say(f"{error} — {HINTS[self.tool]}")

    def _place(self, name, at_mm, fixed: bool):
        if name is not None:
            raise BuildError(f"{name} is already there")
        mech, new = building.add_point(self.document.mechanism, self.file_xy(at_mm), fixed=fixed)
        self._apply(mech, f"add {'pivot' if fixed else 'joint'} {new}")
        self.made.emit("point", new)
        self.say(f"{'fixed pivot' if fixed else 'joint'} {new} placed — {HINTS[self.tool]}")
        return new

    def place_at(self, at_mm, fixed: bool):
        """Add a fixed pivot or a joint at ``at_mm`` whatever the tool (the right-click menu)."""
        self._place(None, at_mm, fixed)

    def _pivot(self, name, at_mm):
        self._place(name, at_mm, fixed=True)

    def _joint(self, name, at_mm):
        self._place(name, at_mm, fixed=False)

    def _link(self, name, at_mm):
        if name is None:
            name = self._place(None, at_mm, fixed=False)
        elif self.picks and name == self.picks[-1]:
            self.finish()
            return
        if name not in self.picks:
            self.picks.append(name)
        self.say(f"link through {' – '.join(self.picks)}: click {self.picks[-1]} again or press Enter to finish")

    def _slide(self, name, at_mm):
        self._collect(name, ("sliding joint", "first point of its line", "second point of its line"))
        if len(self.picks) == 3:
            point, e, f = self.picks
            self.picks = []
            mech, slide = building.add_slide(self.document.mechanism, point, e, f)
            self._apply(mech, f"add {slide}")
            self.say(f"{slide}: {point} slides on the line {e}–{f} — {HINTS['slide']}")

    def _driver(self, name, at_mm):
        self._collect(name, ("fixed pivot", "joint of the link it turns"))
        if len(self.picks) == 2:
            pivot, point = self.picks
            self.picks = []
            if building.cylinder_slide(self.document.mechanism, pivot, point) is not None:
                mech = building.set_cylinder_driver(self.document.mechanism, pivot, point)
                self._apply(mech, "choose the cylinder driver")
                self.say(f"driver: {mech.driver.cylinder_words} from {pivot} to {point}, extending at "
                         f"{mech.driver.linear_speed_value:g} {mech.driver.linear_speed_unit}")
                return
            mech = building.set_driver(self.document.mechanism, pivot, point)
            self._apply(mech, "choose the driver")
            self.say(f"driver: {mech.driver.link} about {pivot} at {mech.driver.speed_value:g} {mech.driver.speed_unit}"
                     " (change the speed in the Design tab)")

    def _cylinder(self, name, at_mm):
        self._collect(name, ("barrel's fixed pivot", "joint the rod is pinned to"))
        if len(self.picks) == 2:
            pivot, rod_end = self.picks
            self.picks = []
            mech, slide = building.add_cylinder(self.document.mechanism, pivot, rod_end)
            self._apply(mech, f"add {slide}")
            self.made.emit("link", mech.slides[slide].guide)  # the barrel
            driver = mech.driver
            self.say(f"driver: {driver.cylinder_words} from {pivot} to {rod_end}, extending at "
                     f"{driver.linear_speed_value:g} {driver.linear_speed_unit} (speed and stroke in the Design tab)")

    def _delete(self, name, at_mm):
        if name is None:
            raise BuildError("click on a joint to delete it")
        self._apply(building.delete_point(self.document.mechanism, name), f"delete {name}")
        self.say(f"{name} deleted — {HINTS['delete']}")

    def _collect(self, name, roles):
        if name is None:
            raise BuildError(f"click on a joint: the {roles[len(self.picks)]}")
        self.picks.append(name)
        if len(self.picks) < len(roles):
            self.say(f"{self.tool}: {', '.join(self.picks)} — now the {roles[len(self.picks)]}")

    def finish(self):
        """Enter: close the link being built."""
        if self.tool == "link" and self.picks:
            picks, self.picks = self.picks, []
            try:
                mech, link = building.join(self.document.mechanism, picks)
            except BuildError as error:
                self.say(f"{error} — {HINTS['link']}")
                return
            self._apply(mech, f"add {link}")
            self.made.emit("link", link)
            self.say(f"{link} joins {' – '.join(picks)} — {HINTS['link']}")

    def cancel(self):
        self.picks = []
        self.say(f"cancelled — {HINTS[self.tool]}")
