"""What the cycle plot draws, read from the core's :class:`kinematics.Sweep`
(numpy only, no Qt): the quantities a design offers, their values in the
units the window shows, the x axis (driver angle or time), the peaks
readout, the y range and the grid lines.

>>> Quantity("velocity", "x", "P").label
'vₓ P'
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from kinematics.cycle.advantage import advantage_over_cycle
from kinematics.model.mechanism import GROUND

from .display_units import LENGTH_SYSTEMS, angular_speed

# family -> symbol; each family is one row of the plot (one unit per row)
FAMILIES = {
    "velocity": "v",
    "acceleration": "a",
    "angular velocity": "ω",
    "angular acceleration": "α",
    "jerk": "j",
    "angular jerk": "dα/dt",
}
# The output's mechanical advantage (kinematics.cycle.advantage): its unit follows the output, a
# link's torque or a point's force per unit driver torque, so each is a family of its own.
ADVANTAGE_UNITS = {"mechanical advantage": "N·m/N·m", "mechanical advantage (force)": "N/(N·m)"}
FAMILIES |= dict.fromkeys(ADVANTAGE_UNITS, "MA")
# Towards a toggle the advantage grows without bound: the plot holds it to this many times its least
# value, so the rest of the cycle stays readable (the peaks table gives the angles where it locks).
ADVANTAGE_SHOWN_UP_TO = 20.0
POINT_FAMILIES = ("velocity", "acceleration", "jerk")  # of a point; "angular …" of a link, sliding … of a slide
_POINT_TABLES = {"velocity": "velocities", "acceleration": "accelerations", "jerk": "jerks"}
_FORMS = {"magnitude": "|{}|", "x": "{}ₓ", "y": "{}ᵧ", "rate": "{}", "sliding": "{}", "output": "{}"}
# A subscript s, not a dot over s: the double dot (combining U+0308) is lost in common fonts.
_SLIDING_SYMBOLS = {"velocity": "vₛ", "acceleration": "aₛ", "jerk": "jₛ"}


@dataclass(frozen=True)
class Quantity:
    """One plottable series.

    Attributes
    ----------
    family : a key of :data:`FAMILIES` (the unit it is shown in).
    form : "magnitude", "x" or "y" of a point's vector; "rate" of a link; "sliding" of a slide.
    subject : the point, link or slide name.
    """

    family: str
    form: str
    subject: str

    @property
    def symbol(self) -> str:
        return _SLIDING_SYMBOLS[self.family] if self.form == "sliding" else FAMILIES[self.family]

    @property
    def label(self) -> str:
        return f"{_FORMS[self.form].format(self.symbol)} {self.subject}"

    @property
    def description(self) -> str:
        """The label in words, for a tooltip.

        >>> Quantity("acceleration", "sliding", "slot").description
        'sliding acceleration of slide slot, along its guide'
        """
        if self.form == "sliding":
            return f"sliding {self.family} of slide {self.subject}, along its guide"
        if self.form == "rate":
            return f"{self.family} {self.symbol} of link {self.subject} (counter-clockwise positive)"
        if self.form == "output":
            return (f"mechanical advantage of the output {self.subject} against the driver, held to "
                    f"{ADVANTAGE_SHOWN_UP_TO:g} times its least value near a toggle")
        what = "magnitude" if self.form == "magnitude" else f"{self.form} component"
        return f"{what} of the {self.family} of point {self.subject}"


def available(mechanism) -> list[Quantity]:
    """Every quantity worth plotting: moving points, links, slides (fixed points never move)."""
    found = []
    for point in mechanism.points:
        if point not in mechanism.ground:
            found += [Quantity(family, "magnitude", point) for family in POINT_FAMILIES]
            found += [Quantity(family, axis, point) for family in POINT_FAMILIES for axis in "xy"]
    for link in mechanism.links:
        found += [Quantity(f"angular {family}", "rate", link) for family in POINT_FAMILIES]
    for slide in mechanism.slides:
        found += [Quantity(family, "sliding", slide) for family in POINT_FAMILIES]
    output = mechanism.output or {}
    if output and mechanism.driver.speed_rad_s != 0.0:
        family = "mechanical advantage" if "link" in output else "mechanical advantage (force)"
        found.append(Quantity(family, "output", output.get("link") or output["point"]))
    return found


def default_choice(mechanism) -> list[Quantity]:
    """What a designer looks at first: the declared output, else the first coupler point, else the last link."""
    output = mechanism.output or {}
    if "link" in output:
        return [Quantity(f"angular {family}", "rate", output["link"]) for family in ("velocity", "acceleration")]
    paths = [p for p in mechanism.points if _on_one_link(mechanism, p)]
    point = output.get("point") or (paths[-1] if paths else None)
    if point is not None:
        return [Quantity(family, "magnitude", point) for family in ("velocity", "acceleration")]
    return [Quantity("angular velocity", "rate", list(mechanism.links)[-1])] if mechanism.links else []


def si_values(sweep, quantity: Quantity) -> np.ndarray:
    """The (N,) series in SI (m/s, m/s², m/s³, rad/s, rad/s², rad/s³, N·m/N·m, N/(N·m)), in the
    order the sweep holds it."""
    if quantity.form == "output":
        found = advantage_over_cycle(sweep)
        cap = ADVANTAGE_SHOWN_UP_TO * found.least_advantage
        return np.clip(found.mechanical_advantage, -cap, cap)
    if quantity.form == "rate":
        return getattr(sweep, quantity.family.replace(" ", "_"))[quantity.subject]
    if quantity.form == "sliding":
        return getattr(sweep, f"sliding_{quantity.family}")[quantity.subject]
    vectors = getattr(sweep, _POINT_TABLES[quantity.family])
    vector = vectors[:, sweep.point_names.index(quantity.subject)]
    if quantity.form == "magnitude":
        return np.linalg.norm(vector, axis=1)
    return vector[:, 0 if quantity.form == "x" else 1]


@dataclass(frozen=True)
class Units:
    """The window's choice: lengths in mm, m or in; ω in rad/s or rpm (α stays rad/s², dα/dt rad/s³)."""

    length: str = "mm"
    speed: str = "rad/s"

    def unit(self, family: str) -> str:
        length = LENGTH_SYSTEMS[self.length]
        return {"velocity": length.velocity_unit, "acceleration": length.acceleration_unit,
                "jerk": length.jerk_unit, "angular velocity": self.speed, "angular acceleration": "rad/s²",
                "angular jerk": "rad/s³", **ADVANTAGE_UNITS}[family]

    def shown(self, family: str, si: np.ndarray) -> np.ndarray:
        """``si`` converted to this family's shown unit."""
        if family in POINT_FAMILIES:  # a length per second, per second squared, per second cubed
            return si / LENGTH_SYSTEMS[self.length].metres
        if family == "angular velocity":
            return angular_speed(si, self.speed)
        return si


