"""The checks of a design as sentences: what ``kinepoly check`` prints and the
review report's checks page shows, written once here for both."""

from __future__ import annotations

from dataclasses import dataclass

from ..cycle.checks import report
from ..groups.decompose import decompose
from ..solver.mobility import diagnose, gruebler_count, jacobian_mobility
from .text import advantage_sentence, placing


@dataclass(frozen=True)
class CheckSentences:
    """``lines``: each check as one sentence with its value ("mobility: 1 from …");
    ``findings``: what stops the analysis (empty when the design can be analysed)."""

    lines: tuple
    findings: tuple


def check_sentences(mech, steps: int = 3600) -> CheckSentences:
    """Mobility, construction order, Grashof class or rotatability, driver range,
    transmission angles, the output's limit positions, travel and time ratio, its
    mechanical advantage,
    and the warnings, in that order. With findings, only the mobility is told.

    ``steps`` poses of the cycle are swept for the cycle's checks.
    """
    lines = [f"warning: {warning}" for warning in mech.warnings]
    findings = tuple(diagnose(mech))
    mobility, _ = jacobian_mobility(mech)
    lines.append(f"mobility: {mobility} from the rank of the constraint Jacobian "
                 f"(Gruebler-Kutzbach count {gruebler_count(mech)})")
    if findings:
        return CheckSentences(tuple(lines), findings)
    decomposition = decompose(mech)
    driven = ", ".join(g.name for g in decomposition.groups)
    lines.append(f"construction order: {decomposition.driver.name}" + (f", then {driven}" if driven else ""))
    data = report(mech, steps)
    for loop in data["loops"]:
        turns = f"; turns fully: {loop.turns_fully}" if loop.turns_fully else "; no link turns fully"
        lines.append(f"{loop.loop}: {loop.verdict}{turns}")
    if data["cycle"]:
        lines.append(f"cycle not swept: {data['cycle']}")
        return CheckSentences(tuple(lines), findings)
    place = placing(data)
    if data["stroke_m"] is not None:
        lines.append(stroke_sentence(mech, data["stroke_m"]))
    elif data["full_turn"]:
        lines.append(f"driver {mech.driver.link} turns fully")
    else:
        low, high = data["range_deg"]
        lines.append(f"driver {mech.driver.link} cannot turn fully: dead points at {low:.3f}° and {high:.3f}°")
    for key, t in data["transmission"].items():
        where = place.at(t[f"deviation_at_{place.suffix}"], 2)
        lines.append(f"transmission angle {key}: {t['min_deg']:.2f}° to {t['max_deg']:.2f}°, largest deviation "
                     f"from 90° {t['largest_deviation_from_90_deg']:.2f}° " +
                     (where if place.suffix == "length_m" else where.replace("at ", "at driver angle ", 1)))
    out = data["output"]
    if out:
        reversals = ", ".join(place.text(a, 2) + ("°" if place.suffix == "deg" else " mm")
                              for a in out[f"rate_reversals_{place.suffix}"]) or "none (it turns one way)"
        lines.append(f"output {out['output']}: travel {out['travel']:.4g} {out['unit']}; rate reverses (limit "
                     f"positions) at {reversals}")
        if "time_ratio" in out:
            lines.append(f"time ratio {out['time_ratio']:.4f}: slow stroke {out['slow_stroke']} over "
                         f"{out['slow_stroke_driver_deg']:.2f}° of driver turn, "
                         f"fast over {out['fast_stroke_driver_deg']:.2f}°")
    if data["mechanical_advantage"]:
        lines.append(advantage_sentence(data["mechanical_advantage"]))
    lines += [f"warning: {warning}" for warning in data["warnings"]]
    return CheckSentences(tuple(lines), findings)


def stroke_sentence(mech, stroke_m) -> str:
    """The cylinder's stroke as swept: the file's stroke, or where the linkage's reach cuts it short."""
    driver = mech.driver
    low, high = stroke_m
    k = mech.metres_per_unit
    given = (driver.stroke_min, driver.stroke_max)
    ends = []
    for value, limit, word in ((low, given[0], "shortest"), (high, given[1], "longest")):
        if limit is None:
            ends.append(f"{word} {value * 1000:.1f} mm (the linkage's reach; the file gives no stroke end)")
        elif abs(value - limit * k) > 1e-9 * max(abs(value), 1.0):
            ends.append(f"{word} {value * 1000:.1f} mm (the linkage's reach cuts the file's {limit * k * 1000:.1f} mm)")
        else:
            ends.append(f"{word} {value * 1000:.1f} mm")
    return (f"{driver.cylinder_words}: stroke {low * 1000:.1f} to {high * 1000:.1f} mm, {(high - low) * 1000:.1f} mm "
            f"long; " + ", ".join(ends))
