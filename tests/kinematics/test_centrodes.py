"""The coupler's fixed and moving centrodes over the cycle."""

import numpy as np
import pytest

import kinematics
from kinematics.cycle.centrodes import CENTRODE_REACH, centrodes, coupler_of
from tests.designs import four_bar, load, slider_crank


def arc_length(piece):
    return float(np.sum(np.linalg.norm(np.diff(piece, axis=0), axis=1)))


def test_the_centrodes_roll_without_slipping():
    # The moving centrode rolls on the fixed one without slipping (common practice): the pole runs
    # along both at the same speed, so matching stretches have the same length. Both polylines are
    # chords of the same curves' samples, 0.25° apart, so their lengths agree to O(step²) of the
    # curvature: 1e-4 relative is that with a wide margin (measured about 1e-6).
    result = kinematics.sweep(load(four_bar(40, 120, 100, 140, 30)), 1440)
    found = centrodes(result)
    assert found.fixed
    for fixed, moving in zip(found.fixed, found.moving, strict=True):
        assert arc_length(moving) == pytest.approx(arc_length(fixed), rel=1e-4)


def test_the_fixed_centrode_breaks_where_the_coupler_stops_turning():
    # A crank-rocker's coupler rocks: its ω passes through zero twice a turn, where crank and rocker
    # are parallel and the pole runs off to infinity (common practice). Every point kept lies within
    # the stated reach of the linkage.
    result = kinematics.sweep(load(four_bar(40, 120, 100, 140, 30)), 1440)
    omega = result.angular_velocity["coupler"]
    assert np.count_nonzero(np.sign(omega) != np.sign(np.roll(omega, -1))) == 2
    found = centrodes(result)
    assert len(found.fixed) == 2
    reach = CENTRODE_REACH * result.mechanism.size / 1000
    a = result.positions[:, result.point_names.index("A")]
    for piece in found.fixed:
        assert np.min(np.linalg.norm(piece[:, None, :] - a[None, :, :], axis=2), axis=1).max() <= reach


def test_slider_crank_rods_pole_is_on_the_crank_line_above_the_piston():
    # The rod's centre relative to the frame: on the crank line O2A and on the normal to the line of
    # stroke through the piston pin D (common practice), so its x is D's.
    result = kinematics.sweep(load(slider_crank(30.0, 110.0, 0.0, 20.0)), 720)
    found = centrodes(result)
    assert found.link == "rod" == coupler_of(result.mechanism)
    d = result.positions[:, result.point_names.index("D")]
    a = result.positions[:, result.point_names.index("A")]
    angles = list(result.driver_angle_deg)
    for piece, at in zip(found.fixed, found.driver_angle_deg, strict=True):
        pose = [angles.index(x) for x in at]
        # 1e-12 m and 1e-15 m²: rounding of coordinates of about 0.1 m and of their products.
        assert np.allclose(piece[:, 0], d[pose, 0], rtol=0, atol=1e-12)
        assert np.allclose(piece[:, 0] * a[pose, 1] - piece[:, 1] * a[pose, 0], 0.0, rtol=0, atol=1e-15)


def test_a_linkage_with_no_coupler_says_so():
    doc = slider_crank(30.0, 110.0, 0.0, 20.0)
    with pytest.raises(kinematics.KinematicsError, match='unknown link "nothing"') as err:
        centrodes(kinematics.sweep(load(doc), 90), "nothing")
    assert err.value.location == "link"
