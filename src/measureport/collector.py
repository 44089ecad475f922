"""Pausing Python's cyclic garbage collector while one large structure is built.

Compiling a query builds tree after tree of linked nodes (each sqlglot node points back to its
parent, so every tree is a cycle), and nearly all of them stay alive until the statement is done.
While they grow, the collector's full passes walk every one of them again, in vain: on 200
measures, most of a compile's time. Paused, the collector makes one pass over the young
generations when the pause ends: it frees what the compile left, and moves what survives to the
oldest generation at once, where only the rare full passes see it (left young, the survivors
would be walked by every pass of the middle generation until they grew old).
"""

from __future__ import annotations

import gc
from collections.abc import Iterator
from contextlib import contextmanager


@contextmanager
def collection_paused() -> Iterator[None]:
    """No cyclic garbage collection inside the block, one pass over the young generations after
    it; a collector that was off stays off (and makes no pass)."""
    was_enabled = gc.isenabled()
    gc.disable()
    try:
        yield
    finally:
        if was_enabled:
            gc.enable()
            gc.collect(1)
