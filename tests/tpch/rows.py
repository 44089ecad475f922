"""Helpers of the TPC-H checks: results keyed by their grouping values, compared value by value."""

from __future__ import annotations

import math
from collections.abc import Sequence
from decimal import Decimal
from typing import Any

import duckdb

from measureport.query import ResultTable

Keyed = dict[tuple[Any, ...], tuple[Any, ...]]


def plain(value: Any) -> Any:
    """A value as the comparisons see it: Decimal as float, everything else unchanged."""
    return float(value) if isinstance(value, Decimal) else value


def keyed_result(result: ResultTable) -> Keyed:
    """A measure result as grouping values -> measure values. A grand total whose measures are
    all null has no row (rule 6); it is keyed as one row of nulls, as SQL returns it."""
    n = len(result.by)
    keyed = {tuple(map(plain, row[:n])): tuple(map(plain, row[n:])) for row in result.rows}
    if not result.by and not keyed:
        keyed[()] = (None,) * len(result.measures)
    return keyed


def keyed_sql(
    connection: duckdb.DuckDBPyConnection, sql: str, keys: Sequence[str], values: Sequence[str]
) -> Keyed:
    """The rows of ``sql`` as the values of the columns ``keys`` -> those of the columns ``values``."""
    relation = connection.sql(sql)
    names = list(relation.columns)
    key_at = [names.index(k) for k in keys]
    value_at = [names.index(v) for v in values]
    return {
        tuple(plain(row[i]) for i in key_at): tuple(plain(row[i]) for i in value_at)
        for row in relation.fetchall()
    }


def same_value(left: Any, right: Any) -> bool:
    """Equal, with numbers equal to a relative 1e-9 (float sums in another order differ in the last bits)."""
    if isinstance(left, int | float) and isinstance(right, int | float) and not isinstance(left, bool):
        return math.isclose(left, right, rel_tol=1e-9, abs_tol=1e-9)
    return bool(left == right)


def differences(expected: Keyed, actual: Keyed, limit: int = 5) -> list[str]:
    """Plain lines naming the keys missing on either side and the values that differ (at most ``limit``)."""
    lines = [f"missing {key}" for key in sorted(expected.keys() - actual.keys(), key=repr)[:limit]]
    lines += [f"unexpected {key}" for key in sorted(actual.keys() - expected.keys(), key=repr)[:limit]]
    for key in sorted(expected.keys() & actual.keys(), key=repr):
        want, got = expected[key], actual[key]
        if len(want) != len(got) or not all(map(same_value, want, got)):
            lines.append(f"{key}: expected {want}, got {got}")
            if len(lines) >= limit:
                break
    return lines
