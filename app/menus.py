"""The Tools menu with each building tool's key, and the Help menu: the shortcuts page (read from
the window's own menus, so it lists what the keys really do), the user guide shipped in the
package, and About with the version and the caution."""

from __future__ import annotations

from importlib import metadata
from importlib.resources import files

from PySide6.QtCore import Qt
from PySide6.QtGui import QAction, QKeySequence
from PySide6.QtWidgets import QDialog, QTextBrowser, QVBoxLayout

import kinematics

TOOL_KEYS = {"select": "S", "pivot": "P", "joint": "J", "link": "L", "slide": "G", "driver": "D", "cylinder": "C",
             "delete": "X"}
# Keys no menu entry carries: they act on the space diagram itself.
VIEW_KEYS = (
    ("Arrow keys", "nudge the selected joint one grid step (one undo step each)"),
    ("Shift + arrow keys", "nudge it a tenth of a grid step"),
    ("Arrow keys, nothing selected", "pan the space diagram"),
    ("Enter", "finish the link being built"),
    ("Mouse wheel", "zoom about the pointer"),
    ("Middle button drag, or left drag on empty space", "pan"),
    ("Right click", "the joint's, link's or empty space's menu"),
)


def version() -> str:
    try:
        return metadata.version("kinepoly")
    except metadata.PackageNotFoundError:  # run from a source tree that was never installed
        return "unknown (not installed)"


def guide_text() -> str:
    """The user guide in Markdown, shipped inside the package (app/guide.md)."""
    return files("app").joinpath("guide.md").read_text(encoding="utf-8")


def add_tool_menu(window, menu):
    """Give each tool action of ``window.tool_actions`` its key and list it in ``menu``; Escape
    leaves any tool for Select (dropping a chain half built)."""
    for tool, action in window.tool_actions.items():
        action.setShortcut(QKeySequence(TOOL_KEYS[tool]))
        drawing_key(window, action)
        menu.addAction(action)
    menu.addSeparator()
    back = QAction("Back to &Select", window)
    back.setShortcut(QKeySequence(QKeySequence.StandardKey.Cancel))
    back.setToolTip("Escape: drop what the tool was building and return to Select")
    back.triggered.connect(window.back_to_select)
    drawing_key(window, back)
    menu.addAction(back)


def drawing_key(window, action):
    """Let ``action``'s key act while the drawings have the focus only: a letter or Delete typed in a
    table or field is that widget's (a grid starts editing on a letter), not a tool's."""
    action.setShortcutContext(Qt.ShortcutContext.WidgetWithChildrenShortcut)
    window.drawings.addAction(action)


def shortcut_rows(window) -> list[tuple[str, str]]:
    """(keys, what they do) for every menu entry with a shortcut, then the keys of the space diagram."""
    rows = []

    def walk(menu, path):
        for action in menu.actions():
            if action.menu() is not None:
                walk(action.menu(), f"{path} › {action.menu().title().replace('&', '')}")
            elif not action.shortcut().isEmpty():
                keys = action.shortcut().toString(QKeySequence.SequenceFormat.NativeText)
                rows.append((keys, f"{path} › {action.text().replace('&', '')}"))

    for top in window.menuBar().actions():
        if top.menu() is not None:
            walk(top.menu(), top.menu().title().replace("&", ""))
    return rows + list(VIEW_KEYS)


def _page(window, title: str, body: str, markdown: bool = False) -> QDialog:
    dialog = QDialog(window)
    dialog.setWindowTitle(title)
    text = QTextBrowser(dialog)
    text.setOpenExternalLinks(True)
    if markdown:
        text.setMarkdown(body)
    else:
        text.setHtml(body)
    QVBoxLayout(dialog).addWidget(text)
    dialog.resize(640, 560)
    return dialog


def show_shortcuts(window) -> QDialog:
    rows = "".join(f"<tr><td><b>{keys}</b></td><td>&nbsp;&nbsp;{what}</td></tr>" for keys, what in
                   shortcut_rows(window))
    dialog = _page(window, "Keyboard shortcuts", f"<table>{rows}</table>")
    dialog.show()
    return dialog


def show_guide(window) -> QDialog:
    dialog = _page(window, "Kinepoly user guide", guide_text(), markdown=True)
    dialog.show()
    return dialog


def about_text() -> str:
    return ("<b>Kinepoly</b> " + version() + " — velocity and acceleration polygons of planar linkages, built by "
            "exact graphical construction and checked against a numeric solver.<br><br>" + kinematics.CAUTION)


def add_help_menu(window, menu):
    window._action(menu, "&User guide", lambda: show_guide(window), QKeySequence(QKeySequence.StandardKey.HelpContents))
    window._action(menu, "&Keyboard shortcuts", lambda: show_shortcuts(window), QKeySequence("Ctrl+/"))
    menu.addSeparator()
    window._action(menu, "&About Kinepoly", window.about)
