"""The printed sheet measured from outside: pdfplumber reads the PDF Qt wrote
and we check lengths on paper against the mechanism file's own numbers."""

import json
import math
import re

import pdfplumber
import pytest
from PySide6.QtPrintSupport import QPrinter

import kinematics
from app.cli import main as command_line
from app.printing import print_construction
from tests.designs import BOTTLE_PUSHER, GATE_LIFTER, SAMPLE_FILES, SWING_LEVER, TRIPLE_ROCKER, construction

MM_PER_PT = 25.4 / 72.0  # PDF user space is in points of 1/72 inch
RATIO = re.compile(r"Space diagram (\d+(?:\.\d+)?):(\d+(?:\.\d+)?)")
PER_MM = re.compile(r"(Velocity|Acceleration) polygon 1 mm = ([\d.]+) m/s")


def main(argv):
    return command_line(["print", *argv])


def _segments(page):
    """Straight two-point strokes as ((x0, y0), (x1, y1), width) in mm, y downwards."""
    out = []
    for line in page.lines:
        (x0, y0), (x1, y1) = line["pts"][0], line["pts"][-1]
        out.append(((x0 * MM_PER_PT, y0 * MM_PER_PT), (x1 * MM_PER_PT, y1 * MM_PER_PT),
                    line["linewidth"] * MM_PER_PT))
    return out


def _words(page):
    return [{**w, "text": w["text"].replace("\t", " ")}
            for w in page.extract_words(keep_blank_chars=True, x_tolerance=1.5)]


def _page_text(page):
    return " ".join(w["text"] for w in _words(page))


def _space_ratio(page) -> float:
    numerator, denominator = RATIO.search(_page_text(page)).groups()
    return float(numerator) / float(denominator)


def _polygon_scales(page) -> dict:
    return {kind.lower(): float(value) for kind, value in PER_MM.findall(_page_text(page))}


def _with_length_and_direction(segments, length_mm, direction_deg):
    """Segments of that length (±0.1 mm) along that direction (y up, either sense, ±0.2°)."""
    found = []
    for (x0, y0), (x1, y1), width in segments:
        if abs(math.hypot(x1 - x0, y1 - y0) - length_mm) > 0.1:
            continue
        angle = math.degrees(math.atan2(-(y1 - y0), x1 - x0))  # PDF y runs down the page
        if abs((angle - direction_deg + 90.0) % 180.0 - 90.0) <= 0.2:
            found.append(width)
    return found


@pytest.fixture
def sheet_pdf(qapp, tmp_path):
    def make(design=GATE_LIFTER, angle=None, **options):
        path = tmp_path / "sheet.pdf"
        print_construction(construction(design, angle), path, file_name="design.json", **options)
        return pdfplumber.open(path).pages[0]

    return make


@pytest.mark.parametrize("paper, landscape, size", [("A4", False, (210, 297)), ("A4", True, (297, 210)),
                                                    ("A3", True, (420, 297)), ("A3", False, (297, 420))])
def test_page_is_the_iso_216_size_asked_for(sheet_pdf, paper, landscape, size):
    page = sheet_pdf(paper=paper, landscape=landscape)
    # ISO 216: A4 210 × 297 mm, A3 297 × 420 mm; a PDF rounds to whole points, hence ±0.5 mm.
    assert page.width * MM_PER_PT == pytest.approx(size[0], abs=0.5)
    assert page.height * MM_PER_PT == pytest.approx(size[1], abs=0.5)


@pytest.mark.parametrize("paper, landscape", [("A4", False), ("A3", True)])
def test_links_measure_true_length_times_the_printed_scale(sheet_pdf, paper, landscape):
    page = sheet_pdf(paper=paper, landscape=landscape)
    ratio = _space_ratio(page)
    assert ratio in {0.1, 0.2, 0.5, 1.0, 2.0, 5.0}  # ISO 5455 recommended scales
    segments = _segments(page)
    # From the design file: crank O2(0, 0)-A(24, 32) is 40 mm at 53.13°, rocker O4(180, 0)-B(150, 95).
    crank = _with_length_and_direction(segments, 40.0 * ratio, math.degrees(math.atan2(32, 24)))
    rocker = _with_length_and_direction(segments, math.hypot(30, 95) * ratio, math.degrees(math.atan2(95, -30)))
    assert crank and rocker
    # ISO 128: link centre lines are drawn with the 0.5 mm weight.
    assert crank[0] == pytest.approx(0.5, abs=0.01) and rocker[0] == pytest.approx(0.5, abs=0.01)


