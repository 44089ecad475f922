"""Every model type, with nulls, loaded into each real engine and read back (invented data).

The engines are the external references here: SQLite (stdlib sqlite3), ClickHouse (chdb),
DataFusion, PostgreSQL (a real server) and Spark SQL (local mode). Each test names the engine in
its parameter id. Expected values are the rows of samples.READING_ROWS written out by hand,
as the type mapping of each adapter's docstring says they come back.
"""

from __future__ import annotations

import datetime as dt

import pytest
from sqlglot import exp

from measureport.engines.sqlengine import SqlEngine
from measureport.engines.typed_rows import table_kinds
from realengines.engines import OpenEngine, engine_params
from realengines.samples import READING_TYPES, readings

# Read back, by the column kinds: decimals as floats, dates as dates, booleans as bools.
EXPECTED_ROWS = [
    (1, 9007199254740993, 12.5, -3.25, 'say "hi", ok\nx', dt.date(1969, 12, 31), True),
    (2, None, None, None, None, None, None),
    (3, -5, -0.01, 1e300, "", dt.date(2024, 2, 29), False),
]


def select_all(engine: SqlEngine, table: str, columns: list[str], order_by: str) -> str:
    """``SELECT columns FROM table ORDER BY order_by`` in the engine's dialect."""
    query = (
        exp.select(*(exp.column(c, quoted=True) for c in columns))
        .from_(exp.Table(this=exp.to_identifier(table, quoted=True)))
        .order_by(exp.Ordered(this=exp.column(order_by, quoted=True), nulls_first=False))
    )
    return query.sql(dialect=engine.sqlglot_dialect, identify=True)


@pytest.mark.parametrize("engine_name", engine_params())
def test_every_type_and_null_comes_back_as_loaded(engine_name: str, open_engine: OpenEngine) -> None:
    bound, dataset = readings()
    engine = open_engine(engine_name, bound, dataset)
    sql = select_all(engine, "readings", list(READING_TYPES), "reading_id")
    rows = engine.execute(sql, table_kinds(bound.model, "readings"))
    assert rows == EXPECTED_ROWS
    for row, expected in zip(rows, EXPECTED_ROWS, strict=True):
        # Equal is not enough: 1 == 1.0 == True in Python. The types must be the documented ones.
        assert [type(v) for v in row] == [type(v) for v in expected]


@pytest.mark.parametrize("engine_name", engine_params())
def test_bigint_beyond_double_precision_is_exact(engine_name: str, open_engine: OpenEngine) -> None:
    # 2**53 + 1 is odd; through a double it would come back as 2**53 (even).
    bound, dataset = readings()
    engine = open_engine(engine_name, bound, dataset)
    value = exp.column("dock_id", quoted=True)
    query = (
        exp.select(exp.Mod(this=value, expression=exp.Literal.number(2)))
        .from_(exp.Table(this=exp.to_identifier("readings", quoted=True)))
        .where(exp.EQ(this=exp.column("reading_id", quoted=True), expression=exp.Literal.number(1)))
    )
    assert engine.execute(query.sql(dialect=engine.sqlglot_dialect, identify=True), ["number"]) == [(1,)]


# The column type each engine reports for each model type, as the adapters' docstrings document.
DECLARED: dict[str, dict[str, str]] = {
    "sqlite": {
        "reading_id": "INTEGER",
        "dock_id": "INTEGER",
        "fee": "REAL",
        "temperature": "REAL",
        "note": "TEXT",
        "day": "TEXT",
        "is_faulty": "INTEGER",
    },
    "postgres": {
        "reading_id": "bigint",
        "dock_id": "bigint",
        "fee": "numeric(12,2)",
        "temperature": "double precision",
        "note": "text",
        "day": "date",
        "is_faulty": "boolean",
    },
    "clickhouse": {
        "reading_id": "Nullable(Int64)",
        "dock_id": "Nullable(Int64)",
        "fee": "Nullable(Decimal(12, 2))",
        "temperature": "Nullable(Float64)",
        "note": "Nullable(String)",
        "day": "Nullable(Date32)",
        "is_faulty": "Nullable(Bool)",
    },
    "spark": {
        "reading_id": "bigint",
        "dock_id": "bigint",
        "fee": "decimal(12,2)",
        "temperature": "double",
        "note": "string",
        "day": "date",
        "is_faulty": "boolean",
    },
    "datafusion": {
        "reading_id": "Int64",
        "dock_id": "Int64",
        "fee": "Decimal128(12, 2)",
        "temperature": "Float64",
        "note": "Utf8",
        "day": "Date32",
        "is_faulty": "Boolean",
    },
}


# Each engine's own description of a table, as (column name, type) rows.
DESCRIBE_READINGS = {
    "sqlite": 'SELECT "name", "type" FROM pragma_table_info(\'readings\') ORDER BY "cid"',
    "postgres": (
        "SELECT attname::text, format_type(atttypid, atttypmod) FROM pg_attribute "
        "WHERE attrelid = 'readings'::regclass AND attnum > 0 AND NOT attisdropped ORDER BY attnum"
    ),
    "clickhouse": (
        "SELECT name, type FROM system.columns "
        "WHERE database = currentDatabase() AND table = 'readings' ORDER BY position"
    ),
    "spark": "DESCRIBE readings",
    "datafusion": "SELECT "
    + ", ".join(f"'{c}', arrow_typeof(\"{c}\")" for c in READING_TYPES)
    + " FROM readings LIMIT 1",
}


def declared_types(engine_name: str, engine: SqlEngine) -> dict[str, str]:
    """Each column's type as the engine itself describes the loaded table."""
    rows = engine.execute(DESCRIBE_READINGS[engine_name])
    if engine_name == "datafusion":
        flat = rows[0]
        return {flat[i]: flat[i + 1] for i in range(0, len(flat), 2)}
    return {row[0]: row[1] for row in rows}


@pytest.mark.parametrize("engine_name", engine_params())
def test_engine_reports_the_documented_column_types(engine_name: str, open_engine: OpenEngine) -> None:
    bound, dataset = readings()
    engine = open_engine(engine_name, bound, dataset)
    assert declared_types(engine_name, engine) == DECLARED[engine_name]
