"""Every construct of the language, lowered to SQL and run on DuckDB, against the reference
evaluator: by no column, one, two and three grouping columns (within one table and across
tables), with and without report filters and totals.

Invented data (tests/differential/tram.py). Where a value is also worked out by hand, the
arithmetic is in the comment beside it.
"""

from __future__ import annotations

from collections.abc import Iterator

import pytest

from differential.harness import Differential
from differential.tram import tram_differential

MEASURES = """
measure boardings_n = count(boardings)
measure riders = sum(boardings.riders)
measure mean_fare = mean(boardings.fare)
measure fares_seen = count(boardings.fare)
measure stops_seen = distinct(boardings.stop_id)
measure first_day = min(boardings.day)
measure last_day = max(boardings.day)
measure stop_count = count(stops)
measure platforms = sum(stops.platforms)
measure faults = sum(inspections.faults)
measure faults_per_boarding = faults / boardings_n

measure line_share = riders / (riders given clear lines)
measure zone_a = riders given stops.zone = "A"
measure zone_a_narrow = riders given narrow stops.zone = "A"
measure zone_a_or_b = riders given stops.zone in ("A", "B")
measure all_stops = riders given clear stops
measure keep_zone = riders given clear stops but stops.zone
measure big_fares = riders given boardings.fare >= 2.5
measure above_mean = boardings_n given boardings.fare > mean(boardings.fare)
measure cleared_then_set = riders given clear stops, stops.name like "M%"
measure not_harbour = riders given stops.name != "Harbour"
measure null_zone = riders given stops.zone is null

measure per_stop = mean(riders for each stops)
measure per_stop_row = mean(riders given row for each stops)
measure busiest = max(riders for each stops.name)
measure zones_used = count(riders for each stops.zone)
measure bare_inside = max(sum(boardings.riders) for each stops)
measure row_sum = sum(boardings.riders * 2 for each boardings)
measure bound_rows = sum(riders for each boardings)
measure rich_rows = count(boardings.riders for each boardings where boardings.fare > 2)
measure filtered_each = sum(riders for each stops where stops.platforms >= 2)
measure pairs = count(riders for each stops.zone, lines.kind)
measure cleared_each = sum(riders given row, clear stops for each stops)
measure replaced_each = sum(riders given stops.zone = "B" for each stops)
measure nested = sum(max(riders for each days.month) for each stops.zone)
measure within_given = sum(riders for each stops) given clear lines
measure mix_outer = sum(boardings.riders / riders for each boardings)

measure big_day = if riders >= 10 then "busy" else "quiet"
measure with_let =
  let here = riders
  let everywhere = riders given clear stops, clear lines
  if everywhere > 0 then here / everywhere
measure scaled = round(coalesce(mean_fare, 0) * 3, 1) + abs(0 - boardings_n)
measure extremes = greatest(riders, faults, 0) - least(riders, faults)
measure maybe = if restricted(stops.name) then single(stops.zone)
measure the_line = single(lines.name)

measure ytd = riders given to_date(days.day, year)
measure fiscal_ytd = riders given to_date(days.day, year, start "04-01")
measure qtd = riders given to_date(days.day, quarter)
measure mtd = riders given to_date(days.day, month)
measure last_year = riders given shift(days.day, -1, year)
measure prior_month = riders given shift(days.day, -1, month)
measure next_week = riders given shift(days.day, 7, day)
measure trailing_28 = riders given trailing(days.day, 28, day)
measure trailing_2m = riders given trailing(days.day, 2, month)
measure ly_ytd = riders given shift(days.day, -1, year), to_date(days.day, year)
measure recent = boardings_n given days.day >= max(boardings.day)

measure stop_rank = rank(riders over stops.name)
measure stop_rank_up = rank(riders over stops.name ascending)
measure zone_rank = rank(boardings_n over stops.zone)
"""

PLAIN = [
    "boardings_n",
    "riders",
    "mean_fare",
    "fares_seen",
    "stops_seen",
    "first_day",
    "last_day",
    "stop_count",
    "platforms",
    "faults",
    "faults_per_boarding",
]
GIVEN = [
    "line_share",
    "zone_a",
    "zone_a_narrow",
    "zone_a_or_b",
    "all_stops",
    "keep_zone",
    "big_fares",
    "above_mean",
    "cleared_then_set",
    "not_harbour",
    "null_zone",
]
EACH = [
    "per_stop",
    "per_stop_row",
    "busiest",
    "zones_used",
    "bare_inside",
    "row_sum",
    "bound_rows",
    "rich_rows",
    "filtered_each",
    "pairs",
    "cleared_each",
    "replaced_each",
    "nested",
    "within_given",
    "mix_outer",
]
SCALARS = ["big_day", "with_let", "scaled", "extremes", "maybe", "the_line"]
TIME = [
    "ytd",
    "fiscal_ytd",
    "qtd",
    "mtd",
    "last_year",
    "prior_month",
    "next_week",
    "trailing_28",
    "trailing_2m",
    "ly_ytd",
    "recent",
]
RANKS = ["stop_rank", "stop_rank_up", "zone_rank"]

