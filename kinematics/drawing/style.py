"""Kinepoly's visual language, shared by the window, the printer and the DXF
writer so that a construction reads the same everywhere.

Line weights are from the ISO 128 series (mm). Colours are chosen to stay
apart on screen and in a grey-scale print (each also differs in dash or weight).
"""

from __future__ import annotations

from dataclasses import dataclass

from ..groups.steps import Component, Role, Step


@dataclass(frozen=True)
class Pen:
    """How a role is drawn: its colour, ISO 128 line weight, dash, DXF layer and legend words."""

    colour: str        # "#rrggbb"
    weight_mm: float   # ISO 128 line weight
    dash: str          # "solid", "dashed", "dotted", "dashdot"
    layer: str         # DXF layer name
    legend: str        # words for the legend


SPACE_LINK = Pen("#1d2b3a", 0.5, "solid", "SPACE-LINKS", "link centre line")
SPACE_GROUND = Pen("#1d2b3a", 0.35, "solid", "SPACE-GROUND", "fixed pivot, guide")
SPACE_PATH = Pen("#7a869a", 0.25, "dotted", "SPACE-PATHS", "path of a point")
KNOWN = Pen("#0b6e99", 0.5, "solid", "KNOWN-VECTORS", "known vector")
DIRECTION = Pen("#8a8f98", 0.25, "dashed", "CONSTRUCTION-LINES", "construction line (known direction)")
RESULT = Pen("#c0392b", 0.7, "solid", "RESULT-VECTORS", "result vector")
CORIOLIS = Pen("#7d3c98", 0.5, "solid", "CORIOLIS", "Coriolis component")
SLIDING = Pen("#b9770e", 0.5, "solid", "SLIDING", "sliding component")
IMAGE = Pen("#1e8449", 0.35, "solid", "IMAGES", "image point and label")
NUMERIC = Pen("#b03a2e", 0.35, "dashdot", "NUMERIC-IMAGES", "image from the numeric solver (no dyad)")
FLAGGED = Pen("#e67e22", 0.7, "dashed", "FLAGGED", "ill-conditioned intersection")
ANNOTATION = Pen("#1d2b3a", 0.25, "solid", "NOTES", "scale bar, title, notes")
CENTRE = Pen("#00897b", 0.35, "solid", "CENTRES", "instantaneous centre (Kennedy's theorem)")
KENNEDY = Pen("#00897b", 0.35, "dashed", "CENTRES-KENNEDY", "line of Kennedy's theorem")
CENTRODE_FIXED = Pen("#00897b", 0.35, "solid", "CENTRODES", "fixed centrode (path of the centre on the frame)")
CENTRODE_MOVING = Pen("#00897b", 0.35, "dashdot", "CENTRODES-MOVING",
                      "moving centrode (path of the centre on the link, in its pose)")
DIMENSION = Pen("#5d6d7e", 0.25, "solid", "DIMENSIONS", "length of a link, joint to joint")
MASS_CENTRE = Pen("#1d2b3a", 0.35, "solid", "MASS-CENTRES", "centre of mass of a link")

LEGEND = (KNOWN, RESULT, CORIOLIS, SLIDING, DIRECTION, IMAGE, NUMERIC, FLAGGED)


def pen_for(step: Step) -> Pen:
    """The pen a construction step is drawn with."""
    if step.numeric:
        return NUMERIC
    if step.flagged:
        return FLAGGED
    if step.role is Role.DIRECTION:
        return DIRECTION
    if step.component is Component.CORIOLIS:
        return CORIOLIS
    if step.component is Component.SLIDING and step.role is not Role.DIRECTION:
        return SLIDING
    if step.role is Role.KNOWN:
        return KNOWN
    if step.role is Role.RESULT:
        return RESULT
    return IMAGE
