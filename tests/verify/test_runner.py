"""The verify runner on the bakery model (bakery.py, invented data), with real engines and with
test doubles that break the DuckDB engine in one known way each (doubles.py)."""

from __future__ import annotations

import pytest

from measureport.errors import MeasureportError
from measureport.verify import (
    DEFAULT_REFERENCE_LIMIT,
    Progress,
    VerifyResult,
    default_checks,
    requested_targets,
    run_verify,
)
from measureport.workspace import Workspace
from verify.bakery import TOTAL_ROWS
from verify.doubles import CRASHES, DROPS_FILTER, PERTURBS, REFUSES

FAST = ["reference", "duckdb", "sqlite", "tsql"]


def verify(
    workspace: Workspace,
    engines: list[str],
    reference_limit: int = DEFAULT_REFERENCE_LIMIT,
    progress: Progress | None = None,
) -> VerifyResult:
    checks = default_checks(workspace)
    return run_verify(workspace, checks, requested_targets(engines), 1e-9, reference_limit, progress)


def column(result: VerifyResult, target: str) -> list[str]:
    return [result.cell(i, target).status for i in range(len(result.checks))]


def test_every_engine_agrees_with_the_reference(bakery_workspace: Workspace) -> None:
    result = verify(bakery_workspace, FAST)
    assert result.baseline == "reference"
    assert column(result, "reference") == ["baseline"] * 5
    for engine in ("duckdb", "sqlite", "tsql"):
        assert column(result, engine) == ["pass"] * 5, engine
    assert not result.failed
    assert result.counts()["pass"] == 15  # 5 checks on 3 engines besides the baseline


def test_a_dropped_filter_fails_its_check_only(bakery_workspace: Workspace) -> None:
    result = verify(bakery_workspace, ["reference", DROPS_FILTER])
    # Only the view town_2026 filters calendar.year = 2026.
    assert column(result, DROPS_FILTER) == ["fail", "pass", "pass", "pass", "pass"]
    cell = result.cell(0, DROPS_FILTER)
    assert cell.comparison is not None
    differences = {(d.key, d.measure): (d.expected, d.actual) for d in cell.comparison.differences}
    # Northfield in 2026: bakes 2, 3, 6 (50 loaves, 160.00); with bake 1 of 2025 as well: 90
    # loaves, 280.00, and 280 / 90 a loaf.
    assert differences[(("Northfield",), "loaves")] == (50, 90)
    assert differences[(("Northfield",), "takings")] == (160.0, 280.0)
    assert differences[(("Northfield",), "price_per_loaf")][1] == pytest.approx(280 / 90)
    assert len(differences) == 3
    # The largest relative difference is the loaves': |90 - 50| / 50 = 0.8.
    assert cell.largest_relative == pytest.approx(0.8)
    assert cell.sql is not None and "2026" not in cell.sql
    assert result.failed


def test_one_perturbed_cell_is_found(bakery_workspace: Workspace) -> None:
    result = verify(bakery_workspace, ["reference", PERTURBS])
    grand_total = result.cell(2, PERTURBS)
    assert grand_total.status == "fail" and grand_total.comparison is not None
    (difference,) = grand_total.comparison.differences
    # All loaves: 40 + 30 + 20 + 50 + 10 + 0 = 150; the double says 151.
    assert (difference.measure, difference.expected, difference.actual) == ("loaves", 150, 151)
    assert grand_total.largest_relative == pytest.approx(1 / 150)


def test_a_measure_the_dialect_cannot_write_is_unsupported_and_the_rest_compared(
    bakery_workspace: Workspace,
) -> None:
    result = verify(bakery_workspace, ["reference", REFUSES])
    # town_2026 has no share_of_town; shop_league and the grouping checks do.
    assert column(result, REFUSES) == ["pass", "unsupported", "unsupported", "unsupported", "unsupported"]
    league = result.cell(1, REFUSES)
    assert league.unsupported_measures == (
        ("share_of_town", "measure share_of_town: the test dialect cannot clear a grouping column"),
    )
    assert league.comparison is not None and league.comparison.equal
    assert league.comparison.measures == ("loaves",)
    assert league.text() == "unsupported 1"
    assert not result.failed  # unsupported is shown, never counted as a pass or a mismatch


def test_an_engine_that_crashes_is_an_error_cell(bakery_workspace: Workspace) -> None:
    result = verify(bakery_workspace, ["reference", CRASHES])
    cell = result.cell(0, CRASHES)
    assert (cell.status, cell.reason) == ("error", "RuntimeError: the test engine lost its connection")
    assert result.failed


def test_too_much_data_skips_the_reference(bakery_workspace: Workspace) -> None:
    result = verify(bakery_workspace, ["reference", "duckdb", "sqlite"], reference_limit=TOTAL_ROWS - 1)
    assert result.baseline == "duckdb"
    assert column(result, "reference") == ["skipped"] * 5
    assert column(result, "duckdb") == ["baseline"] * 5
    assert column(result, "sqlite") == ["pass"] * 5
    assert result.notes == (
        "the reference evaluator was skipped: the model's tables hold 12 rows, more than the limit of "
        "11 (--reference-limit); results are compared with DuckDB",
    )


def test_the_baseline_runs_even_when_not_named(bakery_workspace: Workspace) -> None:
    result = verify(bakery_workspace, ["tsql"])
    assert [t.name for t in result.targets] == ["reference", "duckdb", "tsql"]


class Recording:
    def __init__(self) -> None:
        self.total = 0
        self.advanced = 0
        self.said: list[str] = []

    def start(self, total: int) -> None:
        self.total = total

    def working(self, text: str) -> None:
        self.said.append(text)

    def advance(self) -> None:
        self.advanced += 1


def test_progress_counts_every_cell(bakery_workspace: Workspace) -> None:
    progress = Recording()
    verify(bakery_workspace, ["reference", "duckdb", "tsql"], progress=progress)
    assert progress.total == progress.advanced == 15  # 5 checks on 3 targets
    assert "view town_2026 on tsql" in progress.said and "starting tsql" in progress.said


def test_a_named_engine_that_cannot_start_is_an_error(bakery_workspace: Workspace) -> None:
    from measureport.workspace import register_engine

    def broken(workspace: Workspace) -> object:
        raise MeasureportError("the pond engine is not reachable")

    register_engine("double-cannot-start", broken)
    with pytest.raises(MeasureportError) as caught:
        verify(bakery_workspace, ["double-cannot-start"])
    assert caught.value.message == (
        "the engine double-cannot-start could not start: the pond engine is not reachable"
    )


@pytest.mark.slow
def test_a_database_url_is_verified_like_any_engine(bakery_workspace: Workspace, postgres_url: str) -> None:
    # The session's PostgreSQL server (tests/conftest.py), reached by its URL.
    result = verify(bakery_workspace, ["reference", postgres_url])
    (target,) = [t for t in result.targets if t.source == postgres_url]
    assert column(result, target.name) == ["pass"] * 5
