"""Print and export from the window hand the shown Construction to the core's sheet and DXF writers."""

import ezdxf.recover
import pdfplumber
from PySide6.QtCore import Qt
from PySide6.QtGui import QPageLayout, QPageSize
from PySide6.QtPrintSupport import QPrinter, QPrintPreviewWidget
from PySide6.QtWidgets import QFileDialog, QToolBar

import kinematics
from tests.app.dialogs import when_shown
from tests.designs import CLAW_FEED, SAMPLES, UNFINISHED

CAP_PRESS = SAMPLES / "cap-press-feeder.json"  # a sample with mass data


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
    preview = SheetPreview(window.document.construction, printer, "claw.json", window._contents, parent=window)
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


def _pages(path):
    with pdfplumber.open(path) as pdf:
        return [page.extract_text() or "" for page in pdf.pages]


def test_the_pdf_includes_the_force_polygon_and_the_centres_as_the_paper_dialog_says(make_window, tmp_path, qtbot,
                                                                                      monkeypatch):
    from app.print_preview import PaperDialog

    window = make_window(CLAW_FEED)
    assert window.open_path(str(CAP_PRESS))
    target = tmp_path / "press.pdf"
    monkeypatch.setattr(QFileDialog, "getSaveFileName", lambda *args: (str(target), "PDF sheet (*.pdf)"))
    assert window.include_forces.isChecked() and not window.include_centres.isChecked()
    # By default a design with mass data gets its force polygon on a second sheet.
    when_shown(PaperDialog, lambda dialog: qtbot.keyClick(dialog, Qt.Key.Key_Return))
    window.export_pdf_dialog()
    pages = _pages(target)
    assert len(pages) == 2 and "force polygon" in pages[1].lower()
    assert "instantaneous centres" not in pages[0].lower()

    def choose(dialog):
        (centres, _), (forces, _) = dialog.includes
        centres.setFocus()
        qtbot.keyClick(centres, Qt.Key.Key_Space)  # ticked
        forces.setFocus()
        qtbot.keyClick(forces, Qt.Key.Key_Space)  # cleared
        qtbot.keyClick(dialog, Qt.Key.Key_Return)

    when_shown(PaperDialog, choose)
    window.export_pdf_dialog()
    pages = _pages(target)
    assert len(pages) == 1
    assert "ground|crank" in pages[0]  # a centre's name: the pivot of the crank
    assert window.include_centres.isChecked() and not window.include_forces.isChecked()  # the choice is kept


def test_the_dxf_takes_the_centres_and_the_force_polygon_from_the_file_menu(make_window, tmp_path):
    window = make_window(CLAW_FEED)
    assert window.open_path(str(CAP_PRESS))
    window.include_centres.trigger()  # File > Prints and exports include > Instantaneous centres
    target = tmp_path / "press.dxf"
    assert window.export_dxf(target)
    doc, auditor = ezdxf.recover.readfile(target)
    assert not auditor.has_errors
    layers = {e.dxf.layer for e in doc.modelspace()}
    assert "CENTRES" in layers and any(layer.startswith("FORCE-") for layer in layers)
    window.include_forces.trigger()
    window.include_centres.trigger()
    assert window.export_dxf(target)
    layers = {e.dxf.layer for e in ezdxf.recover.readfile(target)[0].modelspace()}
    assert "CENTRES" not in layers and not any(layer.startswith("FORCE-") for layer in layers)


def test_the_preview_offers_the_same_choices_and_lays_the_sheets_out_again(make_window, qtbot):
    from app.print_preview import SheetPreview

    window = make_window(CLAW_FEED)
    assert window.open_path(str(CAP_PRESS))
    seen = {}

    def inspect(preview):
        toolbar = preview.findChild(QToolBar)
        assert window.include_forces in toolbar.actions() and window.include_centres in toolbar.actions()
        shown = preview.findChild(QPrintPreviewWidget)
        seen["with forces"] = shown.pageCount()
        window.include_forces.trigger()  # the tool bar's button is the File menu's action
        seen["without"] = shown.pageCount()
        preview.reject()

    when_shown(SheetPreview, inspect)
    qtbot.keyClick(window, Qt.Key.Key_P, Qt.KeyboardModifier.ControlModifier)
    assert seen == {"with forces": 2, "without": 1}