def test_driver_velocity_vector_measures_omega_r_at_the_polygon_scale(sheet_pdf):
    page = sheet_pdf()
    per_mm = _polygon_scales(page)["velocity"]
    # v_A = ω·r (rigid body turning about a fixed pivot): 90 rpm = 3π rad/s, r = 40 mm, perpendicular to O2A.
    speed = 3 * math.pi * 0.040
    assert _with_length_and_direction(_segments(page), speed / per_mm, math.degrees(math.atan2(32, 24)) + 90.0)


def test_each_scale_bar_is_as_long_as_its_label_says(sheet_pdf):
    assert scale_bars_measured(sheet_pdf(BOTTLE_PUSHER, 40.0)) == 3


def scale_bars_measured(page) -> int:
    """Measure every scale bar of a construction sheet against its caption's scale (±0.1 mm);
    returns how many were measured."""
    words, segments = _words(page), _segments(page)
    ratio, per_mm = _space_ratio(page), _polygon_scales(page)
    checked = 0
    for caption in (w for w in words if re.match(r"(Space diagram|Velocity polygon|Acceleration polygon) ", w["text"])):
        x0 = caption["x0"] * MM_PER_PT
        below = caption["bottom"] * MM_PER_PT
        # The bar's end label: the nearest "<number> <unit>" under the caption.
        label = min((w for w in words if re.fullmatch(r"[\d.]+ (mm|m/s|m/s²)", w["text"])
                     and 0 < w["top"] * MM_PER_PT - below < 12 and w["x0"] * MM_PER_PT > x0 - 1),
                    key=lambda w: w["x0"])
        value, unit = label["text"].split()
        bars = [(a, b) for a, b, _ in segments if abs(a[1] - b[1]) < 1e-6 and below < a[1] < label["top"] * MM_PER_PT
                and abs(min(a[0], b[0]) - x0) < 4.0]
        drawn = max(abs(b[0] - a[0]) for a, b in bars)
        expected = {"mm": float(value) * ratio, "m/s": float(value) / per_mm.get("velocity", math.nan),
                    "m/s²": float(value) / per_mm.get("acceleration", math.nan)}[unit]
        assert drawn == pytest.approx(expected, abs=0.1), caption["text"]
        checked += 1
    return checked


def test_the_sheet_carries_the_caution_and_the_results(sheet_pdf):
    page = sheet_pdf(SWING_LEVER, 75.0)
    text = _page_text(page)
    assert " ".join(kinematics.CAUTION.split()) in " ".join(text.split())
    solution = construction(SWING_LEVER, 75.0).solution
    assert f"{solution.angular_velocity['lever']:.4g}" in text and "75.00°" in text and "design.json" in text


def test_a_printer_the_window_hands_over_prints_the_same_true_scale(qapp, tmp_path):
    printer = QPrinter(QPrinter.PrinterMode.HighResolution)
    printer.setOutputFormat(QPrinter.OutputFormat.PdfFormat)
    printer.setOutputFileName(str(tmp_path / "printer.pdf"))
    print_construction(construction(GATE_LIFTER), printer, paper="A3", landscape=True)
    page = pdfplumber.open(tmp_path / "printer.pdf").pages[0]
    assert (page.width * MM_PER_PT, page.height * MM_PER_PT) == (pytest.approx(420, abs=0.5),
                                                                 pytest.approx(297, abs=0.5))
    assert _with_length_and_direction(_segments(page), 40.0 * _space_ratio(page), math.degrees(math.atan2(32, 24)))


def _design_file(tmp_path, design):
    path = tmp_path / "design.json"
    path.write_text(json.dumps(design), encoding="utf-8")
    return path


def test_command_writes_the_pdf(qapp, tmp_path):
    out = tmp_path / "sheet.pdf"
    assert main([str(_design_file(tmp_path, GATE_LIFTER)), "--angle", "30", "--paper", "A3", "--landscape",
                 "-o", str(out)]) == 0
    assert out.read_bytes().startswith(b"%PDF")
    assert "30.00°" in _page_text(pdfplumber.open(out).pages[0])


