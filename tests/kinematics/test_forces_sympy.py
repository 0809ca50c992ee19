"""The drive torque against sympy.physics.mechanics (sympy, https://www.sympy.org: an independent
general-purpose reference): Lagrange's equations of the linkage with one generalised coordinate,
the crank angle q, with every body's position written in closed form in q, and the drive torque
as the generalised force on q. Nothing of Kinepoly's kinematics or forces is used on that side;
only the designs' defining numbers (lengths, masses, the centres in each link's own axes)."""

import functools
import math
from dataclasses import replace

import numpy as np
import pytest
import sympy as sp
from sympy.physics.mechanics import (
    LagrangesMethod,
    Lagrangian,
    Particle,
    Point,
    ReferenceFrame,
    RigidBody,
    dynamicsymbols,
    inertia,
)

import kinematics
from kinematics.dynamics import forces
from kinematics.model.mass import LinkMass, Load, MassData, PointMass
from tests.designs import four_bar, load, slider_crank

# Both sides are exact formulations in double precision: 1e-9 of the torque's size.
TOLERANCE = 1e-9


def _local(mech, link, centre_mm):
    """The centre in the link's own axes (along its first side, and turned +90°), metres, from the
    design's reference numbers."""
    p, q = (np.array(mech.points[n], float) for n in mech.links[link][:2])
    u = (q - p) / np.linalg.norm(q - p)
    r = (np.array(centre_mm) - p) / 1000.0
    return float(r @ u), float(-r[0] * u[1] + r[1] * u[0])


def _lagrange_torque(bodies, frame, crank_frame, q, loads=()):
    """T(q, q̇, q̈) from Lagrange's equations, as a function of (angle rad, speed rad/s, acceleration rad/s²)."""
    torque = sp.symbols("T")
    lagrangian = Lagrangian(frame, *bodies)
    method = LagrangesMethod(lagrangian, [q], forcelist=[(crank_frame, torque * frame.z), *loads], frame=frame)
    method.form_lagranges_equations()
    equation = (method.mass_matrix * sp.Matrix([q.diff(dynamicsymbols._t, 2)]) - method.forcing)[0]
    qd, qdd = q.diff(), q.diff().diff()
    speed, accel, angle = sp.symbols("w a th")
    equation = equation.subs({qdd: accel}).subs({qd: speed}).subs({q: angle})
    # The equation is linear in T (the generalised force on q): T = −E(0)/(∂E/∂T).
    solved = -equation.subs(torque, 0) / equation.diff(torque)
    return sp.lambdify((angle, speed, accel), solved, "math", cse=True)


def _at(torque, angles_deg, rpm, alpha):
    return [float(torque(math.radians(a), rpm * 2 * math.pi / 60, alpha)) for a in angles_deg]


def _body(name, frame, origin, local, mass, inertia_kg_m2, gravity, reference_point):
    centre = origin.locatenew(f"G_{name}", local[0] * frame.x + local[1] * frame.y)
    centre.set_vel(reference_point.frame, centre.pos_from(reference_point.point).dt(reference_point.frame))
    body = RigidBody(name, centre, frame, mass, (inertia(frame, 0, 0, inertia_kg_m2), centre))
    position = centre.pos_from(reference_point.point)
    body.potential_energy = -mass * (gravity[0] * position.dot(reference_point.frame.x)
                                     + gravity[1] * position.dot(reference_point.frame.y))
    return body


class _Fixed:
    def __init__(self, frame, point):
        self.frame, self.point = frame, point


ANGLES = [0.0, 37.0, 90.0, 151.0, 222.0, 300.0]


FOUR_BAR = (40.0, 150.0, 110.0, 160.0)
FOUR_BAR_MASSES = {"crank": (1.1, (12.0, 20.0), 0.0021), "coupler": (2.4, (95.0, 70.0), 0.0118),
                   "rocker": (1.7, (175.0, 40.0), 0.0063)}
GRAVITY = (1.5, -9.80665)


