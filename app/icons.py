"""Our own toolbar icons, drawn as SVG files in ``icons/`` at the project root (installed as
the package ``app.icons``)."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtGui import QIcon

_INSTALLED = Path(__file__).resolve().parent / "icons"
ICON_FOLDER = _INSTALLED if _INSTALLED.is_dir() else Path(__file__).resolve().parent.parent / "icons"


def icon(name: str) -> QIcon:
    """The icon ``icons/<name>.svg`` (an empty icon if the file is missing)."""
    path = ICON_FOLDER / f"{name}.svg"
    return QIcon(str(path)) if path.exists() else QIcon()
