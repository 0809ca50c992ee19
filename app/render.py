"""``kinepoly render FILE [--angle DEG] -o view.png [--size 1600x1000] [--forces]``:
the window's three drawings (the force polygon as the third with ``--forces``), drawn offscreen
into a PNG (for tests and bug reports).

Exit codes as the other commands: 0 written; 2 a bad file or a mechanism that cannot be
analysed; 3 the linkage cannot assemble at the asked angle.
"""

from __future__ import annotations

import os
import sys
from pathlib import Path

FOOTER_PIXELS = 44


def render_image(document, size: tuple[int, int], forces: bool = False):
    """A QImage of ``size`` with the drawings of ``document`` and a footer with the status line;
    with ``forces``, the force polygon in place of the acceleration polygon."""
    from PySide6.QtCore import QRect, Qt
    from PySide6.QtGui import QColor, QImage, QPainter

    from .drawing_kit import label_font
    from .panels import DrawingsPanel
    from .status import status_text

    width, height = size
    panel = DrawingsPanel(document)
    panel.setAttribute(Qt.WidgetAttribute.WA_DontShowOnScreen)
    panel.resize(width, height - FOOTER_PIXELS)
    panel.setSizes([int(width * 0.4), int(width * 0.3), width - 2 * int(width * 0.3)])
    panel.show_forces(forces)
    panel.show()
    panel.refresh()
    panel.fit_all()
    image = QImage(width, height, QImage.Format.Format_ARGB32)
    image.fill(QColor("white"))
    painter = QPainter(image)
    painter.drawPixmap(0, 0, panel.grab())
    painter.setFont(label_font(12))
    painter.setPen(QColor("#1d2b3a"))
    title = document.mechanism.title or (Path(document.path).name if document.path else "")
    painter.drawText(QRect(8, height - FOOTER_PIXELS + 2, width - 16, FOOTER_PIXELS - 4),
                     Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignVCenter | Qt.TextFlag.TextWordWrap,
                     f"{title} — {status_text(document.analysis)}")
    painter.end()
    panel.close()
    panel.deleteLater()
    return image


def png_bytes(image) -> bytes:
    from PySide6.QtCore import QBuffer, QByteArray, QIODevice

    data = QByteArray()
    buffer = QBuffer(data)
    buffer.open(QIODevice.OpenModeFlag.WriteOnly)
    if not image.save(buffer, "PNG"):
        raise OSError("the image could not be encoded as PNG")
    buffer.close()
    return bytes(data)


# What Qt's offscreen plugin says about every widget it shows: true of the plugin, no news to the user.
QUIET_QT_MESSAGES = ("This plugin does not support propagateSizeHints()",)


def _pass_on_qt_message(mode, context, message):
    if message not in QUIET_QT_MESSAGES:
        print(message, file=sys.stderr)


def run(options) -> int:
    """``kinepoly render`` with its parsed arguments (:func:`app.cli.parser`): the exit code."""
    os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
    from PySide6.QtCore import qInstallMessageHandler
    from PySide6.QtWidgets import QApplication

    app = QApplication.instance() or QApplication(["kinepoly"])
    previous = qInstallMessageHandler(_pass_on_qt_message)
    try:
        return _render(options, app)
    finally:
        qInstallMessageHandler(previous)


def _render(options, app) -> int:
    """Load, analyse, draw and write; the exit code (see the module doc)."""
    import kinematics
    from kinematics.files.storage import write_atomically

    from .document import Document

    try:
        mechanism = kinematics.load_mechanism(options.file)
    except (kinematics.KinematicsError, OSError) as error:
        print(f"kinepoly render: {error}", file=sys.stderr)
        return 2
    document = Document(mechanism, options.file)
    if document.solution is None:
        print(f"kinepoly render: {options.file}: {document.analysis.problem}", file=sys.stderr)
        return 2
    if options.angle is not None:
        problem = document.set_angle(options.angle)
        if problem:
            print(f"kinepoly render: {problem}", file=sys.stderr)
            return 3
    try:
        write_atomically(options.output, png_bytes(render_image(document, options.size, options.forces)))
    except kinematics.KinematicsError as error:
        print(f"kinepoly render: {error}", file=sys.stderr)
        return 1
    app.processEvents()
    print(f"wrote {options.output} ({options.size[0]}x{options.size[1]} px)")
    return 0
