"""Mass data kept through an edit that removes joints or links or fixes a joint: what no longer
has its link or point (or now stands on the frame) is left out, so the edit gives a design the
file format accepts instead of a refusal."""

from __future__ import annotations

from dataclasses import replace

from ..model.mass import MassData


def mass_data_kept(data: MassData | None, points, links, ground) -> MassData | None:
    """``data`` without the entries that ``points``, ``links`` (name -> point names) and ``ground``
    no longer support: masses of removed links, point masses at removed or fixed points, loads whose
    point or link is gone, which act on the frame, or whose link no longer holds their point.

    >>> from kinematics.model.mass import PointMass
    >>> data = MassData(point_masses={"D": PointMass("D", 2.0)})
    >>> mass_data_kept(data, {"D": (0, 0)}, {}, ("D",)).point_masses
    mappingproxy({})
    """
    if data is None:
        return None
    fixed = set(ground)

    def load_stands(load) -> bool:
        if load.link is not None and load.link not in links:
            return False
        if load.point is None:
            return True
        if load.point not in points:
            return False
        return load.point in links[load.link] if load.link is not None else load.point not in fixed

    return replace(data, masses={k: m for k, m in data.masses.items() if k in links},
                   point_masses={p: m for p, m in data.point_masses.items() if p in points and p not in fixed},
                   loads={n: ld for n, ld in data.loads.items() if load_stands(ld)})
