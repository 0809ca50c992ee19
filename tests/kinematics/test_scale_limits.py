"""Designs too small to analyse are refused with their size; no output ever carries NaN."""

import contextlib
import copy
import dataclasses
import io
import json
import math

import numpy as np
import pytest

import kinematics
from app import cli
from tests.designs import CARTON_PUSHER, CLAW_FEED


def scaled(design: dict, factor: float) -> dict:
    doc = copy.deepcopy(design)
    doc["points"] = {k: [x * factor, y * factor] for k, (x, y) in doc["points"].items()}
    return doc


def run_cli(*argv) -> tuple[int, str, str]:
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        code = cli.main(list(argv))
    return code, out.getvalue(), err.getvalue()


@pytest.mark.parametrize("design", [CLAW_FEED, CARTON_PUSHER])
def test_a_design_scaled_by_1e_300_is_refused_with_its_size(tmp_path, design):
    path = tmp_path / "tiny.json"
    path.write_text(json.dumps(scaled(design, 1e-300)), encoding="utf-8")
    for verb in (["solve", "--json"], ["construct", "--json"], ["sweep"], ["check"]):
        code, out, err = run_cli(verb[0], str(path), *verb[1:])
        assert code == 2, (verb, out, err)
        assert "NaN" not in out and "nan" not in out.lower()
        assert "error: points: the design is " in err and "mm across" in err
        assert "smaller than 0.001 mm (1 µm) cannot be analysed" in err


def test_the_size_limit_is_a_finding_naming_the_size():
    mech = kinematics.load_mechanism(scaled(CLAW_FEED, 1e-5))  # 0.0022 mm across: above the limit
    assert kinematics.diagnose(mech) == []
    tiny = kinematics.load_mechanism(scaled(CLAW_FEED, 1e-6))  # 0.00022 mm across: below it
    (finding,) = kinematics.diagnose(tiny)
    size_mm = tiny.size
    assert str(finding) == (f"points: the design is {size_mm:.3g} mm across; designs smaller than 0.001 mm (1 µm) "
                            "cannot be analysed (the solver's tolerance would exceed a billionth of their size)")


def test_a_non_finite_result_is_refused_rather_than_written(tmp_path, monkeypatch):
    """Whatever goes wrong upstream, the command says where the number went bad, exit code 2."""
    path = tmp_path / "claw.json"
    path.write_text(json.dumps(CLAW_FEED), encoding="utf-8")
    real = kinematics.solve

    def spoiled(mechanism, angle_deg=None, length=None):
        solution = real(mechanism, angle_deg, length=length)  # frozen: spoil a copy
        velocities = solution.velocities.copy()
        velocities[1, 0] = np.inf
        return dataclasses.replace(solution, angular_velocity={**solution.angular_velocity, "coupler": math.nan},
                                   velocities=velocities)

    monkeypatch.setattr(cli, "solve", spoiled)
    for extra in ([], ["--json"], ["--csv"]):
        code, out, err = run_cli("solve", str(path), *extra)
        assert (code, out) == (2, ""), extra
        assert err.startswith(f"error: {path}: the result is not a finite number at ")
