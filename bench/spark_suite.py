"""The Spark suite: the generated SQL of each TPC-H view on Spark SQL in local mode (local[2]),
timed, with its answer compared to DuckDB's answer of the same view."""

from __future__ import annotations

import sys
import time
import warnings
from collections.abc import Sequence
from typing import TYPE_CHECKING

from bench.memory import lifetime_peak, mib, peak_above_start
from bench.sections import Section, seconds, table, times
from bench.timing import alternate, median, ratio
from bench.tpch_queries import spec_pairs
from measureport.compare import compare_results, summary_text
from measureport.compile import CompiledQuery, compile_query
from measureport.engines.duckdb import DuckDBEngine
from measureport.engines.spark import LOCAL_MASTER, LOCAL_SETTINGS, SparkEngine, end_local_jvm
from measureport.errors import MeasureportError
from measureport.query import ResultTable
from measureport.tpch import prepare_tpch
from measureport.workspace import Workspace

if TYPE_CHECKING:
    from pyspark.sql import SparkSession

FACT = "lineitem"


def spark_session(driver_memory: str) -> SparkSession:
    """A local[2] session with the Spark adapter's local settings and ``driver_memory`` for the JVM
    (the default of 1 GiB does not hold SF1 loaded from Arrow)."""
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", FutureWarning)  # pyspark's pandas version check
        from pyspark.sql import SparkSession

    builder = SparkSession.builder.master(LOCAL_MASTER).appName("measureport-bench")
    for key, value in {**LOCAL_SETTINGS, "spark.driver.memory": driver_memory}.items():
        builder = builder.config(key, value)
    return builder.getOrCreate()


def jvm_pid() -> str | None:
    """The process id of the JVM pyspark started, as text for /proc, or None."""
    from pyspark import SparkContext

    process = getattr(SparkContext._gateway, "proc", None)
    return str(process.pid) if process is not None else None


def run_spark_suite(scale: float, repeat: int, driver_memory: str, only: Sequence[str] = ()) -> Section:
    """Every TPC-H view (or those named in ``only``) on Spark at ``scale``, against DuckDB."""
    ws = Workspace.open(prepare_tpch(scale))
    pairs = [p for p in spec_pairs() if not only or {p.view, p.name} & set(only)]
    duck = DuckDBEngine(ws.bound)
    print(f"  spark sf{scale:g}: starting Spark and loading the tables ...", file=sys.stderr, flush=True)
    started = time.perf_counter()
    session = spark_session(driver_memory)
    start_s = time.perf_counter() - started
    version = session.version
    rows: list[tuple[str, ...]] = []
    problems: list[str] = []
    spark_medians: list[float] = []
    try:
        pid = jvm_pid()
        spark, load_s = _timed_engine(ws, session)
        for pair in pairs:
            print(f"  spark sf{scale:g}: {pair.name} ...", file=sys.stderr, flush=True)
            row, problem, spark_s = _spark_query(ws, spark, duck, pair.view, pair.name, repeat, pid)
            rows.append(row)
            problems += [problem] if problem else []
            spark_medians += [spark_s] if spark_s is not None else []
        jvm_total = lifetime_peak(pid) if pid is not None else None
        spark.close()
    finally:
        session.stop()
        end_local_jvm()
        duck.close()
    body = [
        f"TPC-H at scale factor {scale:g} on Spark SQL {version} in local mode ({LOCAL_MASTER}, the "
        f"adapter's local settings, driver memory {driver_memory}). The tables are loaded by the Spark "
        "adapter (read from Parquet, sent to the JVM as Arrow). Each view's SQL, rendered for Spark, runs "
        f"once (first run, checked against DuckDB's answer of the same view), then {repeat} times "
        "alternately with the DuckDB statement; the table shows the medians.",
        "",
        f"Starting Spark took {start_s:.1f} s and loading the tables {load_s:.1f} s; the JVM's resident "
        f"set peaked at {mib(jvm_total)} MiB.",
        "",
        *table(
            ("query", "rows", "Spark first s", "Spark s", "DuckDB s", "Spark / DuckDB", "answers match",
             f"{FACT} scans", "JVM peak rise MiB"),
            rows,
            (False, True, True, True, True, True, False, True, True),
        ),
        "",
        f"Spark total of the medians: {sum(spark_medians):.1f} s over {len(spark_medians)} queries.",
    ]
    return Section(
        key=f"spark-{scale:g}",
        title=f"Spark SQL at SF{scale:g}: the generated SQL on local[2], answers against DuckDB",
        body=body,
        problems=problems,
    )


def _spark_query(
    ws: Workspace, spark: SparkEngine, duck: DuckDBEngine, view: str, name: str, repeat: int, pid: str | None
) -> tuple[tuple[str, ...], str, float | None]:
    """One view on Spark: its table row, a problem (or ""), and its median seconds (None if it failed)."""
    query = ws.view_query(view)
    on_spark = compile_query(ws.bound, query, "spark")
    on_duck = compile_query(ws.bound, query, "duckdb")
    scans = str(on_spark.scans.get(FACT, 0))
    expected = duck.run_compiled(on_duck)
    try:
        (result, first_s), jvm_peak = _first_run(spark, on_spark, pid)
    except MeasureportError as exc:
        return (name, "–", "failed", "–", "–", "–", "no", scans, "–"), f"{name}: {exc.message}", None
    comparison = compare_results(expected, result, tolerance=1e-9)
    problem = "" if comparison.equal else (
        f"{name}: Spark's answer differs from DuckDB's: {summary_text(comparison)}"
    )
    spark_sql, duck_sql = on_spark.run_sql(), on_duck.run_sql()
    spark_times, duck_times = alternate(
        lambda: spark.fetch(spark_sql), lambda: duck.connection.execute(duck_sql).fetchall(), repeat
    )
    spark_s, duck_s = median(spark_times), median(duck_times)
    row = (
        name, str(len(result.rows)), seconds(first_s), seconds(spark_s), seconds(duck_s),
        times(ratio(spark_s, duck_s)), "yes" if comparison.equal else "**no**", scans, mib(jvm_peak),
    )
    return row, problem, spark_s


def _first_run(
    spark: SparkEngine, compiled: CompiledQuery, pid: str | None
) -> tuple[tuple[ResultTable, float], int | None]:
    """The checking run: the result, its seconds, and how far the JVM's resident set rose."""

    def run() -> tuple[ResultTable, float]:
        started = time.perf_counter()
        result = spark.run_compiled(compiled)
        return result, time.perf_counter() - started

    if pid is None:
        return run(), None
    return peak_above_start(run, pid)


def _timed_engine(ws: Workspace, session: SparkSession) -> tuple[SparkEngine, float]:
    started = time.perf_counter()
    engine = SparkEngine(ws.bound, session=session)
    return engine, time.perf_counter() - started
