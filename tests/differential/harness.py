"""Differential testing: the reference evaluator and the SQL on DuckDB must give the same table.

Cells are compared one by one: numbers with a relative tolerance of 1e-9, nulls equal to nulls
only, everything else exactly; rows in order, and the subtotal levels too.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from typing import Any

from measureport.engines.duckdb import DuckDBEngine
from measureport.language.parser import parse_measures
from measureport.model.schema import Model
from measureport.model.tabledata import Dataset
from measureport.query import Query, ResultTable
from measureport.reference.evaluator import evaluate
from measureport.semantics.binder import bind_model, build_query
from measureport.semantics.bound import BoundModel

REL_TOL = 1e-9


def same_value(a: Any, b: Any) -> bool:
    """Equal cells: both null, numbers within the relative tolerance, or equal values."""
    if a is None or b is None:
        return a is None and b is None
    if _is_number(a) and _is_number(b):
        return math.isclose(a, b, rel_tol=REL_TOL, abs_tol=1e-12)
    return type(a) is type(b) and bool(a == b)


def _is_number(x: Any) -> bool:
    return isinstance(x, int | float) and not isinstance(x, bool)


def differences(expected: ResultTable, actual: ResultTable, limit: int = 8) -> list[str]:
    """What differs between two results, in words (empty when they agree)."""
    found: list[str] = []
    if expected.columns != actual.columns:
        found.append(f"columns {expected.columns} != {actual.columns}")
    if len(expected.rows) != len(actual.rows):
        found.append(f"{len(expected.rows)} rows expected, {len(actual.rows)} found")
    for i, (x, y) in enumerate(zip(expected.rows, actual.rows, strict=False)):
        if len(x) != len(y) or not all(same_value(a, b) for a, b in zip(x, y, strict=True)):
            found.append(f"row {i}: reference {x} / duckdb {y}")
        if len(found) >= limit:
            break
    if expected.levels != actual.levels:
        found.append(f"levels {expected.levels} != {actual.levels}")
    return found


class Differential:
    """One model, its data and measures, on both the reference and a DuckDB engine."""

    def __init__(self, model: Model, dataset: Dataset, measures: str) -> None:
        self.bound: BoundModel = bind_model(model, [parse_measures(measures, "test.measures")])
        self.dataset = dataset
        self.engine = DuckDBEngine(self.bound, dataset)

    def query(
        self, names: Sequence[str], by: Sequence[str] = (), where: Sequence[str] = (), totals: bool = False
    ) -> Query:
        return build_query(self.bound, list(names), list(by), list(where), totals)

    def both(self, query: Query) -> tuple[ResultTable, ResultTable]:
        return evaluate(self.bound, self.dataset, query), self.engine.run(query)

    def check(
        self, names: Sequence[str], by: Sequence[str] = (), where: Sequence[str] = (), totals: bool = False
    ) -> ResultTable:
        """Run on both; fail with the differences and the SQL when they disagree. Returns the
        DuckDB result (for tests that also check values worked out by hand)."""
        query = self.query(names, by, where, totals)
        expected, actual = self.both(query)
        problems = differences(expected, actual)
        if problems:
            sql = self.engine.compile(query).sql
            raise AssertionError("\n".join(["reference and DuckDB differ:", *problems, "SQL:", sql]))
        return actual

    def close(self) -> None:
        self.engine.close()
