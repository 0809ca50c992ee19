"""The examples in the core's docstrings run (as shapely runs its own)."""

import doctest
import importlib
import pkgutil

import pytest

import kinematics

MODULES = sorted(m.name for m in pkgutil.walk_packages(kinematics.__path__, "kinematics."))


@pytest.mark.parametrize("name", MODULES)
def test_docstring_examples(name):
    result = doctest.testmod(importlib.import_module(name), optionflags=doctest.ELLIPSIS)
    assert result.failed == 0
