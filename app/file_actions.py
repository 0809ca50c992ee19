"""The File menu's design files: New, Open (asking about unsaved changes before the file dialog),
the numbered recent files with "Clear list", Save and Save As (the filter's extension added, a name
suggested), and the message a file that cannot be read or written shows."""

from __future__ import annotations

import os

from PySide6.QtWidgets import QFileDialog, QMessageBox

import kinematics
from kinematics import KinematicsError
from kinematics.files.storage import remove_stale_temporaries

from .building import empty
from .file_names import suggested_name, with_extension
from .files import clear_recent, recent_files, remember, save_asking

FILE_FILTER = "Kinepoly mechanism (*.json);;All files (*)"


def file_message(path, error) -> str:
    """``error`` about ``path`` in words, the path said once (the core's messages already name it)."""
    text = str(error)
    return text if str(path) in text else f"{path}:\n{text}"


def save_path(parent, title: str, suggestion: str, filters: str) -> str:
    """Ask where to save; the answer with its filter's extension, "" when cancelled. A name whose added
    extension makes it another file that exists is replaced only when the user says so (the dialog
    asked about the name as typed)."""
    path, chosen = QFileDialog.getSaveFileName(parent, title, suggestion, filters)
    full = with_extension(path, chosen, filters)
    if full != path and os.path.exists(full):
        button = QMessageBox.StandardButton
        if QMessageBox.question(parent, "Replace the file?", f"{full} already exists.\n\nReplace it?",
                                button.Yes | button.No, button.No) != button.Yes:
            return ""
    return full


class FileActions:
    """File menu actions for a window with ``document``, ``drawings``, ``recent_menu`` and ``say``."""

    def ask_to_save(self) -> bool:
        """True when it is fine to drop the current design (saved, discarded, or unchanged)."""
        if self.document.undo_stack.isClean():
            return True
        button = QMessageBox.StandardButton
        answer = QMessageBox.question(self, "Unsaved changes", "The design has changes that are not saved. "
                                      "Save them first?", button.Save | button.Discard | button.Cancel, button.Save)
        if answer == button.Save:
            return self.save()
        return answer == button.Discard

    def new_design(self):
        if self.ask_to_save():
            self.note = ""
            self.document.replace(empty())
            self.drawings.fit_all()

    def open_dialog(self):
        """File > Open: unsaved changes are asked about first, then the file is chosen."""
        if not self.ask_to_save():
            return
        path, _ = QFileDialog.getOpenFileName(self, "Open a mechanism", "", FILE_FILTER)
        if path:
            self.open_path(path)

    def open_path(self, path, ask: bool = False) -> bool:
        """Load ``path``; a bad file shows its message and leaves the current design as it is."""
        if ask and not self.ask_to_save():
            return False
        try:
            mechanism = kinematics.load_mechanism(path)
        except (KinematicsError, OSError) as error:
            self.show_error("Cannot open the file", file_message(path, error))
            return False
        remove_stale_temporaries(path)  # what saves of this design cut short left beside it
        self.document.replace(mechanism, path)
        self.note = "; ".join(mechanism.warnings)  # after the history is cleared, which clears the note
        self.drawings.fit_all()
        remember(path)
        self._fill_recent()
        return True

    def _fill_recent(self):
        self.recent_menu.clear()
        paths = recent_files()
        for number, path in enumerate(paths, start=1):
            # The number is the menu's key for the first nine (&1 … &9); an & in a path is shown, not a key.
            shown = path.replace("&", "&&")
            label = f"&{number}  {shown}" if number < 10 else f"{number}  {shown}"
            self.recent_menu.addAction(label, lambda p=path: self.open_path(p, ask=True))
        if paths:
            self.recent_menu.addSeparator()
            self.recent_menu.addAction("&Clear list", self._clear_recent)
        self.recent_menu.setEnabled(bool(paths))

    def _clear_recent(self):
        clear_recent()
        self._fill_recent()

    def save(self) -> bool:
        if not self.document.path:
            return self.save_as()
        return self.save_to(self.document.path)

    def save_as(self) -> bool:
        doc = self.document
        path = save_path(self, "Save the mechanism", suggested_name(doc.path, doc.mechanism.title, ".json"),
                         FILE_FILTER)
        return bool(path) and self.save_to(path)

    def save_to(self, path) -> bool:
        try:
            if not save_asking(self, self.document.mechanism, path):
                self.say(f"not saved: {path} was left as it was")
                return False
        except (KinematicsError, OSError) as error:
            self.show_error("Cannot save", file_message(path, error))
            return False
        self.document.path = str(path)
        self.document.undo_stack.setClean()
        remember(path)
        self._fill_recent()
        self._update_title()
        return True

    def show_error(self, title: str, text: str):
        """A refusal the user must see: a message box that stays until dismissed."""
        QMessageBox.warning(self, title, text)
