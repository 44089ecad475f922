"""Fixtures of the TPC-H checks: the example at a small scale factor, generated once into the cache."""

from __future__ import annotations

from collections.abc import Iterator
from pathlib import Path

import duckdb
import pytest

from measureport.tpch import connect_tables, prepare_tpch
from measureport.workspace import Workspace

SMALL_SCALE = 0.01


@pytest.fixture(scope="session")
def small_model() -> Path:
    """The TPC-H model at scale factor 0.01 (generated on first use, then read from the cache)."""
    return prepare_tpch(SMALL_SCALE)


@pytest.fixture(scope="session")
def small_workspace(small_model: Path) -> Iterator[Workspace]:
    with Workspace.open(small_model) as workspace:
        yield workspace


@pytest.fixture(scope="session")
def small_sql(small_model: Path) -> Iterator[duckdb.DuckDBPyConnection]:
    """DuckDB with the TPC-H tables under their own names, for the specification's SQL text."""
    connection = connect_tables(small_model.parent / "data")
    yield connection
    connection.close()
