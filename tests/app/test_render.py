"""``kinepoly render`` writes a PNG of the asked size, or says plainly why not."""

import json
import struct
from pathlib import Path

import pytest

from app.main import main as kinepoly
from tests.designs import CLAW_FEED, SAMPLE_FILES, SWING_LEVER, TRIPLE_ROCKER, UNFINISHED


def png_size(path):
    """Width and height from the IHDR chunk: PNG signature (8 bytes), chunk length and type (8 bytes),
    then width and height as 4-byte big-endian integers (PNG specification, ISO/IEC 15948:2004, 11.2.2)."""
    data = Path(path).read_bytes()
    assert data[:8] == b"\x89PNG\r\n\x1a\n" and data[12:16] == b"IHDR"
    return struct.unpack(">II", data[16:24])


def test_render_writes_a_png_of_the_asked_size(qapp, tmp_path):
    design = tmp_path / "claw.json"
    design.write_text(json.dumps(CLAW_FEED), encoding="utf-8")
    out = tmp_path / "view.png"
    assert kinepoly(["render", str(design), "--angle", "210", "-o", str(out), "--size", "900x560"]) == 0
    assert png_size(out) == (900, 560)
    assert kinepoly(["render", str(design), "-o", str(out)]) == 0
    assert png_size(out) == (1600, 1000)


@pytest.mark.parametrize("sample", SAMPLE_FILES, ids=[p.stem for p in SAMPLE_FILES])
def test_every_sample_renders(qapp, tmp_path, sample):
    out = tmp_path / f"{sample.stem}.png"
    assert kinepoly(["render", str(sample), "-o", str(out), "--size", "800x500"]) == 0
    assert png_size(out) == (800, 500)


def test_a_bad_file_or_angle_writes_nothing_and_says_why(qapp, tmp_path, capsys):
    out = tmp_path / "view.png"
    assert kinepoly(["render", str(tmp_path / "missing.json"), "-o", str(out)]) == 2
    assert "missing.json" in capsys.readouterr().err
    design = tmp_path / "lever.json"
    design.write_text(json.dumps(SWING_LEVER), encoding="utf-8")
    # 1: the output could not be written
    assert kinepoly(["render", str(design), "-o", str(tmp_path / "no" / "view.png")]) == 1
    assert "is not an existing folder" in capsys.readouterr().err
    assert not out.exists()
    rocker = tmp_path / "rocker.json"
    rocker.write_text(json.dumps(TRIPLE_ROCKER), encoding="utf-8")
    assert kinepoly(["render", str(rocker), "--angle", "180", "-o", str(out)]) == 3
    assert "cannot assemble" in capsys.readouterr().err
    unfinished = tmp_path / "unfinished.json"
    unfinished.write_text(json.dumps(UNFINISHED), encoding="utf-8")
    assert kinepoly(["render", str(unfinished), "-o", str(out)]) == 2
    assert "no driver" in capsys.readouterr().err
    assert not out.exists()
    assert kinepoly(["render", str(design), "-o", str(out), "--size", "big"]) == 2  # argparse's refusal
    assert "WIDTHxHEIGHT" in capsys.readouterr().err
