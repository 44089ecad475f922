"""Engine values back to the Python values of a ResultTable, by the kind each column is known to have.

Engines differ in what they hand back for the same SQL type: SQLite gives dates as ISO text and
booleans as 0/1, Spark and DataFusion give a timestamp where a date was truncated, PostgreSQL
gives ``numeric`` for a sum of integers. Each column's kind (number, text, date, boolean) is known
from the model (grouping columns) or the binder (measures), so every value is converted by it:

- number: ``int`` and ``float`` as they are; a decimal becomes an ``int`` when it is written with
  no fractional digits (a sum of integers), else a ``float`` (as the reference keeps decimals);
- date: ``datetime.date``; a timestamp is cut to its day, ISO text is read;
- boolean: ``bool``; the integers 0 and 1 are read as false and true;
- text: ``str``.

A value that does not fit its kind is handed on unchanged, for the comparison to report.
"""

from __future__ import annotations

import datetime as dt
import decimal
from collections.abc import Iterable, Sequence
from typing import Any

from measureport.model.schema import Model, ValueKind
from measureport.query import Query
from measureport.semantics.bound import BoundModel

Kinds = Sequence[ValueKind | None]


def typed_value(value: Any, kind: ValueKind | None) -> Any:
    """``value`` as the Python value of a column of ``kind`` (None: whatever the value says)."""
    item = getattr(value, "item", None)
    if callable(item) and not isinstance(value, dt.date | decimal.Decimal):
        value = item()
    if value is None:
        return None
    if kind == "date":
        return _as_date(value)
    if kind == "boolean":
        return _as_bool(value)
    if isinstance(value, decimal.Decimal):
        return _decimal_number(value)
    if kind is None and isinstance(value, dt.datetime):
        return value.date()
    return value


def typed_rows(rows: Iterable[Sequence[Any]], kinds: Kinds | None) -> list[tuple[Any, ...]]:
    """Every row with each value converted by its column's kind (all kinds unknown when None)."""
    if kinds is None:
        return [tuple(typed_value(v, None) for v in row) for row in rows]
    return [tuple(typed_value(v, k) for v, k in zip(row, kinds, strict=True)) for row in rows]


def table_kinds(model: Model, table: str) -> tuple[ValueKind, ...]:
    """The kinds of a model table's columns, in model order."""
    return tuple(column.type.kind for column in model.tables[table].columns.values())


def result_kinds(bound: BoundModel, query: Query, level_column: bool = True) -> tuple[ValueKind | None, ...]:
    """The kinds of a compiled query's result columns: grouping columns, measures, and (when
    ``level_column``) the trailing subtotal-level number."""
    tables = bound.model.tables
    by: list[ValueKind | None] = [tables[c.table].columns[c.column].type.kind for c in query.by]
    measures: list[ValueKind | None] = [bound.measures[name].type for name in query.measures]
    level: list[ValueKind | None] = ["number"] if level_column else []
    return (*by, *measures, *level)


def _decimal_number(value: decimal.Decimal) -> int | float:
    exponent = value.as_tuple().exponent
    if isinstance(exponent, int) and exponent >= 0:
        return int(value)
    return float(value)


def _as_date(value: Any) -> Any:
    if isinstance(value, dt.datetime):
        return value.date()
    if isinstance(value, dt.date):
        return value
    if isinstance(value, str):
        try:
            return dt.date.fromisoformat(value[:10])
        except ValueError:
            return value
    return value


def _as_bool(value: Any) -> Any:
    if isinstance(value, bool):
        return value
    if isinstance(value, int) and value in (0, 1):
        return value == 1
    return value
