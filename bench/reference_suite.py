"""The reference suite: the reference evaluator against the generated SQL on DuckDB, on the demo
(invented data) at a small number of rides, query by query: how much faster the SQL path is."""

from __future__ import annotations

import sys
from collections.abc import Sequence
from dataclasses import dataclass
from functools import partial

from bench.demo_suite import demo_at, demo_query
from bench.queries import QUERIES, BenchQuery
from bench.sections import Section, seconds, table, times
from bench.timing import median, ratio, timed_call
from measureport.compare import compare_results, summary_text
from measureport.compile import compile_query
from measureport.engines.duckdb import DuckDBEngine
from measureport.reference.evaluator import Evaluator, evaluate_with
from measureport.reference.prepared import PreparedData
from measureport.semantics.bound import BoundModel
from measureport.workspace import Workspace


@dataclass(frozen=True)
class ReferenceTiming:
    """Median seconds of one query: the reference evaluator, compiling, and running the SQL."""

    name: str
    rows: int
    reference: float
    compile: float
    run: float
    problem: str = ""

    @property
    def speedup(self) -> float:
        """The reference's time over the SQL path's (compile and run)."""
        return ratio(self.reference, self.compile + self.run)


def time_reference(
    bound: BoundModel,
    prepared: PreparedData,
    engine: DuckDBEngine,
    ws: Workspace,
    bq: BenchQuery,
    repeat: int,
) -> ReferenceTiming:
    """Run one query ``repeat`` times by each path, alternately, and compare the answers."""
    query = demo_query(ws, bq)
    reference: list[float] = []
    compiling: list[float] = []
    running: list[float] = []
    for _ in range(repeat):
        # A new evaluator each time: its caches would otherwise answer the repeats.
        evaluator = Evaluator(bound, prepared)
        expected, seconds_reference = timed_call(partial(evaluate_with, evaluator, query))
        compiled, seconds_compile = timed_call(partial(compile_query, bound, query, "duckdb"))
        actual, seconds_run = timed_call(partial(engine.run_compiled, compiled))
        reference.append(seconds_reference)
        compiling.append(seconds_compile)
        running.append(seconds_run)
    comparison = compare_results(expected, actual, tolerance=1e-9)
    problem = "" if comparison.equal else (
        f"{bq.name}: the reference evaluator and DuckDB disagree: {summary_text(comparison)}"
    )
    return ReferenceTiming(
        bq.name, len(actual.rows), median(reference), median(compiling), median(running), problem
    )


def run_reference_suite(rides: int, repeat: int, only: Sequence[str] = ()) -> Section:
    """Every demo query (or those named in ``only``) by the reference evaluator and by DuckDB."""
    ws = Workspace.open(demo_at(rides))
    prepared, prepare_s = timed_call(lambda: PreparedData(ws.model, ws.dataset))
    engine = DuckDBEngine(ws.bound)
    try:
        timings = []
        for bq in QUERIES:
            if only and bq.name not in only:
                continue
            print(f"  reference {rides:,}: {bq.name} ...", file=sys.stderr, flush=True)
            timings.append(time_reference(ws.bound, prepared, engine, ws, bq, repeat))
    finally:
        engine.close()
    rows = [
        (t.name, str(t.rows), seconds(t.reference), seconds(t.compile), seconds(t.run),
         times(t.speedup), times(ratio(t.reference, t.run)))
        for t in timings
    ]
    speedups = [t.speedup for t in timings]
    body = [
        f"The demo (invented data) at {rides:,} rides. Each query runs {repeat} times by the reference "
        "evaluator (a new evaluator each time, so that its caches do not answer the repeats; the data "
        f"read and prepared once, in {prepare_s:.2f} s) and as generated SQL on DuckDB (compiled, "
        "then run), alternately; the answers are compared. The table shows the medians; the speed-up "
        "is the reference's time over the SQL path's.",
        "",
        *table(
            ("query", "rows", "reference s", "compile s", "DuckDB run s", "speed-up", "speed-up, run only"),
            rows,
            (False, True, True, True, True, True, True),
        ),
    ]
    if speedups:
        body += [
            "",
            f"Median speed-up {median(speedups):.2f} (from {min(speedups):.2f} to {max(speedups):.2f}); "
            f"in total the reference took {sum(t.reference for t in timings):.2f} s, the SQL path "
            f"{sum(t.compile + t.run for t in timings):.2f} s.",
        ]
    return Section(
        key=f"reference-{rides}",
        title=f"Reference evaluator against generated SQL, demo at {rides:,} rides",
        body=body,
        problems=[t.problem for t in timings if t.problem],
    )
