"""``let``, ``if``, arithmetic, scalar functions, ``single``, ``restricted`` and literals; rule 5
(nulls), on invented data.

Expected values are worked out by hand from ``contract/harbour.py``; the rules (SQL meaning)
are common practice, no source.
"""

from __future__ import annotations

import pytest

from contract.harbour import topic_files
from contract.tables import Grid, assert_column

TOPIC = "values"
MEASURES = """\
# A let written outside the given keeps the value it had where it was written.
measure kept =
  let base = passengers
  base given clear route.name
measure shared =
  let everyone = (passengers given clear route.name)
  passengers / everyone
# The let is the cell's value, not bound to each row of the loop.
measure let_in_loop =
  let total = passengers
  sum(total for each sailings)
measure busy_word = if passengers > 200 then "busy" else "quiet"
measure busy_only = if passengers > 200 then passengers
measure per_trip = passengers / trips
measure by_zero = passengers / (trips - trips)
measure by_null = passengers / (trips given route.name = "Night Owl")
measure arithmetic = (passengers - 85) * 2 + 1
measure quarter_trips = trips / 4
measure plus_null = (passengers given route.name = "Night Owl") + 1
measure zero_filled = coalesce(passengers given route.name = "Night Owl", 0)
measure distance = abs(passengers - 200)
measure first_known = coalesce(passengers given route.name = "Night Owl",
                               trips given route.name = "Night Owl", trips)
measure mixed = passengers - trips * 10 / 4
measure left_assoc = passengers - 100 - 50
measure negated = -trips + 20
measure rounded = round(passengers / 7, 2)
measure half_up = round(trips / 8, 0)
measure half_down = round(0 - trips / 8, 0)
measure floor_100 = least(passengers, 100)
measure ceiling_100 = greatest(passengers, 100)
measure one_route = single(route.name)
measure one_town = single(harbour.town)
measure route_filtered = if restricted(route.name) then 1 else 0
measure lit_number = 42 + 3.5
measure lit_text = "Skipper's ""own"" pick"
measure lit_true = if true then 1 else 2
measure lit_false = if false then 1 else 2
measure lit_null = coalesce(null, 7)
measure lit_date = trips given calendar.day >= date "2025-03-01"
"""
FILES = topic_files(TOPIC, MEASURES)
ALL = [
    "passengers", "kept", "shared", "let_in_loop", "busy_word", "busy_only", "per_trip", "by_zero", "by_null",
    "arithmetic", "quarter_trips", "plus_null", "zero_filled", "distance", "first_known", "mixed",
    "left_assoc", "negated", "rounded", "half_up", "half_down", "floor_100", "ceiling_100",
    "one_route", "one_town", "route_filtered", "lit_number", "lit_text", "lit_true", "lit_false",
    "lit_null", "lit_date",
]
SHARED = {"by_route": ALL, "overall": ALL}
COMMANDS: dict[str, list[str]] = {}

ROUTES = ["East Cross", "Night Owl", "North Loop", "South Shuttle", ""]
# passengers: 160, null, 450, 50, 25 (685 in all); trips: 3, null, 5, 3, 1 (12 in all).
BY_ROUTE: dict[str, list[object]] = {
    "passengers": [160, None, 450, 50, 25],
    "kept": [160, None, 450, 50, 25],  # not re-evaluated as 685
    "shared": [160 / 685, None, 450 / 685, 50 / 685, 25 / 685],
    "let_in_loop": [160 * 3, None, 450 * 5, 50 * 3, 25 * 1],  # passengers x sailings
    # Night Owl: null > 200 is null, so the else branch.
    "busy_word": ["quiet", "quiet", "busy", "quiet", "quiet"],
    "busy_only": [None, None, 450, None, None],  # no else: null
    "per_trip": [160 / 3, None, 90, 50 / 3, 25],
    "by_zero": [None] * 5,  # division by 0 is null
    "by_null": [None] * 5,  # division by null (Night Owl has no trips) is null
    "arithmetic": [151, None, 731, -69, -119],  # (p - 85) * 2 + 1
    "quarter_trips": [0.75, None, 1.25, 0.75, 0.25],  # true division of integers
    "plus_null": [None] * 5,  # null + 1
    "zero_filled": [0] * 5,
    "distance": [40, None, 250, 150, 175],
    "first_known": [3, None, 5, 3, 1],  # the first two are null everywhere
    "mixed": [152.5, None, 437.5, 42.5, 22.5],  # p - ((t * 10) / 4)
    "left_assoc": [10, None, 300, -100, -125],  # (p - 100) - 50
    "negated": [17, None, 15, 17, 19],  # (-t) + 20
    # 160/7 = 22.857..., 450/7 = 64.2857..., 50/7 = 7.1428..., 25/7 = 3.5714...
    "rounded": [22.86, None, 64.29, 7.14, 3.57],
    "half_up": [0, None, 1, 0, 0],  # 3/8, 5/8, 3/8, 1/8
    "half_down": [0, None, -1, 0, 0],  # -0.375 rounds to 0 (shown as 0 or -0)
    "floor_100": [100, 100, 100, 50, 25],  # least ignores the null
    "ceiling_100": [160, 100, 450, 100, 100],
    # The empty member's one visible name is null.
    "one_route": ["East Cross", "Night Owl", "North Loop", "South Shuttle", None],
    # A filter on route does not narrow harbour: three towns visible, so null.
    "one_town": [None] * 5,
    "route_filtered": [1] * 5,
    "lit_number": [45.5] * 5,
    "lit_text": ['Skipper\'s "own" pick'] * 5,
    "lit_true": [1] * 5,
    "lit_false": [2] * 5,
    "lit_null": [7] * 5,
    # From 2025-03-01: sailings 10 (East Cross), 11 (empty), 12 (South Shuttle).
    "lit_date": [1, None, None, 1, 1],
}
OVERALL: dict[str, object] = {
    "passengers": 685,
    "kept": 685,
    "shared": 1,
    "let_in_loop": 685 * 12,
    "busy_word": "busy",
    "busy_only": 685,
    "per_trip": 685 / 12,
    "by_zero": None,
    "by_null": None,
    "arithmetic": 1201,
    "quarter_trips": 3,
    "plus_null": None,
    "zero_filled": 0,
    "distance": 485,
    "first_known": 12,
    "mixed": 655,
    "left_assoc": 535,
    "negated": 8,
    "rounded": 97.86,  # 685/7 = 97.857...
    "half_up": 2,  # 12/8 = 1.5, half away from zero
    "half_down": -2,  # -1.5
    "floor_100": 100,
    "ceiling_100": 685,
    "one_route": None,  # four names and the empty member
    "one_town": None,
    "route_filtered": 0,
    "lit_number": 45.5,
    "lit_text": 'Skipper\'s "own" pick',
    "lit_true": 1,
    "lit_false": 2,
    "lit_null": 7,
    "lit_date": 3,
}


def test_route_rows(grid: Grid) -> None:
    assert grid("by_route").column("route.name") == ROUTES


@pytest.mark.parametrize("measure", ALL)
def test_value_by_route(grid: Grid, measure: str) -> None:
    assert_column(grid("by_route"), measure, BY_ROUTE[measure])


@pytest.mark.parametrize("measure", ALL)
def test_value_over_everything(grid: Grid, measure: str) -> None:
    assert_column(grid("overall"), measure, [OVERALL[measure]])
