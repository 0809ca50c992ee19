"""The checks a designer runs before trusting a layout: Grashof class of each
four-bar loop, rotatability of slide loops, transmission angles, dead points,
limit positions of the output, swing or stroke, time ratio, and the output's
mechanical advantage (the cycle's
measures are in :mod:`kinematics.cycle.measures`, its peaks in :mod:`kinematics.cycle.peaks`)."""

from __future__ import annotations

from ..errors import KinematicsError
from ..groups.decompose import decompose
from ..model.mechanism import Mechanism
from .peaks import peaks
from .sweep import sweep

__all__ = ["loop_checks", "report"]


def loop_checks(mech: Mechanism) -> list:
    """Rotatability of each loop closed by a dyad whose input link is pivoted on ground."""
    return [check for group in decompose(mech).groups if (check := group.loop_check(mech)) is not None]


def report(mech: Mechanism, steps: int = 3600) -> dict:
    """Everything ``kinepoly check`` prints, as data. A cycle that cannot be swept (a change
    point on the way, a group that is no dyad) leaves the loop checks and says why in ``cycle``."""
    loops = loop_checks(mech)
    try:
        table = peaks(sweep(mech, steps))
    except KinematicsError as err:
        return {"loops": loops, "cycle": str(err)}
    return {"loops": loops, "cycle": "", "transmission": table["transmission"], "full_turn": table["full_turn"],
            "range_deg": table["range_deg"], "output": table["output"], "warnings": table["warnings"],
            "mechanical_advantage": table.get("mechanical_advantage")}
