"""Drawing a construction: the Sheet of recorded primitives that the printer,
the DXF writer and (later) the window replay. No Qt here."""

from .layout import PAPER, draw_model, draw_sheet
from .sheet import Arrow, Circle, Hatch, Line, Note, Polyline, Recorder, Sheet, Text, View
from .table import results_csv

__all__ = ["PAPER", "Arrow", "Circle", "Hatch", "Line", "Note", "Polyline", "Recorder", "Sheet", "Text", "View",
           "draw_model", "draw_sheet", "results_csv"]
