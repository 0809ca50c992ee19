"""``kinepoly check | solve | construct | centres | sweep | export`` — the analysis commands (no Qt).

Exit codes: 0 ok; 1 the output could not be written; 2 a bad file or a
mechanism with findings (message on stderr names the place); 3 the linkage
cannot assemble (or has no construction) at the asked angle.
"""

from __future__ import annotations

import argparse
import io
import json
import math
import sys

import numpy as np

from . import CAUTION, KinematicsError, acceleration_components, construct, load_mechanism, solve
from .arguments import finite_angle, joined_numbers, output_name
from .drawing.output import run_reporting
from .files.storage import write_atomically
from .reports.text import construction_text, peaks_text, solution_table


def _solution_json(solution) -> dict:
    names = solution.point_names
    return {
        "kinepoly_result": 1, "driver_angle_deg": solution.driver_angle_deg,
        "units": {"length": "m", "velocity": "m/s", "acceleration": "m/s^2", "angular_velocity": "rad/s",
                  "angular_acceleration": "rad/s^2"},
        "points": {n: {"position": solution.positions[i].tolist(), "velocity": solution.velocities[i].tolist(),
                       "acceleration": solution.accelerations[i].tolist()} for i, n in enumerate(names)},
        "links": {k: {"angle_deg": solution.link_angle_deg[k], "angular_velocity": solution.angular_velocity[k],
                      "angular_acceleration": solution.angular_acceleration[k]} for k in solution.link_angle_deg},
        "slides": {k: {"point": solution.mechanism.slides[k].point,
                       "sliding_velocity": solution.sliding_velocity[k],
                       "sliding_acceleration": solution.sliding_acceleration[k]} for k in solution.sliding_velocity},
        "warnings": list(solution.warnings)}


def _polygon_json(polygon) -> dict:
    return {"unit": polygon.unit, "scale_per_mm": polygon.scale_per_mm,
            "images": {k: list(v) for k, v in polygon.images.items()},
            "marks": {k: list(v) for k, v in polygon.marks.items()},
            "steps": [{"id": s.id, "role": s.role.value, "component": s.component.value if s.component else None,
                       "label": s.label, "equation": s.equation, "text": s.text, "geometry": s.geometry.wkt,
                       "about": s.about,
                       "condition": s.condition, "flagged": s.flagged, "numeric": s.numeric}
                      for s in polygon.steps]}


def construction_json(construction) -> dict:
    return {"kinepoly_construction": 1, "driver_angle_deg": construction.solution.driver_angle_deg,
            "velocity": _polygon_json(construction.velocity),
            "acceleration": _polygon_json(construction.acceleration),
            "acceleration_components": [
                {"point": c.point, "about": c.about, "component": c.component.value, "link": c.link,
                 "carried": c.carried, "vector": list(c.vector), "step": c.step}
                for c in acceleration_components(construction)],
            "crosscheck": {"max_relative_difference": construction.max_relative_difference,
                           "where": construction.where},
            "warnings": list(construction.warnings)}


def _non_finite(value, path: str = "") -> str:
    """The JSON path of the first NaN or infinite number in ``value`` ("" when there is none)."""
    if isinstance(value, (float, np.floating)):
        return "" if math.isfinite(value) else (path or "the result")
    if isinstance(value, np.ndarray):
        bad = np.argwhere(~np.isfinite(value)) if value.dtype.kind in "fc" else ()
        return f"{path}{''.join(f'[{i}]' for i in bad[0])}" if len(bad) else ""
    if isinstance(value, dict):
        items = ((f"{path}.{k}" if path else str(k), v) for k, v in value.items())
    elif isinstance(value, (list, tuple)):
        items = ((f"{path}[{i}]", v) for i, v in enumerate(value))
    else:
        return ""
    return next((found for found in (_non_finite(v, at) for at, v in items) if found), "")


def _require_finite(result: dict, where: str):
    """Refuse to write a result holding NaN or infinity (JSON cannot carry it, and no reader expects it)."""
    at = _non_finite(result)
    if at:
        raise KinematicsError(f"the result is not a finite number at {at}; nothing was written", where)


def _emit(text: str, output):
    if output is not None:
        write_atomically(output, text)
    else:
        sys.stdout.write(text if text.endswith("\n") else text + "\n")


