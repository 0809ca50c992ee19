"""Cylinder-driven test designs (invented proportions; the references are in the tests)."""

import math

from kinematics import Driver, Mechanism, Slide


def cylinder_driver(speed_m_s=0.05, accel_m_s2=0.0, stroke=(None, None)):
    return Driver(link="barrel", pivot="C", speed_value=0.0, kind="actuator", slide="cylinder",
                  linear_speed_value=speed_m_s, linear_acceleration_value=accel_m_s2,
                  stroke_min=stroke[0], stroke_max=stroke[1])


def tipping_table(length_mm, pivot=(600.0, 300.0), arm_mm=350.0, tip=(500.0, 30.0), above=True, **driver):
    """Barrel pivoted on the ground at C = (0, 0); the rod's end B on the table, pivoted at O; the
    cylinder ``length_mm`` long. ``tip`` is T's distance from O and its angle from OB (degrees)."""
    ox, oy = pivot
    d = math.hypot(ox, oy)
    cos_beta = (length_mm ** 2 + d ** 2 - arm_mm ** 2) / (2 * length_mm * d)
    phi = math.atan2(oy, ox) + (1 if above else -1) * math.acos(cos_beta)
    bx, by = length_mm * math.cos(phi), length_mm * math.sin(phi)
    along = math.atan2(by - oy, bx - ox) + math.radians(tip[1])
    points = {"C": (0.0, 0.0), "O": pivot, "B": (bx, by), "F": (3 * bx, 3 * by),
              "T": (ox + tip[0] * math.cos(along), oy + tip[0] * math.sin(along))}
    return Mechanism(points=points, ground=("C", "O"), links={"barrel": ("C", "F"), "table": ("O", "B", "T")},
                     slides={"cylinder": Slide("cylinder", "B", "barrel", ("C", "F"))},
                     driver=cylinder_driver(**driver), output={"link": "table"}, length_unit="mm")
