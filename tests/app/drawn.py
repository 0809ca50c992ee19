"""What a scene shows, read off its items: the items of a Ref, a label's text, boxes on screen."""

from PySide6.QtWidgets import QGraphicsSimpleTextItem

from app.scene_backend import ITEM_HANDLE, ITEM_REF
from kinematics.drawing import Ref


def texts(scene, ref) -> list:
    """The text items showing ``ref`` in ``scene``."""
    return [item for item in scene.items() if isinstance(item, QGraphicsSimpleTextItem) and item.data(ITEM_REF) == ref]


def joint_label(scene, name: str) -> str:
    """The text beside joint ``name`` in the space diagram."""
    (label,) = texts(scene, Ref("point", name))
    return label.text()


def joints(scene) -> set:
    """The names of the joints the space diagram draws a pin for."""
    return {item.data(ITEM_REF).name for item in scene.items()
            if item.data(ITEM_HANDLE) and item.data(ITEM_REF).kind == "point"}


def on_screen(view, item):
    """The box ``item`` covers in ``view``'s viewport pixels (items that keep their size included)."""
    return item.deviceTransform(view.viewportTransform()).mapRect(item.boundingRect())


def outline(item) -> list:
    """The corners (x, y) of a drawn outline, open (a path item) or closed (a polygon item)."""
    if hasattr(item, "polygon"):
        return [(p.x(), p.y()) for p in item.polygon()]
    path = item.path()
    return [(path.elementAt(i).x, path.elementAt(i).y) for i in range(path.elementCount())]
