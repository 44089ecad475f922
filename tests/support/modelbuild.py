"""Build small in-memory models and datasets for reference-evaluator tests (invented data)."""

from __future__ import annotations

import datetime as dt
from pathlib import Path
from typing import Any

import numpy as np

from measureport.model.schema import (
    BOOLEAN,
    DATE,
    DOUBLE,
    INTEGER,
    TEXT,
    Column,
    DataType,
    Model,
    Relationship,
    Table,
)
from measureport.model.tabledata import ColumnData, Dataset, TableData


def _type_of(values: list[Any]) -> DataType:
    present = [v for v in values if v is not None]
    if not present:
        return INTEGER
    v = present[0]
    if isinstance(v, bool):
        return BOOLEAN
    if isinstance(v, int):
        return INTEGER
    if isinstance(v, float):
        return DOUBLE
    if isinstance(v, dt.date):
        return DATE
    return TEXT


def _column(values: list[Any], kind: DataType) -> ColumnData:
    null = np.array([v is None for v in values], dtype=np.bool_)
    if kind is DATE:
        arr = np.array([v if v is not None else dt.date(1970, 1, 1) for v in values], dtype="datetime64[D]")
    elif kind is INTEGER:
        arr = np.array([v if v is not None else 0 for v in values], dtype=np.int64)
    elif kind is DOUBLE:
        arr = np.array([v if v is not None else 0.0 for v in values], dtype=np.float64)
    elif kind is BOOLEAN:
        arr = np.array([v if v is not None else False for v in values], dtype=np.bool_)
    else:
        arr = np.array([v if v is not None else "" for v in values], dtype=object)
    return ColumnData(arr, null)


def make(
    tables: dict[str, dict[str, list[Any]]],
    keys: dict[str, str] | None = None,
    relationships: list[str] | None = None,
) -> tuple[Model, Dataset]:
    """A model and its data from columns given as Python lists; relationships as 'a.b -> c.d'."""
    keys = keys or {}
    model_tables = {}
    data = {}
    for name, cols in tables.items():
        types = {c: _type_of(v) for c, v in cols.items()}
        model_tables[name] = Table(
            name, f"data/{name}.csv", {c: Column(c, t) for c, t in types.items()}, keys.get(name)
        )
        n = len(next(iter(cols.values())))
        data[name] = TableData(name, n, {c: _column(v, types[c]) for c, v in cols.items()})
    rels = []
    for text in relationships or []:
        left, right = (s.strip() for s in text.split("->"))
        mt, mc = left.split(".")
        ot, oc = right.split(".")
        rels.append(Relationship(mt, mc, ot, oc))
    model = Model("test", Path("model.yaml"), model_tables, tuple(rels), (), {})
    return model, Dataset(data)
