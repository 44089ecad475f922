"""Generated SQL against SQL written by hand for the same answer, on one DuckDB connection.

Both statements run once and their answers are compared cell by cell (the written statement's
peak memory is measured on that run, as is the generated one's); only when they agree are they
timed, alternately, and their medians compared.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass

from bench.memory import peak_above_start
from bench.timing import alternate, median, ratio
from measureport.compare import compare_results, comparison_text
from measureport.compile import CompiledQuery
from measureport.engines.duckdb import DuckDBEngine
from measureport.errors import MeasureportError
from measureport.query import ResultTable


@dataclass(frozen=True)
class Written:
    """A statement written by hand: ``run`` executes it once and shapes its rows as the query's
    result; ``timed_sql`` is what is timed (the same statement, or one that computes the same rows,
    such as the text without its LIMIT). With ``contained``, the written rows need only be among
    the generated rows (the written text keeps only the top rows)."""

    run: Callable[[], ResultTable]
    timed_sql: str
    contained: bool = False


@dataclass(frozen=True)
class PairResult:
    """One query's outcome. ``ratio`` is None when the query was not timed: ``verdict`` is then
    "differs" (the answers differ) or "failed" (a statement could not run), and ``problem`` says how."""

    name: str
    strategy: str
    rows: int
    generated: float | None
    written: float | None
    ratio: float | None
    fact_scans: int
    generated_peak: int | None
    written_peak: int | None
    contained: bool = False
    verdict: str = ""
    problem: str = ""


def measure_pair(
    engine: DuckDBEngine,
    name: str,
    strategy: str,
    compiled: CompiledQuery,
    written: Written,
    fact: str,
    repeat: int,
) -> PairResult:
    """Check that ``compiled`` and ``written`` give the same answer on ``engine``, then time them
    ``repeat`` times each, alternately. ``fact`` is the table whose scans are counted."""
    scans = compiled.scans.get(fact, 0)
    sql = compiled.run_sql()
    try:
        generated, generated_peak = peak_above_start(lambda: engine.run_compiled(compiled))
        by_hand, written_peak = peak_above_start(written.run)
    except MeasureportError as exc:
        return PairResult(
            name, strategy, 0, None, None, None, scans, None, None, verdict="failed",
            problem=f"{name}: {exc.message}",
        )
    comparison = compare_results(by_hand, generated, tolerance=1e-9)
    agree = comparison.equal or (
        written.contained and not comparison.missing and not comparison.differences
    )
    if not agree:
        text = comparison_text(comparison, "written by hand", "generated")
        return PairResult(
            name, strategy, len(generated.rows), None, None, None, scans, generated_peak, written_peak,
            written.contained, "differs", f"{name}: the generated and the hand-written SQL disagree\n{text}",
        )
    connection = engine.connection
    generated_times, written_times = alternate(
        lambda: connection.execute(sql).fetchall(),
        lambda: connection.execute(written.timed_sql).fetchall(),
        repeat,
    )
    generated_s, written_s = median(generated_times), median(written_times)
    return PairResult(
        name, strategy, len(generated.rows), generated_s, written_s, ratio(generated_s, written_s),
        scans, generated_peak, written_peak, written.contained,
    )
