"""The coupler's centrodes over the cycle, from a sweep (vectorised over its arrays).

The centrodes are the paths of a link's instantaneous centre relative to the frame (the fixed
centrode) and relative to the link itself (the moving centrode, in the link's own frame: origin
at its first point, x along its first two points). For a link turning at ω with a point P
moving at v_P the centre is P + perp(v_P)/ω; where it runs off towards infinity (the link
momentarily translating) the polylines break. The moving centrode rolls on the fixed one
without slipping as the linkage moves.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..errors import KinematicsError
from ..model.mechanism import GROUND
from .sweep import Sweep

# A centre farther than this many mechanism sizes from the linkage leaves the centrode's polyline.
CENTRODE_REACH = 20.0


@dataclass(frozen=True)
class Centrodes:
    """``fixed`` and ``moving``: tuples of (k, 2) arrays in metres, one per finite stretch;
    ``driver_angle_deg``: the (k,) driver angles of each stretch's points, in the same order."""

    link: str
    fixed: tuple
    moving: tuple
    driver_angle_deg: tuple


def coupler_of(mech) -> str:
    """The first link (file order) with no point on the frame: a four-bar's or slider-crank's coupler."""
    link = next((k for k, pts in mech.links.items() if not any(GROUND in mech.bodies_of(p) for p in pts)), None)
    if link is None:
        raise KinematicsError("every link is pivoted on the frame: there is no coupler", "links")
    return link


def _stretches(points: np.ndarray, finite: np.ndarray, closes: bool) -> tuple:
    breaks = np.flatnonzero(np.diff(finite.astype(int)) != 0) + 1
    pieces = [piece for piece, ok in zip(np.split(points, breaks), np.split(finite, breaks), strict=True) if ok[0]]
    if closes and len(pieces) > 1 and finite[0] and finite[-1]:  # the turn's end runs on into its start
        pieces[0] = np.concatenate([pieces.pop(), pieces[0]])
    return tuple(piece for piece in pieces if len(piece) > 1)


def centrodes(result: Sweep, link: str | None = None) -> Centrodes:
    """Fixed and moving centrodes of ``link`` (the coupler by default) over the sweep."""
    mech = result.mechanism
    link = link or coupler_of(mech)
    if link not in mech.links:
        raise KinematicsError(f'unknown link "{link}"', "link")
    first, second = (result.point_names.index(p) for p in mech.links[link][:2])
    p = result.positions[:, first, 0] + 1j * result.positions[:, first, 1]
    q = result.positions[:, second, 0] + 1j * result.positions[:, second, 1]
    v = result.velocities[:, first, 0] + 1j * result.velocities[:, first, 1]
    omega = result.angular_velocity[link]
    size = mech.size * mech.metres_per_unit
    reach = CENTRODE_REACH * size
    with np.errstate(divide="ignore", invalid="ignore"):
        centre = p + 1j * v / omega
        finite = np.isfinite(centre) & (np.abs(centre - p) <= reach)
        centre = np.where(finite, centre, p)
    body = (centre - p) * np.conj((q - p) / np.abs(q - p))
    xy = np.stack([centre.real, centre.imag], axis=-1)
    uv = np.stack([body.real, body.imag], axis=-1)
    closes = result.full_turn and result.closes
    return Centrodes(link=link, fixed=_stretches(xy, finite, closes), moving=_stretches(uv, finite, closes),
                     driver_angle_deg=_stretches(result.driver_angle_deg, finite, closes))
