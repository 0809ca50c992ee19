"""Drawing a construction: the Sheet of recorded primitives that the printer,
the DXF writer and the window replay. No Qt here.

>>> import kinematics
>>> from kinematics.drawing import draw_sheet
>>> mech = kinematics.load_mechanism({"kinepoly": 1, "length_unit": "mm",
...     "points": {"O": [0, 0], "A": [30, 40]}, "ground": ["O"], "links": {"crank": ["O", "A"]},
...     "driver": {"link": "crank", "pivot": "O", "speed": {"value": 60, "unit": "rpm"}}})
>>> sheet = draw_sheet(kinematics.construct(kinematics.solve(mech)), paper="A4")
>>> sheet.width, sheet.height, sheet.views["space"].scale_text
(210.0, 297.0, '2:1')
"""

from .layout import PAPER, draw_model, draw_sheet
from .sheet import Arrow, Circle, Hatch, Line, Note, Polyline, Recorder, Ref, Sheet, Strokes, Text, View
from .table import results_csv

__all__ = ["PAPER", "Arrow", "Circle", "Hatch", "Line", "Note", "Polyline", "Recorder", "Ref", "Sheet", "Strokes",
           "Text", "View", "draw_model", "draw_sheet", "results_csv"]
