"""``for each`` over a table, over columns, with ``where``; rules 1, 2 and the measure binding of
rule 3, on invented data.

Expected values are worked out by hand from ``contract/harbour.py``; the rules are common
practice, no source.
"""

from __future__ import annotations

import pytest

from contract.bench import Outcome, run_args
from contract.harbour import topic_files
from contract.tables import Grid, assert_column

TOPIC = "iteration"
MEASURES = """\
# Seats left on each sailing: a column of the table the sailing points to (rule 2).
measure empty_seats = sum(route.capacity - sailings.passengers for each sailings)
# The inner max does not see the row: the same value on every row (rule 1).
measure flat_max = sum(max(sailings.passengers) for each sailings)
# A measure inside for each is bound to the row (rule 3).
measure own_loads = sum(passengers for each sailings)
measure best_route_trips = max(trips for each route)
measure mean_route_trips = mean(trips for each route)
measure mean_route_trips_zero = mean(coalesce(trips, 0) for each route)
measure busiest_month = max(passengers
                            for each calendar.year, calendar.month)
measure active_months = count(passengers for each calendar.year, calendar.month)
measure route_years = count(1 for each route.name, calendar.year)
measure big_sailings = count(1 for each sailings where sailings.passengers >= 70)
measure big_boat_trips = sum(trips for each route where route.capacity >= 80)
# A measure in the where of a for each is bound to the row as well.
measure busy_route_trips = sum(trips for each route where trips > 3)
# Nested: the given binds the outer route row; without it the inner loop sees every sailing.
measure nested_bound = sum(sum(sailings.passengers for each sailings) given row for each route)
measure nested_unbound = sum(sum(sailings.passengers for each sailings) for each route)
# Column iteration sees the empty member's null name as a member.
measure route_names = count(1 for each route.name)
"""
FILES = topic_files(TOPIC, MEASURES)
MODEL = f"{TOPIC}.yaml"
ALL = [
    "empty_seats", "flat_max", "own_loads", "best_route_trips", "mean_route_trips",
    "mean_route_trips_zero", "busiest_month", "active_months", "route_years", "big_sailings",
    "big_boat_trips", "busy_route_trips", "route_names",
    "nested_bound", "nested_unbound",
]
SHARED = {"by_route": ALL, "overall": ALL}
COMMANDS = {"by_town": run_args(MODEL, ALL, ["harbour.town"])}

ROUTES = ["East Cross", "Night Owl", "North Loop", "South Shuttle", ""]
TOWNS = ["Gull Rock", "Pier Town", "Quayside", ""]

# Per sailing: passengers (capacity of its route)
#   North Loop (150): 1: 90, 2: 100, 5: 120, 6: 80, 9: 60
#   East Cross (80):  3: 40, 7: 50, 10: 70
#   South Shuttle (50): 4: 20, 8: 30, 12: null       empty member (no capacity): 11: 25
# Trips per route: North Loop 5, East Cross 3, South Shuttle 3, Night Owl null.
# Passengers per (year, month): 2024-02 90, 2024-03 140, 2024-11 20, 2025-01 250, 2025-02 90,
# 2025-03 95.
BY_ROUTE: dict[str, list[object]] = {
    # East: 40+30+10; North: 60+50+30+70+90; South: 30+20 (+ null); empty: null capacity.
    "empty_seats": [80, None, 300, 50, None],
    # max in the cell times the rows iterated: East 70*3, North 120*5, South 30*3 (sailing 12
    # counts too: the inner max does not look at its null), empty 25*1.
    "flat_max": [210, None, 600, 90, 25],
    "own_loads": [160, None, 450, 50, 25],
    # for each route sees the one route of the cell; the empty member is not a row of route.
    "best_route_trips": [3, None, 5, 3, None],
    "mean_route_trips": [3, None, 5, 3, None],
    "mean_route_trips_zero": [3, 0, 5, 3, None],
    # Months of each route: East 40, 50, 70; North 90, 100, 200 (2025-01: 120+80), 60;
    # South 20, 30, null; empty 25.
    "busiest_month": [70, None, 200, 30, 25],
    # The calendar is not narrowed by route, so all 36 months are iterated; count keeps the
    # non-null values. Night Owl: 36 null values, count 0 (SQL count of nulls).
    "active_months": [3, 0, 4, 2, 1],
    # (route.name, year) pairs of the visible sailings: East 2024/2025, North 2024/2025,
    # South 2024/2025, empty 2025; Night Owl has no sailing, so nothing to iterate: null.
    "route_years": [2, None, 2, 2, 1],
    # passengers >= 70: sailings 1, 2, 5, 6 (North) and 10 (East).
    "big_sailings": [1, None, 4, None, None],
    "big_boat_trips": [3, None, 5, None, None],
    "busy_route_trips": [None, None, 5, None, None],  # only North Loop has more than 3 trips
    "route_names": [1, 1, 1, 1, 1],
    # One route per cell, so bound or not the inner sum is that route's passengers.
    "nested_bound": [160, None, 450, 50, None],
    "nested_unbound": [160, None, 450, 50, None],
}

