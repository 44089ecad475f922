"""The benchmark's hand-written statements give the same answers as the generated SQL.

Each hand-written demo statement is an independent DuckDB rendering of the query written by hand
(common practice, no source); each TPC-H statement is the specification's SQL text (TPC-H
Standard Specification, clause 2.4, as kept in tests/tpch/spec_queries.py). The benchmark refuses
to time a query whose two answers differ; these slow tests check the pairs at a small scale.
"""

from __future__ import annotations

import pytest
from bench.demo_suite import measure_query
from bench.queries import QUERIES
from bench.tpch_queries import STRATEGIES, spec_pairs
from bench.tpch_suite import measure_spec_pair

from measureport.demo.writer import write_demo
from measureport.engines.duckdb import DuckDBEngine
from measureport.tpch import prepare_tpch
from measureport.workspace import Workspace


@pytest.mark.slow
def test_every_benchmark_query_agrees_with_its_hand_written_sql(
    tmp_path_factory: pytest.TempPathFactory,
) -> None:
    # Invented data: the bike-share demo at 20,000 rides.
    folder = tmp_path_factory.mktemp("bench-demo")
    write_demo(folder, rides=20_000, fmt="parquet")
    ws = Workspace.open(folder / "model.yaml")
    engine = DuckDBEngine(ws.bound)
    strategies = set()
    for bq in QUERIES:
        result = measure_query(ws, engine, bq, repeat=1)
        assert result.verdict == "", result.problem
        assert result.rows > 0, bq.name
        assert result.ratio is not None and result.ratio > 0
        strategies.add(bq.strategy)
    assert len(strategies) >= 15


@pytest.mark.slow
def test_every_tpch_view_agrees_with_the_specification_sql() -> None:
    ws = Workspace.open(prepare_tpch(0.01))
    engine = DuckDBEngine(ws.bound)
    pairs = spec_pairs()
    # The twelve queries of tests/tpch/spec_queries.py: Q1, Q3-Q6, Q10-Q12, Q14, Q16, Q17, Q19.
    assert [p.number for p in pairs] == [1, 3, 4, 5, 6, 10, 11, 12, 14, 16, 17, 19]
    for pair in pairs:
        assert pair.view in STRATEGIES, f"{pair.view} has no strategy label"
        result = measure_spec_pair(ws, engine, pair, repeat=1)
        assert result.verdict == "", result.problem
        assert result.ratio is not None
