"""The space diagram: the linkage to scale in the pose the core solved.

Scene units are millimetres of the machine, y up through
:func:`~app.drawing_kit.scene_xy`. Joints, pivot signs, blocks and labels
keep their screen size at any zoom; links and guides are drawn to scale.
Items are made once per topology and moved in place for each pose.
"""

from __future__ import annotations

import math

from PySide6.QtCore import QLineF, QPointF, QRectF
from PySide6.QtGui import QColor, QPainterPath, QPen, QPolygonF
from PySide6.QtWidgets import (
    QGraphicsEllipseItem,
    QGraphicsItem,
    QGraphicsLineItem,
    QGraphicsPathItem,
    QGraphicsPolygonItem,
    QGraphicsRectItem,
    QGraphicsScene,
)

from kinematics.drawing.style import ANNOTATION, SPACE_GROUND, SPACE_LINK, SPACE_PATH

from .drawing_kit import Label, ScaleBar, declutter, hatch_path, preferred_length, qpen, scene_xy, square

BAR_COLOUR = "#c9d3de"
PLATE_COLOUR = "#dfe6ee"
JOINT_PIXELS = 5.0
HOVER_COLOUR = "#f1c40f"
BLOCK_GAP_PIXELS = 15.0
GUIDE_REACH = 0.25  # a guide runs this fraction of the mechanism's size past its ends


def point_kind(mechanism, name: str) -> str:
    """"pivot" (fixed, on a link), "guide" (a fixed point that only sets a slide's line), "coupler"
    (a marked point carried by one link only) or "joint"."""
    on_slide = any(name in (s.point, *s.line) for s in mechanism.slides.values())
    if name in mechanism.ground:
        return "guide" if on_slide and len(mechanism.bodies_of(name)) == 1 else "pivot"
    if len(mechanism.bodies_of(name)) == 1 and not on_slide:
        links = mechanism.links[mechanism.bodies_of(name)[0]]
        if len(links) > 2 and name not in links[:2]:
            return "coupler"
    return "joint"


def _drawn_to_scale(item) -> bool:
    """False for items (and children of items) that keep their screen size: their bounds are pixels."""
    while item is not None:
        if item.flags() & QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations:
            return False
        item = item.parentItem()
    return True


def _hull_order(points: list) -> list:
    """Indices of ``points`` around their centroid, so a plate outline never crosses itself."""
    cx = sum(p.x() for p in points) / len(points)
    cy = sum(p.y() for p in points) / len(points)
    return sorted(range(len(points)), key=lambda i: math.atan2(points[i].y() - cy, points[i].x() - cx))


class _Link:
    def __init__(self, scene, name: str, points: tuple):
        self.name, self.points = name, points
        self.body = QGraphicsPolygonItem() if len(points) > 2 else QGraphicsLineItem()
        self.centre = [QGraphicsLineItem() for _ in (points if len(points) > 2 else points[:1])]
        if len(points) > 2:
            self.body.setBrush(QColor(PLATE_COLOUR))
            self.body.setPen(QPen(QColor(BAR_COLOUR), 1))
        else:
            bar = QPen(QColor(BAR_COLOUR), 11)
            bar.setCosmetic(True)
            self.body.setPen(bar)
        for item in [self.body, *self.centre]:
            item.setData(0, ("link", name))
            item.setZValue(1 if item is self.body else 2)
            scene.addItem(item)
        self.emphasise(False)

    def emphasise(self, on: bool):
        for line in self.centre:
            line.setPen(qpen(SPACE_LINK, 2.2 if on else 1.0))

    def place(self, at: dict):
        corners = [at[p] for p in self.points]
        if len(corners) == 2:
            self.body.setLine(QLineF(*corners))
            self.centre[0].setLine(QLineF(*corners))
            return
        order = [corners[i] for i in _hull_order(corners)]
        self.body.setPolygon(QPolygonF(order))
        for line, start, end in zip(self.centre, order, order[1:] + order[:1], strict=True):
            line.setLine(QLineF(start, end))


class _Joint:
    def __init__(self, scene, name: str, kind: str):
        self.name = name
        self.sign = None
        if kind == "pivot":
            self.sign = QGraphicsPathItem(hatch_path(9.0))
            self.sign.setPen(qpen(SPACE_GROUND))
            self.sign.setFlag(QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations)
            self.sign.setZValue(3)
            scene.addItem(self.sign)
        radius = JOINT_PIXELS * {"coupler": 0.8, "guide": 0.6}.get(kind, 1.0)
        self.dot = QGraphicsEllipseItem(-radius, -radius, 2 * radius, 2 * radius)
        self.dot.setFlag(QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations)
        self.dot.setZValue(6)
        self.filled = QColor(SPACE_LINK.colour) if kind in ("coupler", "guide") else QColor("white")
        self.dot.setData(0, ("point", name))
        scene.addItem(self.dot)
        self.label = Label(scene, name, SPACE_LINK.colour, z=8, bold=True)
        self.emphasise(False)

    def emphasise(self, on: bool):
        self.dot.setPen(qpen(SPACE_LINK, 1.0))
        self.dot.setBrush(QColor(HOVER_COLOUR) if on else self.filled)

    def place(self, at: QPointF, away: QPointF, gap: float = Label.GAP_PIXELS):
        """Move the joint to ``at``; its label goes towards ``away`` when the scene is decluttered."""
        self.dot.setPos(at)
        if self.sign is not None:
            self.sign.setPos(at)
        self.label_at = (at, (away.x(), away.y()), gap)


