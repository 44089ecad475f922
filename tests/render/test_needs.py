"""Which columns of each plan node its readers use (render/needs.py), on plans built by hand over
an invented table of trips; each expected set read off the plan: what the result shows, what
each node reads to make what is asked of it."""

from __future__ import annotations

from measureport.plan import nodes as N
from measureport.plan import scalar as S
from measureport.render.needs import kept, needed_columns
from measureport.render.relations import _exists_nodes

TRIPS = N.Scan(
    "trips", ("trips",), (("t_day", "day"), ("t_zone", "zone"), ("t_fare", "fare"), ("t_km", "km"))
)
PER_DAY = N.Aggregate(
    TRIPS,
    keys=(("day", S.Col("t_day")), ("zone", S.Col("t_zone"))),
    values=(("fare", S.AggCall("sum", S.Col("t_fare"))), ("km", S.AggCall("sum", S.Col("t_km")))),
)


def test_a_chain_of_ranks_needs_only_what_the_result_shows() -> None:
    by_fare = N.DenseRank(PER_DAY, "fare_rank", (), S.Col("fare"))
    by_km = N.DenseRank(by_fare, "km_rank", (), S.Col("km"))
    root = N.Result(by_km, (("day", S.Col("day")), ("km_rank", S.Col("km_rank"))), ())
    need = needed_columns(root, _exists_nodes)
    assert need[by_km] == {"day", "km_rank"}
    # The km rank reads km; the fare rank is asked for nothing (its own rank included).
    assert need[by_fare] == {"day", "km"}
    # The fare rank reads fare; the aggregate renders every item, so its scan gives all four.
    assert need[PER_DAY] == {"day", "km", "fare"}
    assert need[TRIPS] == {"t_day", "t_zone", "t_fare", "t_km"}


def test_a_filter_and_a_join_condition_add_what_they_read() -> None:
    zones = N.Scan("zones", ("zones",), (("z_zone", "zone"), ("z_name", "name")))
    joined = N.Join(PER_DAY, zones, "left", S.Compare("=", S.Col("zone"), S.Col("z_zone")))
    busy = N.Filter(joined, S.Compare(">", S.Col("km"), S.Const(10)))
    root = N.Result(busy, (("z_name", S.Col("z_name")),), (N.SortKey(S.Col("day")),))
    need = needed_columns(root, _exists_nodes)
    assert need[busy] == {"z_name", "day"}  # shown, and sorted on
    assert need[joined] == {"z_name", "day", "km"}
    assert need[PER_DAY] == {"day", "km", "zone"}
    assert need[zones] == {"z_name", "z_zone"}


def test_distinct_rows_and_union_parts_need_every_column() -> None:
    days = N.Distinct(N.Project(TRIPS, (("d", S.Col("t_day")), ("z", S.Col("t_zone")))))
    both = N.UnionAll((days, N.NullRow((("d", "DATE"), ("z", "TEXT")))))
    root = N.Result(both, (("d", S.Col("d")),), ())
    need = needed_columns(root, _exists_nodes)
    assert need[days] == {"d", "z"}
    assert need[days.input] == {"d", "z"}


def test_kept_columns_keep_their_order_and_at_least_one() -> None:
    assert kept(("a", "b", "c"), {"c", "a"}) == ["a", "c"]
    assert kept(("a", "b"), set()) == ["a"]
    assert kept(("a", "b"), None) == ["a", "b"]
