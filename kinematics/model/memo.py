"""Results kept for as long as the (immutable) Mechanism they belong to lives, and
the freezing of a result's containers so that results can be shared safely."""

from __future__ import annotations

import dataclasses
import weakref
from collections.abc import Callable
from types import MappingProxyType

import numpy as np

_STORE: dict = {}


def remembered(mechanism, key: str, make: Callable):
    """``make()`` once per mechanism and key; dropped when the mechanism is collected."""
    slot = _STORE.get(id(mechanism))
    if slot is None:
        slot = _STORE[id(mechanism)] = {}
        weakref.finalize(mechanism, _STORE.pop, id(mechanism), None)
    if key not in slot:
        slot[key] = make()
    return slot[key]


def _frozen(value):
    if isinstance(value, np.ndarray):
        value.flags.writeable = False
        return value
    if isinstance(value, dict):
        return MappingProxyType({k: _frozen(v) for k, v in value.items()})
    return value


def frozen_fields(result):
    """Make every numpy array of a frozen dataclass ``result`` read-only (in place) and every dict
    field a read-only mapping (of read-only arrays). For ``__post_init__``."""
    for item in dataclasses.fields(result):
        value = getattr(result, item.name)
        frozen = _frozen(value)
        if frozen is not value:
            object.__setattr__(result, item.name, frozen)