class _Slide:
    def __init__(self, scene, slide):
        self.slide = slide
        self.guide = QGraphicsLineItem()
        self.guide.setPen(qpen(SPACE_GROUND, 1.2))
        self.guide.setZValue(0.5)
        self.block = QGraphicsRectItem(-11, -7, 22, 14)
        self.block.setFlag(QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations)
        self.block.setPen(qpen(SPACE_LINK))
        self.block.setBrush(QColor(BAR_COLOUR))
        self.block.setZValue(4)
        for item in (self.guide, self.block):
            item.setData(0, ("slide", slide.name))
            scene.addItem(item)

    def place(self, at: dict, reach: float):
        e, f, d = (at[p] for p in (*self.slide.line, self.slide.point))
        direction = f - e
        length = math.hypot(direction.x(), direction.y()) or 1.0
        ux, uy = direction.x() / length, direction.y() / length
        along = [0.0, length, (d.x() - e.x()) * ux + (d.y() - e.y()) * uy]
        lo, hi = min(along) - reach, max(along) + reach
        self.guide.setLine(e.x() + lo * ux, e.y() + lo * uy, e.x() + hi * ux, e.y() + hi * uy)
        self.block.setPos(d)
        self.block.setRotation(math.degrees(math.atan2(uy, ux)))


