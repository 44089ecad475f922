"""The compile suite: how long the compiler takes and how much memory it needs, on the demo's own
measures over five groupings and on 1,000 generated measures; how many scans of the rides the
plain measures of one context need; and the peak memory of running the generated queries."""

from __future__ import annotations

import gc
import sys
from collections.abc import Callable, Sequence
from dataclasses import dataclass
from functools import partial
from typing import TypeVar

from bench.demo_suite import demo_at
from bench.measure_texts import GeneratedMeasure, generate_measures, measure_file_text
from bench.memory import mib, peak_above_start, traced_peak
from bench.sections import Section, TargetCheck, seconds, table
from bench.timing import median, timed_call
from measureport.compile import CompiledQuery, compile_query
from measureport.engines.duckdb import DuckDBEngine
from measureport.errors import MeasureportError
from measureport.language.parser import parse_measures
from measureport.model.loader import load_model
from measureport.model.schema import Model
from measureport.query import ResultTable
from measureport.semantics.binder import bind_model, build_query
from measureport.semantics.bound import BoundModel
from measureport.semantics.sources import read_measure_files

GROUPINGS: tuple[tuple[str, ...], ...] = (
    (),
    ("districts.name",),
    ("calendar.month",),
    ("bikes.model", "plans.name"),
    ("districts.name", "stations.name", "calendar.year"),
)
FACT = "rides"
# The demo's measures that aggregate the rides under the report's own context.
PLAIN_DEMO = ("trips", "revenue", "revenue_per_trip", "mean_duration", "longest_ride", "first_ride_day",
              "bikes_in_use")
DEMO_TARGET_S = 1.0
GENERATED_TARGET_S = 2.0
GENERATED_COUNT = 1_000


Batch = tuple[Sequence[str], Sequence[str]]
T = TypeVar("T")


def timed_alone(run: Callable[[], T]) -> tuple[T, float]:
    """``timed_call`` after a full garbage collection (not timed): the garbage that the parts
    before left is not collected inside this one, whose own collections are."""
    gc.collect()
    return timed_call(run)


def compile_all(bound: BoundModel, batches: Sequence[Batch]) -> list[CompiledQuery]:
    """Compile each (measures, grouping) batch to DuckDB SQL text, as ``measureport sql`` would."""
    compiled = []
    for measures, by in batches:
        query = compile_query(bound, build_query(bound, tuple(measures), tuple(by), (), False), "duckdb")
        query.run_sql()
        compiled.append(query)
    return compiled


def bind_generated(model: Model, generated: Sequence[GeneratedMeasure]) -> tuple[BoundModel, float, float]:
    """The demo model bound with the generated measures added; seconds to parse and to bind."""
    text = measure_file_text(list(generated))
    parsed, parse_s = timed_alone(lambda: parse_measures(text, "<generated measures>"))
    bound, bind_s = timed_alone(lambda: bind_model(model, [*read_measure_files(model), parsed]))
    return bound, parse_s, bind_s


@dataclass(frozen=True)
class AloneTiming:
    """Compiling one generated measure alone: seconds, or the error it raised."""

    measure: GeneratedMeasure
    seconds: float
    error: str = ""


def compile_each_alone(bound: BoundModel, generated: Sequence[GeneratedMeasure]) -> list[AloneTiming]:
    """Compile every generated measure in a query of its own, the groupings taken in turn."""
    timings = []
    for i, measure in enumerate(generated):
        batch = [((measure.name,), GROUPINGS[i % len(GROUPINGS)])]
        try:
            _, spent = timed_call(partial(compile_all, bound, batch))
            timings.append(AloneTiming(measure, spent))
        except MeasureportError as exc:
            timings.append(AloneTiming(measure, 0.0, exc.message))
    return timings


