"""The TPC-H suite: each view's generated SQL against the specification's SQL text, on the same
DuckDB connection (the engine names its views as the specification names the tables)."""

from __future__ import annotations

import sys
from collections.abc import Sequence

from bench.pair_report import ISSUE_6, pair_table, ratio_checks, ratio_summary, scan_check
from bench.pairs import PairResult, Written, measure_pair
from bench.sections import Section
from bench.tpch_queries import ONE_CONTEXT, SpecPair, spec_pairs
from measureport.compile import compile_query
from measureport.engines.duckdb import DuckDBEngine
from measureport.engines.values import python_value
from measureport.query import Query, ResultTable
from measureport.tpch import prepare_tpch
from measureport.workspace import Workspace

FACT = "lineitem"


def spec_result(engine: DuckDBEngine, pair: SpecPair, query: Query) -> ResultTable:
    """The rows of the specification's text as the result of ``query``: its ``keys`` columns as the
    grouping values, its ``values`` columns as the measures. Rows whose measures are all null are
    left out, as rule 6 leaves them out of a measure result (a grand total over no rows)."""
    cursor = engine.connection.execute(pair.sql)
    names = [d[0] for d in cursor.description]
    key_at = [names.index(k) for k in pair.keys]
    value_at = [names.index(v) for v in pair.values]
    rows = []
    for row in cursor.fetchall():
        values = tuple(python_value(row[i]) for i in value_at)
        if any(v is not None for v in values):
            rows.append(tuple(python_value(row[i]) for i in key_at) + values)
    return ResultTable(
        by=tuple(str(c) for c in query.by),
        measures=tuple(query.measures),
        rows=rows,
        levels=[len(query.by)] * len(rows),
    )


def measure_spec_pair(ws: Workspace, engine: DuckDBEngine, pair: SpecPair, repeat: int) -> PairResult:
    """Check one view's generated SQL against the specification's text, then time them alternately."""
    query = ws.view_query(pair.view)
    compiled = compile_query(ws.bound, query, "duckdb")
    written = Written(lambda: spec_result(engine, pair, query), pair.timed_sql, contained=pair.limited)
    return measure_pair(engine, pair.name, pair.strategy, compiled, written, FACT, repeat)


def run_tpch_suite(scale: float, repeat: int, only: Sequence[str] = ()) -> Section:
    """Every TPC-H pair (or those whose view or name is in ``only``) at scale factor ``scale``."""
    ws = Workspace.open(prepare_tpch(scale))
    pairs = [p for p in spec_pairs() if not only or {p.view, p.name} & set(only)]
    engine = DuckDBEngine(ws.bound)
    try:
        results = []
        for pair in pairs:
            print(f"  tpch sf{scale:g}: {pair.name} ...", file=sys.stderr, flush=True)
            results.append(measure_spec_pair(ws, engine, pair, repeat))
    finally:
        engine.close()
    body = [
        f"TPC-H at scale factor {scale:g} (data from tpchgen-cli, as Parquet), on DuckDB. Each view of "
        "examples/tpch is compiled and checked against the SQL text of its query in the TPC-H "
        "specification (clause 2.4, validation parameters; text in tests/tpch/spec_queries.py), run on "
        f"the same connection; then both run {repeat} times each, alternately. {limit_note(pairs)}",
        "",
        *pair_table(results, FACT, "specification"),
        "",
        ratio_summary(results),
    ]
    one_context = [p.name for p in pairs if p.view in ONE_CONTEXT]
    return Section(
        key=f"tpch-{scale:g}",
        title=f"TPC-H at SF{scale:g}: generated SQL against the specification's SQL on DuckDB",
        body=body,
        targets=[*ratio_checks(results, ISSUE_6), *scan_check(results, one_context, FACT)],
        problems=[r.problem for r in results if r.problem],
    )


def limit_note(pairs: Sequence[SpecPair]) -> str:
    """What the table says about the specification's row limits."""
    limited = [p.name for p in pairs if p.limited]
    if not limited:
        return (
            "None of these texts has a LIMIT (the row limits the specification puts on Q3 and Q10 are "
            "left out of them), so both sides compute the same rows."
        )
    return (
        f"The texts of {', '.join(limited)} end in ORDER BY ... LIMIT: their rows are checked to be "
        "among the generated rows (marked \"rows contained\"), and they are timed without the LIMIT, "
        "so that both sides compute the same rows."
    )