# The default run: no column, one, two within one table, three across three tables.
GROUPINGS = [
    (),
    ("stops.name",),
    ("stops.zone", "stops.name"),
    ("lines.name", "stops.zone", "days.month"),
]
# The slow run adds these, and every report filter below.
MORE_GROUPINGS = [("lines.name",), ("days.month",), ("lines.kind", "days.year")]
FILTERS: list[tuple[str, ...]] = [(), ("days.year = 2025",), ('stops.zone != "C"', "boardings.riders > 3")]
GROUPS = {"plain": PLAIN, "given": GIVEN, "each": EACH, "scalars": SCALARS, "time": TIME, "rank": RANKS}


@pytest.fixture(scope="module")
def tram() -> Iterator[Differential]:
    yield from tram_differential(MEASURES)


@pytest.mark.parametrize("by", GROUPINGS, ids=lambda b: ",".join(b) or "none")
@pytest.mark.parametrize("group", list(GROUPS))
def test_reference_equals_duckdb(tram: Differential, group: str, by: tuple[str, ...]) -> None:
    for where in FILTERS[:2]:
        tram.check(GROUPS[group], by, where)


@pytest.mark.slow
@pytest.mark.parametrize("by", GROUPINGS + MORE_GROUPINGS, ids=lambda b: ",".join(b) or "none")
@pytest.mark.parametrize("group", list(GROUPS))
def test_reference_equals_duckdb_every_filter(tram: Differential, group: str, by: tuple[str, ...]) -> None:
    for where in FILTERS:
        tram.check(GROUPS[group], by, where)


@pytest.mark.parametrize("group", list(GROUPS))
def test_reference_equals_duckdb_with_totals(tram: Differential, group: str) -> None:
    tram.check(GROUPS[group], ("stops.zone", "stops.name"), totals=True)


@pytest.mark.slow
@pytest.mark.parametrize(
    "by", [("lines.name", "days.month"), ("days.year",), ("lines.kind", "stops.zone", "days.year")]
)
def test_reference_equals_duckdb_with_more_totals(tram: Differential, by: tuple[str, ...]) -> None:
    for group in GROUPS.values():
        tram.check(group, by, ["days.year = 2025"], totals=True)


def test_plain_sums_by_line_with_the_empty_member(tram: Differential) -> None:
    # Red has Harbour (10+5+3) and Market (8+7+7) = 40; Blue has Depot 4; the empty member of
    # lines gets Quarry (no boardings) and the boardings whose stop is unknown (9) or null: 6+2.
    result = tram.check(["riders", "line_share"], ["lines.name"])
    assert result.rows == [("Blue", 4, 4 / 52), ("Red", 40, 40 / 52), (None, 8, 8 / 52)]


def test_time_windows_by_month(tram: Differential) -> None:
    # February 2025: year to date is Jan 1 - Feb 28 2025: 10 + 5 + 8 + 4 = 27. Last year: the
    # days of February 2025 moved back a year are Feb 1-28 2024: the two identical rows, 7 + 7.
    # Trailing 28 days of February: Feb 1 - 28: 8 + 4 = 12. Of March 2025 (last day Mar 31):
    # Mar 4 - Mar 31, only the ride of Mar 5: 2.
    result = tram.check(["ytd", "last_year", "trailing_28"], ["days.month"], ["days.year = 2025"])
    rows = {r[0]: r[1:] for r in result.rows}
    assert rows["2025-02"] == (27, 14, 12)
    assert rows["2025-03"][2] == 2


def test_identical_rows_bind_together(tram: Differential) -> None:
    # Binding a boarding row binds its twin too: each of the two identical rows sees 14 riders.
    # 10 + 5 + 8 + 4 + 6 + 2 + 14 + 14 + 3 = 66, against the plain sum 52.
    result = tram.check(["bound_rows", "riders"])
    assert result.rows == [(66, 52)]


def test_rank_of_stops(tram: Differential) -> None:
    # Riders per stop: Market 22, Harbour 18, the empty member 8, Depot 4; Quarry has none
    # (null: no rank, and with no riders its row is dropped).
    result = tram.check(["riders", "stop_rank"], ["stops.name"])
    assert result.rows == [("Depot", 4, 4), ("Harbour", 18, 2), ("Market", 22, 1), (None, 8, 3)]


def test_two_facts_are_aggregated_apart(tram: Differential) -> None:
    # Zone A: faults 1 + 0 over 4 boardings (Harbour 3, Depot 1) = 0.25; zone B: 3 / 3; zone C
    # (Quarry) has neither: dropped; the empty member: orphan inspection 2 over 2 boardings = 1.
    result = tram.check(["faults_per_boarding"], ["stops.zone"])
    assert result.rows == [("A", 0.25), ("B", 1.0), (None, 1.0)]
