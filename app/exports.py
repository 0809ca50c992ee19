"""Printing and exporting from the window: the sheet and the DXF drawing are
drawn by the core's drawing package (see docs/output.md); the window only
hands over the Construction it shows and says what became of it."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtCore import Qt
from PySide6.QtGui import QAction
from PySide6.QtPrintSupport import QPrinter
from PySide6.QtWidgets import QApplication, QDialog, QProgressDialog

from kinematics import KinematicsError, NoMassData, SweepCancelled, dumps

from .file_actions import file_message, save_path
from .file_names import filter_extensions, suggested_name


def add_sheet_contents(window, menu) -> None:
    """File > Prints and exports include: the instantaneous centres over the space diagram and the
    force polygon (a second sheet in a PDF, its own layers in a DXF), as ``kinepoly print`` and
    ``export`` take them with ``--centres`` and ``--forces``. Both are the window's
    ``include_centres`` and ``include_forces`` actions, also offered by the print preview and the
    PDF paper dialog."""
    contents = menu.addMenu("Prints and exports &include")
    for name, text, tip, on in (
            ("include_centres", "Instantaneous &centres", "the instantaneous centres on the printed and exported "
             "space diagram (DXF layer CENTRES)", False),
            ("include_forces", "&Force polygon", "the force polygon of the pose, where the design has mass data: a "
             "second sheet in a PDF, its FORCE layers in a DXF", True)):
        action = QAction(text, window)
        action.setCheckable(True)
        action.setChecked(on)
        action.setToolTip(tip)
        contents.addAction(action)
        setattr(window, name, action)
    contents.setToolTipsVisible(True)


class SheetOutputs:
    """Print, Export PDF and Export DXF for a window with ``document``, ``drawings``, ``say``,
    ``show_error`` and the ``include_centres`` and ``include_forces`` actions."""

    def _ready_construction(self):
        construction = self.document.construction
        if construction is None:
            self.say(f"nothing to print yet: {self.document.analysis.problem}")
        return construction

    def _export(self, file_filter: str, write):
        """Ask where (the design's name suggested, the filter's extension added), then ``write`` there."""
        if self._ready_construction() is None:
            return
        extension = filter_extensions(file_filter)[0]
        doc = self.document
        path = save_path(self, "Export", suggested_name(doc.path, doc.mechanism.title, extension), file_filter)
        if path:
            write(path)

    def _file_name(self) -> str:
        return Path(self.document.path).name if self.document.path else ""

    def _contents(self) -> tuple:
        """(keyword arguments of the sheet and the DXF for what File > Prints and exports include
        asks, and in words what was asked and left out)."""
        extras = {"with_centres": self.include_centres.isChecked(), "forces": None}
        left_out = ""
        if self.include_forces.isChecked():
            from .outcomes import forces_of

            try:
                extras["forces"] = forces_of(self.document.construction)
            except NoMassData:
                pass  # nothing to include: the design has no masses and no loads
            except KinematicsError as error:
                left_out = f"; force polygon left out: {error}"
        return extras, left_out

    def export_pdf(self, path, paper: str = "A4", landscape: bool = False) -> bool:
        """The construction at true scale on a ``paper`` sheet, as ``kinepoly print`` draws it."""
        construction = self._ready_construction()
        if construction is None:
            return False
        from .printing import print_construction  # the sheet machinery loads when first used

        extras, left_out = self._contents()
        try:
            print_construction(construction, str(path), paper=paper, landscape=landscape,
                               file_name=self._file_name(), **extras)
        except (KinematicsError, OSError) as error:
            self.show_error("Cannot export", file_message(path, error))
            return False
        self.say(f"sheet written to {path}{left_out}")
        return True

    def export_dxf(self, path) -> bool:
        """The space diagram at true size and both polygons at their scales, as ``kinepoly export`` writes them."""
        construction = self._ready_construction()
        if construction is None:
            return False
        from kinematics.drawing.dxf import write_dxf  # ezdxf takes half a second to import: only when asked

        extras, left_out = self._contents()
        try:
            write_dxf(construction, str(path), file_name=self._file_name(), **extras)
        except (KinematicsError, OSError) as error:
            self.show_error("Cannot export", file_message(path, error))
            return False
        self.say(f"drawing written to {path}{left_out}")
        return True

    def print_dialog(self):
        """File > Print… (Ctrl+P): a preview of the sheet with its paper and orientation, printed from there."""
        construction = self._ready_construction()
        if construction is None:
            return
        from .print_preview import SheetPreview  # the sheet machinery loads when first used

        printer = QPrinter(QPrinter.PrinterMode.HighResolution)
        preview = SheetPreview(construction, printer, self._file_name(), self._contents,
                               (self.include_centres, self.include_forces), self)
        preview.exec()
        if preview.errors:
            self.show_error("Cannot print", preview.errors[-1])

    def export_pdf_dialog(self):
        """File > Export sheet as PDF…: the paper and orientation, then where."""
        if self._ready_construction() is None:
            return
        from .print_preview import PaperDialog

        dialog = PaperDialog(self, contents=(self.include_centres, self.include_forces))
        if dialog.exec() != QDialog.DialogCode.Accepted:
            return
        paper, landscape = dialog.choice()
        self._export("PDF sheet (*.pdf)", lambda path: self.export_pdf(path, paper, landscape))

    def review_dialog(self):
        """File > Review report…: ask where, then write the design-review report."""
        if self._ready_construction() is None:
            return
        doc = self.document
        path = save_path(self, "Review report", suggested_name(doc.path, doc.mechanism.title, ".pdf"),
                         "PDF report (*.pdf)")
        if path:
            self.export_review(path)

    def _design_bytes(self) -> bytes:
        """The bytes the report's fingerprint is of: the file itself while the design is as
        saved, otherwise the design as it would be saved now."""
        path = self.document.path
        if path and self.document.undo_stack.isClean():
            try:
                return Path(path).read_bytes()
            except OSError:
                pass
        return dumps(self.document.mechanism).encode("utf-8")

    def export_review(self, path) -> bool:
        """The design-review report, with a progress dialog whose Cancel leaves no file."""
        if self._ready_construction() is None:
            return False
        from .review import write_review  # pypdf and the report's pages load when first used

        dialog = QProgressDialog("Writing the review report…", "Cancel", 0, 1000, self)
        dialog.setWindowTitle("Review report")
        dialog.setWindowModality(Qt.WindowModality.WindowModal)
        dialog.setMinimumDuration(0)

        def progress(fraction):
            dialog.setValue(round(1000 * fraction))
            QApplication.processEvents()
            return not dialog.wasCanceled()

        try:
            write_review(self.document.mechanism, self._design_bytes(), str(path), file_name=self._file_name(),
                         progress=progress)
        except SweepCancelled:
            self.say("review report cancelled: no file written")
            return False
        except (KinematicsError, OSError) as error:
            self.show_error("Cannot write the review report", file_message(path, error))
            return False
        finally:
            dialog.reset()
        self.say(f"review report written to {path}")
        return True
