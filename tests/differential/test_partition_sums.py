"""Iterations whose per-member counts or sums add up (plan/partition_sums.py): one aggregate
without the binding, against the reference evaluator; and the iterations where that would not be
exact, which keep their frame. Invented data: the tram network of tram.py.
"""

from __future__ import annotations

from collections.abc import Iterator

import pytest

from differential.harness import Differential
from differential.tram import tram_differential

MEASURES = """
measure riders = sum(boardings.riders)
measure boardings_n = count(boardings)
measure mean_daily_riders = mean(coalesce(riders, 0) for each days.day)
measure daily_riders_total = sum(riders for each days.day)
measure daily_boardings_or_zero = sum(coalesce(boardings_n, 0) for each days.day)
measure per_year_and_month = mean(coalesce(riders, 0) for each days.year, days.month)
measure mean_daily_riders_2025 =
  mean(coalesce(riders, 0) for each days.day where days.day >= date "2025-01-01")
measure mean_riders = mean(boardings.riders)
measure mean_of_daily_means = mean(coalesce(mean_riders, 0) for each days.day)
measure per_stop_name = mean(coalesce(riders, 0) for each stops.name)
measure busy_days = count(riders for each days.day)
"""

SUMMED = [
    "per_stop_name",
    "mean_daily_riders",
    "daily_riders_total",
    "daily_boardings_or_zero",
    "per_year_and_month",
]
KEPT = ["mean_daily_riders_2025", "mean_of_daily_means", "busy_days"]
DAYS = 366 + 31 + 28 + 31  # 2024-01-01 .. 2025-03-31


@pytest.fixture(scope="module")
def tram() -> Iterator[Differential]:
    yield from tram_differential(MEASURES)


def iteration_frames(tram: Differential, measure: str, by: list[str]) -> int:
    plan = tram.engine.compile(tram.query([measure], by)).query_plan
    return sum(1 for s in plan.strategies if s.words.startswith("nested aggregation"))


def test_mean_of_daily_riders_is_the_riders_over_the_days(tram: Differential) -> None:
    # Every day of the calendar is iterated (no boarding points outside it): 456 days. Red's
    # riders are 40, Blue's 4, the empty line's 8 (Quarry's unknown line and the unknown stops).
    result = tram.check(["mean_daily_riders"], ["lines.name"])
    assert result.rows == [("Blue", 4 / DAYS), ("Red", 40 / DAYS), (None, 8 / DAYS)]
    assert iteration_frames(tram, "mean_daily_riders", ["lines.name"]) == 0


def test_the_empty_member_is_one_of_the_iterated_names(tram: Differential) -> None:
    # Red: Harbour and Market, 40 riders over 2 names; Blue: Depot, 4 / 1; the empty line holds
    # Quarry (no riders: 0) and the empty stop (8): 8 / 2.
    result = tram.check(["per_stop_name"], ["lines.name"])
    assert result.rows == [("Blue", 4.0), ("Red", 20.0), (None, 4.0)]
    assert iteration_frames(tram, "per_stop_name", ["lines.name"]) == 0


def test_a_month_on_the_grid_iterates_its_own_days(tram: Differential) -> None:
    # February 2025 has 28 days and 8 + 4 riders: 12 / 28; March 2025: 6 + 2 over 31 days.
    result = tram.check(["mean_daily_riders"], ["days.month"], ["days.year = 2025"])
    rows = dict(result.rows)
    assert rows["2025-02"] == 12 / 28
    assert rows["2025-03"] == 8 / 31
    assert iteration_frames(tram, "mean_daily_riders", ["days.month"]) == 0


def test_iterations_that_do_not_add_up_keep_their_frame(tram: Differential) -> None:
    # A where on the iteration, a mean inside, a count of the per-day values: not sums.
    for measure in KEPT:
        assert iteration_frames(tram, measure, ["lines.name"]) == 1, measure


def test_a_grid_on_the_iterated_column_keeps_the_frame(tram: Differential) -> None:
    # By day, the binding replaces the grid's own day filter: the iterated days are the cell's
    # day, but the sums per bound day are not a partition of the cell's rows; kept as written.
    tram.check(["mean_daily_riders", "riders"], ["days.day"], ["days.month = \"2025-02\""])
    assert iteration_frames(tram, "mean_daily_riders", ["days.day"]) == 1


@pytest.mark.parametrize(
    "by", [(), ("stops.name",), ("lines.name", "days.year"), ("days.month",), ("stops.zone",)]
)
@pytest.mark.parametrize("where", [(), ("days.year = 2025",), ('stops.zone != "C"',)])
def test_partition_sums_agree_with_the_reference(
    tram: Differential, by: tuple[str, ...], where: tuple[str, ...]
) -> None:
    tram.check([*SUMMED, *KEPT], by, where)


def test_partition_sums_with_totals_agree_with_the_reference(tram: Differential) -> None:
    tram.check(SUMMED, ("lines.name", "stops.name"), totals=True)
