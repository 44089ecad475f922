"""The model's data arranged for the reference evaluator.

Each dimension (a table on the one side of a relationship) gets one extra row at the end, the
*empty member*: every column null. Many-side rows whose key is null or has no match point at it.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from functools import cached_property
from typing import Any

import numpy as np
import numpy.typing as npt

from measureport.model.schema import Model, Relationship
from measureport.model.tabledata import Dataset, TableData

IntArray = npt.NDArray[np.int64]
ObjArray = npt.NDArray[np.object_]


@dataclass
class PreparedTable:
    """A table's columns as object arrays of Python values, with the empty member appended
    when the table is a dimension."""

    name: str
    n_rows: int
    is_dimension: bool
    values: dict[str, ObjArray]
    blank_exists: bool = False
    _codes: dict[str, tuple[IntArray, dict[Any, int]]] = field(default_factory=dict)

    @property
    def size(self) -> int:
        """Rows including the empty member."""
        return self.n_rows + (1 if self.is_dimension else 0)

    @property
    def blank_index(self) -> int | None:
        return self.n_rows if self.is_dimension else None

    def codes(self, column: str) -> tuple[IntArray, dict[Any, int]]:
        """Dense integer codes of a column's values (null has a code too), for equality filters."""
        if column not in self._codes:
            mapping: dict[Any, int] = {}
            vals = self.values[column]
            codes = np.fromiter((mapping.setdefault(v, len(mapping)) for v in vals), np.int64, len(vals))
            self._codes[column] = (codes, mapping)
        return self._codes[column]

    @cached_property
    def row_groups(self) -> IntArray:
        """A group number per row; identical rows (every column equal) share one."""
        mapping: dict[tuple[Any, ...], int] = {}
        cols = [self.values[c].tolist() for c in self.values]
        rows = zip(*cols, strict=True) if cols else (() for _ in range(self.size))
        return np.fromiter((mapping.setdefault(r, len(mapping)) for r in rows), np.int64, self.size)


def _column_values(data: TableData, column: str, extra: int) -> ObjArray:
    col = data.columns[column]
    items = col.values.tolist()
    nulls = col.null.tolist()
    out = np.empty(data.n_rows + extra, dtype=object)
    out[: data.n_rows] = [None if isnull else v for v, isnull in zip(items, nulls, strict=True)]
    if extra:
        out[data.n_rows] = None
    return out


class PreparedData:
    """Tables, the index of each relationship, and reachability between tables."""

    def __init__(self, model: Model, dataset: Dataset) -> None:
        self.model = model
        dims = {r.one_table for r in model.relationships}
        self.tables: dict[str, PreparedTable] = {}
        for name, table in model.tables.items():
            data = dataset.tables[name]
            extra = 1 if name in dims else 0
            values = {c: _column_values(data, c, extra) for c in table.columns if c in data.columns}
            self.tables[name] = PreparedTable(name, data.n_rows, name in dims, values)
        self.links: dict[Relationship, IntArray] = {r: self._link(r) for r in model.relationships}
        self._mark_empty_members()
        self._paths: dict[tuple[str, str], IntArray | None] = {}

    def _link(self, rel: Relationship) -> IntArray:
        many = self.tables[rel.many_table]
        one = self.tables[rel.one_table]
        position = {v: i for i, v in enumerate(one.values[rel.one_column][: one.n_rows].tolist())}
        blank = one.n_rows
        keys = many.values[rel.many_column].tolist()
        return np.fromiter(
            (blank if k is None else position.get(k, blank) for k in keys), np.int64, many.size
        )

    def _mark_empty_members(self) -> None:
        changed = True
        while changed:
            changed = False
            for rel, idx in self.links.items():
                many = self.tables[rel.many_table]
                one = self.tables[rel.one_table]
                if one.blank_exists:
                    continue
                pointing = idx[: many.n_rows]
                if many.blank_exists:
                    pointing = idx
                if np.any(pointing == one.n_rows):
                    one.blank_exists = True
                    changed = True

    def relationships_from(self, table: str) -> tuple[Relationship, ...]:
        return self.model.relationships_from(table)

    def path_index(self, source: str, target: str) -> IntArray | None:
        """For each row of ``source``, the row of ``target`` it reaches (None when not reachable)."""
        key = (source, target)
        if key not in self._paths:
            self._paths[key] = self._compute_path(source, target)
        return self._paths[key]

    def _compute_path(self, source: str, target: str) -> IntArray | None:
        if source == target:
            return np.arange(self.tables[source].size, dtype=np.int64)
        for rel in self.relationships_from(source):
            rest = self.path_index(rel.one_table, target)
            if rest is not None:
                return rest[self.links[rel]]
        return None

    def reaches(self, source: str, target: str) -> bool:
        return self.path_index(source, target) is not None
