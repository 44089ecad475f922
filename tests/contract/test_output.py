"""What ``measureport run`` prints (section 4) and ``--totals`` (rule 6), on invented data.

CSV: a header of the grouping columns as written in ``--by``, then the measure names; rows in
the order of the grouping columns, nulls last; nulls as empty fields. With ``--totals`` the
subtotals are re-evaluated, never summed, and marked (docs/semantics-choices.md: a last column
``totals`` saying ``subtotal`` or ``total``; ``(all)`` in the table format).
Expected values are worked out by hand; the rules are common practice, no source.
"""

from __future__ import annotations

from contract.bench import Outcome, run_args
from contract.harbour import topic_files
from contract.tables import assert_column

TOPIC = "output"
MEASURES = """\
measure routes_sailed = distinct(sailings.route_id)
measure mean_load = mean(sailings.passengers)
"""
FILES = topic_files(TOPIC, MEASURES)
MODEL = f"{TOPIC}.yaml"
SPLIT = ["route.name", "calendar.year"]
COMMANDS = {
    "totals": run_args(MODEL, ["trips", "routes_sailed", "mean_load"], SPLIT, totals=True),
    "year_first": run_args(MODEL, ["trips"], ["calendar.year", "route.name"]),
    "json": run_args(MODEL, ["passengers", "trips"], ["route.name"], fmt="json"),
    "table_totals": run_args(MODEL, ["trips"], ["route.name"], totals=True, fmt="table"),
}


def test_header_follows_by_then_measures(outcomes: dict[str, Outcome]) -> None:
    assert outcomes["year_first"].table().header == ["calendar.year", "route.name", "trips"]


def test_rows_follow_the_order_of_by_with_nulls_last(outcomes: dict[str, Outcome]) -> None:
    # Sailings per year and route: 2024 East 1, North 2, South 1; 2025 East 2, North 3,
    # South 2, the empty member (sailing 11) 1. No 2023 sailing: those rows are all null.
    table = outcomes["year_first"].table()
    assert table.rows == [
        ["2024", "East Cross", "1"],
        ["2024", "North Loop", "2"],
        ["2024", "South Shuttle", "1"],
        ["2025", "East Cross", "2"],
        ["2025", "North Loop", "3"],
        ["2025", "South Shuttle", "2"],
        ["2025", "", "1"],
    ]


def test_totals_are_re_evaluated_and_marked(outcomes: dict[str, Outcome]) -> None:
    table = outcomes["totals"].table()
    assert table.header == [*SPLIT, "trips", "routes_sailed", "mean_load", "totals"]
    assert table.keys(2) == [
        ("East Cross", "2024"), ("East Cross", "2025"), ("East Cross", ""),
        ("North Loop", "2024"), ("North Loop", "2025"), ("North Loop", ""),
        ("South Shuttle", "2024"), ("South Shuttle", "2025"), ("South Shuttle", ""),
        ("", "2025"), ("", ""),
        ("", ""),
    ]  # fmt: skip
    marks = ["", "", "subtotal"] * 3 + ["", "subtotal", "total"]
    assert table.column("totals") == marks
    assert_column(table, "trips", [1, 2, 3, 2, 3, 5, 1, 2, 3, 1, 1, 12])
    # distinct route ids: 1 on each route's rows and subtotals (not 2); {1, 2, 3, 9} overall.
    assert_column(table, "routes_sailed", [1] * 11 + [4])
    # Means of the passengers, not means of means: East 40 | 50, 70 | 160/3; North 90, 100 |
    # 120, 80, 60 | 450/5; South 20 | 30 (and a null) | 50/2; empty 25 | 25; all 685/11.
    assert_column(
        table,
        "mean_load",
        [40, 60, 160 / 3, 95, 260 / 3, 90, 20, 30, 25, 25, 25, 685 / 11],
    )


def test_json_has_one_record_per_row_with_nulls(outcomes: dict[str, Outcome]) -> None:
    records = outcomes["json"].records()
    assert [r["route.name"] for r in records] == ["East Cross", "North Loop", "South Shuttle", None]
    assert [r["passengers"] for r in records] == [160, 450, 50, 25]
    assert [r["trips"] for r in records] == [3, 5, 3, 1]


def test_table_format_marks_the_total(outcomes: dict[str, Outcome]) -> None:
    done = outcomes["table_totals"]
    assert done.returncode == 0, done.describe()
    last = done.stdout.strip().splitlines()[-1].split()
    assert last == ["(all)", "12"]
