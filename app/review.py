"""Writing the design-review report: the core assembles its pages as Sheets
(:mod:`kinematics.review`); here they are painted on one QPdfWriter with the
printer's painter, then pypdf adds what QPdfWriter cannot (the outline and the
subject), and the file goes into place through the atomic writer, so a failure
or a cancel leaves no file."""

from __future__ import annotations

import argparse
import io
import math
import os
from pathlib import Path

from pypdf import PdfReader, PdfWriter
from PySide6.QtCore import QBuffer, QIODevice
from PySide6.QtGui import QGuiApplication

from kinematics import KinematicsError, load_mechanism
from kinematics.drawing import PAPER
from kinematics.drawing.output import run_reporting
from kinematics.files.storage import replace_atomically
from kinematics.review import Progress, build_report

from .printing import paint_sheets, pdf_writer

# The assembly (sweep, constructions, layout) takes this share of the progress bar, painting the rest.
ASSEMBLY_SHARE = 0.5


def _painted(report, paper: str, progress) -> bytes:
    """The report's pages painted by Qt into PDF bytes, in memory."""
    buffer = QBuffer()
    buffer.open(QIODevice.OpenModeFlag.WriteOnly)
    writer = pdf_writer(buffer, report.title, paper)
    paint_sheets(report.sheets, writer, "review report", progress)
    del writer  # the PDF's trailer is written when the writer goes
    data = bytes(buffer.data())
    buffer.close()
    return data


def _bound(report, painted: bytes, temporary: str) -> None:
    """The painted PDF with its outline (one entry per section and per sub-entry) and metadata."""
    pdf = PdfWriter(clone_from=PdfReader(io.BytesIO(painted)))
    pdf.add_metadata({"/Title": report.title, "/Subject": report.subject, "/Creator": "Kinepoly",
                      "/Keywords": f"kinepoly design review; SHA-256 {report.fingerprint}"})
    for entry in report.outline:
        parent = pdf.add_outline_item(title=entry.title, page_number=entry.page)
        for child in entry.children:
            pdf.add_outline_item(title=child.title, page_number=child.page, parent=parent)
    pdf.page_mode = "/UseOutlines"  # a reader opens with the bookmarks shown
    with open(temporary, "wb") as stream:
        pdf.write(stream)


def write_review(mechanism, source: bytes, path, file_name: str = "", paper: str = "A4", steps: int = 3600,
                 angles_deg=None, progress=None):
    """Assemble and write the design-review report of ``mechanism`` to the PDF ``path``.

    ``source`` is the design file's bytes (for the fingerprint); ``progress`` is called with
    the fraction done and may return False to stop (:class:`kinematics.SweepCancelled`, no
    file written). Returns the :class:`kinematics.review.Report`.
    """
    whole = Progress(progress)
    report = build_report(mechanism, source, file_name=file_name, paper=paper, steps=steps, angles_deg=angles_deg,
                          progress=whole.share(0.0, ASSEMBLY_SHARE))

    def write(temporary):
        _bound(report, _painted(report, paper, whole.share(ASSEMBLY_SHARE, 1.0)), temporary)

    replace_atomically(path, write)
    return report


def _angles(text: str) -> tuple:
    try:
        angles = tuple(float(part) for part in text.split(",") if part.strip())
    except ValueError:
        raise argparse.ArgumentTypeError(f"angles as degrees separated by commas (30,150), not {text!r}") from None
    if not angles or not all(math.isfinite(a) for a in angles):
        raise argparse.ArgumentTypeError(f"angles as finite degrees separated by commas, not {text!r}")
    return angles


def main(argv=None) -> int:
    """``kinepoly report FILE [-o review.pdf] [--paper A4|A3] [--steps N] [--angles 30,150,...]``."""
    parser = argparse.ArgumentParser(prog="kinepoly report",
                                     description="The design-review report: cover, checks, the construction at the "
                                                 "analysis angles, the cycle, the mechanism's data, in one PDF.")
    parser.add_argument("file", help="mechanism file (JSON)")
    parser.add_argument("-o", "--output", default=None, help="PDF file to write (default: FILE's name + .review.pdf)")
    parser.add_argument("--paper", choices=("A4", "A3"), default="A4", help="ISO 216 size of every page")
    parser.add_argument("--steps", type=int, default=3600, help="poses in the cycle's sweep (default 3600)")
    parser.add_argument("--angles", type=_angles, default=None, metavar="DEG,DEG,...",
                        help="analysis angles (default: the file's analysis_angles_deg, else the reference pose)")
    args = parser.parse_args(argv)
    assert args.paper in PAPER
    output = args.output or str(Path(args.file).with_suffix(".review.pdf"))
    if QGuiApplication.instance() is None:
        os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
        application = QGuiApplication([])  # fonts need a GUI application; kept alive until we return
    else:
        application = QGuiApplication.instance()

    def action():
        try:
            source = Path(args.file).read_bytes()
        except OSError as err:
            raise KinematicsError(f"cannot read the file: {err.strerror or err}", args.file) from None
        write_review(load_mechanism(args.file), source, output, file_name=Path(args.file).name, paper=args.paper,
                     steps=args.steps, angles_deg=args.angles)
        print(f"review report written to {output}")

    code = run_reporting(action)
    del application
    return code
