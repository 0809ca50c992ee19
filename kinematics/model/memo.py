"""Results kept for as long as the (immutable) Mechanism they belong to lives."""

from __future__ import annotations

import weakref
from collections.abc import Callable

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
