"""The rows a ``for each`` walks, and how a column or a binding is read from them."""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field
from typing import Any

import numpy as np

from measureport.reference.context import Filter, equals
from measureport.reference.prepared import IntArray, PreparedData


@dataclass
class RowEnv:
    """The current rows of one iteration.

    A table iteration walks ``rows`` (row numbers of ``table``); a column iteration walks
    distinct combinations, whose values are in ``combos`` by (table, column). ``parent`` is the
    enclosing iteration, which has exactly one current row whenever this one exists.
    """

    data: PreparedData
    table: str | None
    rows: IntArray | None
    combos: dict[tuple[str, str], list[Any]] = field(default_factory=dict)
    parent: RowEnv | None = None

    @property
    def size(self) -> int:
        if self.rows is not None:
            return len(self.rows)
        return len(next(iter(self.combos.values()))) if self.combos else 0

    def covers(self, table: str, column: str) -> bool:
        """Whether this iteration itself gives ``table.column`` a current value."""
        if self.table is not None and self.rows is not None:
            return self.data.reaches(self.table, table) and column in self.data.tables[table].values
        return (table, column) in self.combos

    def find(self, table: str, column: str) -> RowEnv | None:
        """The innermost iteration (this one or an enclosing one) that covers the column."""
        env: RowEnv | None = self
        while env is not None:
            if env.covers(table, column):
                return env
            env = env.parent
        return None

    def column(self, table: str, column: str) -> list[Any]:
        """The column's value on each current row of this iteration (it must cover it)."""
        if self.rows is not None and self.table is not None:
            path = self.data.path_index(self.table, table)
            assert path is not None
            values = self.data.tables[table].values[column][path[self.rows]]
            return list(values.tolist())
        return self.combos[(table, column)]

    def subset(self, positions: Sequence[int]) -> RowEnv:
        """The same iteration restricted to some of its current rows."""
        if self.rows is not None:
            chosen = self.rows[np.asarray(positions, dtype=np.int64)]
            return RowEnv(self.data, self.table, chosen, {}, self.parent)
        combos = {k: [v[p] for p in positions] for k, v in self.combos.items()}
        return RowEnv(self.data, self.table, None, combos, self.parent)

    def binding_groups(self) -> list[list[int]]:
        """Positions of the current rows grouped by the filters binding them: identical rows of a
        table bind together; each combination of a column iteration binds alone."""
        if self.rows is not None and self.table is not None:
            groups: dict[int, list[int]] = {}
            ids = self.data.tables[self.table].row_groups[self.rows].tolist()
            for position, gid in enumerate(ids):
                groups.setdefault(gid, []).append(position)
            return list(groups.values())
        return [[i] for i in range(self.size)]

    def binding(self, position: int) -> tuple[Filter, ...]:
        """The filters that bind the current row at ``position`` (rule 3)."""
        if self.rows is not None and self.table is not None:
            table = self.data.tables[self.table]
            row = int(self.rows[position])
            return tuple(equals(self.table, c, values[row]) for c, values in table.values.items())
        return tuple(equals(t, c, values[position]) for (t, c), values in self.combos.items())
