"""Print and export from the window hand the shown Construction to the core's sheet and DXF writers."""

import ezdxf.recover
import pdfplumber
from PySide6.QtGui import QPageLayout
from PySide6.QtPrintSupport import QPrinter

import app.exports
import kinematics
from tests.designs import CLAW_FEED, UNFINISHED


def test_export_pdf_writes_the_shown_pose_with_the_caution(make_window, tmp_path):
    window = make_window(CLAW_FEED)
    window.turn_driver(140.0)
    target = tmp_path / "sheet.pdf"
    assert window.export_pdf(target)
    with pdfplumber.open(target) as pdf:  # an outside reader of the file written
        text = "".join(page.extract_text() or "" for page in pdf.pages)
    assert "at 140.00°" in text  # the pose shown, not the reference pose (53.13°)
    assert "competent engineer" in " ".join(text.split())
    assert "sheet written" in window.status.text()


def test_export_dxf_writes_a_drawing_ezdxf_reads_back(make_window, tmp_path):
    window = make_window(CLAW_FEED)
    target = tmp_path / "drawing.dxf"
    assert window.export_dxf(target)
    doc, auditor = ezdxf.recover.readfile(target)  # ezdxf's recovering reader, as PITFALLS.md advises
    assert not auditor.has_errors
    assert len(doc.modelspace().query("LINE")) > 5


def test_nothing_to_print_for_an_unfinished_design(make_window, tmp_path):
    window = make_window(UNFINISHED)
    assert not window.export_pdf(tmp_path / "sheet.pdf")
    assert not (tmp_path / "sheet.pdf").exists()
    assert "nothing to print yet" in window.status.text() and "no driver" in window.status.text()


def test_print_hands_the_sheet_to_the_chosen_printer(make_window, tmp_path, monkeypatch):
    window = make_window(CLAW_FEED)
    target = tmp_path / "printed.pdf"

    class ChosenPrinter:
        """Stands in for the platform's print dialog: the user picks a PDF printer and presses Print."""

        Accepted = 1

        def __init__(self, printer, parent):
            printer.setOutputFormat(QPrinter.PdfFormat)
            printer.setOutputFileName(str(target))
            printer.setPageOrientation(QPageLayout.Portrait)

        def exec(self):
            return self.Accepted

    monkeypatch.setattr(app.exports, "QPrintDialog", ChosenPrinter)
    window.print_dialog()
    with pdfplumber.open(target) as pdf:
        assert len(pdf.pages) == 1
        assert kinematics.CAUTION.split()[0] in (pdf.pages[0].extract_text() or "")