BY_TOWN: dict[str, list[object]] = {
    # Gull Rock: no route, no sailing. Pier Town: South Shuttle and Night Owl. Quayside: North
    # Loop and East Cross. The empty town: sailing 11 only.
    "empty_seats": [None, 50, 380, None],
    "flat_max": [None, 90, 120 * 8, 25],
    "own_loads": [None, 50, 610, 25],
    "best_route_trips": [None, 3, 5, None],  # Pier Town: max(3, null)
    "mean_route_trips": [None, 3, 4, None],  # Pier Town: mean(3, null); Quayside: (5+3)/2
    "mean_route_trips_zero": [None, 1.5, 4, None],  # Pier Town: (3+0)/2
    # Quayside months: 90, 140, 250, 60, 70; Pier Town: 20, 30, null.
    "busiest_month": [None, 30, 250, 25],
    "active_months": [0, 2, 5, 1],
    "route_years": [None, 2, 4, 1],
    "big_sailings": [None, None, 5, None],
    "big_boat_trips": [None, None, 8, None],
    "busy_route_trips": [None, None, 5, None],
    # The empty route points at the empty town only.
    "route_names": [None, 2, 2, 1],
    "nested_bound": [None, 50, 610, None],  # Pier Town: 50 + Night Owl's null
    "nested_unbound": [None, 100, 1220, None],  # the town's passengers once per route
}

OVERALL: dict[str, object] = {
    "empty_seats": 80 + 300 + 50,
    "flat_max": 120 * 12,
    "own_loads": 685,
    "best_route_trips": 5,
    "mean_route_trips": 11 / 3,  # (5 + 3 + 3) / 3, Night Owl's null left out
    "mean_route_trips_zero": 11 / 4,  # Night Owl counted as 0
    "busiest_month": 250,
    "active_months": 6,
    "route_years": 7,
    "big_sailings": 5,
    "big_boat_trips": 8,
    "busy_route_trips": 5,
    "route_names": 5,  # four names and the empty member's null
    "nested_bound": 450 + 160 + 50,  # sailing 11 has no route row to iterate
    "nested_unbound": 685 * 4,
}


def test_rows(outcomes: dict[str, Outcome], grid: Grid) -> None:
    assert grid("by_route").column("route.name") == ROUTES
    # Gull Rock stays: active_months is 0 there, not null.
    assert outcomes["by_town"].table().column("harbour.town") == TOWNS


@pytest.mark.parametrize("measure", ALL)
def test_iteration_by_route(grid: Grid, measure: str) -> None:
    assert_column(grid("by_route"), measure, BY_ROUTE[measure])


@pytest.mark.parametrize("measure", ALL)
def test_iteration_by_town(outcomes: dict[str, Outcome], measure: str) -> None:
    assert_column(outcomes["by_town"].table(), measure, BY_TOWN[measure])


@pytest.mark.parametrize("measure", ALL)
def test_iteration_over_everything(grid: Grid, measure: str) -> None:
    assert_column(grid("overall"), measure, [OVERALL[measure]])
