"""Printing and exporting from the window: the sheet and the DXF drawing are
drawn by the core's drawing package (see docs/output.md); the window only
hands over the Construction it shows and says what became of it."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtPrintSupport import QPrintDialog, QPrinter
from PySide6.QtWidgets import QDialog, QFileDialog

from kinematics import KinematicsError


class SheetOutputs:
    """Print, Export PDF and Export DXF for a window with ``document``, ``say`` and ``show_error``."""

    def _ready_construction(self):
        construction = self.document.construction
        if construction is None:
            self.say(f"nothing to print yet: {self.document.analysis.problem}")
        return construction

    def _export(self, file_filter: str, write):
        if self._ready_construction() is None:
            return
        path, _ = QFileDialog.getSaveFileName(self, "Export", "", file_filter)
        if path:
            write(path)

    def _file_name(self) -> str:
        return Path(self.document.path).name if self.document.path else ""

    def export_pdf(self, path) -> bool:
        """The construction at true scale on an A4 sheet, as ``kinepoly print`` draws it."""
        construction = self._ready_construction()
        if construction is None:
            return False
        from .printing import print_construction  # the sheet machinery loads when first used

        try:
            print_construction(construction, str(path), file_name=self._file_name())
        except (KinematicsError, OSError) as error:
            self.show_error("Cannot export", f"{path}:\n{error}")
            return False
        self.say(f"sheet written to {path}")
        return True

    def export_dxf(self, path) -> bool:
        """The space diagram at true size and both polygons at their scales, as ``kinepoly export`` writes them."""
        construction = self._ready_construction()
        if construction is None:
            return False
        from kinematics.drawing.dxf import write_dxf  # ezdxf takes half a second to import: only when asked

        try:
            write_dxf(construction, str(path), file_name=self._file_name())
        except (KinematicsError, OSError) as error:
            self.show_error("Cannot export", f"{path}:\n{error}")
            return False
        self.say(f"drawing written to {path}")
        return True

    def print_dialog(self):
        construction = self._ready_construction()
        if construction is None:
            return
        from .printing import print_construction

        printer = QPrinter(QPrinter.PrinterMode.HighResolution)
        if QPrintDialog(printer, self).exec() == QDialog.DialogCode.Accepted:
            try:
                print_construction(construction, printer, file_name=self._file_name())
            except (KinematicsError, OSError) as error:
                self.show_error("Cannot print", str(error))

