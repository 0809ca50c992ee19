"""Polygon legends in a short view: in a 1024×700 window with the drawings given 260 pixels of
height (the table and tabs dragged larger) the legend folds into a row of swatches (its words in a
tooltip) so that no vector is drawn under it; at 1600×1000 it is the full list."""

import json
from pathlib import Path

import pytest
from PySide6.QtCore import QEvent, QPoint
from PySide6.QtGui import QHelpEvent
from PySide6.QtWidgets import QApplication, QGraphicsLineItem, QToolTip

from app.views import LEGEND_SHARE
from tests.app.drawn import on_screen

SAMPLE = Path(__file__).resolve().parents[2] / "samples" / "cap-press-feeder.json"


SHORT_DRAWINGS = 260  # pixels of height for the three drawings in the short case


def _window(make_window, width, height, sample=SAMPLE):
    window = make_window(json.loads(sample.read_text(encoding="utf-8")))
    window.resize(width, height)
    QApplication.processEvents()
    if width < 1600:
        splitter = window.centralWidget()
        splitter.setSizes([SHORT_DRAWINGS, sum(splitter.sizes()) - SHORT_DRAWINGS])
        QApplication.processEvents()
    window.drawings.fit_all()
    QApplication.processEvents()
    return window


@pytest.mark.parametrize("size, folded", [((1024, 700), True), ((1600, 1000), False)])
def test_the_legend_folds_only_where_the_view_is_short(make_window, size, folded):
    window = _window(make_window, *size)
    for view in (window.drawings.velocity_view, window.drawings.acceleration_view):
        assert view.folded() is folded
        assert view.legend_height() <= LEGEND_SHARE * view.viewport().height() or not folded
        # No vector of the polygon runs under the title and legend.
        lines = [item for item in view.scene().items() if isinstance(item, QGraphicsLineItem) and item.isVisible()]
        assert lines
        top = min(on_screen(view, item).top() for item in lines)
        assert top >= view.legend_height() - 1.0, (view.title, top, view.legend_height())


def test_a_folded_legend_gives_its_words_in_a_tooltip(make_window):
    window = _window(make_window, 1024, 700)
    view = window.drawings.velocity_view
    assert view.folded()
    at = QPoint(20, int(view.legend_rows_height()) - 6)
    event = QHelpEvent(QEvent.Type.ToolTip, at, view.viewport().mapToGlobal(at))
    QApplication.sendEvent(view.viewport(), event)
    words = QToolTip.text()
    assert words.splitlines() == [pen.legend for pen in view.scene().used_pens()]
    assert "result vector" in words


def test_a_folded_legend_is_drawn_in_each_pen_used(make_window):
    window = _window(make_window, 1024, 700)
    view = window.drawings.velocity_view
    image = view.viewport().grab().toImage()
    from app.views import LEGEND_TOP, SWATCH, SWATCH_GAP

    for i, pen in enumerate(view.scene().used_pens()):
        if pen.dash != "solid":
            continue
        x = int(10 + i * (SWATCH + SWATCH_GAP) + 4)
        assert image.pixelColor(x, int(LEGEND_TOP - 4)).name() == pen.colour, pen.legend



def test_the_force_panes_message_stays_above_the_polygon_in_a_small_window(make_window):
    window = _window(make_window, 1024, 700, SAMPLE.parent / "tile-trimmer-quick-return.json")
    window.drawings.show_forces(True)
    QApplication.processEvents()
    window.drawings.fit_all()
    QApplication.processEvents()
    view = window.drawings.force_view
    assert view.folded() and view.message
    where, words = view._message_lines()
    # One line, cut short with an ellipsis; the whole message is in the legend's tooltip.
    assert words.endswith("…") and words[:-1] in view.message and view.message in view.legend_words()
    assert where.bottom() <= view.legend_height() + 1e-9
    lines = [item for item in view.scene().items() if isinstance(item, QGraphicsLineItem) and item.isVisible()]
    assert min(on_screen(view, item).top() for item in lines) >= view.legend_height() - 1.0


@pytest.mark.parametrize("name", sorted(p.name for p in SAMPLE.parent.glob("*.json")))
def test_every_sample_fits_a_1024_by_700_window(make_window, name):
    # No tab's form may hold the window taller than the screen it was made for: the Design tab scrolls.
    window = make_window(json.loads((SAMPLE.parent / name).read_text(encoding="utf-8")))
    window.resize(1024, 700)
    QApplication.processEvents()
    assert (window.width(), window.height()) == (1024, 700)
    assert window.minimumSizeHint().height() <= 700
