"""Every sample opens (its reference pose, which the window and `kinepoly construct` show first) at
a pose that shows its construction well.

Criterion (ours, stated here): at the opening pose
- neither polygon is collapsed towards a line: of the pole and every moving point's image, the
  smaller principal spread is at least FLAT_LEAST of the larger (singular values of the centred
  points; 0 is a line, 1 a round cloud);
- every moving link turns: |ω| at least TURN_LEAST of the driver's;
- every slide on a moving guide slides, so its Coriolis component 2·ω·v is drawn: at least
  CORIOLIS_LEAST of the largest point acceleration.
"""

import numpy as np
import pytest

import kinematics
from tests.designs import SAMPLE_FILES

FLAT_LEAST = 0.1  # the quick-return at its former 90° pose scored 0.000; the others score 0.3 to 0.8
TURN_LEAST = 0.01
CORIOLIS_LEAST = 0.05


def flatness(points: np.ndarray) -> float:
    spread = np.linalg.svd(points - points.mean(axis=0), compute_uv=False)
    return float(spread[-1] / spread[0])


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.name)
def test_the_opening_pose_is_not_near_degenerate(path):
    mech = kinematics.load_mechanism(path)
    pose = kinematics.solve(mech, None)
    moving = [p for p in mech.points if p not in mech.ground]
    for rates in (pose.velocity, pose.acceleration):
        images = np.array([[0.0, 0.0]] + [rates(p) for p in moving])
        assert flatness(images) >= FLAT_LEAST, f"{path.name}: a polygon nearly a line"
    driver_omega = abs(pose.angular_velocity[mech.driver.link])
    for link, omega in pose.angular_velocity.items():
        assert abs(omega) >= TURN_LEAST * driver_omega, f"{path.name}: {link} at rest"
    largest = max(float(np.hypot(*pose.acceleration(p))) for p in moving)
    for name, slide in mech.slides.items():
        if slide.guide in mech.links:
            coriolis = 2.0 * abs(pose.angular_velocity[slide.guide] * pose.sliding_velocity[name])
            assert coriolis >= CORIOLIS_LEAST * largest, f"{path.name}: no Coriolis component on {name}"
