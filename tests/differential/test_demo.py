"""Every measure of the bike-share demo (generated, invented data): reference == DuckDB, by no
column, one, two and three grouping columns, within one table and across tables, with and
without report filters and totals."""

from __future__ import annotations

from collections.abc import Iterator
from pathlib import Path

import pytest

from differential.harness import differences
from measureport.demo.writer import write_demo
from measureport.workspace import Workspace

RIDES = 300

GROUPINGS = [
    (),
    ("districts.name",),
    ("calendar.year", "calendar.month"),
    ("districts.zone", "bikes.model", "calendar.quarter"),
]
MORE_GROUPINGS = [
    ("stations.name",),
    ("plans.name", "bikes.is_electric"),
    ("districts.name", "stations.name"),
    ("calendar.weekday", "plans.name", "districts.zone"),
]
FILTERS: list[list[str]] = [
    [],
    ["calendar.year = 2025"],
    ["bikes.is_electric = true", 'districts.zone != "outer"'],
]


@pytest.fixture(scope="module")
def demo(tmp_path_factory: pytest.TempPathFactory) -> Iterator[Workspace]:
    folder: Path = tmp_path_factory.mktemp("demo")
    write_demo(folder, rides=RIDES, seed=11)
    workspace = Workspace.open(folder / "model.yaml")
    yield workspace
    workspace.close()


def _agree(ws: Workspace, measures: list[str], by: tuple[str, ...], where: list[str], totals: bool) -> None:
    query = ws.query(measures, list(by), where, totals)
    problems = differences(ws.run(query, "reference"), ws.run(query, "duckdb"))
    assert not problems, "\n".join([f"by {by} where {where} totals {totals}", *problems])


@pytest.mark.parametrize("by", GROUPINGS, ids=lambda b: ",".join(b) or "none")
def test_every_demo_measure(demo: Workspace, by: tuple[str, ...]) -> None:
    _agree(demo, list(demo.measure_names), by, [], False)


def test_every_demo_measure_with_filters_and_totals(demo: Workspace) -> None:
    _agree(demo, list(demo.measure_names), ("districts.name", "calendar.year"), FILTERS[1], True)


@pytest.mark.slow
@pytest.mark.parametrize("by", GROUPINGS + MORE_GROUPINGS, ids=lambda b: ",".join(b) or "none")
@pytest.mark.parametrize("totals", [False, True])
def test_every_demo_measure_deep(demo: Workspace, by: tuple[str, ...], totals: bool) -> None:
    for where in FILTERS:
        for measure in demo.measure_names:
            _agree(demo, [measure], by, where, totals)