def run_compile_suite(count: int, repeat: int, run_rides: int) -> Section:
    """Compile timings and memory for the demo measures and for ``count`` generated measures; the
    generated queries are also run on the demo at ``run_rides`` rides."""
    model = load_model(demo_at(run_rides))
    demo_bound = bind_model(model)
    demo_batches = [(tuple(demo_bound.measures), by) for by in GROUPINGS]
    print("  compile: the demo's measures over five groupings ...", file=sys.stderr, flush=True)
    _, demo_cold = timed_alone(lambda: compile_all(demo_bound, demo_batches))
    demo_warm = median([timed_alone(lambda: compile_all(demo_bound, demo_batches))[1] for _ in range(repeat)])
    _, demo_traced = traced_peak(lambda: compile_all(demo_bound, demo_batches))

    generated = generate_measures(count)
    bound, parse_s, bind_s = bind_generated(model, generated)
    names = [m.name for m in generated]
    size = -(-count // len(GROUPINGS))
    batches = [(names[k * size:(k + 1) * size], by) for k, by in enumerate(GROUPINGS)]
    print(f"  compile: {count} generated measures in {len(batches)} queries ...", file=sys.stderr, flush=True)
    batch_runs = [timed_alone(lambda: compile_all(bound, batches)) for _ in range(max(1, min(repeat, 3)))]
    batch_s = median([spent for _, spent in batch_runs])
    compiled_batches = batch_runs[0][0]
    _, batch_traced = traced_peak(lambda: compile_all(bound, batches))
    print(f"  compile: {count} generated measures one by one ...", file=sys.stderr, flush=True)
    gc.collect()
    alone = compile_each_alone(bound, generated)
    print("  compile: scans of the plain measures, and running the generated queries ...", file=sys.stderr,
          flush=True)
    plain = [*PLAIN_DEMO, *(m.name for m in generated if m.family == "aggregate")]
    plain_scans = [c.scans.get(FACT, 0) for c in compile_all(bound, [(plain, by) for by in GROUPINGS])]
    runs, run_problems = _run_batches(bound, compiled_batches)

    compiled_ok = [t for t in alone if not t.error]
    alone_total = sum(t.seconds for t in compiled_ok)
    body = [
        "Compile means building the query from its measure names and grouping columns, lowering it "
        "to a plan, rendering it and writing its DuckDB SQL text (not formatted for reading); it "
        "includes the one pass of Python's garbage collector that ends each compile (the collector "
        "is paused while a query compiles), and not the parsing and binding of the measure files, "
        "which have rows of their own. Each timed part starts after a full collection (not "
        "timed), so that garbage the parts before it left is not collected inside it. The demo's "
        f"{len(demo_bound.measures)} measures are compiled as one query per grouping, five groupings "
        f"({', '.join(' + '.join(g) or 'grand total' for g in GROUPINGS)}). The {count} generated "
        "measures (texts of our own over the demo model, the families below taken in turn; "
        "bench/measure_texts.py) are parsed and bound with the demo's, then compiled in "
        f"{len(batches)} queries of up to {size} measures (one per grouping) and each alone. Peak "
        "compile memory is the peak of Python allocations (tracemalloc) during a separate run, "
        "garbage kept until a query's collector pass included. Each "
        "measure alone is compiled once, so its slowest time can include a pause of the machine.",
        "",
        *table(
            ("what", "seconds", "peak compile memory MiB"),
            [
                (f"demo: {len(demo_bound.measures)} measures x 5 groupings, first run",
                 seconds(demo_cold), "–"),
                (f"demo: {len(demo_bound.measures)} measures x 5 groupings, median of {repeat}",
                 seconds(demo_warm), mib(demo_traced)),
                (f"generated: parse {count} measures", seconds(parse_s), "–"),
                ("generated: bind them with the demo's", seconds(bind_s), "–"),
                (f"generated: compile all in {len(batches)} queries (median of {len(batch_runs)})",
                 seconds(batch_s), mib(batch_traced)),
                (f"generated: parse, bind and compile all in {len(batches)} queries, the rows above added",
                 seconds(parse_s + bind_s + batch_s), "–"),
                (f"generated: compile each alone, {len(compiled_ok)} queries in all",
                 seconds(alone_total), "–"),
            ],
            (False, True, True),
        ),
        "",
        "Compiling each generated measure alone, by family:",
        "",
        *_family_table(alone),
        "",
        f"Scans of {FACT} by one query of the {len(plain)} plain measures (the demo's "
        f"{len(PLAIN_DEMO)} and the generated aggregates, all under the report's own context), per "
        f"grouping: {', '.join(map(str, plain_scans))}.",
        "",
        f"The generated queries run on DuckDB over the demo at {run_rides:,} rides (each query once; "
        "peak memory is the rise of the resident set):",
        "",
        *table(
            ("query", "measures", "grouping", "rows", "run s", "peak MiB", f"{FACT} scans"),
            runs,
            (False, True, False, True, True, True, True),
        ),
    ]
    errors = [f"{t.measure.name} ({t.measure.family}): {t.error}" for t in alone if t.error]
    targets = [
        TargetCheck(f"issue 3: compile all demo measures over five groupings < {DEMO_TARGET_S:g} s",
                    f"{demo_warm:.3f} s", demo_warm < DEMO_TARGET_S),
        TargetCheck(f"one scan of {FACT} for measures over one fact under one context",
                    ", ".join(map(str, plain_scans)), all(n == 1 for n in plain_scans)),
    ]
    if count == GENERATED_COUNT:
        targets.insert(1, TargetCheck(
            f"issue 6: compile {count:,} measures < {GENERATED_TARGET_S:g} s (in {len(batches)} queries)",
            f"{batch_s:.2f} s", batch_s < GENERATED_TARGET_S,
        ))
    return Section(
        key="compile",
        title=f"Compile time and memory: demo measures and {count} generated measures",
        body=body,
        targets=targets,
        problems=errors[:20] + run_problems,
    )


def _family_table(alone: Sequence[AloneTiming]) -> list[str]:
    families: dict[str, list[AloneTiming]] = {}
    for timing in alone:
        families.setdefault(timing.measure.family, []).append(timing)
    rows = []
    for family, timings in families.items():
        ok = [t.seconds for t in timings if not t.error]
        slowest = max((t for t in timings if not t.error), key=lambda t: t.seconds, default=None)
        rows.append((
            family, str(len(timings)), str(len(timings) - len(ok)),
            f"{median(ok) * 1000:.1f}" if ok else "–",
            f"{slowest.seconds * 1000:.1f} ({slowest.measure.name})" if slowest else "–",
        ))
    return table(("family", "measures", "failed", "median ms", "slowest ms"), rows,
                 (False, True, True, True, False))


def _run_batches(
    bound: BoundModel, compiled: Sequence[CompiledQuery]
) -> tuple[list[tuple[str, ...]], list[str]]:
    """Run each compiled query once: its table row; and the errors of those that failed."""
    engine = DuckDBEngine(bound)
    rows: list[tuple[str, ...]] = []
    problems: list[str] = []
    try:
        for k, query in enumerate(compiled):
            by = " + ".join(str(c) for c in query.query.by) or "grand total"
            label = (f"batch {k + 1}", str(len(query.query.measures)), by)
            scans = str(query.scans.get(FACT, 0))

            def run(query: CompiledQuery = query) -> tuple[ResultTable, float]:
                return timed_call(lambda: engine.run_compiled(query))

            try:
                (result, spent), peak = peak_above_start(run)
            except MeasureportError as exc:
                rows.append((*label, "–", "failed", "–", scans))
                problems.append(f"{label[0]} of the generated measures: {exc.message}")
                continue
            rows.append((*label, str(len(result.rows)), seconds(spent), mib(peak), scans))
    finally:
        engine.close()
    return rows, problems
