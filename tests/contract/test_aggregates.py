"""The six aggregates and ``count(t)`` (vocabulary rows 1-2), rule 1 and rule 5, on invented data.

Expected values are worked out by hand from the table in ``contract/harbour.py``; the rules are
common practice, no source.
"""

from __future__ import annotations

import pytest

from contract.bench import Outcome, run_args
from contract.harbour import topic_files
from contract.tables import Grid, assert_column

TOPIC = "aggregates"
MEASURES = """\
measure fares = sum(sailings.fare_total)
measure mean_load = mean(sailings.passengers)
measure smallest_load = min(sailings.passengers)
measure largest_load = max(sailings.passengers)
measure counted_loads = count(sailings.passengers)
measure days_sailed = distinct(sailings.day)
measure routes_known = count(route)
measure last_sailing = max(sailings.day)
measure names_known = distinct(route.name)
measure harbours_known = count(harbour)
"""
FILES = topic_files(TOPIC, MEASURES)
ALL = [
    "passengers", "trips", "fares", "mean_load", "smallest_load", "largest_load",
    "counted_loads", "days_sailed", "routes_known", "last_sailing", "names_known",
    "harbours_known",
]
MODEL = f"{TOPIC}.yaml"
SHARED = {"by_route": ALL, "overall": ALL}
COMMANDS = {"only_null_loads": run_args(MODEL, ALL, where=["sailings.passengers is null"])}

# Rows by route.name: ascending, the empty member (route 9 does not exist) last. Night Owl has
# no sailings but count(route) is 1 there, so its row stays (rule 6).
ROUTES = ["East Cross", "Night Owl", "North Loop", "South Shuttle", ""]

BY_ROUTE: dict[str, list[object]] = {
    # East Cross = sailings 3, 7, 10; North Loop = 1, 2, 5, 6, 9; South Shuttle = 4, 8, 12
    # (12 has no passenger count); the empty member = sailing 11; Night Owl = none (rule 5: null).
    "passengers": [40 + 50 + 70, None, 90 + 100 + 120 + 80 + 60, 20 + 30, 25],
    "trips": [3, None, 5, 3, 1],
    "fares": [80 + 100 + 140, None, 225 + 250 + 300 + 200 + 150, 60 + 90 + 0, 50],
    "mean_load": [160 / 3, None, 450 / 5, 50 / 2, 25],  # the null count is not a value
    "smallest_load": [40, None, 60, 20, 25],
    "largest_load": [70, None, 120, 30, 25],
    "counted_loads": [3, None, 5, 2, 1],  # count(c) counts non-null values
    "days_sailed": [3, None, 5, 3, 1],  # North Loop's five days are all different
    # count(route) sees one route per row; the empty member is not a row of route, so null.
    "routes_known": [1, 1, 1, 1, None],
    "last_sailing": ["2025-03-01", None, "2025-02-28", "2025-03-31", "2025-03-15"],
    "names_known": [1, 1, 1, 1, None],  # aggregates over route's columns skip the empty member
    # A filter on route.name does not narrow harbour, route's one side (filters never flow
    # from the many side back): all three harbours on every row.
    "harbours_known": [3, 3, 3, 3, 3],
}

OVERALL: dict[str, object] = {
    "passengers": 685,  # 90+100+40+20+120+80+50+30+60+70+25, sailing 12 is null
    "trips": 12,
    "fares": 1645,  # 225+250+80+60+300+200+100+90+150+140+50+0
    "mean_load": 685 / 11,
    "smallest_load": 20,
    "largest_load": 120,
    "counted_loads": 11,
    "days_sailed": 11,  # twelve sailings, two of them on 2025-01-20
    "routes_known": 4,  # the empty member is never counted as a row of route
    "last_sailing": "2025-03-31",
    "names_known": 4,
    "harbours_known": 3,
}

# Only sailing 12 is visible: its passenger count is null. count(c) of all-null values is 0,
# the other aggregates of the column are null; count(route) is not narrowed by a filter on the
# many side (filters never flow back), so it stays 4.
ONLY_NULL: dict[str, object] = {
    "passengers": None,
    "trips": 1,
    "fares": 0,
    "mean_load": None,
    "smallest_load": None,
    "largest_load": None,
    "counted_loads": 0,
    "days_sailed": 1,
    "routes_known": 4,
    "last_sailing": "2025-03-31",
    "names_known": 4,
    "harbours_known": 3,
}


def test_rows_by_route_are_ordered_with_the_empty_member_last(grid: Grid) -> None:
    table = grid("by_route")
    assert table.header[0] == "route.name"
    assert table.column("route.name") == ROUTES


@pytest.mark.parametrize("measure", ALL)
def test_aggregate_by_route(grid: Grid, measure: str) -> None:
    assert_column(grid("by_route"), measure, BY_ROUTE[measure])


@pytest.mark.parametrize("measure", ALL)
def test_aggregate_over_everything(grid: Grid, measure: str) -> None:
    table = grid("overall")
    assert "route.name" not in table.header  # no --by: only the measure names
    assert_column(table, measure, [OVERALL[measure]])


@pytest.mark.parametrize("measure", ALL)
def test_aggregate_over_null_values_only(outcomes: dict[str, Outcome], measure: str) -> None:
    assert_column(outcomes["only_null_loads"].table(), measure, [ONLY_NULL[measure]])
