"""The bike-share demo (generated, invented data) on each real engine, compared with the reference
evaluator: every measure by several groupings, with report filters and totals.

The default run keeps one case per in-process engine — every measure by year and month, where the
time windows and the dialect forms of dates are — and the filtered query with totals on SQLite
(the quickest engine). Every other case, and PostgreSQL and Spark, are in the slow suite.
"""

from __future__ import annotations

from collections.abc import Iterator
from dataclasses import dataclass
from pathlib import Path

import pytest

from differential_engines.conftest import clock
from differential_engines.engines import disagreement
from measureport.demo.writer import write_demo
from measureport.query import Query, ResultTable
from measureport.reference.evaluator import evaluate
from measureport.workspace import Workspace

FAST_ENGINES = ["sqlite", "clickhouse", "datafusion"]
SLOW_ENGINES = ["postgres", "spark"]


@dataclass(frozen=True)
class Case:
    """One query of the demo: every measure by ``by``, under ``where``, with or without totals."""

    name: str
    by: tuple[str, ...]
    where: tuple[str, ...] = ()
    totals: bool = False

    def query(self, demo: Workspace) -> Query:
        return demo.query(list(demo.measure_names), list(self.by), list(self.where), self.totals)


CASES = {
    case.name: case
    for case in (
        Case("grand_total", ()),
        Case("by_month", ("calendar.year", "calendar.month")),
        Case("by_district_and_plan", ("districts.name", "plans.name")),
        Case("filtered_with_totals", ("districts.name",), ("calendar.year = 2025",), True),
    )
}
#: The (engine, case) pairs of the default run; every other pair is marked slow.
QUICK = {(engine, "by_month") for engine in FAST_ENGINES} | {("sqlite", "filtered_with_totals")}


def _params(engines: list[str], slow: bool) -> list[object]:
    return [
        pytest.param(
            engine, case, id=f"{engine}-{case}",
            marks=[pytest.mark.slow] if slow or (engine, case) not in QUICK else [],
        )
        for engine in engines
        for case in CASES
    ]


@pytest.fixture(scope="module")
def demo(tmp_path_factory: pytest.TempPathFactory) -> Iterator[Workspace]:
    folder: Path = tmp_path_factory.mktemp("demo")
    write_demo(folder, rides=200, seed=11)
    workspace = Workspace.open(folder / "model.yaml")
    yield workspace
    workspace.close()


_EXPECTED: dict[tuple[int, str], ResultTable] = {}


def _expected(demo: Workspace, case: str) -> ResultTable:
    """The reference evaluator's result of ``case``, evaluated once for every engine."""
    key = (id(demo), case)
    if key not in _EXPECTED:
        _EXPECTED[key] = evaluate(demo.bound, demo.dataset, CASES[case].query(demo))
    return _EXPECTED[key]


def _check(demo: Workspace, name: str, case: str, open_engine: object, timed: dict[str, float]) -> None:
    expected = _expected(demo, case)
    start = clock()
    engine = open_engine(name, demo.bound, demo.dataset)  # type: ignore[operator]
    found = disagreement(demo.bound, demo.dataset, engine, CASES[case].query(demo), expected)
    timed[name] += clock() - start
    assert not found, f"{case}:\n{found}"


@pytest.mark.parametrize(("name", "case"), _params(FAST_ENGINES, slow=False))
def test_demo_on_in_process_engine(
    demo: Workspace, name: str, case: str, open_engine: object, timed: dict[str, float]
) -> None:
    """SQLite (stdlib sqlite3), ClickHouse (chdb) and DataFusion, each run in process as an
    external reference for the SQL of its dialect."""
    _check(demo, name, case, open_engine, timed)


@pytest.mark.parametrize(("name", "case"), _params(SLOW_ENGINES, slow=True))
def test_demo_on_server_engine(
    demo: Workspace, name: str, case: str, open_engine: object, timed: dict[str, float]
) -> None:
    """PostgreSQL (a throwaway server) and Spark SQL (local[2]) as external references."""
    _check(demo, name, case, open_engine, timed)
