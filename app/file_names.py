"""File names the window's save dialogs hand back: the extension the chosen filter implies is added
(a design saved as "slider" with the JSON filter is "slider.json"), and a name is suggested — the
design's own file name, or its title — in the folder it came from."""

from __future__ import annotations

import re
from pathlib import Path

# A title becomes a file name of letters, digits, - and _ (what every file system and mail program keeps).
_UNSAFE = re.compile(r"[^A-Za-z0-9_-]+")


def filter_extensions(file_filter: str) -> list[str]:
    """The extensions one filter such as "PDF sheet (*.pdf)" names, with their dots ([] for "*")."""
    patterns = re.search(r"\(([^)]*)\)", file_filter)
    found = patterns.group(1).split() if patterns else []
    return [p[1:] for p in found if p.startswith("*.") and len(p) > 2]


def with_extension(path: str, chosen_filter: str, filters: str) -> str:
    """``path`` ending as the chosen filter says (its first extension added unless it already has one
    of them); "All files" adds nothing. When the dialog says which filter was chosen only by an empty
    string, the first of ``filters`` counts."""
    chosen = chosen_filter or filters.split(";;")[0]
    extensions = filter_extensions(chosen)
    if not path or not extensions or Path(path).suffix.lower() in extensions:
        return path
    return path + extensions[0]


def suggested_name(design_path: str | None, title: str, extension: str) -> str:
    """The name a save dialog starts with: the design's file with ``extension``, else its title."""
    if design_path:
        return str(Path(design_path).with_suffix(extension))
    stem = _UNSAFE.sub("_", title.strip()).strip("_") or "untitled"
    return stem + extension
