"""``given`` and its modifiers (replace, ``in``, ``narrow``, ``clear``, ``clear ... but``, ``row``),
the reach of ``given``, and rules 3 (binding order) and 4 (values computed outside), on invented
data.

Expected values are worked out by hand from ``contract/harbour.py``; the rules are common
practice, no source.
"""

from __future__ import annotations

import pytest

from contract.bench import Outcome, run_args
from contract.harbour import topic_files
from contract.tables import Grid, assert_column

TOPIC = "modifiers"
MEASURES = """\
measure north_only = passengers given route.name = "North Loop"
measure cross_or_shuttle = passengers given route.name in ("East Cross", "South Shuttle")
measure narrowed = passengers given narrow route.name in ("East Cross", "South Shuttle")
measure all_routes = passengers given clear route.name
measure route_share = passengers / (passengers given clear route.name)
# given takes the whole expression on its left: (passengers / passengers) given ...
measure whole_share = passengers / passengers given clear route.name
measure big_boats = passengers given route.capacity >= 80
measure bound_max = sum(max(sailings.passengers) given row for each route)
measure unbound_max = sum(max(sailings.passengers) for each route)
measure bind_then_clear = sum(trips given clear route for each route)
measure bind_then_clear_name = sum(trips given clear route.name for each route)
measure bind_then_replace = sum(trips given route.name = "North Loop" for each route)
measure outside_max = trips given clear route, sailings.passengers >= max(sailings.passengers)
# Conditions apply left to right, each replacing or narrowing (rule 3).
measure replaced_twice = passengers given route.name = "North Loop", route.name = "East Cross"
measure replaced_then_narrowed = passengers given route.name = "North Loop", narrow route.name = "East Cross"
measure narrowed_then_replaced = passengers given narrow route.name = "East Cross", route.name = "North Loop"
# Every clear of the list comes before its conditions, wherever it is written (rule 3).
measure clear_written_last = trips given route.name = "North Loop", clear route
measure any_day_trips = trips given clear calendar
measure year_passengers = passengers given clear calendar but calendar.year
measure everything = trips given clear calendar, clear route
"""
FILES = topic_files(TOPIC, MEASURES)
MODEL = f"{TOPIC}.yaml"
ROUTE_LEVEL = [
    "passengers", "north_only", "cross_or_shuttle", "narrowed", "all_routes", "route_share",
    "whole_share", "big_boats", "bound_max", "unbound_max", "bind_then_clear", "bind_then_replace",
    "bind_then_clear_name",
    "outside_max", "replaced_twice", "replaced_then_narrowed", "narrowed_then_replaced",
    "clear_written_last",
]
CALENDAR_LEVEL = ["passengers", "trips", "any_day_trips", "year_passengers", "everything"]
SHARED = {"by_route": ROUTE_LEVEL, "overall": ROUTE_LEVEL}
COMMANDS = {
    "north_by_month": run_args(
        MODEL,
        CALENDAR_LEVEL,
        ["calendar.year", "calendar.month"],
        ["calendar.month in (1, 3)", 'route.name = "North Loop"'],
    ),
}

