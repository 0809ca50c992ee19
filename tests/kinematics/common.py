"""Kept only for bench/bench_sweep.py, which imports four_bar from here: the test designs live in
tests/designs.py. Delete this file once the bench imports ``tests.designs``."""

from tests.designs import four_bar

__all__ = ["four_bar"]
