"""The four-bar against the closed-form solution of the standard machine-design texts.

Reference: Freudenstein's equation for θ4 and the vector-loop closed forms for ω and α,
as given in R. L. Norton, *Design of Machinery*, 5th ed., McGraw-Hill, 2012, §4.5
(position), §6.7 (velocity) and §7.3 (acceleration)  # from memory (section numbers)
Those relations take the frame on the x axis from O2 to O4, as tests.designs.four_bar does.
"""

import math

import pytest

import kinematics
from tests.designs import four_bar


def norton_four_bar(a, b, c, d, theta2, omega2, alpha2, open_branch=True):
    k1, k2, k3 = d / a, d / c, (a * a - b * b + c * c + d * d) / (2 * a * c)
    k4, k5 = d / b, (c * c - d * d - a * a - b * b) / (2 * a * b)
    big_a = math.cos(theta2) - k1 - k2 * math.cos(theta2) + k3
    big_b = -2 * math.sin(theta2)
    big_c = k1 - (k2 + 1) * math.cos(theta2) + k3
    big_d = math.cos(theta2) - k1 + k4 * math.cos(theta2) + k5
    big_e = -2 * math.sin(theta2)
    big_f = k1 + (k4 - 1) * math.cos(theta2) + k5
    sign = -1.0 if open_branch else 1.0
    theta4 = 2 * math.atan2(-big_b + sign * math.sqrt(big_b ** 2 - 4 * big_a * big_c), 2 * big_a)
    theta3 = 2 * math.atan2(-big_e + sign * math.sqrt(big_e ** 2 - 4 * big_d * big_f), 2 * big_d)
    omega3 = a * omega2 / b * math.sin(theta4 - theta2) / math.sin(theta3 - theta4)
    omega4 = a * omega2 / c * math.sin(theta2 - theta3) / math.sin(theta4 - theta3)
    ca, cb = c * math.sin(theta4), b * math.sin(theta3)
    cc = (a * alpha2 * math.sin(theta2) + a * omega2 ** 2 * math.cos(theta2) + b * omega3 ** 2 * math.cos(theta3)
          - c * omega4 ** 2 * math.cos(theta4))
    cd, ce = c * math.cos(theta4), b * math.cos(theta3)
    cf = (a * alpha2 * math.cos(theta2) - a * omega2 ** 2 * math.sin(theta2) - b * omega3 ** 2 * math.sin(theta3)
          + c * omega4 ** 2 * math.sin(theta4))
    alpha3 = (cc * cd - ca * cf) / (ca * ce - cb * cd)
    alpha4 = (cc * ce - cb * cf) / (ca * ce - cb * cd)
    return theta3, theta4, omega3, omega4, alpha3, alpha4


CASES = [  # a, b, c, d (mm), θ2 (°), rpm, α2 (rad/s²)
    (40, 120, 100, 140, 30, 120, 0.0),
    (40, 120, 100, 140, 200, -300, 12.0),
    (60, 180, 130, 200, 95, 45, -4.0),
    (25, 90, 70, 80, 300, 1450, 0.0),
]


@pytest.mark.parametrize("a, b, c, d, theta, rpm, alpha", CASES)
def test_four_bar_matches_closed_form(a, b, c, d, theta, rpm, alpha):
    mech = kinematics.load_mechanism(four_bar(a, b, c, d, theta, rpm=rpm, alpha=alpha))
    solution = kinematics.solve(mech)
    omega2 = rpm * 2 * math.pi / 60
    theta3, theta4, omega3, omega4, alpha3, alpha4 = norton_four_bar(a, b, c, d, math.radians(theta), omega2, alpha)
    # Norton's open circuit is Kinepoly's four_bar(open_branch=True): same θ3, θ4.
    assert math.radians(solution.link_angle_deg["coupler"]) == pytest.approx(
        math.atan2(math.sin(theta3), math.cos(theta3)), abs=1e-10)
    assert math.radians(solution.link_angle_deg["rocker"]) == pytest.approx(
        math.atan2(math.sin(theta4), math.cos(theta4)), abs=1e-10)  # θ4 is the angle of O4 -> B
    # Relative tolerance 1e-9: both are exact formulations evaluated in double precision.
    assert solution.angular_velocity["coupler"] == pytest.approx(omega3, rel=1e-9)
    assert solution.angular_velocity["rocker"] == pytest.approx(omega4, rel=1e-9)
    assert solution.angular_acceleration["coupler"] == pytest.approx(alpha3, rel=1e-9, abs=1e-9)
    assert solution.angular_acceleration["rocker"] == pytest.approx(alpha4, rel=1e-9, abs=1e-9)
    construction = kinematics.construct(solution)
    assert construction.max_relative_difference < 1e-9


def test_swing_angle_equals_law_of_cosines():
    """Crank-rocker swing from its two limit positions, where crank and coupler are in line:
    O2B = b − a and O2B = b + a; the rocker angle at O4 by the law of cosines  # common practice
    (e.g. Norton, Design of Machinery, 5th ed., §3.3, toggle positions  # from memory)."""
    from kinematics.cycle.measures import output_motion
    from kinematics.cycle.sweep import sweep

    a, b, c, d = 40.0, 120.0, 100.0, 140.0
    mech = kinematics.load_mechanism(four_bar(a, b, c, d, 30.0))
    motion = output_motion(mech, sweep(mech, 7200))

    def rocker_angle(reach):
        return math.degrees(math.acos((d * d + c * c - reach * reach) / (2 * d * c)))

    swing = rocker_angle(b + a) - rocker_angle(b - a)
    # 7200 steps: the sampled extreme is within (0.05°)² · |θ4''|/2 of the true one.
    assert motion["travel"] == pytest.approx(swing, abs=1e-3)


def test_a_crank_turned_back_and_forth_stays_on_the_closed_form_branch():
    """A crank dragged to and fro in small turns (as in the window) goes back from poses it has
    reached; every pose must still be Norton's open circuit (closed form above)."""
    a, b, c, d, start, rpm = 40.0, 120.0, 100.0, 140.0, 30.0, 120.0
    mech = kinematics.load_mechanism(four_bar(a, b, c, d, start, rpm=rpm))
    omega2 = rpm * 2 * math.pi / 60
    angles = [start + 3.0 * i for i in range(40)] + [start + 120.0 - 1.5 * i for i in range(160)]
    for angle in angles:
        solution = kinematics.solve(mech, angle)
        theta3, theta4, omega3, omega4, *_ = norton_four_bar(a, b, c, d, math.radians(angle), omega2, 0.0)
        assert math.radians(solution.link_angle_deg["rocker"]) == pytest.approx(
            math.atan2(math.sin(theta4), math.cos(theta4)), abs=1e-10), angle
        assert solution.angular_velocity["rocker"] == pytest.approx(omega4, rel=1e-9), angle
