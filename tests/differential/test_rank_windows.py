"""Ranks over a grid column computed as a window over the grid's own rows, against the
reference evaluator; and the ranks where that form would not be exact, which keep the rank frame.
Invented data: the tram network of tram.py.
"""

from __future__ import annotations

from collections.abc import Iterator

import pytest
import sqlglot
from sqlglot import exp

from differential.harness import Differential
from differential.tram import tram_differential

MEASURES = """
measure riders = sum(boardings.riders)
measure stop_rank = rank(riders over stops.name)
measure stop_rank_up = rank(riders over stops.name ascending)
measure rank_across_lines = rank(riders over stops.name) given clear lines
measure rank_in_zone_a = rank(riders over stops.name) given stops.zone = "A"
measure line_rank = rank(riders over lines.name)
measure stop_rank_or_zero = rank(coalesce(riders, 0) over stops.name)
"""


@pytest.fixture(scope="module")
def tram() -> Iterator[Differential]:
    yield from tram_differential(MEASURES)


def rank_partitions(tram: Differential, measures: list[str], by: list[str]) -> list[int]:
    """How many columns each dense rank of the statement is partitioned by."""
    sql = tram.engine.compile(tram.query(measures, by)).sql
    tree = sqlglot.parse_one(sql, read="duckdb")
    return [
        len(w.args.get("partition_by") or [])
        for w in tree.find_all(exp.Window)
        if isinstance(w.this, exp.DenseRank)
    ]


def test_rank_within_each_line(tram: Differential) -> None:
    # Riders per stop: Harbour 10 + 5 + 3 = 18, Market 8 + 7 + 7 = 22, Depot 4, the empty member
    # of stops (stop 9 and a null stop) 6 + 2 = 8, Quarry none. Within Red: Market 1, Harbour 2;
    # Blue: Depot 1; the empty line (Quarry's line 5 is unknown): the empty stop 1, Quarry null
    # (its row is dropped, as are the cells of a line and a stop of another line).
    result = tram.check(["riders", "stop_rank"], ["lines.name", "stops.name"])
    assert result.rows == [
        ("Blue", "Depot", 4, 1),
        ("Red", "Harbour", 18, 2),
        ("Red", "Market", 22, 1),
        (None, None, 8, 1),
    ]
    # A window over the grid rows of each line (partitioned by the line alone), not a rank frame
    # of every stop per grid row (partitioned by both grid columns).
    assert rank_partitions(tram, ["stop_rank"], ["lines.name", "stops.name"]) == [1]
    # The riders are null wherever no stop of the cell is visible, so they tell the members
    # alone: boardings are read once, with no count of the visible stops and no test of
    # whether stops have an empty member.
    compiled = tram.engine.compile(tram.query(["stop_rank"], ["lines.name", "stops.name"]))
    assert compiled.scans["boardings"] == 1


def test_rank_of_a_value_that_is_never_null_counts_the_members(tram: Differential) -> None:
    # coalesce(riders, 0) is 0 in cells without a stop, so the members are counted per cell:
    # Red: Market 1, Harbour 2; Blue: Depot 1; the empty line: the empty stop 8 (1), Quarry 0
    # (2). A cell of a line and a stop of another line has no member and no rank.
    result = tram.check(["stop_rank_or_zero"], ["lines.name", "stops.name"])
    assert result.rows == [
        ("Blue", "Depot", 1),
        ("Red", "Harbour", 2),
        ("Red", "Market", 1),
        (None, "Quarry", 2),
        (None, None, 1),
    ]
    assert rank_partitions(tram, ["stop_rank_or_zero"], ["lines.name", "stops.name"]) == [1]


def test_rank_ascending_within_each_zone(tram: Differential) -> None:
    # Zone A: Depot 4 (1), Harbour 18 (2); B: Market 1; C: Quarry without riders (dropped);
    # the empty member's zone is null: the empty stop, 8, ranks 1.
    result = tram.check(["riders", "stop_rank_up"], ["stops.zone", "stops.name"])
    assert result.rows == [
        ("A", "Depot", 4, 1),
        ("A", "Harbour", 18, 2),
        ("B", "Market", 22, 1),
        (None, None, 8, 1),
    ]
    assert rank_partitions(tram, ["stop_rank_up"], ["stops.zone", "stops.name"]) == [1]


def test_rank_with_the_line_cleared_ranks_every_stop(tram: Differential) -> None:
    # Clearing the line: the whole rank is evaluated without the line's filter, so every stop is
    # one visible member in every line's rows: Market 1, Harbour 2, the empty stop 3, Depot 4;
    # Quarry has no riders (no rank, dropped).
    result = tram.check(["rank_across_lines"], ["lines.name", "stops.name"])
    ranks = [("Depot", 4), ("Harbour", 2), ("Market", 1), (None, 3)]
    assert result.rows == [(line, stop, r) for line in ("Blue", "Red", None) for stop, r in ranks]
    assert rank_partitions(tram, ["rank_across_lines"], ["lines.name", "stops.name"]) == [1]


def test_rank_where_a_condition_replaces_a_grid_column_keeps_the_rank_frame(tram: Differential) -> None:
    # The zone's grid filter is replaced, so the members (zone A stops) are not the grid rows of
    # the row's zone: no window over the grid; the answer still agrees with the reference.
    tram.check(["rank_in_zone_a"], ["stops.zone", "stops.name"])
    tram.check(["rank_in_zone_a", "riders"], ["stops.zone", "stops.name"], ["days.year = 2025"])
    assert rank_partitions(tram, ["rank_in_zone_a"], ["stops.zone", "stops.name"]) == [2]


@pytest.mark.parametrize(
    "by", [("stops.name",), ("lines.name",), ("lines.name", "stops.name"), ("days.month", "stops.name")]
)
@pytest.mark.parametrize("where", [(), ("days.year = 2025",), ('stops.zone != "C"',)])
def test_ranks_agree_with_the_reference(
    tram: Differential, by: tuple[str, ...], where: tuple[str, ...]
) -> None:
    measures = ["stop_rank", "stop_rank_up", "rank_across_lines", "line_rank", "stop_rank_or_zero", "riders"]
    tram.check(measures, by, where)


def test_ranks_with_totals_agree_with_the_reference(tram: Differential) -> None:
    tram.check(["stop_rank", "line_rank", "riders"], ("lines.name", "stops.name"), totals=True)