def _check(args) -> int:
    from .reports.check_text import check_sentences

    checks = check_sentences(load_mechanism(args.file))
    for line in checks.lines:
        print(line)
    for finding in checks.findings:
        print(f"error: {finding}", file=sys.stderr)
    return 2 if checks.findings else 0


def _solve(args) -> int:
    mech = load_mechanism(args.file)
    solution = solve(mech, args.angle)
    _require_finite(_solution_json(solution), args.file)
    if args.csv:
        from .drawing.table import results_csv

        _emit(results_csv(solution), args.output)
    elif args.json:
        _emit(json.dumps(_solution_json(solution), indent=1), args.output)
    else:
        _emit(solution_table(solution) + f"\n\n{CAUTION}", args.output)
    return 0


def _construct(args) -> int:
    construction = construct(solve(load_mechanism(args.file), args.angle))
    _require_finite(construction_json(construction), args.file)
    if args.json:
        _emit(json.dumps(construction_json(construction), indent=1), args.output)
    else:
        _emit(construction_text(construction), args.output)
    return 0


def _centres(args) -> int:
    from . import centres
    from .instantaneous.text import centres_json, centres_table

    result = centres(solve(load_mechanism(args.file), args.angle))
    _emit(json.dumps(centres_json(result), indent=1) if args.json else centres_table(result), args.output)
    return 0


def _sweep(args) -> int:
    from .cycle.peaks import peaks
    from .cycle.sweep import sweep, sweep_csv

    result = sweep(load_mechanism(args.file), args.steps)
    _require_finite({k: v for k, v in vars(result).items() if k != "mechanism"}, args.file)
    if args.json:
        stream = io.StringIO()
        json.dump({"kinepoly_sweep": 1, "peaks": peaks(result), "csv": sweep_csv(result)}, stream, indent=1)
        _emit(stream.getvalue(), args.output)
    elif args.peaks:
        _emit(peaks_text(peaks(result)), args.output)
    else:
        _emit(sweep_csv(result), args.output)
    for warning in result.warnings:
        print(f"warning: {warning}", file=sys.stderr)
    return 0


def _parser():
    parser = argparse.ArgumentParser(prog="kinepoly", description="Velocity and acceleration polygons of planar "
                                     "linkages, built by exact graphical construction.")
    sub = parser.add_subparsers(dest="command", required=True)
    check = sub.add_parser("check", help="mobility, Grashof, transmission angle, limit positions")
    check.add_argument("file")
    for name, helptext in (("solve", "positions, velocities, accelerations at one driver angle"),
                           ("construct", "the polygon construction steps in words")):
        p = sub.add_parser(name, help=helptext)
        p.add_argument("file")
        p.add_argument("--angle", type=finite_angle, default=None,
                       help="driver angle in degrees (default: the file's pose)")
        p.add_argument("--json", action="store_true", help="machine-readable output in SI units")
        p.add_argument("-o", "--output", type=output_name, help="write to this file instead of the screen")
        if name == "solve":
            p.add_argument("--csv", action="store_true", help="the results table as CSV (SI units)")
    ce = sub.add_parser("centres", help="instantaneous centres by Kennedy's theorem and their velocity check")
    ce.add_argument("file")
    ce.add_argument("--angle", type=float, default=None, help="driver angle in degrees (default: the file's pose)")
    ce.add_argument("--json", action="store_true", help="machine-readable output in SI units")
    ce.add_argument("-o", "--output", help="write to this file instead of the screen")
    sw = sub.add_parser("sweep", help="one driver turn: CSV of every pose, or the peaks table")
    sw.add_argument("file")
    sw.add_argument("--steps", type=int, default=360)
    sw.add_argument("--peaks", action="store_true", help="print the peaks table")
    sw.add_argument("--json", action="store_true", help="peaks and CSV as JSON")
    sw.add_argument("-o", "--output", type=output_name, help="write to this file instead of the screen")
    return parser


COMMANDS = {"check": _check, "solve": _solve, "construct": _construct, "sweep": _sweep, "centres": _centres}


def main(argv=None) -> int:
    argv = list(sys.argv[1:] if argv is None else argv)
    if argv and argv[0] == "export":
        from .drawing.dxf import main as export_main

        return export_main(argv[1:])
    args = _parser().parse_args(joined_numbers(argv))
    outcome = []
    code = run_reporting(lambda: outcome.append(COMMANDS[args.command](args)))
    return code or outcome[0]


if __name__ == "__main__":
    sys.exit(main())
