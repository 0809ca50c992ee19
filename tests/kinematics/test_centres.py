"""Instantaneous centres by Kennedy's theorem: closed forms, the definition of a centre, and the
velocities from the centres (a third formulation) against the polygon and the solver."""

import math
from itertools import combinations

import numpy as np
import pytest

import kinematics
from kinematics import centres
from kinematics.instantaneous.advantage import advantage
from kinematics.model.mechanism import GROUND
from tests.designs import (
    SAMPLE_FILES,
    SWING_LEVER,
    TRIAD_PRESS,
    block_on_rotating_guide,
    four_bar,
    load,
    slider_crank,
    slotted_lever,
    solve_at,
)

# Rounding of the space diagram (1e-16 relative) through one or two line intersections of condition
# below 1e3: a few 1e-13 of the mechanism's size at worst; 1e-9 leaves a wide margin and still
# catches any wrong line (which errs by the order of the size itself).
EXACT = 1e-9


def all_designs():
    yield from ((p.name, kinematics.load_mechanism(p)) for p in SAMPLE_FILES)
    yield "four-bar", load(four_bar(40, 120, 100, 140, 30))
    yield "slider-crank", load(slider_crank(30, 110, 10, 50))
    yield "slotted lever", load(slotted_lever(40, 110, 65, offset=12.0))
    yield "swing lever", load(SWING_LEVER)
    yield "block on rotating guide", load(block_on_rotating_guide(30.0))
    yield "triad press", load(TRIAD_PRESS)


DESIGNS = dict(all_designs())


def cross(a, b) -> float:
    return float(a[0] * b[1] - a[1] * b[0])


@pytest.mark.parametrize("name", DESIGNS)
def test_n_bodies_have_n_n_minus_1_over_2_centres(name):
    # N = n(n − 1)/2 for n bodies, frame included (common practice; stated in every text on the method).
    mech = DESIGNS[name]
    found = centres(kinematics.solve(mech))
    n = 1 + len(mech.links) + len(mech.slides)  # the frame, the links, one block per slide
    assert len(found.bodies) == n
    assert len(found.centres) == n * (n - 1) // 2
    assert list(found.bodies) == [GROUND, *mech.links, *mech.slides]
    for key in found.centres:  # "<body>|<body>", bodies in the file's order
        a, b = key.split("|")
        assert found.bodies.index(a) < found.bodies.index(b)


def _velocity_field(solution, body):
    """The velocity of any place z as a point of ``body``, from the solver alone (complex, m/s)."""
    mech = solution.mechanism
    if body == GROUND:
        return 0.0, lambda z: 0j
    if body in mech.slides:  # a block: it carries the slide's point and turns with its guide
        slide = mech.slides[body]
        base, omega = slide.point, 0.0 if slide.guide == GROUND else solution.angular_velocity[slide.guide]
    else:
        base, omega = mech.links[body][0], solution.angular_velocity[body]
    p, v = complex(*solution.position(base)), complex(*solution.velocity(base))
    return omega, lambda z: v + 1j * omega * (z - p)


@pytest.mark.parametrize("name", DESIGNS)
@pytest.mark.parametrize("angle", [None, 37.0, 151.0, 263.0])
def test_every_centre_has_the_same_velocity_in_both_bodies(name, angle):
    # The definition of the instantaneous centre (common practice): the one point with the same velocity
    # in both bodies; at infinity in direction d, the bodies translate relative to each other across d.
    # The velocities here are the solver's, which the centres never read.
    mech = DESIGNS[name]
    try:
        solution = solve_at(mech, angle)
    except kinematics.CannotAssemble:
        pytest.skip("no pose there")
    found = centres(solution)
    scale = max(float(np.abs(solution.velocities).max()), 1e-12)
    for centre in found.centres.values():
        (wa, va), (wb, vb) = (_velocity_field(solution, body) for body in centre.bodies)
        if centre.kind == "point":
            z = complex(*centre.at_m)
            # A far centre magnifies the field's rounding by its distance: scale by it.
            reach = max(1.0, abs(z) / (mech.size * mech.metres_per_unit))
            assert abs(va(z) - vb(z)) <= EXACT * scale * reach, centre.name
        elif centre.kind == "direction":
            d = complex(*centre.direction)
            relative = va(0j) - vb(0j)
            assert abs(wa - wb) <= EXACT * scale / (mech.size * mech.metres_per_unit), centre.name
            assert abs((relative * d.conjugate()).real) <= EXACT * scale, centre.name
        else:
            assert centre.reason


@pytest.mark.parametrize("name", DESIGNS)
def test_kennedy_three_centres_of_any_three_bodies_lie_on_one_line(name):
    # Kennedy's theorem (Aronhold-Kennedy; common practice) over every triple of finite centres.
    found = centres(kinematics.solve(DESIGNS[name]))
    size = DESIGNS[name].size * DESIGNS[name].metres_per_unit
    for triple in combinations(found.bodies, 3):
        places = [found.centre(a, b) for a, b in combinations(triple, 2)]
        if all(c.kind == "point" for c in places):
            p, q, r = (complex(*c.at_m) for c in places)
            longest = max(abs(q - p), abs(r - p), abs(r - q), size)
            height = abs(((q - p).conjugate() * (r - p)).imag) / longest
            assert height <= EXACT * max(size, abs(p), abs(q), abs(r)), triple


