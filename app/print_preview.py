"""The window's print preview and the paper choice for a PDF export.

Ctrl+P opens a preview of the sheet (Qt's QPrintPreviewDialog) whose tool bar carries the ISO 216
paper sizes the sheet is laid out for beside Qt's own orientation buttons, and the window's
choices of what prints and exports include (the centres, the force polygon); each change lays the
sheet out again (the views' scales depend on the paper), and Print sends it to the printer chosen
there. Export PDF first asks the paper, the orientation and the same choices (:class:`PaperDialog`).
"""

from __future__ import annotations

from PySide6.QtGui import QPageLayout, QPageSize
from PySide6.QtPrintSupport import QPrinter, QPrintPreviewDialog, QPrintPreviewWidget
from PySide6.QtWidgets import (
    QCheckBox,
    QComboBox,
    QDialog,
    QDialogButtonBox,
    QFormLayout,
    QLabel,
    QToolBar,
)

from kinematics.drawing import PAPER

from .printing import PAGE_SIZES, print_construction

ORIENTATIONS = ("portrait", "landscape")


def paper_of(printer: QPrinter) -> tuple:
    """(paper name, landscape) of ``printer``'s page layout; A4 for a size the sheet has no layout for."""
    layout = printer.pageLayout()
    size = layout.pageSize().id()
    paper = next((name for name, page in PAGE_SIZES.items() if page == size), "A4")
    return paper, layout.orientation() == QPageLayout.Orientation.Landscape


class SheetPreview(QPrintPreviewDialog):
    """A preview of ``construction``'s sheet on ``printer``, with an ISO paper choice and the
    ``choices`` (checkable actions of what the sheet includes) in its tool bar; ``contents()``
    gives the sheet's keyword arguments for them."""

    def __init__(self, construction, printer: QPrinter, file_name: str, contents, choices=(), parent=None):
        super().__init__(printer, parent)
        self.setWindowTitle("Print preview")
        self.construction, self.file_name, self.printer = construction, file_name, printer
        self.contents = contents
        self.errors = []
        self.paper = QComboBox()
        self.paper.addItems(list(PAPER))
        self.paper.setCurrentText(paper_of(printer)[0])
        self.paper.setToolTip("ISO 216 paper: the sheet's views are scaled to fit it")
        self.paper.currentTextChanged.connect(self._paper_chosen)
        toolbar = self.findChild(QToolBar)
        toolbar.addSeparator()
        toolbar.addWidget(QLabel(" Paper "))
        toolbar.addWidget(self.paper)
        toolbar.addSeparator()
        for choice in choices:
            toolbar.addAction(choice)
            choice.toggled.connect(self._contents_changed)
        self.finished.connect(lambda _result: [c.toggled.disconnect(self._contents_changed) for c in choices])
        self.paintRequested.connect(self.paint)

    def _contents_changed(self, _on: bool) -> None:
        self.findChild(QPrintPreviewWidget).updatePreview()

    def _paper_chosen(self, paper: str) -> None:
        self.printer.setPageSize(QPageSize(PAGE_SIZES[paper]))
        self.findChild(QPrintPreviewWidget).updatePreview()

    def paint(self, printer: QPrinter) -> None:
        """Lay the sheet out for the printer's paper and orientation, and paint it there."""
        paper, landscape = paper_of(printer)
        extras, _left_out = self.contents()
        try:
            print_construction(self.construction, printer, paper=paper, landscape=landscape, file_name=self.file_name,
                               **extras)
        except OSError as error:  # a printer that cannot be painted on: said by the window
            self.errors.append(str(error))


class PaperDialog(QDialog):
    """Asks the paper and orientation of a PDF sheet, and what it includes: a check box for each of
    ``contents`` (the window's checkable actions, set from the boxes when accepted)."""

    def __init__(self, parent=None, paper: str = "A4", landscape: bool = False, contents=()):
        super().__init__(parent)
        self.setWindowTitle("Sheet paper")
        form = QFormLayout(self)
        self.paper = QComboBox()
        self.paper.addItems(list(PAPER))
        self.paper.setCurrentText(paper)
        self.paper.setToolTip("ISO 216 paper: the sheet's views are scaled to fit it")
        self.orientation = QComboBox()
        self.orientation.addItems(list(ORIENTATIONS))
        self.orientation.setCurrentIndex(1 if landscape else 0)
        form.addRow("Paper", self.paper)
        form.addRow("Orientation", self.orientation)
        self.includes = []
        for action in contents:
            box = QCheckBox(action.text().replace("&", ""))
            box.setChecked(action.isChecked())
            box.setToolTip(action.toolTip())
            form.addRow("Include" if not self.includes else "", box)
            self.includes.append((box, action))
        self.accepted.connect(lambda: [action.setChecked(box.isChecked()) for box, action in self.includes])
        buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Ok | QDialogButtonBox.StandardButton.Cancel)
        buttons.accepted.connect(self.accept)
        buttons.rejected.connect(self.reject)
        form.addRow(buttons)

    def choice(self) -> tuple:
        """(paper, landscape) as chosen."""
        return self.paper.currentText(), self.orientation.currentText() == "landscape"
