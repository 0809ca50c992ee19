"""Printing a construction at true scale: the Sheet replayed on a QPainter
(QPdfWriter for a PDF file, or a QPrinter the window hands over).

True scale needs four things (see PITFALLS.md): the page in full-page mode
with our own margins; device pixels per sheet mm read from the device's
resolution; pens with real widths in mm (never cosmetic); text sized in
device pixels from its height in mm. The Sheet is painted directly, with no
QGraphicsScene in between, so no view zoom or item cache can get in the way.
"""

from __future__ import annotations

import os
from pathlib import Path

from PySide6.QtCore import QMarginsF, QPointF, Qt
from PySide6.QtGui import (
    QBrush,
    QColor,
    QGuiApplication,
    QPageLayout,
    QPageSize,
    QPainter,
    QPdfWriter,
    QPen,
    QPolygonF,
)

from kinematics.drawing import Arrow, Circle, Hatch, Line, Note, Polyline, Strokes, Text, draw_sheet
from kinematics.drawing.force_sheet import draw_force_sheet
from kinematics.drawing.sheet import DASHES
from kinematics.errors import StorageError, SweepCancelled
from kinematics.files.storage import replace_atomically

from .arguments import pose_length_m
from .drawing_kit import FONT_FAMILY, MONO_FAMILY, font_for_capitals
from .outcomes import construction_from_file, forces_of, run_reporting

PDF_RESOLUTION_DPI = 1200
PAGE_SIZES = {"A0": QPageSize.PageSizeId.A0, "A1": QPageSize.PageSizeId.A1, "A2": QPageSize.PageSizeId.A2,
              "A3": QPageSize.PageSizeId.A3, "A4": QPageSize.PageSizeId.A4}


class PainterBackend:
    """Replays Sheet primitives (mm, y up) on a painter (device pixels, y down)."""

    def __init__(self, painter: QPainter, sheet_height_mm: float, pixels_per_mm: float):
        self.painter = painter
        self.height = sheet_height_mm
        self.k = pixels_per_mm

    def point(self, xy) -> QPointF:
        return QPointF(xy[0] * self.k, (self.height - xy[1]) * self.k)

    def pen(self, pen) -> QPen:
        qpen = QPen(QColor(pen.colour))
        qpen.setWidthF(pen.weight_mm * self.k)
        qpen.setCosmetic(False)
        qpen.setCapStyle(Qt.PenCapStyle.FlatCap)
        qpen.setJoinStyle(Qt.PenJoinStyle.MiterJoin)
        if pen.dash in DASHES:
            qpen.setDashPattern(list(DASHES[pen.dash]))  # Qt reads dash patterns in pen widths too
        return qpen

    def font(self, height_mm: float, mono: bool = False) -> tuple:
        """A font whose capitals are ``height_mm`` tall on the device, and its metrics."""
        return font_for_capitals(max(1, round(height_mm * self.k)), MONO_FAMILY if mono else FONT_FAMILY)

    def draw(self, primitive) -> None:
        p = self.painter
        solid = QBrush(QColor(primitive.pen.colour))
        if isinstance(primitive, Line):
            p.setPen(self.pen(primitive.pen))
            p.drawLine(self.point(primitive.start), self.point(primitive.end))
        elif isinstance(primitive, Strokes):
            p.setPen(self.pen(primitive.pen))
            ends = primitive.points
            for i in range(0, len(ends) - 1, 2):
                p.drawLine(self.point(ends[i]), self.point(ends[i + 1]))
        elif isinstance(primitive, Polyline):
            p.setPen(self.pen(primitive.pen))
            polygon = QPolygonF([self.point(xy) for xy in primitive.points])
            if primitive.closed:
                p.setBrush(Qt.BrushStyle.NoBrush)
                p.drawPolygon(polygon)
            else:
                p.drawPolyline(polygon)
        elif isinstance(primitive, Arrow):
            p.setPen(self.pen(primitive.pen))
            p.drawLine(self.point(primitive.start), self.point(primitive.end))
            self._fill(primitive.head, solid)
        elif isinstance(primitive, Hatch):
            self._fill(primitive.points, solid)
        elif isinstance(primitive, Circle):
            p.setPen(self.pen(primitive.pen))
            p.setBrush(solid if primitive.filled else Qt.BrushStyle.NoBrush)
            r = primitive.radius * self.k
            p.drawEllipse(self.point(primitive.centre), r, r)
        elif isinstance(primitive, Text):
            self._text(primitive)
        elif isinstance(primitive, Note):
            x, top = primitive.position
            for i, line in enumerate(primitive.lines):
                self._text(Text(position=(x, top - i * primitive.pitch), text=line, height=primitive.height,
                                pen=primitive.pen, anchor="top"))
        else:
            raise TypeError(f"no way to paint {type(primitive).__name__}")

    def _fill(self, points, brush) -> None:
        self.painter.setPen(Qt.PenStyle.NoPen)
        self.painter.setBrush(brush)
        self.painter.drawPolygon(QPolygonF([self.point(xy) for xy in points]))

    def _text(self, text: Text) -> None:
        font, metrics = self.font(text.height, text.mono)
        at = self.point(text.position)
        width = metrics.horizontalAdvance(text.text)
        x = at.x() - {"left": 0.0, "centre": 0.5 * width, "right": width}[text.align]
        y = at.y() + {"baseline": 0.0, "middle": 0.5 * metrics.capHeight(), "top": metrics.capHeight()}[text.anchor]
        self.painter.setFont(font)
        self.painter.setPen(QColor(text.pen.colour))
        self.painter.drawText(QPointF(x, y), text.text)