@pytest.mark.parametrize("theta", [20.0, 75.0, 140.0, 230.0, 310.0])
def test_four_bar_coupler_centre_is_where_crank_and_rocker_lines_meet(theta):
    # Closed form (common practice): the coupler's centre relative to the frame lies on the crank line
    # O2A and on the rocker line O4B; solved here by Cramer's rule from the four pins.
    solution = kinematics.solve(load(four_bar(40, 120, 100, 140, theta)))
    o2, a, b, o4 = (np.array(solution.position(p)) for p in ("O2", "A", "B", "O4"))
    u, w = a - o2, b - o4
    t = cross(o4 - o2, w) / cross(u, w)
    expected = o2 + t * u
    found = centres(solution).centre("coupler", GROUND)
    assert found.kind == "point"
    assert np.allclose(found.at_m, expected, rtol=0, atol=EXACT * 0.14)
    # And the crank-rocker centre on the frame line O2O4 and the coupler line AB (common practice).
    other = centres(solution).centre("crank", "rocker")
    assert abs(other.at_m[1]) <= EXACT * 0.14
    assert abs(cross(np.array(other.at_m) - a, b - a)) <= EXACT * 0.14 * np.linalg.norm(b - a)


@pytest.mark.parametrize("theta", [10.0, 60.0, 100.0, 200.0, 333.0])
def test_slider_crank_velocity_ratio_is_r_sin_theta_plus_beta_over_cos_beta(theta):
    # In-line slider-crank, crank r at θ, rod l at β (sin β = r sin θ / l): dx/dθ = −r·sin(θ + β)/cos β,
    # the piston's velocity per unit crank speed (common practice). The slide runs E -> F along +x.
    r, rod = 30.0, 110.0
    mech = load(slider_crank(r, rod, 0.0, theta))
    found = centres(kinematics.solve(mech))
    t = math.radians(theta)
    beta = math.asin(r * math.sin(t) / rod)
    expected = -r / 1000 * math.sin(t + beta) / math.cos(beta)
    result = advantage(found)
    assert result.unit == "m/rad" and result.advantage_unit == "N/(N·m)"
    assert result.velocity_ratio == pytest.approx(expected, rel=EXACT)
    assert result.mechanical_advantage == pytest.approx(1 / expected, rel=EXACT)
    # The block's centre on the frame is at infinity, perpendicular to the line of stroke.
    assert found.centre("piston", GROUND).direction == pytest.approx((0.0, 1.0), abs=1e-15)


def test_slider_crank_at_dead_centre_locks_the_output():
    # At inner dead centre the piston stops while the crank turns: velocity ratio 0, advantage
    # infinite (common practice: the toggle of the output).
    found = centres(kinematics.solve(load(slider_crank(30.0, 110.0, 0.0, 0.0))))
    result = advantage(found)
    assert result.locked and result.velocity_ratio == 0.0 and math.isinf(result.mechanical_advantage)
    assert "locks here (toggle)" in result.sentence()


def test_slotted_lever_centre_at_infinity_is_perpendicular_to_the_slot():
    solution = kinematics.solve(load(slotted_lever(40, 110, 65)))
    found = centres(solution)
    block = found.centre("lever", "slot")
    assert block.kind == "direction" and block.primary
    c, t = (np.array(solution.position(p)) for p in ("C", "T"))
    assert abs(np.dot(block.direction, t - c)) <= 1e-15 * np.linalg.norm(t - c)
    assert block.how == ("the block of slide slot on lever: at infinity, perpendicular to the guide line C-T")
    assert found.max_relative_difference <= EXACT


def test_a_centre_at_infinity_from_parallel_lines_and_an_undetermined_one_say_so():
    # The quick-return sample turned to 90°, crank, lever and rod on one vertical line: the rod translates
    # (its centre on the frame is at infinity), and the crank-rod centre lies somewhere on that line.
    mech = kinematics.load_mechanism(next(p for p in SAMPLE_FILES if p.name.startswith("tile-trimmer")))
    found = centres(kinematics.solve(mech, 90.0))
    rod = found.centre(GROUND, "rod")
    assert rod.kind == "direction" and rod.direction == pytest.approx((0.0, 1.0), abs=1e-12)
    assert rod.how == ("the lines through I ground|lever, I lever|rod and through I ground|ram, I rod|ram are "
                       "parallel")
    lost = found.centre("crank", "rod")
    assert lost.kind == "undetermined" and lost.place is None
    # Which two coinciding lines are named depends on the last digits of the pose: the form is checked.
    assert lost.reason.startswith("the lines through I ")
    assert " coincide (Kennedy's theorem for crank, rod with " in lost.reason
    assert f"centre crank|rod is undetermined: {lost.reason}" in found.warnings
    assert found.angular_velocity_ratio["rod"] == 0.0  # the velocities never needed it
    assert found.max_relative_difference <= EXACT


def test_steps_are_recorded_in_the_trade_vocabulary():
    found = centres(kinematics.solve(load(four_bar(40, 120, 100, 140, 30))))
    roles = [s.role for s in found.steps]
    assert roles[:4] == [kinematics.Role.KNOWN] * 4  # the four pins
    # Each secondary centre: its two lines, then the intersection, condition figure as the polygon's.
    assert roles[4:] == [kinematics.Role.DIRECTION, kinematics.Role.DIRECTION, kinematics.Role.INTERSECTION] * 2
    meet = found.steps[6]
    assert meet.label == "ground|coupler" and meet.polygon == "centres"
    assert meet.condition >= 1.0 and not meet.flagged
    assert meet.text.startswith("ground|coupler: at (")
    line = found.steps[4]
    assert line.text == ("the line through I ground|crank and I crank|coupler: Kennedy's theorem for ground, coupler "
                         "and crank")
    assert found.centre("ground", "coupler").step == meet.id


def test_the_centres_are_read_only():
    found = centres(kinematics.solve(load(four_bar(40, 120, 100, 140, 30))))
    with pytest.raises(TypeError):
        found.centres["x|y"] = None
    with pytest.raises(AttributeError):
        found.max_relative_difference = 0.0
