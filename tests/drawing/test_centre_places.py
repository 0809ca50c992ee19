"""Where the centres go on the space diagram: on the view, off it (with where), at infinity."""

import doctest

import kinematics
import kinematics.drawing.centre_places as centre_places_module
from kinematics.drawing.centre_places import REACH, bounds_with_centres, centre_places, linkage_box, where_words
from tests.designs import SAMPLE_FILES, four_bar, load, slider_crank


def test_a_near_parallelogram_puts_its_far_centres_off_the_view_and_says_where():
    # Crank and rocker nearly parallel: the coupler's centre (where their lines meet, common practice)
    # lies far away; the view keeps the linkage's size and names the centre's place.
    centres = kinematics.centres(kinematics.solve(load(four_bar(40, 120, 41, 120, 89))))
    places = {p.name: p for p in centre_places(centres)}
    far = places["ground|coupler"]
    assert far.kind == "off view" and far.distance_m > REACH * 0.12
    assert where_words(far).startswith("ground|coupler off the view at (")
    assert places["crank|rocker"].kind == "off view"
    assert bounds_with_centres(centres.solution, places.values()) == linkage_box(centres.solution)


def test_a_slider_crank_draws_its_block_centre_at_infinity_and_grows_the_view_for_the_others():
    centres = kinematics.centres(kinematics.solve(load(slider_crank(30, 110, 10, 50))))
    places = {p.name: p for p in centre_places(centres)}
    assert places["ground|piston"].kind == "infinity"
    assert where_words(places["ground|piston"]) == "ground|piston at infinity, 90.0°"
    rod = places["ground|rod"]
    assert rod.kind == "on view"
    x0, y0, x1, y1 = bounds_with_centres(centres.solution, places.values())
    assert x0 <= rod.at_m[0] <= x1 and y0 <= rod.at_m[1] <= y1


def test_every_sample_places_every_centre_once():
    for path in SAMPLE_FILES:
        centres = kinematics.centres(kinematics.solve(kinematics.load_mechanism(path)))
        n = len(centres.bodies)
        places = centre_places(centres)
        assert len(places) == n * (n - 1) // 2 == len({p.name for p in places}), path.name
        assert all(p.kind in ("on view", "off view", "infinity", "undetermined") for p in places)


def test_the_examples_run():
    assert doctest.testmod(centre_places_module).failed == 0
