"""The demo suite: each query of bench/queries.py, generated SQL against the hand-written
statement, on DuckDB over the bike-share demo (invented data) at a number of rides."""

from __future__ import annotations

import sys
from collections.abc import Sequence
from pathlib import Path

from bench.pair_report import ISSUE_3, ISSUE_6, pair_table, ratio_checks, ratio_summary, scan_check
from bench.pairs import PairResult, Written, measure_pair
from bench.queries import QUERIES, BenchQuery
from bench.sections import Section
from measureport.compile import compile_query
from measureport.demo.writer import write_demo
from measureport.engines.duckdb import DuckDBEngine
from measureport.engines.values import python_value
from measureport.query import Query, ResultTable
from measureport.workspace import Workspace

ROOT = Path(__file__).resolve().parents[1]
CACHE = ROOT / ".cache" / "bench"
FACT = "rides"


def demo_at(rides: int, cache: Path = CACHE) -> Path:
    """The demo model with ``rides`` rides as Parquet, generated once into ``cache``."""
    folder = cache / f"rides-{rides}"
    model = folder / "model.yaml"
    if not model.exists():
        print(f"generating the demo with {rides:,} rides into {folder} ...", file=sys.stderr, flush=True)
        write_demo(folder, rides=rides, fmt="parquet", force=True)
    return model


def demo_query(ws: Workspace, bq: BenchQuery) -> Query:
    """The measure query of a benchmark query."""
    return ws.query(list(bq.measures), list(bq.by), list(bq.where), bq.totals)


def hand_result(engine: DuckDBEngine, query: Query, sql: str) -> ResultTable:
    """The rows of a hand-written statement (grouping columns, measures, then the subtotal level)
    as the result of ``query``."""
    rows = engine.connection.execute(sql).fetchall()
    n = len(query.by) + len(query.measures)
    return ResultTable(
        by=tuple(str(c) for c in query.by),
        measures=tuple(query.measures),
        rows=[tuple(python_value(v) for v in row[:n]) for row in rows],
        levels=[int(row[n]) for row in rows],
    )


def measure_query(ws: Workspace, engine: DuckDBEngine, bq: BenchQuery, repeat: int) -> PairResult:
    """Check one demo query's two statements equal, then time them alternately."""
    query = demo_query(ws, bq)
    compiled = compile_query(ws.bound, query, "duckdb")
    written = Written(lambda: hand_result(engine, query, bq.hand_sql), bq.hand_sql)
    return measure_pair(engine, bq.name, bq.strategy, compiled, written, FACT, repeat)


def run_demo_suite(rides: int, repeat: int, only: Sequence[str] = ()) -> Section:
    """Every demo query (or those named in ``only``) at ``rides`` rides."""
    ws = Workspace.open(demo_at(rides))
    engine = DuckDBEngine(ws.bound)
    try:
        results = []
        for bq in QUERIES:
            if only and bq.name not in only:
                continue
            print(f"  demo {rides:,}: {bq.name} ...", file=sys.stderr, flush=True)
            results.append(measure_query(ws, engine, bq, repeat))
    finally:
        engine.close()
    body = [
        f"The bike-share demo (invented data) with {rides:,} rides as Parquet, on DuckDB. Each query's "
        "generated SQL and a statement written by hand for the same answer are checked equal, then "
        f"run {repeat} times each, alternately; the table shows the medians. Peak memory is how far "
        "the process's resident set rose above its size at the start of the checking run.",
        "",
        *pair_table(results, FACT, "hand-written"),
        "",
        ratio_summary(results),
    ]
    one_context = [q.name for q in QUERIES if q.one_context]
    return Section(
        key=f"demo-{rides}",
        title=f"Demo at {rides:,} rides: generated against hand-written SQL on DuckDB",
        body=body,
        targets=[*ratio_checks(results, ISSUE_3), *ratio_checks(results, ISSUE_6),
                 *scan_check(results, one_context, FACT)],
        problems=[r.problem for r in results if r.problem],
    )