@functools.cache
def _four_bar_lagrange():
    """The four-bar's drive torque by Lagrange, derived once for every test that uses it."""
    a, b, c, d = FOUR_BAR
    bare = load(four_bar(a, b, c, d, 30.0))
    q = dynamicsymbols("q")
    n = ReferenceFrame("N")
    o2 = Point("O2")
    o2.set_vel(n, 0)
    am, bm, cm, dm = (v / 1000.0 for v in (a, b, c, d))
    ax, ay = am * sp.cos(q), am * sp.sin(q)
    ex, ey = dm - ax, -ay
    dist = sp.sqrt(ex ** 2 + ey ** 2)
    # The open circuit, as the design draws it: B = A + b·(cos, sin)(φ + β).
    phi = sp.atan2(ey, ex) + sp.acos((bm ** 2 + dist ** 2 - cm ** 2) / (2 * bm * dist))
    bx, by = ax + bm * sp.cos(phi), ay + bm * sp.sin(phi)
    theta4 = sp.atan2(by, bx - dm)
    f2, f3, f4 = (n.orientnew(f"F{i}", "Axis", [angle, n.z]) for i, angle in ((2, q), (3, phi), (4, theta4)))
    a_pt = o2.locatenew("A", am * f2.x)
    o4 = o2.locatenew("O4", dm * n.x)
    fixed = _Fixed(n, o2)
    m = FOUR_BAR_MASSES
    bodies = [_body(k, frame, origin, _local(bare, k, m[k][1]), m[k][0], m[k][2], GRAVITY, fixed)
              for k, frame, origin in (("crank", f2, o2), ("coupler", f3, a_pt), ("rocker", f4, o4))]
    return _lagrange_torque(bodies, n, f2, q)


@pytest.mark.parametrize("alpha", [0.0, 6.0])
def test_four_bar_all_links_massive_against_lagrange(alpha):
    rpm = 240.0
    bare = load(four_bar(*FOUR_BAR, 30.0, rpm=rpm, alpha=alpha))
    data = MassData(masses={k: LinkMass(k, m, c_, i) for k, (m, c_, i) in FOUR_BAR_MASSES.items()},
                    gravity_value=GRAVITY)
    mech = replace(bare, mass_data=data)
    ours = [forces(kinematics.solve(mech, angle)).drive_torque_n_m for angle in ANGLES]
    reference = _at(_four_bar_lagrange(), ANGLES, rpm, alpha)
    for got, want in zip(ours, reference, strict=True):
        assert got == pytest.approx(want, rel=TOLERANCE, abs=TOLERANCE * max(map(abs, reference)))


def test_offset_slider_crank_with_block_mass_against_lagrange():
    r, rod, e = 45.0, 160.0, 18.0
    rpm, alpha, gravity = 300.0, 4.0, (0.0, -9.80665)
    bare = load(slider_crank(r, rod, e, 30.0, rpm=rpm, alpha=alpha))
    masses = {"crank": (0.9, (10.0, 8.0), 0.0012), "rod": (1.6, (90.0, 5.0), 0.0052)}
    block_kg, push = 2.3, (-350.0, 40.0)
    data = MassData(masses={k: LinkMass(k, m, c_, i) for k, (m, c_, i) in masses.items()},
                    point_masses={"D": PointMass("D", block_kg)}, gravity_value=gravity,
                    loads={"process": Load("process", point="D", force_value=push)})
    mech = replace(bare, mass_data=data)
    ours = [forces(kinematics.solve(mech, angle)).drive_torque_n_m for angle in ANGLES]

    q = dynamicsymbols("q")
    n = ReferenceFrame("N")
    o2 = Point("O2")
    o2.set_vel(n, 0)
    rm, lm, em = r / 1000.0, rod / 1000.0, e / 1000.0
    ax, ay = rm * sp.cos(q), rm * sp.sin(q)
    # The block on the line y = −e, right of the crank: D = (A_x + √(l² − (A_y + e)²), −e).
    dx = ax + sp.sqrt(lm ** 2 - (ay + em) ** 2)
    theta3 = sp.atan2(-em - ay, dx - ax)
    f2, f3 = n.orientnew("F2", "Axis", [q, n.z]), n.orientnew("F3", "Axis", [theta3, n.z])
    a_pt = o2.locatenew("A", rm * f2.x)
    fixed = _Fixed(n, o2)
    bodies = [_body(k, frame, origin, _local(bare, k, masses[k][1]), masses[k][0], masses[k][2], gravity, fixed)
              for k, frame, origin in (("crank", f2, o2), ("rod", f3, a_pt))]
    d_pt = o2.locatenew("D", dx * n.x - em * n.y)
    d_pt.set_vel(n, d_pt.pos_from(o2).dt(n))
    block = Particle("block", d_pt, block_kg)
    block.potential_energy = -block_kg * (gravity[0] * d_pt.pos_from(o2).dot(n.x)
                                          + gravity[1] * d_pt.pos_from(o2).dot(n.y))
    reference = _at(_lagrange_torque(bodies + [block], n, f2, q, loads=[(d_pt, push[0] * n.x + push[1] * n.y)]),
                    ANGLES, rpm, alpha)
    for got, want in zip(ours, reference, strict=True):
        assert got == pytest.approx(want, rel=TOLERANCE, abs=TOLERANCE * max(map(abs, reference)))
