"""The ``kinepoly`` command line: one parser for every verb, and the verbs that need no Qt
(check, solve, construct, centres, sweep, forces, export). ``render``, ``print`` and ``report`` run in
:mod:`app.render`, :mod:`app.printing` and :mod:`app.review`, imported only when asked for.

Exit codes: 0 ok; 1 the output could not be written; 2 a bad file or a
mechanism with findings (message on stderr names the place); 3 the linkage
cannot assemble (or has no construction) at the asked angle.
"""

from __future__ import annotations

import argparse
import importlib
import io
import json
import math
import sys
from pathlib import Path

import numpy as np

from kinematics import CAUTION, KinematicsError, acceleration_components, construct, load_mechanism, solve
from kinematics.drawing import PAPER
from kinematics.files.storage import write_atomically
from kinematics.reports.text import construction_text, peaks_text, solution_table

from .arguments import (
    cylinder_length_mm,
    finite_angle,
    joined_numbers,
    output_name,
    parse_size,
    pose_length_m,
    review_angles,
)
from .outcomes import construction_from_file, forces_of, run_reporting


def _solution_json(solution) -> dict:
    names = solution.point_names
    return {
        "kinepoly_result": 1, "driver_angle_deg": solution.driver_angle_deg,
        "units": {"length": "m", "velocity": "m/s", "acceleration": "m/s^2", "jerk": "m/s^3",
                  "angular_velocity": "rad/s", "angular_acceleration": "rad/s^2", "angular_jerk": "rad/s^3"},
        "points": {n: {"position": solution.positions[i].tolist(), "velocity": solution.velocities[i].tolist(),
                       "acceleration": solution.accelerations[i].tolist(), "jerk": solution.jerks[i].tolist()}
                   for i, n in enumerate(names)},
        "links": {k: {"angle_deg": solution.link_angle_deg[k], "angular_velocity": solution.angular_velocity[k],
                      "angular_acceleration": solution.angular_acceleration[k],
                      "angular_jerk": solution.angular_jerk[k]} for k in solution.link_angle_deg},
        "slides": {k: {"point": solution.mechanism.slides[k].point,
                       "sliding_velocity": solution.sliding_velocity[k],
                       "sliding_acceleration": solution.sliding_acceleration[k]} for k in solution.sliding_velocity},
        "warnings": list(solution.warnings),
        **({} if solution.driver_length_m is None else {"driver_length_m": solution.driver_length_m})}


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


def force_polygon_json(made) -> dict:
    """The force polygon in the kinematic polygons' structure (``unit`` "N", ``scale_per_mm``), each
    step with its place in the space diagram (m), and the forces it finds, SI."""
    polygon = _polygon_json(made.polygon)
    for entry, step in zip(polygon["steps"], made.polygon.steps, strict=True):
        entry["space"] = [list(xy) for xy in step.space]
    return {"kinepoly_force_polygon": 1, "driver_angle_deg": made.construction.solution.driver_angle_deg,
            "notation": "F(a→b) is the force of a on b",
            "centre_images": [{"id": s.id, "label": s.label, "link": s.links[0], "acceleration": list(s.coords[0]),
                               "text": s.text} for s in made.centre_images],
            "angular_acceleration_rad_s2": dict(made.angular_accelerations),
            "force": polygon,
            "joints_n": {p: {k: list(f) for k, f in by.items()} for p, by in made.joints_n.items()},
            "slides_normal_n": dict(made.normals_n), "drive_torque_n_m": made.drive_torque_n_m,
            "drive_force_n": made.drive_force_n,
            "crosscheck": {"max_relative_difference": made.max_relative_difference, "where": made.where},
            "warnings": list(made.warnings)}


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


def _pose(mech, args):
    """The pose asked for: at ``--angle``, at a cylinder's ``--length``, or the file's own."""
    return solve(mech, args.angle, length=pose_length_m(args))


def _check(args) -> int:
    from kinematics.reports.check_text import check_sentences

    checks = check_sentences(load_mechanism(args.file))
    for line in checks.lines:
        print(line)
    for finding in checks.findings:
        print(f"error: {finding}", file=sys.stderr)
    return 2 if checks.findings else 0


