"""Run SQL that ``measureport`` printed on DuckDB, over the ferry tables named as in the model."""

from __future__ import annotations

import datetime as dt
from decimal import Decimal
from pathlib import Path

import duckdb

from contract.tables import CsvTable

# The model's tables with the model's types (contract/harbour.py).
TABLES: dict[str, tuple[str, dict[str, str]]] = {
    "sailings": (
        "data/sailings.csv",
        {
            "sailing_id": "INTEGER",
            "route_id": "INTEGER",
            "day": "DATE",
            "passengers": "INTEGER",
            "fare_total": "DECIMAL(12,2)",
        },
    ),
    "route": (
        "data/routes.csv",
        {"route_id": "INTEGER", "name": "VARCHAR", "harbour_id": "INTEGER", "capacity": "INTEGER"},
    ),
    "harbour": ("data/harbours.csv", {"harbour_id": "INTEGER", "town": "VARCHAR"}),
    "calendar": ("data/calendar.csv", {"day": "DATE", "month": "INTEGER", "year": "INTEGER"}),
}


def database(root: Path) -> duckdb.DuckDBPyConnection:
    """An in-memory DuckDB with one table per model table, read from the data under ``root``."""
    con = duckdb.connect()
    for name, (path, columns) in TABLES.items():
        con.execute(
            f'CREATE TABLE "{name}" AS SELECT * FROM read_csv(?, header = true, columns = ?)',
            [str(root / path), columns],
        )
    return con


def as_field(value: object) -> str:
    """A result value written as ``run --format csv`` writes it (null as an empty field)."""
    if value is None:
        return ""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, dt.date):
        return value.isoformat()
    if isinstance(value, float):
        return repr(value)
    if isinstance(value, int | Decimal | str):
        return str(value)
    raise TypeError(f"unexpected value {value!r} in a result")


def result_table(con: duckdb.DuckDBPyConnection, sql: str) -> CsvTable:
    """Run ``sql`` and return its result as the fields of a CSV table."""
    cursor = con.execute(sql)
    header = [column[0] for column in cursor.description]
    return CsvTable(header=header, rows=[[as_field(v) for v in row] for row in cursor.fetchall()])