def page_layout(paper: str, landscape: bool) -> QPageLayout:
    """ISO 216 ``paper`` with no margins, in full-page mode: sheet mm 0,0 is the paper's corner."""
    orientation = QPageLayout.Orientation.Landscape if landscape else QPageLayout.Orientation.Portrait
    layout = QPageLayout(QPageSize(PAGE_SIZES[paper]), orientation, QMarginsF(0, 0, 0, 0),
                         QPageLayout.Unit.Millimeter)
    layout.setMode(QPageLayout.Mode.FullPageMode)
    return layout


def paint_sheets(sheets, device, where: str = "", progress=None) -> None:
    """Paint ``sheets``, one a page, on a paged device whose page layout is already set
    (full page); ``where`` names the device in an error. ``progress``, if given, is called
    with the fraction painted after each page; returning False stops with SweepCancelled."""
    painter = QPainter()
    if not painter.begin(device):
        raise StorageError("the printer or PDF file could not be opened for painting", where)
    try:
        painter.setRenderHint(QPainter.RenderHint.Antialiasing, True)
        for number, sheet in enumerate(sheets):
            if number and not device.newPage():
                raise StorageError(f"page {number + 1} could not be started", where)
            backend = PainterBackend(painter, sheet.height, device.resolution() / 25.4)
            for primitive in sheet.primitives:
                backend.draw(primitive)
            if progress is not None and progress((number + 1) / len(sheets)) is False:
                raise SweepCancelled("the printing was cancelled", f"page {number + 1}")
    finally:
        painter.end()


def paint_sheet(sheet, device, where: str = "") -> None:
    """Paint one ``sheet`` (see :func:`paint_sheets`)."""
    paint_sheets((sheet,), device, where)


def pdf_writer(target, title: str, paper: str, landscape: bool = False) -> QPdfWriter:
    """A QPdfWriter on ``target`` (a path or a QIODevice) at PDF_RESOLUTION_DPI, full page."""
    writer = QPdfWriter(target)
    writer.setResolution(PDF_RESOLUTION_DPI)
    writer.setTitle(title)
    writer.setCreator("Kinepoly")
    writer.setPageLayout(page_layout(paper, landscape))
    return writer


def print_construction(construction, printer_or_path, paper: str = "A4", landscape: bool = False,
                       file_name: str = "", date: str | None = None, with_centres: bool = False, forces=None):
    """Print ``construction`` at true scale.

    Parameters
    ----------
    construction : :class:`kinematics.Construction` to print.
    printer_or_path : a PDF file path, or a configured QPrinter (it is put in
        full-page mode and given the paper).
    paper, landscape : ISO 216 size (A4, A3 …) and orientation.
    file_name, date : for the title block (date defaults to today).
    with_centres : draw the instantaneous centres over the space diagram.
    forces : a :class:`kinematics.forcepolygon.ForcePolygon` of the same pose, printed on a
        second sheet (:func:`kinematics.drawing.force_sheet.draw_force_sheet`).

    Returns
    -------
    Sheet
        The (first) sheet printed.

    Raises
    ------
    StorageError
        when the PDF cannot be written; a PDF goes to a temporary file beside
        the target and is moved into place only when whole, so a failure
        leaves no partial file.
    """
    count = 1 if forces is None else 2
    sheet = draw_sheet(construction, paper=paper, landscape=landscape, file_name=file_name, date=date,
                       with_centres=with_centres, sheet=f"1/{count}")
    sheets = (sheet,)
    if forces is not None:
        sheets += (draw_force_sheet(forces, paper=paper, landscape=landscape, file_name=file_name, date=date,
                                    sheet="2/2"),)
    if isinstance(printer_or_path, (str, os.PathLike)):
        def write(temporary):
            writer = pdf_writer(temporary, sheet.title or "Kinepoly construction", paper, landscape)
            paint_sheets(sheets, writer, os.fspath(printer_or_path))
            del writer  # the writer holds the file open; let it go before the file is checked and moved
            # QPdfWriter reports no write errors; a whole PDF ends with its %%EOF marker (ISO 32000-1, 7.5.5).
            with open(temporary, "rb") as pdf:
                pdf.seek(max(0, os.path.getsize(temporary) - 32))
                if b"%%EOF" not in pdf.read():
                    raise OSError("the PDF came out incomplete")

        replace_atomically(printer_or_path, write)
    else:
        printer_or_path.setFullPage(True)
        printer_or_path.setPageLayout(page_layout(paper, landscape))
        paint_sheets(sheets, printer_or_path, printer_or_path.printerName() or "printer")
    return sheet


def run(args) -> int:
    """``kinepoly print`` with its parsed arguments (:func:`app.cli.parser`): the exit code."""
    if QGuiApplication.instance() is None:
        os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
        application = QGuiApplication([])  # fonts need a GUI application; kept alive until we return
    else:
        application = QGuiApplication.instance()

    def action():
        construction = construction_from_file(args.file, args.angle, pose_length_m(args))
        print_construction(construction, args.output, paper=args.paper, landscape=args.landscape,
                           file_name=Path(args.file).name, with_centres=args.centres,
                           forces=forces_of(construction) if args.forces else None)

    code = run_reporting(action)
    del application
    return code
