"""The design-review report read back from outside: pypdf gives the page count, outline and
metadata, pdfplumber the words and the vector paths, and ``kinepoly check`` the values the
checks page must carry."""

import hashlib
import json
import re

import pdfplumber
import pytest
from pypdf import PdfReader
from PySide6.QtCore import Qt, QTimer
from PySide6.QtWidgets import QFileDialog, QProgressDialog, QPushButton

import kinematics
from app.cli import main as core_main
from app.main import main as kinepoly
from app.review import write_review
from tests.app.test_printing import scale_bars_measured
from tests.designs import SAMPLE_FILES, SAMPLES, TRIPLE_ROCKER, UNFINISHED

STEPHENSON = SAMPLES / "stacker-transfer-stephenson.json"


def _flat(text: str) -> str:
    return " ".join(text.split())


def _design_file(tmp_path, design, name="design.json"):
    path = tmp_path / name
    path.write_text(json.dumps(design), encoding="utf-8")
    return path


@pytest.fixture(scope="module")
def stephenson_report(tmp_path_factory):
    folder = tmp_path_factory.mktemp("review")
    out = folder / "review.pdf"
    assert kinepoly(["report", str(STEPHENSON), "--angles", "30,150,270", "--steps", "720", "-o", str(out)]) == 0
    return out


def _outline(reader):
    """[(title, page number from 1, [children as (title, page)])] of the PDF's outline."""
    entries, last = [], None
    for item in reader.outline:
        if isinstance(item, list):
            last[2].extend((child.title, reader.get_destination_page_number(child) + 1) for child in item)
        else:
            last = (item.title, reader.get_destination_page_number(item) + 1, [])
            entries.append(last)
    return entries


def test_outline_has_each_section_and_each_analysis_angle(qapp, stephenson_report):
    reader = PdfReader(stephenson_report)
    outline = _outline(reader)
    assert [title for title, _, _ in outline] == ["Cover", "Checks", "Construction at the analysis angles", "Cycle",
                                                  "Forces", "Appendix: mechanism data"]
    angles = outline[2][2]
    assert [title for title, _ in angles] == ["θ = 30°", "θ = 150°", "θ = 270°"]
    # Each angle's entry leads to its construction sheet; the pages are in order and all in the file.
    pages = [page for _, page, _ in outline]
    assert pages == sorted(pages) and pages[0] == 1 and pages[-1] <= len(reader.pages)
    assert reader.metadata.title.startswith("Stacker transfer arm") and "design review" in reader.metadata.title
    assert "checks" in reader.metadata.subject


def test_every_page_has_title_fingerprint_and_page_n_of_n(qapp, stephenson_report):
    fingerprint = hashlib.sha256(STEPHENSON.read_bytes()).hexdigest()[:10]  # hashlib, outside the project
    with pdfplumber.open(stephenson_report) as pdf:
        count = len(pdf.pages)
        for number, page in enumerate(pdf.pages, start=1):
            text = _flat(page.extract_text())
            assert f"page {number} of {count}" in text and fingerprint in text
            assert "Stacker transfer arm (Stephenson six-bar)" in text


def test_cover_names_file_fingerprint_driver_and_carries_the_caution(qapp, stephenson_report):
    with pdfplumber.open(stephenson_report) as pdf:
        cover = _flat(pdf.pages[0].extract_text())
    assert "stacker-transfer-stephenson.json" in cover
    assert hashlib.sha256(STEPHENSON.read_bytes()).hexdigest()[:10] in cover
    assert "crank about O2, 90 rpm" in cover
    assert _flat(kinematics.CAUTION) in cover
    assert "no strength, stiffness, wear or fatigue check" in cover and "licensed practice" in cover


def test_checks_page_says_what_kinepoly_check_prints(qapp, stephenson_report, capsys):
    assert core_main(["check", str(STEPHENSON)]) == 0
    printed = [line for line in capsys.readouterr().out.splitlines() if line.strip()]
    with pdfplumber.open(stephenson_report) as pdf:
        checks = _flat(pdf.pages[1].extract_text())
    assert len(printed) >= 6
    for line in printed:
        # The page sets "term: text" as a term beside its text, so the colon is not printed.
        assert _flat(line.replace(": ", " ", 1)) in checks, line


def test_each_construction_sheet_measures_true_scale(qapp, stephenson_report):
    reader = PdfReader(stephenson_report)
    sheets = [page for _, page in _outline(reader)[2][2]]
    with pdfplumber.open(stephenson_report) as pdf:
        for number in sheets:
            # Three scale bars (space diagram, both polygons), each ±0.1 mm of its caption's scale.
            assert scale_bars_measured(pdf.pages[number - 1]) == 3


def test_plots_are_vector_paths_not_images(qapp, stephenson_report):
    reader = PdfReader(stephenson_report)
    cycle = _outline(reader)[3][2]
    with pdfplumber.open(stephenson_report) as pdf:
        for title, number in cycle[:-1]:  # the plot pages; the last entry is the peaks table
            page = pdf.pages[number - 1]
            assert page.images == [], title
            # A curve of the 720-pose cycle is one path of hundreds of points.
            assert max(len(c["pts"]) for c in page.curves) >= 700, title
        assert "driver angle θ [°]" in _flat(pdf.pages[cycle[0][1] - 1].extract_text())