class SpaceScene(QGraphicsScene):
    """The space diagram of a Document's mechanism in its solved pose."""

    def __init__(self, parent=None):
        super().__init__(parent)
        # Every item moves with each pose: a spatial index would be rebuilt each frame for nothing.
        self.setItemIndexMethod(QGraphicsScene.ItemIndexMethod.NoIndex)
        self.topology = None
        self.links: dict[str, _Link] = {}
        self.joints: dict[str, _Joint] = {}
        self.slides: list[_Slide] = []
        self.positions_mm: dict[str, QPointF] = {}
        self.scale_bar = None
        self.paths: dict[str, QGraphicsPathItem] = {}
        self.swept = None
        self.motion_rect = QRectF()  # where every joint goes over the cycle

    def show(self, mechanism, solution, sweep=None):
        """Draw ``mechanism`` in the pose of ``solution`` (its reference pose when None), with the
        paths of its coupler points over the cycle ``sweep`` (a :class:`kinematics.Sweep` or None)."""
        # Each point's kind follows from these too.
        topology = (tuple(mechanism.points), tuple(mechanism.links.items()), mechanism.ground,
                    tuple(mechanism.slides.values()))
        if topology != self.topology:
            self.clear()
            self.links = {n: _Link(self, n, pts) for n, pts in mechanism.links.items()}
            self.joints = {p: _Joint(self, p, point_kind(mechanism, p)) for p in mechanism.points}
            self.slides = [_Slide(self, s) for s in mechanism.slides.values()]
            self.scale_bar = ScaleBar(self, ANNOTATION)
            self.paths = {p: self._path_item() for p in mechanism.points if point_kind(mechanism, p) == "coupler"}
            self.topology = topology
            self.swept = None
        if solution is not None:
            self.positions_mm = {n: scene_xy(1e3 * x, 1e3 * y) for n, (x, y) in zip(solution.point_names,
                                                                                     solution.positions, strict=True)}
        else:
            self.positions_mm = {n: scene_xy(*(1e3 * c for c in mechanism.position_m(n))) for n in mechanism.points}
        at = self.positions_mm
        for link in self.links.values():
            link.place(at)
        blocks = {s.point for s in mechanism.slides.values()}
        for name, joint in self.joints.items():
            # A sliding joint's label must clear its block as well.
            joint.place(at[name], self._clear_side(mechanism, name), BLOCK_GAP_PIXELS if name in blocks else
                        Label.GAP_PIXELS)
        reach = GUIDE_REACH * max(1e3 * mechanism.size * mechanism.metres_per_unit, 1.0)
        for slide in self.slides:
            slide.place(at, reach)
        self._place_scale_bar(mechanism)
        self.show_paths(sweep)

    def _path_item(self) -> QGraphicsPathItem:
        item = QGraphicsPathItem()
        item.setPen(qpen(SPACE_PATH, 1.6))
        item.setZValue(0.2)
        # A path of a whole cycle stays put while the driver turns: drawn once into a pixmap, not
        # stroked again at every repaint of the links moving over it.
        item.setCacheMode(QGraphicsItem.CacheMode.DeviceCoordinateCache)
        self.addItem(item)
        return item

    def show_paths(self, sweep):
        """Draw the coupler points' paths over the cycle ``sweep`` (None: none), unless drawn already."""
        if sweep is self.swept:
            return
        self.swept = sweep
        self.motion_rect = QRectF()
        if sweep is not None:
            low, high = sweep.positions.min(axis=(0, 1)) * 1e3, sweep.positions.max(axis=(0, 1)) * 1e3
            self.motion_rect = QRectF(scene_xy(low[0], high[1]), scene_xy(high[0], low[1]))
        for name, item in self.paths.items():
            path = QPainterPath()
            if sweep is not None:
                track = sweep.positions[:, sweep.point_names.index(name)] * 1e3
                path.moveTo(scene_xy(*track[0]))
                for x, y in track[1:]:
                    path.lineTo(scene_xy(x, y))
                if sweep.closes:
                    path.closeSubpath()
            item.setPath(path)

    def _place_scale_bar(self, mechanism):
        # Placed from the reference pose, so it stays put while the driver turns.
        if not mechanism.points:
            self.scale_bar.set_visible(False)
            return
        mm = 1e3 * mechanism.metres_per_unit
        xs = [mm * float(x) for x, _ in mechanism.points.values()]
        ys = [mm * float(y) for _, y in mechanism.points.values()]
        size = max(mm * mechanism.size, 1.0)
        length = preferred_length(0.25 * size)
        self.scale_bar.set_visible(True)
        self.scale_bar.place(scene_xy(min(xs), min(ys) - 0.22 * size), length, 0.015 * size,
                             f"bar {length:g} mm (space diagram to scale)")

    def _clear_side(self, mechanism, name: str) -> QPointF:
        """The screen direction from joint ``name`` least crowded by the links meeting there.

        A fixed pivot's label goes to one side, level with it, clear of its hatching below; a
        label that would sit along one of its links is turned square to it.
        """
        at = self.positions_mm
        x, y = at[name].x(), at[name].y()
        side_x = side_y = 0.0
        units = []  # unit vectors from the joint along each link meeting there (plain floats: QPointF sums cost more)
        for body in mechanism.bodies_of(name):
            for other in mechanism.body_points(body) if body != "ground" else ():
                dx, dy = at[other].x() - x, at[other].y() - y
                length = math.hypot(dx, dy)
                if other != name and length > 0:
                    units.append((dx / length, dy / length))
                    side_x, side_y = side_x - dx / length, side_y - dy / length
        if name in mechanism.ground:
            return QPointF(-1.0 if side_x <= 0 else 1.0, -0.25)
        if math.hypot(side_x, side_y) < 1e-6:
            centre = self.centre()
            side_x, side_y = x - centre.x(), y - centre.y()
        length = math.hypot(side_x, side_y)
        if length < 1e-9:
            return QPointF(1.0, -1.0)
        side_x, side_y = side_x / length, side_y / length
        for ux, uy in units:
            if abs(side_x * uy - side_y * ux) < 0.3:
                return QPointF(abs(uy), -ux if uy >= 0 else ux)
        return QPointF(side_x, side_y)

    def declutter(self, mm_per_pixel: float):
        """Place the joint labels clear of each other, the joints and the blocks (needs the view's
        zoom, so the view calls it after :meth:`show`)."""
        obstacles = [square(j.dot.pos(), JOINT_PIXELS * mm_per_pixel) for j in self.joints.values()]
        obstacles += [square(s.block.pos(), 11.0 * mm_per_pixel) for s in self.slides]
        declutter([(j.label, *j.label_at) for j in self.joints.values()], mm_per_pixel, obstacles)

    def centre(self) -> QPointF:
        if not self.positions_mm:
            return QPointF()
        xs = [p.x() for p in self.positions_mm.values()]
        ys = [p.y() for p in self.positions_mm.values()]
        return QPointF(0.5 * (min(xs) + max(xs)), 0.5 * (min(ys) + max(ys)))

    def drawing_rect(self) -> QRectF:
        """The area the mechanism and its guides cover, with a margin for signs and labels
        (empty for a design without points)."""
        if not self.positions_mm:
            return QRectF()
        path = QPainterPath()
        for item in self.items():
            if _drawn_to_scale(item):
                path.addRect(item.sceneBoundingRect())
        rect = path.boundingRect().united(self.motion_rect) if not self.motion_rect.isEmpty() \
            else path.boundingRect()
        pad = 0.06 * max(rect.width(), rect.height(), 1.0)
        return rect.adjusted(-pad, -pad, pad, pad)

    def emphasise(self, links=(), point: str | None = None):
        """Thicken the centre lines of ``links`` and light up joint ``point``."""
        for name, link in self.links.items():
            link.emphasise(name in links)
        for name, joint in self.joints.items():
            joint.emphasise(name == point)
