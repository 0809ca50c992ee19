"""Print and export from the window hand the shown Construction to the core's sheet and DXF writers."""

import ezdxf.recover
import pdfplumber
from PySide6.QtCore import Qt
from PySide6.QtGui import QPageLayout, QPageSize
from PySide6.QtPrintSupport import QPrinter, QPrintPreviewWidget
from PySide6.QtWidgets import QFileDialog, QToolBar

import kinematics
from tests.app.dialogs import when_shown
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


def test_ctrl_p_opens_a_preview_with_paper_and_orientation(make_window, qtbot):
    from app.print_preview import SheetPreview

    window = make_window(CLAW_FEED)
    seen = {}

    def inspect(preview):
        papers = preview.paper
        seen["papers"] = [papers.itemText(i) for i in range(papers.count())]
        toolbar = preview.findChild(QToolBar)
        seen["actions"] = [a.text() for a in toolbar.actions()]
        # The user picks A3 in the tool bar with the keyboard: the preview lays the sheet out again.
        papers.setFocus()
        index = papers.findText("A3")
        for _ in range(papers.currentIndex() - index):  # the list runs A0 … A4, A4 shown first
            qtbot.keyClick(papers, Qt.Key.Key_Up)
        seen["page"] = preview.printer.pageLayout().pageSize().id()
        seen["painted"] = preview.findChild(QPrintPreviewWidget).pageCount()
        preview.reject()

    when_shown(SheetPreview, inspect)
    qtbot.keyClick(window, Qt.Key.Key_P, Qt.KeyboardModifier.ControlModifier)
    assert "A4" in seen["papers"] and "A3" in seen["papers"]
    assert any("ortrait" in a for a in seen["actions"]) and any("andscape" in a for a in seen["actions"])
    assert seen["page"] == QPageSize.PageSizeId.A3 and seen["painted"] == 1


def test_the_preview_paints_the_sheet_for_the_printers_paper(make_window, tmp_path):
    from app.print_preview import SheetPreview

    window = make_window(CLAW_FEED)
    printer = QPrinter(QPrinter.PrinterMode.HighResolution)
    printer.setOutputFormat(QPrinter.OutputFormat.PdfFormat)
    target = tmp_path / "printed.pdf"
    printer.setOutputFileName(str(target))
    printer.setPageSize(QPageSize(QPageSize.PageSizeId.A3))
    printer.setPageOrientation(QPageLayout.Orientation.Landscape)
    preview = SheetPreview(window.document.construction, printer, "claw.json", window)
    preview.paint(printer)  # what Print in the preview does with the printer chosen there
    with pdfplumber.open(target) as pdf:
        page = pdf.pages[0]
        # ISO 216 A3 landscape 420 × 297 mm; a PDF rounds to whole points, hence ±0.5 mm.
        assert abs(page.width * 25.4 / 72 - 420) <= 0.5 and abs(page.height * 25.4 / 72 - 297) <= 0.5
        assert kinematics.CAUTION.split()[0] in (page.extract_text() or "")


def test_export_pdf_asks_the_paper(make_window, tmp_path, qtbot, monkeypatch):
    from app.print_preview import PaperDialog

    window = make_window(CLAW_FEED)
    target = tmp_path / "sheet.pdf"
    monkeypatch.setattr(QFileDialog, "getSaveFileName", lambda *args: (str(target), "PDF sheet (*.pdf)"))

    def choose(dialog):
        dialog.paper.setFocus()
        qtbot.keyClick(dialog.paper, Qt.Key.Key_Up)  # A4 -> A3 (the list runs A0 … A4)
        dialog.orientation.setFocus()
        qtbot.keyClick(dialog.orientation, Qt.Key.Key_Down)  # portrait -> landscape
        assert dialog.choice() == ("A3", True)
        qtbot.keyClick(dialog, Qt.Key.Key_Return)

    when_shown(PaperDialog, choose)
    window.export_pdf_dialog()
    with pdfplumber.open(target) as pdf:
        page = pdf.pages[0]
        assert abs(page.width * 25.4 / 72 - 420) <= 0.5 and abs(page.height * 25.4 / 72 - 297) <= 0.5
