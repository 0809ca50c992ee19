"""Writing the design-review report: the core assembles its pages as Sheets
(:mod:`kinematics.review`); here they are painted on one QPdfWriter with the
printer's painter, then pypdf adds what QPdfWriter cannot (the outline and the
subject), and the file goes into place through the atomic writer, so a failure
or a cancel leaves no file."""

from __future__ import annotations

import io
import os
from pathlib import Path

from pypdf import PdfReader, PdfWriter
from PySide6.QtCore import QBuffer, QIODevice
from PySide6.QtGui import QGuiApplication

from kinematics import KinematicsError, load_mechanism
from kinematics.drawing import PAPER
from kinematics.files.storage import replace_atomically
from kinematics.review import Progress, build_report

from .outcomes import run_reporting
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


def run(args) -> int:
    """``kinepoly report`` with its parsed arguments (:func:`app.cli.parser`): the exit code."""
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
