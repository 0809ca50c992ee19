"""The cycle of a cylinder-driven design: every pose over the cylinder's stroke at once, in
closed form (the cylinder's group, then the same dyads as a crank-driven design)."""

from __future__ import annotations

import numpy as np

from ..errors import CannotAssemble
from ..groups.base import Frame
from ..solver.cylinder import reference_length_m

# The stroke is probed at this many lengths for the part where the linkage assembles.
STROKE_PROBES = 2001


def stroke_limits_m(mechanism, decomposition) -> tuple:
    """(shortest, longest) cylinder length in m: the file's stroke, or, where it gives none, the
    cylinder's reach about the pivot of the link it drives, |d − l| to d + l."""
    driver, head = mechanism.driver, decomposition.driver
    k = mechanism.metres_per_unit
    c, a, b = (complex(*mechanism.position_m(head.roles[r])) for r in "CAB")
    d, arm = abs(a - c), abs(b - a)
    low = abs(d - arm) if driver.stroke_min is None else float(driver.stroke_min) * k
    high = d + arm if driver.stroke_max is None else float(driver.stroke_max) * k
    return low, high


def _place(mechanism, decomposition, lengths_m) -> Frame:
    frame = Frame.start(mechanism, np.zeros(np.shape(lengths_m)), strict=False, driver_length_m=lengths_m)
    for group in decomposition.chain:
        group.position(frame)
    return frame


def stroke_range(mechanism, decomposition) -> tuple:
    """(shortest, longest, warnings): the part of the stroke where the linkage assembles, the part
    holding the reference length (ends excluded by one probe step, off the dead points)."""
    low, high = stroke_limits_m(mechanism, decomposition)
    reference = reference_length_m(mechanism)
    where = "driver.stroke"
    unit = mechanism.length_unit
    k = mechanism.metres_per_unit
    if not low < high:
        raise CannotAssemble(f"the cylinder's stroke is empty: min {low / k:g} {unit} is not below max "
                             f"{high / k:g} {unit}", where)
    if not low - 1e-12 <= reference <= high + 1e-12:
        raise CannotAssemble(f"the cylinder's length in the drawn pose, {reference / k:g} {unit}, is outside its "
                             f"stroke {low / k:g} to {high / k:g} {unit}", where)
    probes = np.linspace(low, high, STROKE_PROBES)
    ok = ~_place(mechanism, decomposition, probes).invalid
    home = int(np.argmin(np.abs(probes - reference)))
    if not ok[home]:
        raise CannotAssemble("the linkage cannot assemble in its own reference pose", "reference pose")
    first, last = home, home
    while first > 0 and ok[first - 1]:
        first -= 1
    while last < len(probes) - 1 and ok[last + 1]:
        last += 1
    warnings = []
    if first > 0 or last < len(probes) - 1:
        first, last = first + (first > 0), last - (last < len(probes) - 1)
        warnings.append(f"the stroke {low / k:g} to {high / k:g} {unit} is outside the linkage's reach in part: "
                        f"the cycle runs over the assemblable {probes[first] / k:.6g} to {probes[last] / k:.6g} "
                        f"{unit}")
    return float(probes[first]), float(probes[last]), warnings


def stroke_frame(mechanism, decomposition, steps: int):
    """(lengths swept in the cylinder's sense, the placed and moved Frame, warnings)."""
    low, high, warnings = stroke_range(mechanism, decomposition)
    lengths = np.linspace(low, high, steps)
    if mechanism.driver.linear_speed_m_s < 0:
        lengths = lengths[::-1]
    frame = _place(mechanism, decomposition, lengths)
    if np.any(frame.invalid):
        raise CannotAssemble("the linkage cannot assemble at some lengths of the stroke between probed ones",
                             f"cylinder length {lengths[int(np.argmax(frame.invalid))] * 1000:.3f} mm")
    return lengths, frame, warnings
