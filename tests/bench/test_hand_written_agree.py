"""The benchmark's hand-written statements give the same answers as the generated SQL.

Each hand-written statement is an independent DuckDB rendering of the query written by hand
(common practice, no source); the benchmark refuses to time a query whose two answers differ.
"""

from __future__ import annotations

import pytest
from bench.queries import QUERIES
from bench.run import measure_query

from measureport.demo.writer import write_demo
from measureport.engines.duckdb import DuckDBEngine
from measureport.workspace import Workspace


@pytest.mark.slow
def test_every_benchmark_query_agrees_with_its_hand_written_sql(
    tmp_path_factory: pytest.TempPathFactory,
) -> None:
    folder = tmp_path_factory.mktemp("bench-demo")
    write_demo(folder, rides=20_000, fmt="parquet")
    ws = Workspace.open(folder / "model.yaml")
    engine = DuckDBEngine(ws.bound)
    strategies = set()
    for bq in QUERIES:
        result = measure_query(ws, engine, bq, repeat=1)
        assert result["rows"] > 0, bq.name
        strategies.add(bq.strategy)
    assert len(strategies) >= 15
