"""`verify` on the bike-share demo (examples/bikeshare, invented data): every engine that can run
here agrees with the reference evaluator.

The fast test checks the demo's views on DuckDB and two dialects checked by round-trip (tsql,
with read-back repairs and emulated null ordering; mysql); tests/dialects/test_roundtrip.py
checks every round-trip dialect on the views against DuckDB. The slow tests run the default
checks (the views, and every measure at the grand total and by each grouping column of the
views) on every engine available here, the real ones included — SQLite, PostgreSQL, ClickHouse
and DataFusion are external references — and the views on Spark (local mode is slow: a few
seconds a query on two cores, minutes when the machine is busy).
"""

from __future__ import annotations

import dataclasses
from pathlib import Path

import pytest

from measureport.dialects import all_profiles
from measureport.verify import (
    VerifyResult,
    default_checks,
    default_targets,
    requested_targets,
    run_verify,
    view_checks,
)
from measureport.workspace import Workspace

DEMO_MODEL = Path(__file__).resolve().parents[2] / "examples" / "bikeshare" / "model.yaml"
ROUNDTRIPS = tuple(p.name for p in all_profiles() if p.is_roundtrip)
REAL_ENGINES = ("duckdb", "sqlite", "postgres", "spark", "clickhouse", "datafusion")


def statuses(result: VerifyResult, engine: str) -> dict[str, str]:
    return {check.name: result.cell(i, engine).text() for i, check in enumerate(result.checks)}


FAST_ENGINES = ("duckdb", "tsql", "mysql")


def all_pass(found: dict[str, str]) -> bool:
    return all(text == "pass" or text.startswith("pass ") for text in found.values())


@pytest.fixture(scope="module")
def views_verified() -> VerifyResult:
    with Workspace.open(DEMO_MODEL) as workspace:
        choice = requested_targets(["reference", *FAST_ENGINES])
        return run_verify(workspace, view_checks(workspace), choice)


@pytest.mark.parametrize("engine", FAST_ENGINES)
def test_demo_views_agree_on(engine: str, views_verified: VerifyResult) -> None:
    assert views_verified.baseline == "reference"
    assert len(views_verified.checks) == 4
    found = statuses(views_verified, engine)
    assert all_pass(found), found


def _timed(result: VerifyResult) -> VerifyResult:
    times = ", ".join(f"{name} {seconds:.1f} s" for name, seconds in result.seconds.items())
    print(f"\nverify on the demo, time per engine: {times}")
    return result


@pytest.fixture(scope="module")
def everything_but_spark() -> VerifyResult:
    choice = default_targets()
    choice = dataclasses.replace(choice, targets=tuple(t for t in choice.targets if t.name != "spark"))
    with Workspace.open(DEMO_MODEL) as workspace:
        return _timed(run_verify(workspace, default_checks(workspace), choice))


@pytest.fixture(scope="module")
def views_on_spark() -> VerifyResult:
    choice = default_targets()
    if "spark" not in {t.name for t in choice.targets}:
        reason = next((u.reason for u in choice.unavailable if u.name == "spark"), "not available")
        pytest.skip(f"spark cannot run here: {reason}")
    with Workspace.open(DEMO_MODEL) as workspace:
        spark = requested_targets(["reference", "spark"])
        return _timed(run_verify(workspace, view_checks(workspace), spark))


@pytest.mark.slow
@pytest.mark.parametrize("engine", [e for e in (*REAL_ENGINES, *ROUNDTRIPS) if e != "spark"])
def test_demo_default_checks_agree_on(engine: str, everything_but_spark: VerifyResult) -> None:
    result = everything_but_spark
    if engine not in {t.name for t in result.targets}:
        reason = next((u.reason for u in result.unavailable if u.name == engine), "not available")
        pytest.skip(f"{engine} cannot run here: {reason}")
    assert len(result.checks) == 10  # 4 views, the grand total, 5 grouping columns
    found = statuses(result, engine)
    assert all_pass(found), found


@pytest.mark.slow
def test_demo_views_agree_on_spark(views_on_spark: VerifyResult) -> None:
    found = statuses(views_on_spark, "spark")
    assert len(found) == 4 and all_pass(found), found