def test_the_force_pages_say_what_kinepoly_forces_cycle_prints(qapp, stephenson_report, capsys):
    """The Stephenson sample carries steel links, a product at P and gravity (samples/README.md)."""
    forces = dict((title, (page, children)) for title, page, children in _outline(PdfReader(stephenson_report)))
    assert [title for title, _ in forces["Forces"][1]] == ["Turning-moment diagram and joint forces",
                                                           "Drive, flywheel and bearings",
                                                           "Polar diagram of the most loaded pin"]
    pages = dict(forces["Forces"][1])
    assert core_main(["forces", str(STEPHENSON), "--cycle", "--steps", "720"]) == 0
    printed = capsys.readouterr().out
    with pdfplumber.open(stephenson_report) as pdf:
        plots = pdf.pages[pages["Turning-moment diagram and joint forces"] - 1]
        words = _flat(plots.extract_text())
        assert "Turning-moment diagram: drive torque on crank (CCW positive)" in words
        assert "Forces of frictionless rigid joints (no friction is modelled)" in words
        # Gravity alone does no work over a turn: the mean drive torque is 0 (to rounding, shown as 0).
        assert "mean 0 N·m" in words and "mean drive torque 0 N·m" in _flat(printed)
        assert "Joint force magnitudes" in words and "T [N·m]" in words
        assert plots.images == [] and max(len(c["pts"]) for c in plots.curves) >= 700
        summary = _flat(pdf.pages[pages["Drive, flywheel and bearings"] - 1].extract_text())
        for line in printed.split("\n\nCaution")[0].splitlines():
            if line.strip():
                assert _flat(line) in summary, line
        assert _flat(kinematics.CAUTION) in summary
        polar = pdf.pages[pages["Polar diagram of the most loaded pin"] - 1]
        assert "Polar diagram of the force on " in _flat(polar.extract_text())
        assert "Fx [N]" in _flat(polar.extract_text()) and "Fy [N]" in _flat(polar.extract_text())
        # The vector's tip over the 720 poses, closed: one path of 721 points.
        assert max(len(c["pts"]) for c in polar.curves) >= 721


def test_a_design_without_mass_data_has_no_force_pages(qapp, tmp_path):
    out = tmp_path / "r.pdf"
    assert kinepoly(["report", str(SAMPLES / "label-swing-arm.json"), "--steps", "360", "-o", str(out)]) == 0
    assert "Forces" not in [title for title, _, _ in _outline(PdfReader(out))]


@pytest.mark.parametrize("sample", SAMPLE_FILES, ids=lambda p: p.stem)
def test_a_report_of_every_sample_completes(qapp, sample, tmp_path):
    out = tmp_path / "r.pdf"
    assert kinepoly(["report", str(sample), "--steps", "360", "-o", str(out)]) == 0
    assert len(PdfReader(out).pages) >= 6


def test_an_angle_that_cannot_assemble_gets_its_page(qapp, tmp_path):
    out = tmp_path / "r.pdf"
    assert kinepoly(["report", str(_design_file(tmp_path, TRIPLE_ROCKER)), "--angles", "30,180", "--steps", "360",
                     "-o", str(out)]) == 0
    reader = PdfReader(out)
    angles = dict(_outline(reader)[2][2])
    with pdfplumber.open(out) as pdf:
        page = _flat(pdf.pages[angles["θ = 180°"] - 1].extract_text())
        assert "θ = 180°: no construction" in page and "cannot assemble" in page
        assert scale_bars_measured(pdf.pages[angles["θ = 30°"] - 1]) == 3


def test_a_design_with_findings_is_refused_with_them(qapp, tmp_path, capsys):
    out = tmp_path / "r.pdf"
    assert kinepoly(["report", str(_design_file(tmp_path, UNFINISHED)), "-o", str(out)]) == 2
    assert "no driver" in capsys.readouterr().err
    assert not out.exists()


def test_a_cancelled_report_leaves_no_file(qapp, tmp_path):
    calls = []

    def progress(fraction):
        calls.append(fraction)
        return len(calls) < 5 or fraction < 0.55  # stop once painting has begun

    with pytest.raises(kinematics.SweepCancelled):
        write_review(kinematics.load_mechanism(STEPHENSON), STEPHENSON.read_bytes(), tmp_path / "r.pdf",
                     progress=progress)
    assert max(calls) >= 0.5 and list(tmp_path.iterdir()) == []


def test_window_menu_writes_the_report(make_window, tmp_path, monkeypatch):
    window = make_window()
    target = tmp_path / "from-window.pdf"
    monkeypatch.setattr(QFileDialog, "getSaveFileName", lambda *args, **kw: (str(target), ""))
    window.review_action.trigger()
    assert "review report written" in window.status.text()
    assert len(PdfReader(target).pages) >= 6


def test_window_cancel_leaves_no_file(make_window, qtbot, tmp_path, monkeypatch):
    window = make_window()
    target = tmp_path / "cancelled.pdf"
    monkeypatch.setattr(QFileDialog, "getSaveFileName", lambda *args, **kw: (str(target), ""))

    def press_cancel():
        dialog = window.findChild(QProgressDialog)
        if dialog is None or not dialog.isVisible():
            QTimer.singleShot(5, press_cancel)
            return
        qtbot.mouseClick(dialog.findChild(QPushButton), Qt.MouseButton.LeftButton)

    QTimer.singleShot(0, press_cancel)
    window.review_action.trigger()
    assert "cancelled" in window.status.text()
    assert not target.exists() and not [p for p in tmp_path.iterdir() if p.name.startswith(".cancelled")]


def test_default_output_sits_beside_the_file(qapp, tmp_path):
    design = _design_file(tmp_path, json.loads(STEPHENSON.read_text(encoding="utf-8")), "arm.json")
    assert kinepoly(["report", str(design), "--steps", "360"]) == 0
    assert (tmp_path / "arm.review.pdf").exists()
    assert re.match(rb"%PDF-1\.\d", (tmp_path / "arm.review.pdf").read_bytes()[:8])
