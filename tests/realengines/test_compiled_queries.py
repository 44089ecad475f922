"""Measures compiled to SQL and run on each real engine, against results worked out by hand.

The engines are the external references: SQLite (stdlib sqlite3), ClickHouse (chdb), DataFusion,
PostgreSQL (a real server) and Spark SQL (local mode), named in each parameter id. Data and
measures: the tool library of samples.py (invented). Until every dialect has its profile, a
query is compiled for DuckDB and its statement rendered in the engine's sqlglot dialect.
"""

from __future__ import annotations

import dataclasses
import datetime as dt
from collections.abc import Sequence
from typing import Any

import pytest

from measureport.compile import CompiledQuery, compile_query
from measureport.engines.sqlengine import SqlEngine
from measureport.errors import MeasureportError
from measureport.query import Query, ResultTable
from measureport.semantics.binder import build_query
from realengines.engines import OpenEngine, engine_params
from realengines.samples import library


def compiled_for(engine: SqlEngine, query: Query) -> CompiledQuery:
    """The query compiled for the engine's dialect; while that dialect has no profile yet, the
    DuckDB compilation rendered in the engine's sqlglot dialect."""
    try:
        return engine.compile(query)
    except MeasureportError as exc:
        if "there is no dialect named" not in exc.message:
            raise
    duckdb = compile_query(engine.bound, query, "duckdb")
    return dataclasses.replace(
        duckdb, dialect=engine.dialect, sqlglot_dialect=engine.sqlglot_dialect, _sql=None
    )


def run_on(
    engine: SqlEngine, measures: Sequence[str], by: Sequence[str], totals: bool = False
) -> ResultTable:
    return engine.run_compiled(compiled_for(engine, build_query(engine.bound, measures, by, [], totals)))


def assert_rows(got: list[tuple[Any, ...]], expected: list[tuple[Any, ...]]) -> None:
    """Rows equal, floats to a relative 1e-12, and of the same Python types."""
    assert len(got) == len(expected), got
    for row, want in zip(got, expected, strict=True):
        assert [type(v) for v in row] == [type(v) for v in want], (row, want)
        for value, wanted in zip(row, want, strict=True):
            if isinstance(wanted, float):
                assert value == pytest.approx(wanted, rel=1e-12), (row, want)
            else:
                assert value == wanted, (row, want)


@pytest.mark.parametrize("engine_name", engine_params())
def test_plain_aggregates_by_a_dimension_column(engine_name: str, open_engine: OpenEngine) -> None:
    engine = open_engine(engine_name, *library())
    result = run_on(engine, ["loans", "loan_days", "deposits", "mean_days"], ["tools.kind"])
    # access: loan 3 (3 days, 25.50). power: loans 1, 2, 4 (days 2 + 1, loan 4 has none; deposits
    # 10 + 10 + 7.25; mean of 2 and 1). Empty member: loans 5 (tool 9, unknown) and 6 (no tool):
    # days 5 + 1, deposits 4.00 (loan 5 has none), mean 3.
    assert_rows(
        result.rows,
        [("access", 1, 3, 25.5, 3.0), ("power", 3, 3, 27.25, 1.5), (None, 2, 6, 4.0, 3.0)],
    )
    assert result.levels == [1, 1, 1]


@pytest.mark.parametrize("engine_name", engine_params())
def test_replaced_and_cleared_filters(engine_name: str, open_engine: OpenEngine) -> None:
    engine = open_engine(engine_name, *library())
    result = run_on(engine, ["power_loans", "share_of_loans", "tools_lent"], ["tools.name"])
    # power_loans: loans whose tool is a power tool, within the row's tool: drill 2, saw 1; ladder
    # is no power tool and the empty member has no kind (null). share_of_loans: the row's loans
    # over all 6. tools_lent: distinct tool ids of the row's loans (the empty member: only 9).
    # Sander has no loans: every measure is null, so the row is left out (rule 6).
    assert_rows(
        result.rows,
        [
            ("drill", 2, 2 / 6, 1),
            ("ladder", None, 1 / 6, 1),
            ("saw", 1, 1 / 6, 1),
            (None, None, 2 / 6, 1),
        ],
    )


@pytest.mark.parametrize("engine_name", engine_params())
def test_iteration_with_a_case_sensitive_like(engine_name: str, open_engine: OpenEngine) -> None:
    engine = open_engine(engine_name, *library())
    result = run_on(engine, ["loans", "s_tools"], [])
    # Six loans; of the four tools only "saw" starts with a lower-case s ("Sander" does not).
    assert_rows(result.rows, [(6, 1)])
    assert result.levels == [0]


@pytest.mark.parametrize("engine_name", engine_params())
def test_dates_as_grouping_column_with_totals(engine_name: str, open_engine: OpenEngine) -> None:
    engine = open_engine(engine_name, *library())
    result = run_on(engine, ["loans", "days_per_loan"], ["loans.day"], totals=True)
    # days per loan: 1 March 2/1; 2 March (1 + 3)/2; 1 April loan 4 has no days (null);
    # 2 April (5 + 1)/2; in all 12 days over 6 loans.
    assert_rows(
        result.rows,
        [
            (dt.date(2025, 3, 1), 1, 2.0),
            (dt.date(2025, 3, 2), 2, 2.0),
            (dt.date(2025, 4, 1), 1, None),
            (dt.date(2025, 4, 2), 2, 3.0),
            (None, 6, 2.0),
        ],
    )
    assert result.levels == [1, 1, 1, 1, 0]
