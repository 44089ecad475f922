"""SQL behaviour each adapter must set up on its engine, checked on the engine itself (invented data).

The external references are the engines: SQLite (stdlib sqlite3), ClickHouse (chdb),
DataFusion, PostgreSQL (a real server) and Spark SQL (local mode), named in each parameter id.
Statements are built with sqlglot and rendered in the engine's dialect. Data: the tool library
of samples.py.
"""

from __future__ import annotations

import pytest
from sqlglot import exp

from measureport.engines.sqlengine import SqlEngine
from measureport.engines.sqlite import refuse_quoted_strings
from measureport.errors import MeasureportError
from realengines.engines import OpenEngine, engine_params
from realengines.samples import library, readings


def col(table: str, name: str) -> exp.Column:
    return exp.column(name, table, quoted=True)


def tbl(name: str) -> exp.Table:
    return exp.Table(this=exp.to_identifier(name, quoted=True))


def run(engine: SqlEngine, query: exp.Expression, kinds: list[str] | None = None) -> list[tuple[object, ...]]:
    return engine.execute(query.sql(dialect=engine.sqlglot_dialect, identify=True), kinds)  # type: ignore[arg-type]


@pytest.mark.parametrize("engine_name", engine_params())
def test_aggregates_over_no_rows_are_null(engine_name: str, open_engine: OpenEngine) -> None:
    # SQL, and the language's rule 5; ClickHouse needs aggregate_functions_null_for_empty for it.
    engine = open_engine(engine_name, *library())
    query = (
        exp.select(exp.Sum(this=col("loans", "days")), exp.Max(this=col("loans", "day")))
        .from_(tbl("loans"))
        .where(exp.GT(this=col("loans", "loan_id"), expression=exp.Literal.number(100)))
    )
    assert run(engine, query, ["number", "date"]) == [(None, None)]


@pytest.mark.parametrize("engine_name", engine_params())
def test_unmatched_outer_join_rows_are_null(engine_name: str, open_engine: OpenEngine) -> None:
    # Loan 5 points at tool 9, which does not exist: its tool columns are null, not 0 or ''
    # (ClickHouse needs join_use_nulls for it).
    engine = open_engine(engine_name, *library())
    query = (
        exp.select(col("tools", "tool_id"), col("tools", "name"), col("tools", "electric"))
        .from_(tbl("loans"))
        .join(
            tbl("tools"),
            on=exp.EQ(this=col("loans", "tool_id"), expression=col("tools", "tool_id")),
            join_type="left",
        )
        .where(exp.EQ(this=col("loans", "loan_id"), expression=exp.Literal.number(5)))
    )
    assert run(engine, query, ["number", "text", "boolean"]) == [(None, None, None)]


@pytest.mark.parametrize("engine_name", engine_params())
def test_like_is_case_sensitive(engine_name: str, open_engine: OpenEngine) -> None:
    # Tools whose name starts with a lower-case s: only "saw", not "Sander" (LANGUAGE.md: SQL
    # meaning; SQLite ignores case unless case_sensitive_like is on).
    engine = open_engine(engine_name, *library())
    query = (
        exp.select(col("tools", "name"))
        .from_(tbl("tools"))
        .where(exp.Like(this=col("tools", "name"), expression=exp.Literal.string("s%")))
    )
    assert run(engine, query, ["text"]) == [("saw",)]


@pytest.mark.parametrize("engine_name", engine_params())
def test_sums_keep_integers_whole_and_decimals_exact(engine_name: str, open_engine: OpenEngine) -> None:
    # days: 2 + 1 + 3 + 1 + 5 = 12 (loan 4 has none); deposits: 10.00 + 10.00 + 25.50 + 7.25 + 4.00
    # = 56.75 (loan 5 has none).
    engine = open_engine(engine_name, *library())
    query = exp.select(exp.Sum(this=col("loans", "days")), exp.Sum(this=col("loans", "deposit"))).from_(
        tbl("loans")
    )
    [(days, deposits)] = run(engine, query, ["number", "number"])
    assert days == 12
    assert type(days) is int
    assert deposits == pytest.approx(56.75, rel=1e-12)
    assert type(deposits) is float


@pytest.mark.parametrize("engine_name", engine_params())
def test_a_failed_statement_is_a_plain_error_and_the_next_one_runs(
    engine_name: str, open_engine: OpenEngine
) -> None:
    engine = open_engine(engine_name, *readings())
    bad = exp.select(exp.Count(this=exp.Star())).from_(tbl("no_such_table"))
    with pytest.raises(MeasureportError) as caught:
        run(engine, bad)
    message = caught.value.message
    assert message.startswith(f"{engine.title} could not run the statement: ")
    assert "\n" not in message
    assert "Traceback" not in message
    count = exp.select(exp.Count(this=exp.Star())).from_(tbl("readings"))
    assert run(engine, count, ["number"]) == [(3,)]


@pytest.mark.parametrize("engine_name", engine_params(("sqlite",)))
def test_sqlite_refuses_a_quoted_name_that_is_no_column(engine_name: str, open_engine: OpenEngine) -> None:
    # SQLite's compatibility rule reads "no_such_column" as the text 'no_such_column'; the adapter
    # turns it off where Python's sqlite3 can (3.12+).
    engine = open_engine(engine_name, *readings())
    if not refuse_quoted_strings(engine.connection):  # type: ignore[attr-defined]
        pytest.skip("this Python's sqlite3 has no Connection.setconfig (Python 3.12+)")
    bad = exp.select(exp.column("no_such_column", quoted=True)).from_(tbl("readings"))
    with pytest.raises(MeasureportError, match="no such column"):
        run(engine, bad)


@pytest.mark.parametrize("engine_name", engine_params(("clickhouse",)))
def test_two_clickhouse_engines_keep_their_tables_apart(engine_name: str, open_engine: OpenEngine) -> None:
    # chdb shares one server per process: each engine has a database of its own.
    first = open_engine(engine_name, *readings())
    second = open_engine(engine_name, *library())
    count = exp.select(exp.Count(this=exp.Star())).from_(tbl("readings"))
    assert run(first, count, ["number"]) == [(3,)]
    with pytest.raises(MeasureportError):
        run(second, count)
    first.close()
    loans = exp.select(exp.Count(this=exp.Star())).from_(tbl("loans"))
    assert run(second, loans, ["number"]) == [(6,)]


@pytest.mark.parametrize("engine_name", engine_params())
def test_close_twice_is_harmless(engine_name: str, open_engine: OpenEngine) -> None:
    engine = open_engine(engine_name, *readings())
    engine.close()
    engine.close()