def _solve(args) -> int:
    mech = load_mechanism(args.file)
    solution = _pose(mech, args)
    _require_finite(_solution_json(solution), args.file)
    if args.csv:
        from kinematics.drawing.table import results_csv

        _emit(results_csv(solution), args.output)
    elif args.json:
        _emit(json.dumps(_solution_json(solution), indent=1), args.output)
    else:
        _emit(solution_table(solution) + f"\n\n{CAUTION}", args.output)
    return 0


def _construct(args) -> int:
    construction = construct(_pose(load_mechanism(args.file), args))
    if args.forces:
        from kinematics.forcepolygon import force_polygon
        from kinematics.reports.force_text import force_polygon_text

        made = force_polygon(construction)
        result = force_polygon_json(made)
        _require_finite(result, args.file)
        _emit(json.dumps(result, indent=1, ensure_ascii=False) if args.json else force_polygon_text(made),
              args.output)
        return 0
    _require_finite(construction_json(construction), args.file)
    if args.json:
        _emit(json.dumps(construction_json(construction), indent=1), args.output)
    else:
        _emit(construction_text(construction), args.output)
    return 0


def _centres(args) -> int:
    from kinematics import centres
    from kinematics.instantaneous.text import centres_json, centres_table

    result = centres(_pose(load_mechanism(args.file), args))
    _emit(json.dumps(centres_json(result), indent=1) if args.json else centres_table(result), args.output)
    return 0


def _sweep(args) -> int:
    from kinematics.cycle.peaks import peaks
    from kinematics.cycle.sweep import sweep, sweep_csv

    if args.forces and args.peaks:
        raise KinematicsError("--forces adds the force columns to the CSV; --peaks prints the peaks table "
                              "without it: choose one")
    result = sweep(load_mechanism(args.file), args.steps)
    _require_finite({k: v for k, v in vars(result).items() if k != "mechanism"}, args.file)
    extra = ((), ())
    if args.forces:
        from kinematics.dynamics import sweep_forces
        from kinematics.reports.forces_tables import force_columns

        extra = force_columns(sweep_forces(result))
        _require_finite(dict(zip(*extra, strict=True)), args.file)
    if args.json:
        stream = io.StringIO()
        json.dump({"kinepoly_sweep": 1, "peaks": peaks(result), "csv": sweep_csv(result, extra)}, stream, indent=1)
        _emit(stream.getvalue(), args.output)
    elif args.peaks:
        _emit(peaks_text(peaks(result)), args.output)
    else:
        _emit(sweep_csv(result, extra), args.output)
    for warning in result.warnings:
        print(f"warning: {warning}", file=sys.stderr)
    return 0


def _forces(args) -> int:
    from kinematics.dynamics import forces, sweep_forces
    from kinematics.reports import forces_tables

    if args.cycle and (args.angle is not None or args.length is not None):
        option = "--angle" if args.angle is not None else "--length"
        raise KinematicsError(f"{option} is for one pose; --cycle sweeps the whole turn: choose one")
    if not args.cycle and (args.fluctuation is not None or args.steps is not None):
        option = "--fluctuation" if args.fluctuation is not None else "--steps"
        raise KinematicsError(f"{option} is for the summary of a cycle: add --cycle")
    mech = load_mechanism(args.file)
    if args.cycle:
        from kinematics.cycle.sweep import sweep
        from kinematics.dynamics import DEFAULT_FLUCTUATION, drive_summary

        result = sweep_forces(sweep(mech, 360 if args.steps is None else args.steps))
        summary = drive_summary(result, DEFAULT_FLUCTUATION if args.fluctuation is None else args.fluctuation)
        document = forces_tables.summary_json(summary, result)
        _require_finite(document, args.file)
        text = json.dumps(document, indent=1) if args.json else \
            forces_tables.summary_text(summary, result) + f"\n\n{CAUTION}"
    else:
        result = forces(_pose(mech, args))
        document = forces_tables.forces_json(result)
        _require_finite(document, args.file)
        text = json.dumps(document, indent=1) if args.json else forces_tables.forces_table(result) + f"\n\n{CAUTION}"
    _emit(text, args.output)
    return 0


def _export(args) -> int:
    from kinematics.drawing.dxf import write_dxf

    construction = construction_from_file(args.file, args.angle, pose_length_m(args))
    write_dxf(construction, args.output, file_name=Path(args.file).name, with_centres=args.centres,
              forces=forces_of(construction) if args.forces else None)
    return 0


