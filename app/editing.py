"""Turning mouse drags into design edits and driver turns.

A drag of a joint is one undoable edit of the reference pose (its moves
merge); a drag of a point of the driver link only turns the driver. When an
edit cannot be analysed, the last valid design stays and the reason is
returned for the status line.
"""

from __future__ import annotations

import itertools
import math

from kinematics import KinematicsError, Mechanism, move_point
from kinematics.files.fileschema import MAX_COORDINATE

from .building import keep_slides_on_guides, snap

_drag_serials = itertools.count(1)


def turns_driver(mechanism: Mechanism, name: str) -> bool:
    """True when dragging joint ``name`` should turn the driver rather than edit the design."""
    driver = mechanism.driver
    # A cylinder's barrel is moved by its length, not turned by the mouse: its joints are edited.
    return (driver is not None and not driver.is_actuator and name in mechanism.links.get(driver.link, ())
            and name != driver.pivot and name not in mechanism.ground)


class JointDrag:
    """One drag of joint ``name`` with the mouse, from scene position ``start_mm`` (machine mm, y up),
    landing on grid nodes ``grid_mm`` apart when snapping (0: free)."""

    def __init__(self, document, name: str, start_mm: tuple, grid_mm: float = 0.0):
        self.document, self.name, self.start_mm, self.grid_mm = document, name, start_mm, grid_mm
        self.turning = turns_driver(document.mechanism, name) and document.solution is not None
        self.serial = next(_drag_serials)
        self.message = ""
        mech = document.mechanism
        if self.turning:
            pivot = document.solution.position(mech.driver.pivot) * 1e3
            self.pivot_mm = (float(pivot[0]), float(pivot[1]))
            self.start_angle = document.shown_angle_deg
            self.start_bearing = self._bearing(start_mm)
            return
        if name not in mech.ground and (document.angle_deg is not None or document.length_m is not None):
            # A moving joint is edited where the design states it: in the reference pose.
            document.set_angle(None)
            self.message = "editing the reference pose (the driver was turned back to it)"
        self.start_xy = mech.points[name]
        self.mm_per_unit = 1e3 * mech.metres_per_unit

    def _bearing(self, at_mm) -> float:
        return math.degrees(math.atan2(at_mm[1] - self.pivot_mm[1], at_mm[0] - self.pivot_mm[0]))

    def to(self, at_mm: tuple) -> str:
        """Follow the mouse to ``at_mm``; returns "" or why the last valid state was kept."""
        if self.turning:
            angle = (self.start_angle + self._bearing(at_mm) - self.start_bearing) % 360.0
            problem = self.document.set_angle(angle)
            return f"the driver cannot turn to {angle:.1f}°: {problem}" if problem else ""
        x = self.start_xy[0] + (at_mm[0] - self.start_mm[0]) / self.mm_per_unit
        y = self.start_xy[1] + (at_mm[1] - self.start_mm[1]) / self.mm_per_unit
        x, y = snap((x, y), self.grid_mm / self.mm_per_unit)
        unit = self.document.mechanism.length_unit
        # The file format holds coordinates up to ±MAX_COORDINATE: a far drag stops at that edge.
        clamped = (min(max(x, -MAX_COORDINATE), MAX_COORDINATE), min(max(y, -MAX_COORDINATE), MAX_COORDINATE))
        edge = (f"{self.name} stops at ({clamped[0]:.4g}, {clamped[1]:.4g}) {unit}: coordinates are limited to "
                f"±{MAX_COORDINATE:g} {unit}" if clamped != (x, y) else "")
        x, y = clamped
        if (x, y) == tuple(self.document.mechanism.points[self.name]):
            return edge  # still on the same grid node (or at the edge): nothing to edit, solve or draw
        try:
            after = keep_slides_on_guides(move_point(self.document.mechanism, self.name, (x, y)))
        except KinematicsError as error:  # a sliding point carried past the edge onto its line
            return f"{error} — the last valid design is kept"
        problem = self.document.edit(after, f"move {self.name}", drag=self.serial)
        if problem:
            return (f"{self.name} cannot go to ({x:.4g}, {y:.4g}) {unit}: {problem} — "
                    "the last valid design is kept")
        return edge
