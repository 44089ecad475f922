"""Visible rows and the result grid: section 1 (filters flow one -> many, snowflake, the empty
member) and rule 6 (which combinations become rows), with report filters, on invented data.

Expected values are worked out by hand from ``contract/harbour.py``; the rules are common
practice, no source.
"""

from __future__ import annotations

from contract.bench import Outcome, run_args
from contract.harbour import topic_files
from contract.tables import assert_column

TOPIC = "grid"
MEASURES = """\
measure routes_known = count(route)
measure constant = 42 + 3.5
"""
FILES = topic_files(TOPIC, MEASURES)
MODEL = f"{TOPIC}.yaml"
COMMANDS = {
    "by_town": run_args(MODEL, ["passengers", "trips", "routes_known"], ["harbour.town"]),
    "one_table": run_args(MODEL, ["constant"], ["route.capacity", "route.name"]),
    "across_tables": run_args(
        MODEL, ["routes_known"], ["harbour.town", "calendar.year"], ["calendar.year >= 2024"]
    ),
    "two_wheres": run_args(
        MODEL, ["passengers", "trips"], where=["route.capacity >= 80", "calendar.year = 2025"]
    ),
    "fact_filter": run_args(
        MODEL, ["passengers", "routes_known"], ["route.name"], ["sailings.passengers > 60"]
    ),
}


def test_snowflake_filter_reaches_the_facts(outcomes: dict[str, Outcome]) -> None:
    # harbour.town -> route -> sailings. Quayside holds North Loop and East Cross, Pier Town holds
    # South Shuttle and Night Owl, Gull Rock no route. Sailing 11 (route 9, no such route) points
    # at route's empty member, which points at harbour's empty member: it groups under an empty
    # town. Gull Rock has only nulls and is dropped (rule 6).
    table = outcomes["by_town"].table()
    assert table.header == ["harbour.town", "passengers", "trips", "routes_known"]
    assert table.column("harbour.town") == ["Pier Town", "Quayside", ""]
    assert_column(table, "passengers", [20 + 30, 450 + 160, 25])
    assert_column(table, "trips", [3, 5 + 3, 1])
    assert_column(table, "routes_known", [2, 2, None])  # empty members are never counted


def test_grid_within_one_table_takes_existing_combinations(outcomes: dict[str, Outcome]) -> None:
    # Rule 6: route.capacity and route.name are of one table, so only the four pairs that exist
    # (and the empty member's null pair), not 5 x 5 combinations, even for a constant measure.
    # Capacities sort as numbers (40 < 50 < 80 < 150), nulls last.
    table = outcomes["one_table"].table()
    assert table.header == ["route.capacity", "route.name", "constant"]
    assert table.keys(2) == [
        ("40", "Night Owl"),
        ("50", "South Shuttle"),
        ("80", "East Cross"),
        ("150", "North Loop"),
        ("", ""),
    ]
    assert_column(table, "constant", [45.5] * 5)


def test_grid_across_tables_takes_all_combinations(outcomes: dict[str, Outcome]) -> None:
    # Rule 6: towns x years (2023 removed by --where). count(route) is 2 in Pier Town and
    # Quayside whatever the year (the calendar does not reach route); Gull Rock and the empty
    # town have no route row, so null, and are dropped.
    table = outcomes["across_tables"].table()
    assert table.keys(2) == [
        ("Pier Town", "2024"), ("Pier Town", "2025"), ("Quayside", "2024"), ("Quayside", "2025")
    ]
    assert_column(table, "routes_known", [2, 2, 2, 2])


def test_several_where_conditions_all_hold(outcomes: dict[str, Outcome]) -> None:
    # capacity >= 80: North Loop, East Cross; year 2025: North Loop sailings 5, 6, 9
    # (120 + 80 + 60) and East Cross sailings 7, 10 (50 + 70).
    table = outcomes["two_wheres"].table()
    assert_column(table, "passengers", [260 + 120])
    assert_column(table, "trips", [3 + 2])


def test_fact_filter_narrows_facts_but_not_the_grid_dimension(outcomes: dict[str, Outcome]) -> None:
    # Sailings with more than 60 passengers: 1 (90), 2 (100), 5 (120), 6 (80) on North Loop and
    # 10 (70) on East Cross. The filter does not narrow route, so every route keeps
    # count(route) = 1; the empty member's only sailing (25) fails, so that row is all null.
    table = outcomes["fact_filter"].table()
    assert table.column("route.name") == ["East Cross", "Night Owl", "North Loop", "South Shuttle"]
    assert_column(table, "passengers", [70, None, 90 + 100 + 120 + 80, None])
    assert_column(table, "routes_known", [1, 1, 1, 1])