def _with_qt(module: str):
    """A handler that imports ``module`` (which imports Qt) only when its verb runs."""
    def handler(args) -> int:
        return importlib.import_module(module).run(args)
    return handler


def _file_and_angle(parser, what="the file's pose", length=True):
    parser.add_argument("file", help="mechanism file (JSON)")
    pose = parser.add_mutually_exclusive_group()
    pose.add_argument("--angle", type=finite_angle, default=None, metavar="DEG",
                      help=f"driver angle in degrees, counter-clockwise from +x (default: {what})")
    if length:
        pose.add_argument("--length", type=cylinder_length_mm, default=None, metavar="MM",
                          help=f"a cylinder driver's length in mm, barrel pivot to rod end (default: {what})")


def parser() -> argparse.ArgumentParser:
    """The one parser of ``kinepoly VERB ...``; each verb's ``handler`` takes the parsed arguments."""
    top = argparse.ArgumentParser(prog="kinepoly", description="Velocity and acceleration polygons of planar "
                                  "linkages, built by exact graphical construction. Without a verb, "
                                  "kinepoly [FILE] opens the drafting window.")
    sub = top.add_subparsers(dest="command", required=True)
    check = sub.add_parser("check", help="mobility, Grashof, transmission angle, limit positions")
    check.add_argument("file", help="mechanism file (JSON)")
    check.set_defaults(handler=_check)
    for name, helptext, handler in (("solve", "positions, velocities, accelerations at one driver angle", _solve),
                                    ("construct", "the polygon construction steps in words", _construct),
                                    ("centres", "instantaneous centres by Kennedy's theorem and their velocity check",
                                     _centres)):
        p = sub.add_parser(name, help=helptext)
        _file_and_angle(p)
        p.add_argument("--json", action="store_true", help="machine-readable output in SI units")
        p.add_argument("-o", "--output", type=output_name, help="write to this file instead of the screen")
        if name == "solve":
            p.add_argument("--csv", action="store_true", help="the results table as CSV (SI units)")
        if name == "construct":
            p.add_argument("--forces", action="store_true",
                           help="the force polygon instead: joint forces and drive torque from the mass data")
        p.set_defaults(handler=handler)
    sw = sub.add_parser("sweep", help="one driver turn: CSV of every pose, or the peaks table")
    sw.add_argument("file", help="mechanism file (JSON)")
    sw.add_argument("--steps", type=int, default=360, help="poses in the turn (default 360)")
    sw.add_argument("--peaks", action="store_true", help="print the peaks table")
    sw.add_argument("--json", action="store_true", help="peaks and CSV as JSON")
    sw.add_argument("--forces", action="store_true", help="add the drive torque, joint, slide and shaking forces "
                    "to the CSV (needs mass data; frictionless joints)")
    sw.add_argument("-o", "--output", type=output_name, help="write to this file instead of the screen")
    sw.set_defaults(handler=_sweep)
    fo = sub.add_parser("forces", help="drive torque, joint and slide forces, inertia and shaking at one pose, or "
                        "the drive and bearing summary of a cycle (frictionless rigid joints; needs mass data)")
    _file_and_angle(fo)
    fo.add_argument("--cycle", action="store_true", help="the drive and bearing summary of one turn at constant speed")
    fo.add_argument("--fluctuation", type=float, default=None, metavar="C_S",
                    help="coefficient of speed fluctuation for the flywheel (with --cycle; default 0.02)")
    fo.add_argument("--steps", type=int, default=None, help="poses in the turn (with --cycle; default 360)")
    fo.add_argument("--json", action="store_true", help="machine-readable output in SI units")
    fo.add_argument("-o", "--output", type=output_name, help="write to this file instead of the screen")
    fo.set_defaults(handler=_forces)
    ex = sub.add_parser("export", help="the space diagram (true size, mm) and both polygons as DXF")
    _file_and_angle(ex, "the reference pose")
    ex.add_argument("-o", "--output", type=output_name, required=True, help="DXF file to write")
    ex.add_argument("--centres", action="store_true", help="the instantaneous centres over the space diagram "
                    "(layer CENTRES)")
    ex.add_argument("--forces", action="store_true",
                    help="the force polygon too, on its own FORCE-… layers (needs mass data)")
    ex.set_defaults(handler=_export)
    rd = sub.add_parser("render", help="the window's three views as a PNG, without a screen")
    _file_and_angle(rd, "the reference pose", length=False)
    rd.add_argument("-o", "--output", type=output_name, required=True, help="PNG file to write")
    rd.add_argument("--size", type=parse_size, default=(1600, 1000), help="WIDTHxHEIGHT pixels (1600x1000)")
    rd.add_argument("--forces", action="store_true", help="the force polygon in place of the acceleration polygon")
    rd.set_defaults(handler=_with_qt("app.render"))
    pr = sub.add_parser("print", help="the construction at true scale on an ISO 216 sheet, as PDF")
    _file_and_angle(pr, "the reference pose")
    pr.add_argument("--paper", choices=sorted(PAPER), default="A4", help="ISO 216 sheet (default A4)")
    pr.add_argument("--landscape", action="store_true", help="landscape instead of portrait")
    pr.add_argument("-o", "--output", type=output_name, required=True, help="PDF file to write")
    pr.add_argument("--centres", action="store_true", help="the instantaneous centres over the space diagram")
    pr.add_argument("--forces", action="store_true",
                    help="a second sheet with the force polygon and the forces it finds (needs mass data)")
    pr.set_defaults(handler=_with_qt("app.printing"))
    rp = sub.add_parser("report", help="the design-review report: one PDF of the whole analysis")
    rp.add_argument("file", help="mechanism file (JSON)")
    rp.add_argument("-o", "--output", type=output_name, default=None,
                    help="PDF file to write (default: FILE's name + .review.pdf)")
    rp.add_argument("--paper", choices=("A4", "A3"), default="A4", help="ISO 216 size of every page")
    rp.add_argument("--steps", type=int, default=3600, help="poses in the cycle's sweep (default 3600)")
    rp.add_argument("--angles", type=review_angles, default=None, metavar="DEG,DEG,...",
                    help="analysis angles (default: the file's analysis_angles_deg, else the reference pose)")
    rp.set_defaults(handler=_with_qt("app.review"))
    return top