@dataclass(frozen=True)
class CycleAxis:
    """The plot's x axis over one sweep.

    A full turn is shown as driver angle wrapped into [0°, 360°); a driver that rocks
    between dead points keeps its range in one piece, centred in [0°, 360°). Time runs
    from the reference pose at constant driver speed. A cylinder-driven design's sweep runs
    over its stroke, shown by the cylinder's length in mm (kind "length") or by time.

    Attributes
    ----------
    kind : "angle" (degrees), "length" (a cylinder's, mm) or "time" (seconds).
    along : (N,) abscissa of each sample, in the sweep's order.
    x : (N,) the same ascending; ``order`` picks the sweep's samples in that order.
    span : (low, high) of the axis: [0, 360) for a full turn, the dead points of a rocking driver.
    first_deg, sense, full_turn, rad_s : the sweep's first angle, its sense (+1 CCW), whether
        it is a full turn, and the driver's speed in rad/s, to map angles to the axis and back.
    angles_deg : a cylinder's sweep: the direction of its axis at each sample, in the sweep's
        order (a pose on screen is placed on the axis, and a click turned into a pose, through
        it; over a stroke it turns one way), else None.
    """

    kind: str
    along: np.ndarray
    x: np.ndarray
    order: np.ndarray
    span: tuple
    first_deg: float
    sense: float
    full_turn: bool
    rad_s: float
    angles_deg: np.ndarray | None = None

    @property
    def label(self) -> str:
        """The axis's name."""
        return {"angle": "driver angle", "length": "cylinder length"}.get(self.kind, "time from the reference pose")

    @property
    def unit(self) -> str:
        """The axis's unit."""
        return {"angle": "°", "length": "mm"}.get(self.kind, "s")

    def where(self, value: float) -> str:
        """An abscissa as a readout says it ("47.4°", "800.0 mm", "1.25 s")."""
        if self.kind == "time":
            return f"{value:.4g} s"
        return f"{value:.1f}{self.unit if self.kind == 'angle' else ' mm'}"

    def x_of_angle(self, angle_deg: float) -> float:
        """Where driver angle ``angle_deg`` (any turn; a cylinder's axis direction) lies on this axis."""
        if self.angles_deg is not None:
            by_angle = np.argsort(self.angles_deg)
            return float(np.interp(angle_deg, self.angles_deg[by_angle], self.along[by_angle]))
        if self.kind == "angle":
            if self.full_turn:
                return angle_deg % 360.0
            middle = 0.5 * (self.span[0] + self.span[1])
            return middle + (angle_deg - middle + 180.0) % 360.0 - 180.0
        turned = self.sense * (angle_deg - self.first_deg)
        turned = turned % 360.0 if self.full_turn else abs(turned)
        return math.radians(turned) / self.rad_s

    def angle_of_x(self, x: float) -> float:
        """The driver angle in [0°, 360°) at abscissa ``x`` (the window's convention)."""
        if self.angles_deg is not None:
            return float(np.interp(x, self.x, self.angles_deg[self.order])) % 360.0
        if self.kind == "angle":
            return x % 360.0
        return (self.first_deg + self.sense * math.degrees(x * self.rad_s)) % 360.0


