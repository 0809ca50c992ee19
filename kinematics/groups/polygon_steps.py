"""Steps every group form draws the same way: the images of a link's further
points, and a laid radial or Coriolis component (see the ``group_*`` modules)."""

from __future__ import annotations

from ..model.mechanism import GROUND
from .base import Frame, Laid
from .steps import Component, PolygonBuilder, Role, figure


def image_steps(builder: PolygonBuilder, frame: Frame, link: str, placed: set, field_name: str):
    """An image step for each point of ``link`` not yet placed on the polygon."""
    values = frame.vel if field_name == "vel" else frame.acc
    how = ("directly similar to the link, turned 90° the way it turns" if field_name == "vel"
           else "directly similar to the link, turned by arg(−ω² + iα)")
    for name in frame.mech.links[link]:
        if name in placed:
            continue
        placed.add(name)
        builder.add(Role.IMAGE, None, builder.label(name), (values[name],),
                    f"{builder.label(name)} by image of {link}", f"{builder.label(name)}: image of {name} on {link}, "
                    f"{how}", points=(name,), links=(link,))


def radial_step(builder: PolygonBuilder, laid: Laid, frame: Frame, links: tuple, carried: bool = False):
    """The laid radial component; ``carried``: it belongs to the point of the link under
    ``laid.point`` (a slotted link), and says so."""
    link = next((k for k in links if {laid.point, laid.about} <= set(frame.mech.links[k])), links[0])
    magnitude = abs(laid.end - laid.start)
    who = f"the point of {link} under {laid.point}" if carried else laid.point
    equation = (f"a^r = ω_{link}²·{laid.about}{laid.point} (point of {link} under {laid.point})"
                if carried else f"a_{laid.point}{laid.about}^r = v_{laid.point}{laid.about}² / "
                f"{laid.point}{laid.about}")
    return builder.vector(
        Component.RADIAL, laid.start, laid.end, "", equation,
        f"radial component of {who} relative to {laid.about}: v²/r = {figure(magnitude)} m/s², "
        f"directed from {laid.point} to {laid.about}", points=(laid.point,), links=(link,), about=laid.about)


def coriolis_step(builder: PolygonBuilder, laid: Laid, guide: str):
    """The laid Coriolis component of ``laid.point`` sliding on ``guide`` (none on the ground)."""
    if guide == GROUND:
        return None
    magnitude = abs(laid.end - laid.start)
    return builder.vector(
        Component.CORIOLIS, laid.start, laid.end, "", f"a_c = 2·ω_{guide} × v_{laid.point}/{guide}",
        f"Coriolis component of {laid.point} sliding on {guide}: 2·ω·v = {figure(magnitude)} m/s², "
        f"the sliding velocity turned 90° the way {guide} turns", points=(laid.point,), links=(guide,),
        about=guide)
