"""Designs past the stated size (kinematics.model.limits, docs/file-format.md) are refused in plain
words before any work that grows with the design: every verb exits 2 naming the place."""

import contextlib
import io
import json

import pytest

import kinematics
from app.main import main as kinepoly
from kinematics.errors import FileFormatError
from kinematics.model.limits import MAX_LINKS_AND_SLIDES, MAX_POINTS
from kinematics.solver import constraints
from tests.designs import many_links, one_link

VERBS = {"check": [], "solve": ["--json"], "construct": ["--json"], "centres": ["--json"], "sweep": [],
         "render": ["-o", "out.png"], "print": ["-o", "out.pdf"], "export": ["-o", "out.dxf"]}


def _chain_of_links(links: int) -> dict:
    """many_links with exactly ``links`` links (3 of the crank-rocker, 2 a dyad) when ``links`` is odd."""
    return many_links(4 + (links - 3))


@pytest.fixture(autouse=True)
def _no_growing_work(monkeypatch):
    def refuse(*_):
        raise AssertionError("a design past the limit reached the constraint rows")
    monkeypatch.setattr(constraints, "build_system", refuse)


@pytest.mark.parametrize(("design", "place", "words"), [
    (one_link(MAX_POINTS + 1), "points", f"{MAX_POINTS + 1} points; Kinepoly analyses designs of at most {MAX_POINTS}"),
    (one_link(10_003), "points", "10,003 points"),
    (_chain_of_links(MAX_LINKS_AND_SLIDES + 1), "links", f"at most {MAX_LINKS_AND_SLIDES} links and slides"),
])
@pytest.mark.parametrize("verb", VERBS)
def test_every_verb_refuses_a_design_past_the_limit_plainly(tmp_path, monkeypatch, design, place, words, verb):
    monkeypatch.chdir(tmp_path)
    path = tmp_path / "big.json"
    path.write_text(json.dumps(design))
    err = io.StringIO()
    with contextlib.redirect_stdout(io.StringIO()), contextlib.redirect_stderr(err):
        code = kinepoly([verb, str(path), *VERBS[verb]])
    assert code == 2
    message = err.getvalue()
    assert f"{place}: the design has" in message and words in message and "Traceback" not in message
    assert not (tmp_path / VERBS[verb][-1]).exists() if VERBS[verb] else True


def test_the_loader_names_the_place_and_a_design_at_the_limit_loads():
    with pytest.raises(FileFormatError) as refused:
        kinematics.load_mechanism(one_link(MAX_POINTS + 1))
    assert refused.value.location == "points"
    assert len(kinematics.load_mechanism(one_link(MAX_POINTS)).points) == MAX_POINTS
    assert len(kinematics.load_mechanism(_chain_of_links(MAX_LINKS_AND_SLIDES - 1)).links) == MAX_LINKS_AND_SLIDES - 1


def test_a_design_built_in_code_past_the_limit_is_a_finding():
    mech = kinematics.load_mechanism(one_link(MAX_POINTS))
    bigger = kinematics.Mechanism(points={**mech.points, "Q": (1.0, 2.0)}, ground=mech.ground,
                                  links={**mech.links, "coupler": (*mech.links["coupler"], "Q")},
                                  slides=mech.slides, driver=mech.driver)
    findings = kinematics.diagnose(bigger)
    assert [f.location for f in findings] == ["points"]
    assert f"{MAX_POINTS + 1} points" in findings[0].message
