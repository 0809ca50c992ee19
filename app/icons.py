"""Our own toolbar icons, drawn as SVG files in ``icons/`` at the project root."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtGui import QIcon

ICON_FOLDER = Path(__file__).resolve().parent.parent / "icons"


def icon(name: str) -> QIcon:
    """The icon ``icons/<name>.svg``, or an empty icon when the folder is not installed."""
    path = ICON_FOLDER / f"{name}.svg"
    return QIcon(str(path)) if path.exists() else QIcon()
