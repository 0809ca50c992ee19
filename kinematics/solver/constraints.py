"""The numeric formulation: constraint equations over point coordinates.

Every constraint is bilinear in the coordinates, (P_a − P_b) ∘ (P_c − P_d) = k,
with ∘ the dot or the cross product, so the Jacobian and the exact
acceleration right-hand side follow from the same four indices:

- a link's first two points keep their distance (dot),
- each further point keeps its dot and cross products with that base pair,
- a slide point keeps zero cross product with its guide line,
- the driver: cross(u(θ), Q − O) = 0, u(θ) the unit vector at the driver angle.

This module knows nothing of dyads or polygons: it is the independent check
of the graphical construction.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import cached_property, lru_cache

import numpy as np

from ..model.mechanism import Mechanism
from ..model.memo import remembered

DOT, CROSS = 0, 1


@dataclass(frozen=True, eq=False)
class ConstraintSystem:
    """Index arrays of one mechanism's constraints (SI coordinates).

    ``names`` orders the points; ``x0`` is the reference pose (n, 2);
    ``free`` marks the points that move; rows a, b, c, d index points;
    ``owner`` says, per row, which link or slide it comes from.
    """

    names: tuple
    x0: np.ndarray
    free: np.ndarray
    kind: np.ndarray
    a: np.ndarray
    b: np.ndarray
    c: np.ndarray
    d: np.ndarray
    k: np.ndarray
    weight: np.ndarray
    owner: tuple
    driver_pivot: int
    driver_point: int

    @property
    def unknown_columns(self) -> np.ndarray:
        """Column indices (into the flattened (n, 2) coordinates) of the unknowns."""
        return np.flatnonzero(np.repeat(self.free, 2))

    def values(self, x: np.ndarray) -> np.ndarray:
        """Constraint values at coordinates x of shape (..., n, 2)."""
        return (_product(self.kind, x[..., self.a, :] - x[..., self.b, :],
                         x[..., self.c, :] - x[..., self.d, :]) - self.k) * self.weight

    def jacobian(self, x: np.ndarray, rows: np.ndarray | None = None) -> np.ndarray:
        """d(values)/d(flattened coordinates of all points), shape (..., m, 2n); only ``rows`` if given."""
        rows = np.arange(len(self.kind)) if rows is None else np.asarray(rows, dtype=int)
        a, b, c, d = self.a[rows], self.b[rows], self.c[rows], self.d[rows]
        u = x[..., a, :] - x[..., b, :]
        v = x[..., c, :] - x[..., d, :]
        keep, turn_first, turn_second = (f[rows] for f in self.factors)
        # dot: d/du = v, d/dv = u; cross: d/du = (v_y, −v_x), d/dv = (−u_y, u_x).
        du = v * keep + v[..., ::-1] * turn_first
        dv = u * keep + u[..., ::-1] * turn_second
        # Each row touches at most four points: its derivatives are placed, not multiplied out of
        # dense selectors (which took (m, 2, 2n) memory, gigabytes for a link of ten thousand points).
        # Within one assignment every row appears once, so no placement overwrites another.
        place = np.arange(len(rows))
        jac = np.zeros(x.shape[:-2] + (len(rows), 2 * len(self.names)))
        for gradient, plus, minus in ((du, a, b), (dv, c, d)):
            for k in (0, 1):
                jac[..., place, 2 * plus + k] += gradient[..., k]
                jac[..., place, 2 * minus + k] -= gradient[..., k]
        return jac

    @cached_property
    def factors(self):
        """The per-row weights that turn the products u ∘ v into dot or cross rows."""
        is_dot = (self.kind == DOT)[:, None]
        w = self.weight[:, None]
        return (is_dot * w, ~is_dot * w * np.array([1.0, -1.0]), ~is_dot * w * np.array([-1.0, 1.0]))

    def quadratic_term(self, xdot: np.ndarray) -> np.ndarray:
        """Second time derivative of the values at zero acceleration: 2·(u̇ ∘ v̇)."""
        return 2.0 * _product(self.kind, xdot[..., self.a, :] - xdot[..., self.b, :],
                              xdot[..., self.c, :] - xdot[..., self.d, :]) * self.weight


    def cubic_term(self, xdot: np.ndarray, xddot: np.ndarray) -> np.ndarray:
        """Third time derivative of the values at zero jerk: 3·(ü ∘ v̇ + u̇ ∘ v̈)."""
        a, b, c, d = self.a, self.b, self.c, self.d
        first_dot, second_dot = xdot[..., a, :] - xdot[..., b, :], xdot[..., c, :] - xdot[..., d, :]
        first_ddot, second_ddot = xddot[..., a, :] - xddot[..., b, :], xddot[..., c, :] - xddot[..., d, :]
        return 3.0 * (_product(self.kind, first_ddot, second_dot)
                      + _product(self.kind, first_dot, second_ddot)) * self.weight


def _product(kind, u, v):
    dot = u[..., 0] * v[..., 0] + u[..., 1] * v[..., 1]
    cross = u[..., 0] * v[..., 1] - u[..., 1] * v[..., 0]
    return np.where(kind == DOT, dot, cross)


def build_system(mechanism: Mechanism) -> ConstraintSystem:
    """The constraint rows of the links and slides of ``mechanism``."""
    names = tuple(mechanism.points)
    free, (kind, a, b, c, d), owner = _rows(names, tuple(mechanism.links.items()),
                                                       tuple(mechanism.slides.values()), mechanism.ground)
    k_m = mechanism.metres_per_unit
    x0 = np.array([mechanism.points[n] for n in names], dtype=float).reshape(-1, 2) * k_m
    u, v = x0[a] - x0[b], x0[c] - x0[d]
    dot = u[:, 0] * v[:, 0] + u[:, 1] * v[:, 1]
    cross = u[:, 0] * v[:, 1] - u[:, 1] * v[:, 0]
    k = np.where(kind == DOT, dot, cross)
    # Scale each row to units of length so that the Jacobian's columns compare.
    weight = 1.0 / np.maximum(np.hypot(u[:, 0], u[:, 1]), 1e-300)
    pivot = point = -1
    if mechanism.driver is not None:
        pivot = names.index(mechanism.driver.pivot)
        point = names.index(next(p for p in mechanism.links[mechanism.driver.link] if p != mechanism.driver.pivot))
    return ConstraintSystem(names=names, x0=x0, free=free, kind=kind, a=a, b=b, c=c, d=d, k=k,
                            weight=weight, owner=owner, driver_pivot=pivot, driver_point=point)


@lru_cache(maxsize=64)
def _rows(names: tuple, links: tuple, slides: tuple, ground: tuple):
    """(free, (kind, a, b, c, d), owner) of a topology: which points move, and each constraint
    row's kind, point indices and owning link or slide. They follow from the
    names alone, so a drag, which makes a new mechanism each frame, works them out once (the arrays
    are read-only)."""
    index = {name: i for i, name in enumerate(names)}
    free = np.array([n not in ground for n in names], dtype=bool)
    rows = []  # (kind, a, b, c, d, owner)
    for link, pts in links:
        p1, p2 = index[pts[0]], index[pts[1]]
        rows.append((DOT, p2, p1, p2, p1, link))
        for p in pts[2:]:
            j = index[p]
            rows.append((DOT, p2, p1, j, p1, link))
            rows.append((CROSS, p2, p1, j, p1, link))
    for slide in slides:
        e, f = index[slide.line[0]], index[slide.line[1]]
        rows.append((CROSS, f, e, index[slide.point], e, slide.name))
    table = np.array([r[:5] for r in rows], dtype=int).reshape(-1, 5)
    # Rows that touch no moving point hold by themselves.
    moving = free[table[:, 1:]].any(axis=1)
    table = np.ascontiguousarray(table[moving].T)
    for array in (free, table):
        array.flags.writeable = False
    return free, tuple(table), tuple(r[5] for r, keep in zip(rows, moving.tolist(), strict=True) if keep)


def constraint_system(mechanism: Mechanism) -> ConstraintSystem:
    """The constraint system of ``mechanism``, built once for as long as the mechanism lives."""
    return remembered(mechanism, "constraints", lambda: build_system(mechanism))


def reference_driver_angle(system: ConstraintSystem) -> float:
    """Driver angle of the reference pose, radians."""
    r = system.x0[system.driver_point] - system.x0[system.driver_pivot]
    return float(np.arctan2(r[1], r[0]))
