"""Turning mouse drags into design edits and driver turns.

A drag of a joint is one undoable edit of the reference pose (its moves
merge); a drag of a point of the driver link only turns the driver. When an
edit cannot be analysed, the last valid design stays and the reason is
returned for the status line.
"""

from __future__ import annotations

import itertools
import math
from dataclasses import replace

from kinematics import KinematicsError, Mechanism, move_point
from kinematics.files.fileschema import MAX_COORDINATE
from kinematics.model.units import angle_text

from .building import keep_slides_on_guides, snap
from .mass_edits import with_link_mass

_drag_serials = itertools.count(1)


def turns_driver(mechanism: Mechanism, name: str) -> bool:
    """True when dragging joint ``name`` should turn the driver rather than edit the design."""
    driver = mechanism.driver
    # A cylinder's barrel is moved by its length, not turned by the mouse: its joints are edited.
    return (driver is not None and not driver.is_actuator and name in mechanism.links.get(driver.link, ())
            and name != driver.pivot and name not in mechanism.ground)


class _ReferenceDrag:
    """Something the design states in its reference pose (``start_xy``, length units), following
    the mouse from scene position ``start_mm`` (machine mm, y up) by the pointer's travel, on grid
    nodes ``grid_mm`` apart when snapping (0: free). A driver turned away from the reference
    pose is turned back to it first when what is dragged moves with the pose (``posed``): the
    drawing then shows what is edited."""

    def __init__(self, document, name: str, start_mm: tuple, grid_mm: float, start_xy: tuple, posed: bool = True):
        self.document, self.name, self.start_mm, self.grid_mm = document, name, start_mm, grid_mm
        self.serial = next(_drag_serials)
        self.message = ""
        if posed and (document.angle_deg is not None or document.length_m is not None):
            document.set_angle(None)
            self.message = "editing the reference pose (the driver was turned back to it)"
        self.start_xy = start_xy
        self.mm_per_unit = 1e3 * document.mechanism.metres_per_unit

    def _place(self, at_mm: tuple, what: str) -> tuple:
        """Where the pointer at ``at_mm`` takes it (snapped, and held inside the file format's
        ±MAX_COORDINATE), and "" or why it stopped at that edge (``what`` names it)."""
        x = self.start_xy[0] + (at_mm[0] - self.start_mm[0]) / self.mm_per_unit
        y = self.start_xy[1] + (at_mm[1] - self.start_mm[1]) / self.mm_per_unit
        x, y = snap((x, y), self.grid_mm / self.mm_per_unit)
        unit = self.document.mechanism.length_unit
        clamped = (min(max(x, -MAX_COORDINATE), MAX_COORDINATE), min(max(y, -MAX_COORDINATE), MAX_COORDINATE))
        edge = (f"{what} stops at ({clamped[0]:.4g}, {clamped[1]:.4g}) {unit}: coordinates are limited to "
                f"±{MAX_COORDINATE:g} {unit}" if clamped != (x, y) else "")
        return clamped, edge


class JointDrag(_ReferenceDrag):
    """One drag of joint ``name`` with the mouse, from scene position ``start_mm`` (machine mm, y up),
    landing on grid nodes ``grid_mm`` apart when snapping (0: free)."""

    def __init__(self, document, name: str, start_mm: tuple, grid_mm: float = 0.0):
        mech = document.mechanism
        self.turning = turns_driver(mech, name) and document.solution is not None
        # A moving joint is edited where the design states it, in the reference pose; a fixed one is
        # the same in every pose, so the pose shown stays (as it does while the driver is turned).
        super().__init__(document, name, start_mm, grid_mm, mech.points[name],
                         posed=not self.turning and name not in mech.ground)
        if self.turning:
            pivot = document.solution.position(mech.driver.pivot) * 1e3
            self.pivot_mm = (float(pivot[0]), float(pivot[1]))
            self.start_angle = document.shown_angle_deg
            self.start_bearing = self._bearing(start_mm)

    def _bearing(self, at_mm) -> float:
        return math.degrees(math.atan2(at_mm[1] - self.pivot_mm[1], at_mm[0] - self.pivot_mm[0]))

    def to(self, at_mm: tuple) -> str:
        """Follow the mouse to ``at_mm``; returns "" or why the last valid state was kept."""
        if self.turning:
            angle = (self.start_angle + self._bearing(at_mm) - self.start_bearing) % 360.0
            problem = self.document.set_angle(angle)
            return f"the driver cannot turn to {angle_text(angle)}: {problem}" if problem else ""
        (x, y), edge = self._place(at_mm, self.name)
        if (x, y) == tuple(self.document.mechanism.points[self.name]):
            return edge  # still on the same grid node (or at the edge): nothing to edit, solve or draw
        try:
            after = keep_slides_on_guides(move_point(self.document.mechanism, self.name, (x, y)))
        except KinematicsError as error:  # a sliding point carried past the edge onto its line
            return f"{error} — the last valid design is kept"
        problem = self.document.edit(after, f"move {self.name}", drag=self.serial)
        if problem:
            unit = self.document.mechanism.length_unit
            return (f"{self.name} cannot go to ({x:.4g}, {y:.4g}) {unit}: {problem} — "
                    "the last valid design is kept")
        return edge


class CentreDrag(_ReferenceDrag):
    """One drag of link ``link``'s centre of mass: one undoable edit of where the design states it
    (in the reference pose), its moves merged."""

    def __init__(self, document, link: str, start_mm: tuple, grid_mm: float = 0.0):
        super().__init__(document, link, start_mm, grid_mm, document.mechanism.mass_data.masses[link].centre)

    def to(self, at_mm: tuple) -> str:
        """Follow the mouse to ``at_mm``; returns "" or why the last valid state was kept."""
        what = f"the centre of mass of {self.name}"
        centre, edge = self._place(at_mm, what)
        entry = self.document.mechanism.mass_data.masses[self.name]
        if centre == tuple(entry.centre):
            return edge
        problem = self.document.edit(with_link_mass(self.document.mechanism, self.name, replace(entry, centre=centre)),
                                     f"move {what}", drag=self.serial)
        if problem:
            unit = self.document.mechanism.length_unit
            return (f"{what} cannot go to ({centre[0]:.4g}, {centre[1]:.4g}) {unit}: {problem} — "
                    "the last valid design is kept")
        return edge
