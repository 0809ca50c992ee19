"""Renaming a design's joints, links and slides: edits that return a new Mechanism in which
every reference to the old name (links, ground, slides, driver, output, mass data: masses keyed by
link, point masses and load points by point, a load's link) carries the new one.

A new name follows the file format (``docs/file-format.md``): a letter, then letters, digits
or ``_``; points, links and slides share one set of names that differ ignoring case (image
labels are lower-case point names); ``ground`` is reserved for the frame.

>>> m = Mechanism(points={"O2": (0, 0), "A": (30, 40)}, links={"crank": ("O2", "A")}, ground=("O2",))
>>> rename_point(m, "A", "crank_pin").links
mappingproxy({'crank': ('O2', 'crank_pin')})
>>> rename_link(m, "crank", "input").links
mappingproxy({'input': ('O2', 'A')})
"""

from __future__ import annotations

from dataclasses import replace

from ..errors import KinematicsError
from ..files.fileschema import NAME_PATTERN, RESERVED_NAME
from ..model.mass import MassData
from ..model.mechanism import Mechanism


def _check_new_name(mechanism: Mechanism, kind: str, old: str, new) -> None:
    """Refuse ``new`` as the name of ``kind`` ("point", "link" or "slide") ``old``, saying why."""
    where = f"{kind}s.{old}"
    if not isinstance(new, str):
        raise KinematicsError(f"{kind} {old} needs a name in text, not {type(new).__name__}", where)
    if not new:
        raise KinematicsError(f"{kind} {old} needs a name: the new name is empty", where)
    if not NAME_PATTERN.fullmatch(new):
        raise KinematicsError(f'{kind} {old} cannot be called "{new}": a name is a letter, then letters, '
                              "digits or _", where)
    if RESERVED_NAME.search(new):
        raise KinematicsError(f'{kind} {old} cannot be called "{new}": "ground" names the frame', where)
    taken = ([("point", n) for n in mechanism.points] + [("link", n) for n in mechanism.links]
             + [("slide", n) for n in mechanism.slides])
    for other_kind, other in taken:
        if other.lower() == new.lower() and (other_kind, other) != (kind, old):
            raise KinematicsError(f'{kind} {old} cannot be called "{new}": it clashes with {other_kind} "{other}" '
                                  "(names of points, links and slides must differ ignoring case)", where)


def _renamer(mechanism: Mechanism, kind: str, old: str, new: str):
    """``name -> name`` carrying ``kind`` ``old`` over to ``new``, once ``new`` is known to be allowed."""
    known = {"point": mechanism.points, "link": mechanism.links, "slide": mechanism.slides}[kind]
    if not isinstance(old, str) or old not in known:
        raise KinematicsError(f'unknown {kind} "{old}"', f"{kind}s")
    if new != old:
        _check_new_name(mechanism, kind, old, new)
    return lambda name: new if name == old else name


def _output(mechanism: Mechanism, kind: str, carried):
    output = mechanism.output
    return None if output is None else {k: carried(v) if k == kind else v for k, v in output.items()}


def _mass_data(mechanism: Mechanism, kind: str, carried) -> MassData | None:
    """The mass data with ``kind`` ("point" or "link") names carried over."""
    data = mechanism.mass_data
    if data is None:
        return None
    if kind == "point":
        return replace(data,
                       point_masses={carried(p): replace(m, point=carried(p)) for p, m in data.point_masses.items()},
                       loads={n: replace(ld, point=ld.point and carried(ld.point)) for n, ld in data.loads.items()})
    return replace(data, masses={carried(k): replace(m, link=carried(k)) for k, m in data.masses.items()},
                   loads={n: replace(ld, link=ld.link and carried(ld.link)) for n, ld in data.loads.items()})


def rename_point(mechanism: Mechanism, old: str, new: str) -> Mechanism:
    """A new Mechanism in which point ``old`` is called ``new``, everywhere it is named.

    Raises
    ------
    KinematicsError
        for an unknown point or a name the file format would refuse (see the module doc).
    """
    carried = _renamer(mechanism, "point", old, new)
    if new == old:
        return mechanism
    driver = mechanism.driver
    return replace(
        mechanism,
        points={carried(n): xy for n, xy in mechanism.points.items()},
        ground=tuple(map(carried, mechanism.ground)),
        links={n: tuple(map(carried, pts)) for n, pts in mechanism.links.items()},
        slides={n: replace(s, point=carried(s.point), line=tuple(map(carried, s.line)))
                for n, s in mechanism.slides.items()},
        driver=None if driver is None else replace(driver, pivot=carried(driver.pivot)),
        output=_output(mechanism, "point", carried),
        mass_data=_mass_data(mechanism, "point", carried),
        warnings=(),  # they name points as they were
    )


def rename_link(mechanism: Mechanism, old: str, new: str) -> Mechanism:
    """A new Mechanism in which link ``old`` is called ``new``, everywhere it is named.

    Raises
    ------
    KinematicsError
        for an unknown link or a name the file format would refuse (see the module doc).
    """
    carried = _renamer(mechanism, "link", old, new)
    if new == old:
        return mechanism
    driver = mechanism.driver
    return replace(
        mechanism,
        links={carried(n): pts for n, pts in mechanism.links.items()},
        slides={n: replace(s, guide=carried(s.guide)) for n, s in mechanism.slides.items()},
        driver=None if driver is None else replace(driver, link=carried(driver.link)),
        output=_output(mechanism, "link", carried),
        mass_data=_mass_data(mechanism, "link", carried),
        warnings=(),
    )


def rename_slide(mechanism: Mechanism, old: str, new: str) -> Mechanism:
    """A new Mechanism in which slide ``old`` is called ``new``, everywhere it is named (the slides
    and a cylinder driver's slide).

    Raises
    ------
    KinematicsError
        for an unknown slide or a name the file format would refuse (see the module doc).
    """
    carried = _renamer(mechanism, "slide", old, new)
    if new == old:
        return mechanism
    driver = mechanism.driver
    if driver is not None and driver.slide is not None:
        driver = replace(driver, slide=carried(driver.slide))
    slides = {carried(n): replace(s, name=carried(s.name)) for n, s in mechanism.slides.items()}
    return replace(mechanism, slides=slides, driver=driver, warnings=())
