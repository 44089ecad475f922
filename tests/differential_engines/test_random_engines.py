"""Property, on the real engines: for random models, data and measures (drawn by
tests/differential/generators.py, all invented), the SQL compiled for each engine's dialect gives
what the reference evaluator gives. The engines are the external references: SQLite (stdlib
sqlite3), ClickHouse (chdb), DataFusion, PostgreSQL (the session's server) and Spark SQL
(the session's local[2] JVM).

Every test here is slow. The draws are derandomized (a fixed seed: the same cases on every
engine, the same on every run) and not shrunk, so that a failure costs no more time than a pass;
the failing case is printed whole. A query the engine's dialect cannot express must fail to
compile with an error naming the dialect: that is counted as unsupported and printed, never
taken for a pass. A query no dialect can lower (DuckDB's neither) is not a case at all.
"""

from __future__ import annotations

from collections import Counter, defaultdict
from collections.abc import Iterator
from dataclasses import dataclass, field

import pytest
from hypothesis import HealthCheck, Phase, assume, given, settings
from hypothesis import strategies as st

from differential.generators import cases as drawn_cases
from differential.harness import differences
from differential_engines.conftest import clock
from measureport.compile import CompiledQuery, compile_query
from measureport.errors import MeasureportError
from measureport.language.parser import parse_measures
from measureport.model.schema import Model
from measureport.model.tabledata import Dataset
from measureport.query import Query
from measureport.reference.evaluator import evaluate
from measureport.render.dialects import dialect_profile
from measureport.semantics.binder import bind_model, build_query
from measureport.semantics.bound import BoundModel

#: Examples drawn per engine, sized so that the whole file takes about three minutes on two
#: idle cores: Spark loads every table of every case into the JVM and plans each statement anew.
EXAMPLES = {"sqlite": 150, "clickhouse": 60, "datafusion": 100, "postgres": 80, "spark": 12}

#: Engine errors already cut down to a strict-xfail regression test: such a case is counted and
#: printed as known, not failed, so that the suite goes on to find other disagreements. A wrong
#: number is never known: only an engine refusing to run the statement.
KNOWN_ENGINE_ERRORS = {
    # tests/dialect_rendering/test_engine_regressions.py::test_clickhouse_least_of_*
    "clickhouse": ("(NO_COMMON_TYPE)",),
}


def _settings(examples: int) -> settings:
    return settings(
        max_examples=examples,
        deadline=None,
        derandomize=True,
        phases=[Phase.explicit, Phase.generate],
        suppress_health_check=[
            HealthCheck.too_slow,
            HealthCheck.filter_too_much,
            HealthCheck.data_too_large,
            HealthCheck.function_scoped_fixture,
        ],
    )


@dataclass(frozen=True)
class Case:
    """One drawn model with its data, three measures and a query over them."""

    model: Model
    dataset: Dataset
    text: str
    names: tuple[str, ...]
    by: tuple[str, ...]
    where: tuple[str, ...]
    totals: bool

    def describe(self) -> str:
        return "\n".join([self.text, f"by {list(self.by)} where {list(self.where)} totals {self.totals}"])

    def __repr__(self) -> str:
        # Hypothesis prints the failing case with repr: the data as lists, short enough to read.
        tables = {
            name: {
                column: [None if null else value for value, null in zip(data.values, data.null, strict=True)]
                for column, data in table.columns.items()
            }
            for name, table in self.dataset.tables.items()
        }
        return f"Case(\n{self.describe()}\ntables={tables!r}\nkeys={sorted(self.model.tables)})"


@st.composite
def cases(draw: st.DrawFn) -> Case:
    """A case as the DuckDB property draws them (tests/differential/test_random.py)."""
    model, data, text, names, by, where, totals = draw(drawn_cases())
    return Case(model, data, text, tuple(names), tuple(by), tuple(where), totals)


