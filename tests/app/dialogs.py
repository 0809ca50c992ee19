"""Answering the window's modal dialogs from a test: the dialog runs its own event loop, so the answer
is given from a timer once the dialog is up."""

from PySide6.QtCore import QTimer
from PySide6.QtWidgets import QApplication


def when_shown(kind, act):
    """Run ``act(dialog)`` once a top-level ``kind`` dialog is up (it runs modally)."""
    def look():
        dialog = next((w for w in QApplication.topLevelWidgets() if isinstance(w, kind) and w.isVisible()), None)
        if dialog is None:
            QTimer.singleShot(20, look)
        else:
            act(dialog)

    QTimer.singleShot(0, look)
