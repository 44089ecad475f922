"""A dictionary that forgets its oldest entries past a size, for the evaluator's memos."""

from __future__ import annotations

from collections import OrderedDict
from typing import Generic, TypeVar

K = TypeVar("K")
T = TypeVar("T")


class BoundedCache(Generic[K, T]):
    """Least recently used entries are dropped once more than ``limit`` are kept."""

    def __init__(self, limit: int) -> None:
        self.limit = limit
        self._items: OrderedDict[K, T] = OrderedDict()

    def lookup(self, key: K) -> tuple[bool, T | None]:
        """``(True, value)`` when ``key`` is kept, else ``(False, None)``."""
        if key in self._items:
            self._items.move_to_end(key)
            return True, self._items[key]
        return False, None

    def put(self, key: K, value: T) -> None:
        self._items[key] = value
        self._items.move_to_end(key)
        while len(self._items) > self.limit:
            self._items.popitem(last=False)