def test_command_reports_a_bad_file_by_place(qapp, tmp_path, capsys):
    bad = tmp_path / "broken.json"
    bad.write_text("{\"kinepoly\": 1, \"points\": ", encoding="utf-8")
    assert main([str(bad), "-o", str(tmp_path / "x.pdf")]) == 2
    assert "broken.json" in capsys.readouterr().err
    assert not (tmp_path / "x.pdf").exists()


def test_command_reports_a_pose_that_cannot_assemble(qapp, tmp_path, capsys):
    code = main([str(_design_file(tmp_path, TRIPLE_ROCKER)), "--angle", "180", "-o", str(tmp_path / "x.pdf")])
    assert code == 3
    assert "180" in capsys.readouterr().err
    assert not (tmp_path / "x.pdf").exists()


def test_unwritable_folder_is_reported_and_leaves_nothing(qapp, tmp_path, capsys):
    blocker = tmp_path / "not-a-folder"
    blocker.write_text("a plain file where a folder should be")
    assert main([str(_design_file(tmp_path, GATE_LIFTER)), "-o", str(blocker / "sheet.pdf")]) == 1
    err = capsys.readouterr().err
    assert "cannot write" in err and "not-a-folder" in err
    assert sorted(p.name for p in tmp_path.iterdir()) == ["design.json", "not-a-folder"]


def test_every_stroke_is_an_iso_128_weight_and_nothing_is_rasterised(sheet_pdf):
    page = sheet_pdf(SWING_LEVER, 140.0)
    widths = {round(line["linewidth"] * MM_PER_PT, 3) for line in page.lines + page.curves + page.rects
              if line.get("stroke", True)}
    # ISO 128 line weights used on the sheet; a cosmetic pen would show up as a 0 mm hairline.
    assert widths and all(min(abs(w - iso) for iso in (0.25, 0.35, 0.5, 0.7)) < 0.01 for w in widths), widths
    assert page.images == []  # drawn as vectors, no cached item turned into a bitmap


def test_lettering_is_iso_3098_capital_height(sheet_pdf):
    page = sheet_pdf()
    words = page.extract_words(extra_attrs=["size", "fontname"])
    # DejaVu Sans: capital height 1493 of 2048 units per em.  # from memory
    # ISO 3098 lettering of capital height h needs an em of h / (1493 / 2048).
    # The title is 5 mm on one line, 3.5 mm on two (this one's two: it is longer than its cell).
    for text, h in (("Velocity", 2.5), ("Results", 1.8), ("Gate", 3.5)):
        word = next(w for w in words if w["text"] == text)
        assert word["size"] * MM_PER_PT == pytest.approx(h / (1493 / 2048), abs=0.05), text
        assert word["fontname"].split("+")[-1] == "DejaVuSans"


@pytest.mark.parametrize("sample", SAMPLE_FILES, ids=lambda p: p.stem)
def test_every_sample_prints(qapp, sample, tmp_path):
    assert main([str(sample), "-o", str(tmp_path / "s.pdf")]) == 0
    page = pdfplumber.open(tmp_path / "s.pdf").pages[0]
    assert _space_ratio(page) > 0 and len(_segments(page)) > 20


def test_frame_sits_at_its_margins_from_the_paper_edge(sheet_pdf):
    # A device margin (Qt's default is about 3.5 mm) would shift everything; full-page mode must not.
    page = sheet_pdf()
    frames = [r for r in page.rects + page.curves if round(r["linewidth"] * MM_PER_PT, 2) == 0.7]
    # ISO 5457 frame: 20 mm from the left (filing) edge, 10 mm from the others.  # from memory
    assert any(abs(f["x0"] * MM_PER_PT - 20) < 0.1 and abs(f["top"] * MM_PER_PT - 10) < 0.1
               and abs(f["x1"] * MM_PER_PT - 200) < 0.1 and abs(f["bottom"] * MM_PER_PT - 287) < 0.1
               for f in frames), [(f["x0"] * MM_PER_PT, f["top"] * MM_PER_PT) for f in frames]