def cycle_axis(sweep, kind: str = "angle") -> CycleAxis:
    """The x axis of ``sweep``; ``kind="time"`` needs ``sweep.time_s`` (constant driver speed)."""
    angles = sweep.driver_angle_deg
    common = {"first_deg": float(angles[0]), "sense": 1.0 if angles[-1] >= angles[0] else -1.0,
              "full_turn": sweep.full_turn, "rad_s": abs(sweep.mechanism.driver.speed_rad_s)}
    if sweep.driver_length_m is not None:
        common["angles_deg"] = np.asarray(angles, float)
        if kind != "time":
            lengths_mm = np.asarray(sweep.driver_length_m, float) * 1e3
            order = np.argsort(lengths_mm, kind="stable")
            return CycleAxis("length", lengths_mm, lengths_mm[order], order,
                             (float(lengths_mm.min()), float(lengths_mm.max())), **common)
    if kind == "time":
        if sweep.time_s is None:
            raise ValueError("time axis: the driver accelerates, so the sweep has no time (use the driver angle)")
        if sweep.full_turn:
            span = (0.0, 2.0 * math.pi / common["rad_s"])
        else:
            span = (0.0, float(sweep.time_s[-1]))
        return CycleAxis("time", sweep.time_s, sweep.time_s, np.arange(len(angles)), span, **common)
    if sweep.full_turn:
        wrapped = angles % 360.0
        span = (0.0, 360.0)
    else:
        middle = 0.5 * (angles.min() + angles.max())
        wrapped = angles - 360.0 * math.floor(middle / 360.0)
        span = (float(wrapped.min()), float(wrapped.max()))
    order = np.argsort(wrapped, kind="stable")
    return CycleAxis("angle", wrapped, wrapped[order], order, span, **common)


