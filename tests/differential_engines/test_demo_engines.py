"""The bike-share demo (generated, invented data) on each real engine, compared with the reference
evaluator: every measure by several groupings, with report filters and totals."""

from __future__ import annotations

from collections.abc import Iterator
from pathlib import Path

import pytest

from differential_engines.conftest import clock
from differential_engines.engines import disagreement
from measureport.demo.writer import write_demo
from measureport.workspace import Workspace

GROUPINGS = [(), ("calendar.year", "calendar.month"), ("districts.name", "plans.name")]
FAST_ENGINES = ["sqlite", "clickhouse", "datafusion"]
SLOW_ENGINES = ["postgres", "spark"]


@pytest.fixture(scope="module")
def demo(tmp_path_factory: pytest.TempPathFactory) -> Iterator[Workspace]:
    folder: Path = tmp_path_factory.mktemp("demo")
    write_demo(folder, rides=200, seed=11)
    workspace = Workspace.open(folder / "model.yaml")
    yield workspace
    workspace.close()


def _check(demo: Workspace, name: str, open_engine: object, timed: dict[str, float]) -> None:
    start = clock()
    engine = open_engine(name, demo.bound, demo.dataset)  # type: ignore[operator]
    problems = []
    for by in GROUPINGS:
        query = demo.query(list(demo.measure_names), list(by), [], False)
        found = disagreement(demo.bound, demo.dataset, engine, query)
        if found:
            problems.append(f"by {by}:\n{found}")
    query = demo.query(list(demo.measure_names), ["districts.name"], ["calendar.year = 2025"], True)
    found = disagreement(demo.bound, demo.dataset, engine, query)
    if found:
        problems.append(f"filtered, with totals:\n{found}")
    timed[name] += clock() - start
    assert not problems, "\n\n".join(problems)


@pytest.mark.parametrize("name", FAST_ENGINES)
def test_demo_on_in_process_engine(
    demo: Workspace, name: str, open_engine: object, timed: dict[str, float]
) -> None:
    """SQLite (stdlib sqlite3), ClickHouse (chdb) and DataFusion, each run in process as an
    external reference for the SQL of its dialect."""
    _check(demo, name, open_engine, timed)


@pytest.mark.slow
@pytest.mark.parametrize("name", SLOW_ENGINES)
def test_demo_on_server_engine(
    demo: Workspace, name: str, open_engine: object, timed: dict[str, float]
) -> None:
    """PostgreSQL (a throwaway server) and Spark SQL (local[2]) as external references."""
    _check(demo, name, open_engine, timed)
