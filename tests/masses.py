"""Mass data for test designs: links as flat steel bars of their own dimensions.

Each link is made of bars between its points (one bar for two points; for three or more, the
outline through them, closed); a bar of length L, width w and thickness t has m = ρ·w·t·L at
its midpoint and I = m·(L² + w²)/12 about it (a thin rectangular plate about its centre,
common practice), combined by the parallel-axis theorem. Steel: ρ = 7850 kg/m³ (common practice)."""

import math
from dataclasses import replace

from kinematics.model.mass import LinkMass, Load, MassData, PointMass

STEEL_KG_M3 = 7850.0


def steel_link(mechanism, link: str, width_mm: float = 25.0, thickness_mm: float = 10.0) -> LinkMass:
    """A LinkMass for ``link`` built of steel bars (mass in kg, centre in the design's unit, inertia kg·m²)."""
    k = mechanism.metres_per_unit
    pts = [mechanism.points[p] for p in dict.fromkeys(mechanism.links[link])]
    ends = list(zip(pts, pts[1:] + pts[:1], strict=True)) if len(pts) > 2 else [(pts[0], pts[1])]
    bars = []
    for (x0, y0), (x1, y1) in ends:
        length = math.hypot(x1 - x0, y1 - y0) * k
        mass = STEEL_KG_M3 * width_mm * 1e-3 * thickness_mm * 1e-3 * length
        bars.append((mass, ((x0 + x1) / 2, (y0 + y1) / 2), mass * (length ** 2 + (width_mm * 1e-3) ** 2) / 12))
    total = sum(b[0] for b in bars)
    cx = sum(b[0] * b[1][0] for b in bars) / total
    cy = sum(b[0] * b[1][1] for b in bars) / total
    inertia = sum(b[2] + b[0] * ((b[1][0] - cx) ** 2 + (b[1][1] - cy) ** 2) * k * k for b in bars)
    return LinkMass(link, total, (cx, cy), inertia)


def steel(mechanism, point_masses=None, loads=(), gravity=None, **bar):
    """``mechanism`` with every link of steel bars, the given point masses (point -> kg), loads and gravity."""
    data = MassData(masses={name: steel_link(mechanism, name, **bar) for name in mechanism.links},
                    point_masses={p: PointMass(p, m) for p, m in (point_masses or {}).items()},
                    loads={ld.name: ld for ld in loads}, gravity_value=gravity)
    return replace(mechanism, mass_data=data)


__all__ = ["Load", "steel", "steel_link"]
