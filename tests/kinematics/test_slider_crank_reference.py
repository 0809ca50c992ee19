"""The in-line and offset slider-crank against the exact piston motion.

x = r·cos θ + √(l² − (r·sin θ + e)²) (offset e), and at dead centre (θ = 0, e = 0) the piston
acceleration −r·ω²·(1 + r/l): J. J. Uicker, G. R. Pennock, J. E. Shigley, *Theory of Machines
and Mechanisms*, 4th ed., Oxford University Press, 2011, §4.8 and eq. (4.24)  # from memory (numbers)
"""

import math

import numpy as np
import pytest

import kinematics
from tests.designs import slider_crank


def test_dead_centre_acceleration():
    r, rod, rpm = 50.0, 180.0, 300.0
    mech = kinematics.load_mechanism(slider_crank(r, rod, 0.0, 0.0, rpm=rpm))
    solution = kinematics.solve(mech)
    omega = rpm * 2 * math.pi / 60
    expected = -(r / 1000) * omega ** 2 * (1 + r / rod)
    assert solution.acceleration("D")[0] == pytest.approx(expected, rel=1e-12)
    assert solution.sliding_acceleration["piston"] == pytest.approx(expected, rel=1e-12)
    construction = kinematics.construct(solution)
    assert construction.acceleration.images["D"][0] == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize("e", [0.0, 20.0, -15.0])
@pytest.mark.parametrize("theta", [10.0, 75.0, 160.0, 250.0, 330.0])
def test_piston_position_velocity_acceleration(theta, e):
    r, rod, rpm = 50.0, 180.0, 300.0
    mech = kinematics.load_mechanism(slider_crank(r, rod, e, 30.0, rpm=rpm))
    solution = kinematics.solve(mech, theta)
    omega = rpm * 2 * math.pi / 60
    t = math.radians(theta)

    def x(angle):
        return (r * math.cos(angle) + math.sqrt(rod * rod - (r * math.sin(angle) + e) ** 2)) / 1000

    # Exact derivatives of x(θ(t)) at constant ω by the chain rule, written out.
    s = r * math.sin(t) + e
    root = math.sqrt(rod * rod - s * s)
    dx = (-r * math.sin(t) - s * r * math.cos(t) / root) / 1000
    ddx = (-r * math.cos(t) - (r * r * math.cos(t) ** 2 - s * r * math.sin(t)) / root
           - s * s * r * r * math.cos(t) ** 2 / root ** 3) / 1000
    assert solution.position("D")[0] == pytest.approx(x(t), abs=1e-12)
    assert solution.velocity("D")[0] == pytest.approx(dx * omega, rel=1e-9, abs=1e-12)
    assert solution.acceleration("D")[0] == pytest.approx(ddx * omega ** 2, rel=1e-9, abs=1e-12)
    assert np.allclose(kinematics.construct(solution).acceleration.images["D"], solution.acceleration("D"),
                       rtol=1e-9, atol=1e-12)
