"""A DuckDB connection with the TPC-H tables under their own names, to run SQL written by hand
(such as the specification's query text) against the same files the model reads."""

from __future__ import annotations

from pathlib import Path

import duckdb

from measureport.errors import MeasureportError
from measureport.tpch.generate import TABLES


def connect_tables(data_dir: Path) -> duckdb.DuckDBPyConnection:
    """A new in-memory DuckDB database with one view per TPC-H table over ``data_dir/<table>.parquet``."""
    missing = [t for t in TABLES if not (data_dir / f"{t}.parquet").is_file()]
    if missing:
        raise MeasureportError(f"{data_dir} has no Parquet file for the tables {', '.join(missing)}")
    connection = duckdb.connect()
    for table in TABLES:
        connection.read_parquet(str(data_dir / f"{table}.parquet")).create_view(table)
    return connection