def length_at_angle_mm(sweep, angle_deg: float) -> float:
    """A cylinder's length (mm) where its axis points at ``angle_deg`` over the swept stroke (the
    axis turns one way over a stroke), for a click on a plot placed by angle."""
    angles = np.asarray(sweep.driver_angle_deg, float)
    by_angle = np.argsort(angles)
    return float(np.interp(angle_deg, angles[by_angle], np.asarray(sweep.driver_length_m)[by_angle] * 1e3))


def peak(values: np.ndarray, clear: np.ndarray) -> int:
    """Index of the largest magnitude of ``values`` among the ``clear`` samples (signed either way)."""
    return int(np.flatnonzero(clear)[np.argmax(np.abs(values[clear]))])


def steady_range(current: tuple, low: float, high: float, margin: float = 0.06, slack: float = 0.6) -> tuple:
    """A y range for data over [low, high] that keeps ``current`` while it still fits.

    Zero is always in view (a magnitude reads from zero, a signed rate shows its reversals).
    The range changes only when the data leaves it or fills less than ``slack`` of it, so
    the axis holds still while a joint is dragged a little.

    >>> steady_range((0.0, 10.0), 1.0, 9.0)
    (0.0, 10.0)
    >>> steady_range((0.0, 10.0), 1.0, 12.0)
    (-0.72, 12.72)
    """
    low, high = min(low, 0.0), max(high, 0.0)
    extent = (high - low) or 1.0
    if current[0] <= low and high <= current[1] and extent >= slack * (current[1] - current[0]):
        return tuple(current)
    return (low - margin * extent, high + margin * extent)


def grid_segments(xs, ys, x_range: tuple, y_range: tuple) -> tuple:
    """x and y arrays of grid lines as point pairs: verticals at ``xs``, horizontals at ``ys``."""
    x = [value for v in xs for value in (v, v)] + [value for _ in ys for value in x_range]
    y = [value for _ in xs for value in y_range] + [value for v in ys for value in (v, v)]
    return np.asarray(x, float), np.asarray(y, float)


def readable(value: float) -> str:
    """Four significant figures without an exponent over the range a machine shows (1e-3 to 1e7)."""
    magnitude = abs(value)
    if magnitude == 0.0 or not 1e-3 <= magnitude < 1e7:
        return f"{value:.4g}"
    return f"{value:.{max(0, 3 - math.floor(math.log10(magnitude)))}f}"


def steps_text(steps: int) -> str:
    """A step count with its thousands set apart by a space (digit grouping of ISO 80000-1).

    >>> steps_text(36000)
    '36 000 steps'
    """
    return f"{steps:,} steps".replace(",", " ")


def peak_text(quantity: Quantity, values: np.ndarray, axis: CycleAxis, unit: str, clear: np.ndarray) -> str:
    """The readout of one plotted series: its largest magnitude (with sign) and where on the axis;
    for the mechanical advantage, its least (its largest is infinite at a toggle)."""
    least = quantity.form == "output"
    at = int(np.flatnonzero(clear)[np.argmin(np.abs(values[clear]))]) if least else peak(values, clear)
    where = axis.where(axis.along[at])
    return f"<b>{quantity.label}</b> {'least' if least else 'peak'} {readable(values[at])} {unit} at {where}"


def major_ticks(axis, low: float, high: float, pixels: float) -> list:
    """Values of the major ticks a pyqtgraph axis item draws over [low, high] in ``pixels``."""
    levels = axis.tickValues(low, high, max(pixels, 1.0))
    return list(levels[0][1]) if levels else []


def _on_one_link(mechanism, point: str) -> bool:
    bodies = mechanism.bodies_of(point)
    return len(bodies) == 1 and bodies[0] != GROUND


def coupler_paths_mm(sweep, mechanism) -> dict[str, np.ndarray]:
    """Paths over the cycle of the points carried by exactly one link (not ground).

    Returns
    -------
    dict
        point name -> (N, 2) positions in mm, in the order of ``sweep.driver_angle_deg``.
    """
    return {p: sweep.positions[:, sweep.point_names.index(p)] * 1e3 for p in mechanism.points
            if _on_one_link(mechanism, p)}
