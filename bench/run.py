"""Generated SQL against hand-written SQL of the same answer, side by side in one process.

    python -m bench                    # the demo at 5 million rides (generated once into .cache/)
    python -m bench --rides 200000 --repeat 3 --out bench/results.md

For each query: both statements run once and are checked equal (cell by cell); then they run
``--repeat`` times each, alternating, and the medians are compared. Also reported: the compile
time of every demo measure over five groupings, and how often each statement reads the rides
table (from the plan).
"""

from __future__ import annotations

import argparse
import platform
import statistics
import sys
import time
from pathlib import Path
from typing import Any

from bench.queries import QUERIES, BenchQuery
from measureport.compare import compare_results, comparison_text
from measureport.compile import compile_query
from measureport.demo.writer import write_demo
from measureport.engines.duckdb import DuckDBEngine
from measureport.engines.values import python_value
from measureport.query import Query, ResultTable
from measureport.workspace import Workspace

ROOT = Path(__file__).resolve().parents[1]
CACHE = ROOT / ".cache" / "bench"

GROUPINGS = (
    (),
    ("districts.name",),
    ("calendar.month",),
    ("bikes.model", "plans.name"),
    ("districts.name", "stations.name", "calendar.year"),
)


def demo_at(rides: int) -> Path:
    """The demo model with ``rides`` rides as Parquet, generated once into the cache."""
    folder = CACHE / f"rides-{rides}"
    model = folder / "model.yaml"
    if not model.exists():
        print(f"generating the demo with {rides:,} rides into {folder} ...", file=sys.stderr)
        write_demo(folder, rides=rides, fmt="parquet", force=True)
    return model


def hand_result(engine: DuckDBEngine, query: Query, sql: str) -> ResultTable:
    rows = engine.connection.execute(sql).fetchall()
    n = len(query.by) + len(query.measures)
    return ResultTable(
        by=tuple(str(c) for c in query.by),
        measures=tuple(query.measures),
        rows=[tuple(python_value(v) for v in row[:n]) for row in rows],
        levels=[int(row[n]) for row in rows],
    )


def timed(engine: DuckDBEngine, sql: str) -> float:
    start = time.perf_counter()
    engine.connection.execute(sql).fetchall()
    return time.perf_counter() - start


def measure_query(
    ws: Workspace, engine: DuckDBEngine, bq: BenchQuery, repeat: int
) -> dict[str, Any]:
    """Check one query's two statements equal, then time them alternately."""
    query = ws.query(list(bq.measures), list(bq.by), list(bq.where), bq.totals)
    compiled = compile_query(ws.bound, query, "duckdb")
    generated_sql = compiled.run_sql()
    generated = engine.run_compiled(compiled)
    written = hand_result(engine, query, bq.hand_sql)
    comparison = compare_results(written, generated, tolerance=1e-9)
    if not comparison.equal:
        raise SystemExit(
            f"{bq.name}: the generated SQL and the hand-written SQL disagree\n"
            + comparison_text(comparison, "hand-written", "generated")
        )
    gen_times: list[float] = []
    hand_times: list[float] = []
    for _ in range(repeat):
        gen_times.append(timed(engine, generated_sql))
        hand_times.append(timed(engine, bq.hand_sql))
    gen, hand = statistics.median(gen_times), statistics.median(hand_times)
    return {
        "name": bq.name,
        "strategy": bq.strategy,
        "rows": len(generated.rows),
        "generated": gen,
        "hand": hand,
        "ratio": gen / hand if hand > 0 else float("inf"),
        "rides_scans": compiled.scans.get("rides", 0),
    }


def compile_time(ws: Workspace) -> tuple[float, int]:
    """Seconds to compile every measure of the model over five groupings, and how many queries."""
    start = time.perf_counter()
    count = 0
    for by in GROUPINGS:
        compile_query(ws.bound, ws.query(list(ws.measure_names), list(by)), "duckdb").run_sql()
        count += 1
    return time.perf_counter() - start, count


def report(results: list[dict[str, Any]], compile_seconds: float, rides: int, repeat: int) -> str:
    ratios = [r["ratio"] for r in results]
    lines = [
        f"Demo at {rides:,} rides, DuckDB, median of {repeat} alternating runs each; "
        f"machine: {platform.machine()}, {platform.python_implementation()} {platform.python_version()}, "
        f"{_cores()} cores.",
        "",
        "| query | strategy | rows | generated s | hand-written s | ratio | rides scans |",
        "|---|---|---:|---:|---:|---:|---:|",
    ]
    for r in results:
        lines.append(
            f"| {r['name']} | {r['strategy']} | {r['rows']} | {r['generated']:.4f} | {r['hand']:.4f} "
            f"| {r['ratio']:.2f} | {r['rides_scans']} |"
        )
    lines += [
        "",
        f"Median ratio {statistics.median(ratios):.2f}, worst {max(ratios):.2f} "
        f"({max(results, key=lambda r: r['ratio'])['name']}). "
        f"Compiling all demo measures over {len(GROUPINGS)} groupings: {compile_seconds:.3f} s.",
    ]
    return "\n".join(lines)


def _cores() -> int:
    import os

    return os.cpu_count() or 1


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m bench", description=__doc__.splitlines()[0])
    parser.add_argument("--rides", type=int, default=5_000_000, help="rides in the demo data")
    parser.add_argument("--repeat", type=int, default=5, help="timed runs of each statement")
    parser.add_argument("--only", action="append", default=[], help="run only these queries")
    parser.add_argument("--out", type=Path, help="also write the table (markdown) to this file")
    args = parser.parse_args(argv)

    ws = Workspace.open(demo_at(args.rides))
    engine = DuckDBEngine(ws.bound)
    chosen = [q for q in QUERIES if not args.only or q.name in args.only]
    results = []
    for bq in chosen:
        print(f"  {bq.name} ...", file=sys.stderr, flush=True)
        results.append(measure_query(ws, engine, bq, args.repeat))
    seconds, _ = compile_time(ws)
    text = report(results, seconds, args.rides, args.repeat)
    print(text)
    if args.out:
        args.out.write_text(text + "\n", encoding="utf-8")
    return 0
