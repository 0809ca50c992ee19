"""The checks of a design as sentences: what ``kinepoly check`` prints and the
review report's checks page shows, written once here for both."""

from __future__ import annotations

from dataclasses import dataclass

from ..cycle.checks import report
from ..groups.decompose import decompose
from ..solver.mobility import diagnose, gruebler_count, jacobian_mobility
from .text import advantage_sentence, turn


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
    lines.append("construction order: driver " + mech.driver.link + ", then " +
                 ", ".join(g.name for g in decompose(mech).groups))
    data = report(mech, steps)
    for loop in data["loops"]:
        turns = f"; turns fully: {loop.turns_fully}" if loop.turns_fully else "; no link turns fully"
        lines.append(f"{loop.loop}: {loop.verdict}{turns}")
    if data["cycle"]:
        lines.append(f"cycle not swept: {data['cycle']}")
        return CheckSentences(tuple(lines), findings)
    if data["full_turn"]:
        lines.append(f"driver {mech.driver.link} turns fully")
    else:
        low, high = data["range_deg"]
        lines.append(f"driver {mech.driver.link} cannot turn fully: dead points at {low:.3f}° and {high:.3f}°")
    for key, t in data["transmission"].items():
        lines.append(f"transmission angle {key}: {t['min_deg']:.2f}° to {t['max_deg']:.2f}°, largest deviation "
                     f"from 90° {t['largest_deviation_from_90_deg']:.2f}° at driver angle "
                     f"{turn(t['deviation_at_deg'], 2):.2f}°")
    out = data["output"]
    if out:
        reversals = ", ".join(f"{turn(a, 2):.2f}°" for a in out["rate_reversals_deg"]) or "none (it turns one way)"
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
