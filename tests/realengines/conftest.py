"""Engines for the real-engine tests, and the time each engine took, printed after the run.

SQLite, ClickHouse (chdb) and DataFusion run in process and are quick; PostgreSQL (a throwaway
server, or the database at $MEASUREPORT_POSTGRES_URL) and Spark (local[2], one JVM for the whole
session) are marked slow, and run in `.ci/run`'s slow suite.
"""

from __future__ import annotations

import re
from collections import defaultdict
from collections.abc import Iterator
from typing import Any

import pytest

from measureport.engines.sqlengine import SqlEngine
from measureport.model.tabledata import Dataset
from measureport.semantics.bound import BoundModel
from realengines.engines import ALL_ENGINES, OpenEngine


@pytest.fixture
def open_engine(request: pytest.FixtureRequest) -> Iterator[OpenEngine]:
    """``open_engine(name, bound, dataset)``: an engine over that data, closed after the test."""
    opened: list[SqlEngine] = []

    def open_one(name: str, bound: BoundModel, dataset: Dataset) -> SqlEngine:
        engine: SqlEngine
        if name == "sqlite":
            from measureport.engines.sqlite import SQLiteEngine

            engine = SQLiteEngine(bound, dataset)
        elif name == "clickhouse":
            from measureport.engines.clickhouse import ClickHouseEngine

            engine = ClickHouseEngine(bound, dataset)
        elif name == "datafusion":
            from measureport.engines.datafusion import DataFusionEngine

            engine = DataFusionEngine(bound, dataset)
        elif name == "postgres":
            from measureport.engines.postgres import PostgresEngine

            engine = PostgresEngine(bound, request.getfixturevalue("postgres_url"), dataset)
        elif name == "spark":
            from measureport.engines.spark import SparkEngine

            engine = SparkEngine(bound, dataset, session=request.getfixturevalue("spark_session"))
        else:
            raise ValueError(name)
        opened.append(engine)
        return engine

    yield open_one
    for engine in opened:
        engine.close()


# --- time per engine --------------------------------------------------------------------------

_SECONDS: dict[str, float] = defaultdict(float)
_TESTS: dict[str, set[str]] = defaultdict(set)
_PARAMS = re.compile(r"\[(.*)\]$")


def pytest_runtest_logreport(report: pytest.TestReport) -> None:
    """Add each phase's duration (setup includes starting a server or a JVM) to its engine."""
    found = _PARAMS.search(report.nodeid)
    if not found:
        return
    for part in found.group(1).split("-"):
        if part in ALL_ENGINES:
            _SECONDS[part] += report.duration
            _TESTS[part].add(report.nodeid)


def pytest_terminal_summary(terminalreporter: Any) -> None:
    if not _SECONDS:
        return
    terminalreporter.section("time per engine (real-engine tests)")
    for name in ALL_ENGINES:
        if name in _SECONDS:
            count = len(_TESTS[name])
            terminalreporter.write_line(f"{name:<12} {_SECONDS[name]:8.2f} s  ({count} tests)")
