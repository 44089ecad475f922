"""Column names of one compilation: every name the lowering hands out is unique and contains an
underscore, so the short local names that nodes use inside themselves (``k1``, ``v1``, ``w``,
without one) never collide with them."""

from __future__ import annotations

import re


class Names:
    """Hands out unique column names for one compilation."""

    def __init__(self) -> None:
        self._taken: set[str] = set()
        self._canonical: dict[tuple[str, str], str] = {}
        self._counter = 0

    def fresh(self, hint: str) -> str:
        """A new name that starts with ``hint`` (cleaned to letters, digits and underscores)."""
        base = _clean(hint)
        while True:
            self._counter += 1
            name = f"{base}_{self._counter}"
            if name not in self._taken:
                self._taken.add(name)
                return name

    def of_column(self, table: str, column: str) -> str:
        """The one name of ``table.column`` in row sets read from the model's tables."""
        key = (table, column)
        found = self._canonical.get(key)
        if found is None:
            base = f"{_clean(table)}_{_clean(column)}"
            found = base
            n = 1
            while found in self._taken:
                n += 1
                found = f"{base}_{n}"
            self._taken.add(found)
            self._canonical[key] = found
        return found


def _clean(text: str) -> str:
    cleaned = re.sub(r"[^0-9A-Za-z]+", "_", text).strip("_").lower()
    return cleaned or "c"
