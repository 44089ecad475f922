"""``rank(EXPR over t.c)``: dense, largest first, ``ascending``, null unless one member is visible,
members taken once the filters on ``t.c`` are cleared; on invented data.

Expected values are worked out by hand from ``contract/harbour.py``; the rules are common
practice, no source.
"""

from __future__ import annotations

from contract.bench import Outcome, run_args
from contract.harbour import topic_files
from contract.tables import Grid, assert_column

TOPIC = "rank"
MEASURES = """\
measure load_rank = rank(passengers over route.name)
measure load_rank_up = rank(passengers over route.name ascending)
measure trip_rank = rank(trips over route.name)
# Keeps the Night Owl row in the grid (1 there), whatever else is asked.
measure rank_routes = count(route)
"""
FILES = topic_files(TOPIC, MEASURES)
MODEL = f"{TOPIC}.yaml"
ALL = ["passengers", "trips", "load_rank", "load_rank_up", "trip_rank", "rank_routes"]
SHARED = {"by_route": ALL, "overall": ALL}
COMMANDS = {"in_quayside": run_args(MODEL, ALL, ["route.name"], ['harbour.town = "Quayside"'])}


def test_dense_rank_over_every_member(grid: Grid) -> None:
    # Members of route.name: North Loop 450 passengers / 5 trips, East Cross 160 / 3,
    # South Shuttle 50 / 3, the empty member 25 / 1, Night Owl null (takes no place, ranks null).
    table = grid("by_route")
    assert table.column("route.name") == ["East Cross", "Night Owl", "North Loop", "South Shuttle", ""]
    assert_column(table, "load_rank", [2, None, 1, 3, 4])
    assert_column(table, "load_rank_up", [3, None, 4, 2, 1])
    # Trips 5, 3, 3, 1: dense, so the tie shares 2 and the next is 3.
    assert_column(table, "trip_rank", [2, None, 1, 2, 3])


def test_rank_keeps_filters_on_other_columns(outcomes: dict[str, Outcome]) -> None:
    # Quayside keeps North Loop and East Cross only (the empty route points at the empty town,
    # which is not Quayside): ranks among those two.
    table = outcomes["in_quayside"].table()
    assert table.column("route.name") == ["East Cross", "North Loop"]
    assert_column(table, "load_rank", [2, 1])
    assert_column(table, "load_rank_up", [1, 2])
    assert_column(table, "trip_rank", [2, 1])


def test_rank_is_null_when_several_members_are_visible(grid: Grid) -> None:
    table = grid("overall")
    assert_column(table, "passengers", [685])
    assert_column(table, "load_rank", [None])
    assert_column(table, "load_rank_up", [None])
    assert_column(table, "trip_rank", [None])