ROUTES = ["East Cross", "Night Owl", "North Loop", "South Shuttle", ""]
# passengers by route: East Cross 160, Night Owl null, North Loop 450, South Shuttle 50, empty 25;
# 685 in all. Largest load per route: East 70, North 120, South 30, empty 25.
BY_ROUTE: dict[str, list[object]] = {
    "passengers": [160, None, 450, 50, 25],
    # The condition on route.name replaces the cell's filter on route.name, on every row.
    "north_only": [450] * 5,
    "cross_or_shuttle": [160 + 50] * 5,
    # narrow intersects: only the cells already inside the list keep their value.
    "narrowed": [160, None, None, 50, None],
    "all_routes": [685] * 5,
    "route_share": [160 / 685, None, 450 / 685, 50 / 685, 25 / 685],
    "whole_share": [1] * 5,  # 685 / 685 once route.name is cleared
    # route.capacity had no filter: the condition adds one, route.name stays. East Cross has 80.
    "big_boats": [160, None, 450, None, None],
    # for each route iterates the cell's route only (never the empty member).
    "bound_max": [70, None, 120, 30, None],
    "unbound_max": [70, None, 120, 30, None],
    # Binding first, then the clear removes it with the cell's filter: all 12 trips, once per
    # iterated route.
    "bind_then_clear": [12, 12, 12, 12, None],
    # Binding puts every column of the route row (route_id too); the condition replaces only
    # route.name, so only route 1 named North Loop has trips.
    # Clearing route.name after binding keeps the other bound columns (route_id, ...): each
    # route's own trips.
    "bind_then_clear_name": [3, None, 5, 3, None],
    "bind_then_replace": [None, None, 5, None, None],
    # max(sailings.passengers) is computed in the cell (rule 4), then route is cleared:
    # East: >= 70 -> sailings 1, 2, 5, 6, 10; North: >= 120 -> 5; South: >= 30 -> all but 20, 25
    # and the null; Night Owl: the max is null, nothing passes; empty: >= 25 -> all but 20 and null.
    "outside_max": [5, None, 1, 9, 10],
    "replaced_twice": [160] * 5,  # the second condition replaces the first
    "replaced_then_narrowed": [None] * 5,  # North Loop and East Cross at once: nothing
    "narrowed_then_replaced": [450] * 5,
    "clear_written_last": [5] * 5,  # not 12: the clear ran before the condition
}
OVERALL: dict[str, object] = {
    "passengers": 685,
    "north_only": 450,
    "cross_or_shuttle": 210,
    "narrowed": 210,  # no filter to intersect with
    "all_routes": 685,
    "route_share": 1,
    "whole_share": 1,
    "big_boats": 450 + 160,
    "bound_max": 120 + 70 + 30,  # Night Owl's max is null
    "unbound_max": 120 * 4,  # the same overall max on each of the four routes
    "bind_then_clear": 12 * 4,
    "bind_then_clear_name": 5 + 3 + 3,
    "bind_then_replace": 5,
    "outside_max": 1,  # >= 120
    "replaced_twice": 160,
    "replaced_then_narrowed": None,
    "narrowed_then_replaced": 450,
    "clear_written_last": 5,
}


def test_route_rows(grid: Grid) -> None:
    assert grid("by_route").column("route.name") == ROUTES


@pytest.mark.parametrize("measure", ROUTE_LEVEL)
def test_modifier_by_route(grid: Grid, measure: str) -> None:
    assert_column(grid("by_route"), measure, BY_ROUTE[measure])


@pytest.mark.parametrize("measure", ROUTE_LEVEL)
def test_modifier_over_everything(grid: Grid, measure: str) -> None:
    assert_column(grid("overall"), measure, [OVERALL[measure]])


def test_clear_table_and_clear_but(outcomes: dict[str, Outcome]) -> None:
    # Report filters: months 1 and 3, North Loop. The grid: three calendar years x two months.
    # North Loop: 2024-03 sailing 2 (100); 2025-01 sailings 5, 6 (120 + 80); 190 in 2024, 260 in
    # 2025, five trips. clear calendar drops the cell's and the report's calendar filters;
    # clear calendar but calendar.year keeps the year; clear route drops the report's route.
    table = outcomes["north_by_month"].table()
    assert table.header == ["calendar.year", "calendar.month", *CALENDAR_LEVEL]
    years_months = [(year, month) for year in ("2023", "2024", "2025") for month in ("1", "3")]
    assert table.keys(2) == years_months
    assert_column(table, "passengers", [None, None, None, 100, 200, None])
    assert_column(table, "trips", [None, None, None, 1, 2, None])
    assert_column(table, "any_day_trips", [5] * 6)
    assert_column(table, "year_passengers", [None, None, 190, 190, 260, 260])
    assert_column(table, "everything", [12] * 6)
