"""Failures the random differential suite found, each kept as a named test (invented data, shrunk
by hypothesis). Each says what went wrong and what the right answer is."""

from __future__ import annotations

from differential.harness import Differential
from support.modelbuild import make


def test_aggregates_of_the_same_rows_at_two_stages_stay_apart() -> None:
    # Found with seed 3. `sum(sum(f.n1) for each a)` reads a's rows like `sum(a.size)`, but one
    # stage later (it needs the bare sum first); the two aggregates were once taken for one and
    # m2 showed sum(a.size) = 0. With no f rows every measure is null, so there is no row at all.
    model, data = make(
        {
            "a": {"id": [1], "name": ["ash"], "size": [0]},
            "f": {"a_id": [], "n1": []},
        },
        keys={"a": "id"},
        relationships=["f.a_id -> a.id"],
    )
    measures = """
measure m0 = sum(f.n1) + (sum(f.n1) + sum(a.size))
measure m1 = sum(f.n1)
measure m2 = sum(sum(f.n1) for each a)
"""
    diff = Differential(model, data, measures)
    try:
        assert diff.check(["m0", "m1", "m2"]).rows == []
    finally:
        diff.close()


def test_a_shifted_window_alone_by_a_dimension_keeps_its_grid() -> None:
    # Found by the deep demo run: a year-shifted sum alone, grouped by a dimension, was taken for
    # an aggregate whose groups could be the grid's rows, though its shifted days are joined in
    # as parameters of the grid; the plan could not be built. Invented data: two shops, sales on
    # 2024-05-01 (shop 1: 3, shop 2: 4) and 2025-05-01 (shop 1: 5); by shop, the sales of the
    # visible days moved back a year: a shop does not narrow the calendar, so both days are
    # visible, moved to 2023-05-01 (not a calendar day) and 2024-05-01: North 3, South 4.
    import datetime as dt

    days = [dt.date(2024, 5, 1), dt.date(2025, 5, 1)]
    model, data = make(
        {
            "shops": {"shop_id": [1, 2], "name": ["North", "South"]},
            "cal": {"day": days, "year": [2024, 2025]},
            "sales": {"shop_id": [1, 2, 1], "day": [days[0], days[0], days[1]], "amount": [3, 4, 5]},
        },
        keys={"shops": "shop_id", "cal": "day"},
        relationships=["sales.shop_id -> shops.shop_id", "sales.day -> cal.day"],
    )
    measures = "measure last_year = sum(sales.amount) given shift(cal.day, -1, year)\n"
    diff = Differential(model, data, measures)
    try:
        assert diff.check(["last_year"], ["shops.name"]).rows == [("North", 3), ("South", 4)]
    finally:
        diff.close()
