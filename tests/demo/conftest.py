"""Shared fixtures for the demo tests: one generated copy of the demo data per session."""

from __future__ import annotations

from pathlib import Path

import duckdb
import pytest

from measureport.demo.generator import generate_data

SMALL_RIDES = 20_000  # the size of examples/bikeshare


@pytest.fixture(scope="session")
def demo_data(tmp_path_factory: pytest.TempPathFactory) -> tuple[Path, dict[str, int]]:
    """The demo data with the default seed, written once: (folder, row counts returned)."""
    out = tmp_path_factory.mktemp("bikeshare")
    return out, generate_data(out, rides=SMALL_RIDES)


@pytest.fixture(scope="session")
def demo_db(demo_data: tuple[Path, dict[str, int]]) -> duckdb.DuckDBPyConnection:
    """A DuckDB connection with one view per demo table, read from the generated CSV files."""
    out, sizes = demo_data
    con = duckdb.connect()
    for table in sizes:
        path = out / "data" / f"{table}.csv"
        con.execute(f"CREATE VIEW {table} AS SELECT * FROM read_csv('{path}')")
    return con
