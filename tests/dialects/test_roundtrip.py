"""The round-trip engine: SQL written for a dialect with no engine here, parsed back with sqlglot,
repaired where sqlglot's reading differs from the dialect's meaning, and run on DuckDB."""

from __future__ import annotations

import dataclasses
from typing import Any

import duckdb
import pytest

from measureport.compare import compare_results
from measureport.dialects import load_profile
from measureport.engines.duckdb import DuckDBEngine
from measureport.engines.roundtrip import RoundTripEngine, read_back
from measureport.errors import MeasureportError

from .conftest import DEMO_VIEWS, DIALECTS, demo

ROUNDTRIP_DIALECTS = tuple(d for d in DIALECTS if load_profile(d).is_roundtrip)


def run_duckdb(sql: str) -> Any:
    return duckdb.connect().execute(sql).fetchone()


def without_repairs(name: str) -> Any:
    return dataclasses.replace(load_profile(name), readback_repairs=())


def test_sized_max_text_is_read_as_text() -> None:
    sql = "SELECT CAST(NULL AS VARCHAR(MAX)) AS t"
    assert read_back(sql, load_profile("tsql")).duckdb_sql == "SELECT CAST(NULL AS TEXT) AS t"
    with pytest.raises(duckdb.Error):  # what sqlglot's reading gives DuckDB without the repair
        run_duckdb(read_back(sql, without_repairs("tsql")).duckdb_sql)


def test_a_plain_float_is_read_as_an_eight_byte_double() -> None:
    # 0.1 as an 8-byte float prints back as 0.1; as a 4-byte one it is 0.10000000149011612.
    sql = "SELECT CAST(0.1 AS FLOAT) AS x"
    assert run_duckdb(read_back(sql, load_profile("tsql")).duckdb_sql) == (0.1,)
    assert run_duckdb(read_back(sql, without_repairs("tsql")).duckdb_sql) != (0.1,)


def test_a_cast_of_a_division_to_an_integer_truncates() -> None:
    # -7 / 2 = -3.5: the dialect's cast truncates to -3; DuckDB's own cast rounds it to -4.
    sql = "SELECT CAST(CAST(-7 AS FLOAT) / 2 AS BIGINT) AS n"
    assert run_duckdb(read_back(sql, load_profile("tsql")).duckdb_sql) == (-3,)
    assert run_duckdb(read_back(sql, without_repairs("tsql")).duckdb_sql) == (-4,)


def test_a_numeric_without_precision_keeps_nine_decimals() -> None:
    # NUMERIC is DECIMAL(38,9) in the dialect: 1.23456 stays; DuckDB's DECIMAL is (18,3): 1.235.
    sql = "SELECT CAST(1.23456 AS NUMERIC) AS x"
    assert float(run_duckdb(read_back(sql, load_profile("bigquery")).duckdb_sql)[0]) == 1.23456
    assert float(run_duckdb(read_back(sql, without_repairs("bigquery")).duckdb_sql)[0]) == 1.235


def test_bit_is_read_as_a_boolean() -> None:
    sql = "SELECT CAST(1 AS BIT) AS b"
    assert run_duckdb(read_back(sql, load_profile("tsql")).duckdb_sql) == (True,)
    assert run_duckdb(read_back(sql, without_repairs("tsql")).duckdb_sql) != (True,)


def test_sql_that_does_not_parse_back_is_a_plain_error() -> None:
    with pytest.raises(MeasureportError) as caught:
        read_back("SELECT (1 + FROM", load_profile("snowflake"))
    assert caught.value.message.startswith("the SQL written for snowflake does not parse back with sqlglot: ")


@dataclasses.dataclass
class _Statement:
    """Stands in for a compiled query whose statement DuckDB cannot run."""

    query: Any

    def run_sql(self, pretty: bool = False) -> str:
        return 'SELECT "no_such_column" FROM "rides"'


def test_a_statement_duckdb_refuses_is_a_plain_error() -> None:
    workspace = demo()
    engine = RoundTripEngine(workspace.bound, "trino", DuckDBEngine.for_workspace(workspace))
    with pytest.raises(MeasureportError) as caught:
        engine.run_compiled(_Statement(workspace.query(["trips"])))  # type: ignore[arg-type]
    assert caught.value.message.startswith("DuckDB could not run the trino statement read back: ")


@pytest.fixture(scope="module")
def duckdb_engine() -> DuckDBEngine:
    return DuckDBEngine.for_workspace(demo())


@pytest.mark.parametrize("view", DEMO_VIEWS)
@pytest.mark.parametrize("dialect", ROUNDTRIP_DIALECTS)
def test_demo_views_round_trip_to_duckdbs_result(
    dialect: str, view: str, duckdb_engine: DuckDBEngine
) -> None:
    workspace = demo()
    query = workspace.view_query(view)
    engine = RoundTripEngine(workspace.bound, dialect, duckdb_engine)
    comparison = compare_results(duckdb_engine.run(query), engine.run(query), 1e-9)
    assert comparison.equal, (comparison.missing, comparison.extra, comparison.differences[:3])
    assert comparison.matched_rows > 0


def test_the_statement_shows_both_texts(duckdb_engine: DuckDBEngine) -> None:
    workspace = demo()
    engine = RoundTripEngine(workspace.bound, "tsql", duckdb_engine)
    text = engine.statement(engine.compile(workspace.query(["trips"], ["stations.name"])))
    assert text.startswith("-- written for tsql\n")
    assert "[stations]" in text  # T-SQL quotes names in brackets
    assert "-- read back with sqlglot and run on DuckDB\n" in text and '"stations"' in text