VERBS = ("check", "solve", "construct", "centres", "sweep", "forces", "export", "render", "print", "report")
# What ``kinepoly --help`` shows: one line a verb (a test keeps it in step with the parser).
USAGE = """usage: kinepoly [FILE]                 open the drafting window (on FILE)
       kinepoly check FILE              mobility, Grashof, transmission angle, limit positions
       kinepoly solve FILE [--angle DEG | --length MM] [--json | --csv]
       kinepoly construct FILE [--angle DEG | --length MM] [--forces] [--json]
       kinepoly centres FILE [--angle DEG | --length MM] [--json]
       kinepoly sweep FILE [--steps N] [-o cycle.csv] [--peaks] [--json] [--forces]
       kinepoly forces FILE [--angle DEG | --length MM] [--json]
       kinepoly forces FILE --cycle [--fluctuation 0.02] [--steps N] [--json]
       kinepoly render FILE [--angle DEG] -o view.png [--size 1600x1000] [--forces]
       kinepoly print FILE [--angle DEG | --length MM] [--paper A3] [--landscape] [--centres] [--forces] -o sheet.pdf
       kinepoly export FILE [--angle DEG | --length MM] [--centres] [--forces] -o drawing.dxf
       kinepoly report FILE [-o review.pdf] [--paper A4|A3] [--steps N] [--angles 30,150,...]
Each command takes --help. Exit codes: 0 ok, 1 output not written, 2 bad file or findings,
3 cannot assemble at that angle or length."""


def main(argv) -> int:
    """Run ``kinepoly VERB ...``: the exit code (see the module doc)."""
    try:
        args = parser().parse_args(joined_numbers(argv))
    except SystemExit as stop:  # argparse has said what is wrong (or printed --help)
        return stop.code if isinstance(stop.code, int) else 2
    if args.handler in (_check, _solve, _construct, _centres, _sweep, _forces, _export):
        outcome = []
        code = run_reporting(lambda: outcome.append(args.handler(args)))
        return code or outcome[0]
    return args.handler(args)
