"""Our own SVG icons load (from icons/ in the source tree, from app/icons when installed)."""

import pytest
from PySide6.QtSvg import QSvgRenderer

from app.icons import ICON_FOLDER, icon


@pytest.mark.parametrize("name", sorted(p.stem for p in ICON_FOLDER.glob("*.svg")))
def test_every_icon_is_a_valid_svg_that_draws(qapp, name):
    assert QSvgRenderer(str(ICON_FOLDER / f"{name}.svg")).isValid()
    assert not icon(name).pixmap(24, 24).isNull()


def test_the_icons_the_window_uses_are_there():
    assert {"kinepoly", "play", "pause", "fit"} <= {p.stem for p in ICON_FOLDER.glob("*.svg")}