@dataclass
class Tally:
    """What one engine's run came to: cases compared, and unsupported ones with their reasons."""

    compared: int = 0
    unsupported: Counter[str] = field(default_factory=Counter)
    known: Counter[str] = field(default_factory=Counter)

    def refuse(self, reason: str) -> None:
        self.unsupported[reason.splitlines()[0]] += 1


TALLIES: dict[str, Tally] = defaultdict(Tally)


@pytest.fixture(scope="module", autouse=True)
def print_tallies(request: pytest.FixtureRequest) -> Iterator[None]:
    """After the module: per engine, the cases compared and the unsupported ones by reason."""
    yield
    reporter = request.config.pluginmanager.get_plugin("terminalreporter")
    capture = request.config.pluginmanager.get_plugin("capturemanager")
    if reporter is None or capture is None or not TALLIES:
        return
    with capture.global_and_fixture_disabled():
        reporter.write_line("")
        reporter.write_line("random differential per engine:")
        for name, tally in sorted(TALLIES.items()):
            refused, known = tally.unsupported, tally.known
            reporter.write_line(
                f"  {name}: {tally.compared} compared, {sum(refused.values())} unsupported, "
                f"{sum(known.values())} known engine errors"
            )
            for reason, count in refused.most_common():
                reporter.write_line(f"    {count}x unsupported: {reason}")
            for reason, count in known.most_common():
                reporter.write_line(f"    {count}x known: {reason}")


def _bound_query(case: Case) -> tuple[BoundModel, Query]:
    """The case bound and its query built; a case the binder refuses is no case."""
    try:
        bound = bind_model(case.model, [parse_measures(case.text, "random.measures")])
        query = build_query(bound, list(case.names), list(case.by), list(case.where), case.totals)
    except MeasureportError:
        assume(False)
        raise
    return bound, query


def _compiled_for(bound: BoundModel, query: Query, dialect: str) -> CompiledQuery | MeasureportError:
    """``query`` compiled and written out for ``dialect``; else the error saying why it cannot be."""
    try:
        compiled = compile_query(bound, query, dialect)
        compiled.run_sql()
    except MeasureportError as exc:
        return exc
    return compiled


def _check_on(name: str, case: Case, open_engine: object, timed: dict[str, float]) -> None:
    bound, query = _bound_query(case)
    dialect = dialect_profile(name).name
    compiled = _compiled_for(bound, query, dialect)
    if isinstance(compiled, MeasureportError):
        # DuckDB is the dialect every lowerable query compiles for (tests/differential).
        assume(not isinstance(_compiled_for(bound, query, "duckdb"), MeasureportError))
        assert dialect in compiled.message.lower(), (
            f"{name} refused the query without naming its dialect: {compiled.message}\n{case.describe()}"
        )
        TALLIES[name].refuse(compiled.message)
        return
    expected = evaluate(bound, case.dataset, query)
    start = clock()
    engine = open_engine(name, bound, case.dataset)  # type: ignore[operator]
    try:
        actual = engine.run_compiled(compiled)
    except MeasureportError as exc:
        known = [mark for mark in KNOWN_ENGINE_ERRORS.get(name, ()) if mark in exc.message]
        if not known:
            raise
        TALLIES[name].known[known[0]] += 1
        return
    finally:
        engine.close()
        timed[name] += clock() - start
    problems = differences(expected, actual)
    TALLIES[name].compared += 1
    assert not problems, "\n".join(
        [f"reference and {name} differ:", case.describe(), *problems, "SQL:", compiled.sql]
    )


def _engine_test(name: str) -> object:
    @pytest.mark.slow
    @_settings(EXAMPLES[name])
    @given(case=cases())
    def test(case: Case, open_engine: object, timed: dict[str, float]) -> None:
        _check_on(name, case, open_engine, timed)

    test.__doc__ = f"Random models and measures: the reference == {name}, case by case."
    return test


test_random_on_sqlite = _engine_test("sqlite")
test_random_on_clickhouse = _engine_test("clickhouse")
test_random_on_datafusion = _engine_test("datafusion")
test_random_on_postgres = _engine_test("postgres")
test_random_on_spark = _engine_test("spark")
