"""One test per rule of LANGUAGE.md section 3, on small hand-made data.

Invented data (a lending library and a small shop); the rules are common practice, no source.
Every expected value is worked out by hand in the comment beside it.
"""

from __future__ import annotations

import datetime as dt

import pytest

from support.evaluate import as_dict, run
from support.modelbuild import make

# branches: 1 Avon (size 10), 2 Avon (20), 3 Brook (30)
# loans:    id branch book fee
#            1   1     1    2
#            2   1     2    3
#            3   2     1    5
#            4   3     1    7
#            5   3     2    1
#            6   7     3    4     <- branch 7 does not exist: an orphan key (empty member)
# books:    1 crime, 2 poetry, 3 atlas
# visits:   (branch 1, walk-in) twice — identical rows — and (branch 2, event)
# repairs:  branch 1 cost 10, branch 3 cost 20 and 5
LIBRARY = make(
    {
        "branches": {"branch_id": [1, 2, 3], "city": ["Avon", "Avon", "Brook"], "size": [10, 20, 30]},
        "books": {"book_id": [1, 2, 3], "genre": ["crime", "poetry", "atlas"]},
        "loans": {
            "loan_id": [1, 2, 3, 4, 5, 6],
            "branch_id": [1, 1, 2, 3, 3, 7],
            "book_id": [1, 2, 1, 1, 2, 3],
            "fee": [2, 3, 5, 7, 1, 4],
        },
        "visits": {"branch_id": [1, 1, 2], "kind": ["walk-in", "walk-in", "event"]},
        "repairs": {"branch_id": [1, 3, 3], "cost": [10, 20, 5]},
    },
    keys={"branches": "branch_id", "books": "book_id"},
    relationships=[
        "loans.branch_id -> branches.branch_id",
        "loans.book_id -> books.book_id",
        "visits.branch_id -> branches.branch_id",
        "repairs.branch_id -> branches.branch_id",
    ],
)

MEASURES = """
measure loans_n = count(loans)
measure fees = sum(loans.fee)
measure avg_fee = mean(loans.fee)
measure bare_max = max(count(loans) for each branches)
measure bare_min = min(count(loans) for each branches)
measure bound_min = min(loans_n for each branches)
measure doubled = sum(loans.fee * 2 for each loans)
measure avon_fees = sum(if branches.city = "Avon" then loans.fee else 0 for each loans)
measure per_branch = mean(loans_n for each branches)
measure per_branch_row = mean(count(loans) given row for each branches)
measure cleared_each = sum(count(loans) given row, clear branches for each branches)
measure replaced_each = sum(count(loans) given branches.city = "Brook" for each branches)
measure top_fee_anywhere = count(loans) given clear branches, loans.fee >= max(loans.fee)
measure nowhere = sum(loans.fee) given branches.city = "Nowhere"
measure nowhere_count = count(loans) given branches.city = "Nowhere"
measure nowhere0 = coalesce(nowhere, 0)
measure nowhere_plus = nowhere + 1
measure zero_divisor = loans_n / (loans_n - loans_n)
measure everywhere = count(loans) given clear branches
measure avon_replace = loans_n given branches.city = "Avon"
measure avon_narrow = loans_n given narrow branches.city = "Avon"
measure share = loans_n / (loans_n given clear branches)
measure share_let =
    let all = loans_n given clear branches
    loans_n / all
measure visits_n = count(visits)
measure bound_visits = sum(visits_n for each visits)
measure cities_with_loans = count(loans_n for each branches.city)
measure big_branches = count(loans_n for each branches where branches.size >= 20)
measure combos = count(loans_n for each branches.city, books.genre)
measure rank_desc = rank(loans_n over branches.city)
measure rank_asc = rank(loans_n over branches.city ascending)
measure the_city = single(branches.city)
measure is_cut = restricted(branches.city)
measure busy = if loans_n >= 3 then "busy" else "quiet"
measure repairs_cost = sum(repairs.cost)
measure cost_per_loan = repairs_cost / loans_n
"""


def by_city(*names: str, **kw: object) -> dict[tuple[object, ...], tuple[object, ...]]:
    model, data = LIBRARY
    return as_dict(run(model, data, MEASURES, names, by=["branches.city"], **kw))  # type: ignore[arg-type]


def total(*names: str) -> tuple[object, ...]:
    model, data = LIBRARY
    result = run(model, data, MEASURES, names)
    assert len(result.rows) == 1
    return result.rows[0]


def test_rule1_an_aggregate_sees_only_the_visible_rows_and_not_the_current_row() -> None:
    # "Inside for each, a bare aggregate does not see the current row: it returns the same value
    # on every row." Avon has loans 1,2,3: bare min = bare max = 3 (the whole cell), while the
    # bound measure gives min(branch 1: 2 loans, branch 2: 1 loan) = 1. Brook: 2, 2, 2.
    # The empty member row has no real branch to iterate: null for the iterations.
    rows = by_city("loans_n", "bare_max", "bare_min", "bound_min")
    assert rows[("Avon",)] == (3, 3, 3, 1)
    assert rows[("Brook",)] == (2, 2, 2, 2)
    assert rows[(None,)] == (1, None, None, None)
    # Total: 6 loans; bound: min(2, 1, 2) = 1.
    assert total("bare_max", "bare_min", "bound_min") == (6, 6, 1)


def test_rule2_columns_inside_for_each_are_the_current_row() -> None:
    # "a column of the iterated table, or of a table it points to, means that column's value on
    # the current row": 2 * (2+3+5+7+1+4) = 44; fees of Avon loans 2+3+5 = 10 (the orphan's city
    # is null, so the condition is null and the else branch 0 is taken).
    assert total("doubled", "avon_fees") == (44, 10)
    # In Brook every loan takes the else branch: 0, not null.
    assert by_city("avon_fees")[("Brook",)] == (0,)


def test_rule3_binding_makes_the_average_of_per_member_values() -> None:
    # Per branch: 2, 1, 2 loans -> mean 5/3, the same with an explicit `given row`.
    per, per_row = total("per_branch", "per_branch_row")
    assert per == pytest.approx(5 / 3)
    assert per_row == pytest.approx(5 / 3)


def test_rule3_binding_first_then_clear_then_conditions() -> None:
    # Binding, then `clear branches` removes it: every branch sees all 6 loans -> 3 * 6 = 18.
    # A condition on branches.city replaces only the city filter of the binding; branch_id and
    # size stay bound: branches 1 and 2 are not in Brook (null), branch 3 has 2 loans -> 2.
    assert total("cleared_each", "replaced_each") == (18, 2)


def test_rule4_condition_values_are_computed_outside_the_given() -> None:
    # In Avon, max(fee) outside the given is 5; after clearing branches, loans with fee >= 5 are
    # loans 3 (5) and 4 (7) -> 2. In Brook and at the total the max is 7 -> only loan 4 -> 1.
    rows = by_city("top_fee_anywhere")
    assert rows[("Avon",)] == (2,)
    assert rows[("Brook",)] == (1,)
    assert total("top_fee_anywhere") == (1,)


def test_rule5_no_rows_give_null_and_null_spreads() -> None:
    # No branch in "Nowhere": sum and count are null, coalesce gives 0, null + 1 is null,
    # and a zero divisor gives null.
    assert total("nowhere", "nowhere_count", "nowhere0", "nowhere_plus", "zero_divisor") == (
        None, None, 0, None, None,
    )


def test_rule6_existing_combinations_within_one_table() -> None:
    # `everywhere` is 6 on any cell, so only the grid decides the rows: the existing
    # (city, branch_id) pairs of branches plus the empty member (None, None) of the orphan loan.
    model, data = LIBRARY
    result = run(model, data, MEASURES, ["everywhere"], by=["branches.city", "branches.branch_id"])
    assert result.rows == [("Avon", 1, 6), ("Avon", 2, 6), ("Brook", 3, 6), (None, None, 6)]


def test_rule6_all_combinations_across_tables() -> None:
    # Cities (Avon, Brook, empty member) times genres (atlas, crime, poetry): 9 rows. The measure
    # clears branches, so it is the loans of the genre: crime (book 1) loans 1,3,4 = 3; poetry
    # (book 2) loans 2,5 = 2; atlas (book 3) loan 6 = 1.
    model, data = LIBRARY
    result = run(model, data, MEASURES, ["everywhere"], by=["branches.city", "books.genre"])
    expected = [
        (city, genre, n)
        for city in ("Avon", "Brook", None)
        for genre, n in (("atlas", 1), ("crime", 3), ("poetry", 2))
    ]
    assert result.rows == expected


def test_rule6_rows_whose_measures_are_all_null_are_dropped() -> None:
    # Under fee > 4: Avon keeps loan 3, Brook loan 4; the orphan loan 6 has fee 4, so the empty
    # member's count is null and its row disappears.
    model, data = LIBRARY
    result = run(model, data, MEASURES, ["loans_n"], by=["branches.city"], where=["loans.fee > 4"])
    assert result.rows == [("Avon", 1), ("Brook", 1)]


def test_rule6_totals_are_re_evaluated_not_summed() -> None:
    # mean fee: Avon (2+3+5)/3, Brook (7+1)/2 = 4, empty member 4; the total is 22/6, not a sum
    # or mean of the rows above. The total row has level 0.
    model, data = LIBRARY
    result = run(model, data, MEASURES, ["avg_fee"], by=["branches.city"], totals=True)
    assert [r[0] for r in result.rows] == ["Avon", "Brook", None, None]
    assert result.levels == [1, 1, 1, 0]
    assert [r[1] for r in result.rows] == pytest.approx([10 / 3, 4.0, 4.0, 22 / 6])


def test_rule6_subtotals_follow_their_detail_rows() -> None:
    # (Avon,1)=2, (Avon,2)=1, Avon subtotal 3, (Brook,3)=2, Brook 2, empty member 1 and its
    # subtotal 1, grand total 6.
    model, data = LIBRARY
    result = run(model, data, MEASURES, ["loans_n"], by=["branches.city", "branches.branch_id"], totals=True)
    assert result.rows == [
        ("Avon", 1, 2), ("Avon", 2, 1), ("Avon", None, 3),
        ("Brook", 3, 2), ("Brook", None, 2),
        (None, None, 1), (None, None, 1),
        (None, None, 6),
    ]
    assert result.levels == [2, 2, 1, 2, 1, 2, 1, 0]


def test_replace_shows_one_value_on_every_row_narrow_only_on_the_match() -> None:
    # Replacing city with Avon gives Avon's 3 loans on every city row; narrowing keeps the
    # cell's own city, so only the Avon row has a value.
    rows = by_city("avon_replace", "avon_narrow")
    assert rows == {("Avon",): (3, 3), ("Brook",): (3, None), (None,): (3, None)}


def test_share_of_total_by_clearing() -> None:
    # 3/6, 2/6, 1/6; the same written with let.
    rows = by_city("share", "share_let")
    assert rows[("Avon",)] == pytest.approx((0.5, 0.5))
    assert rows[("Brook",)] == pytest.approx((1 / 3, 1 / 3))
    assert rows[(None,)] == pytest.approx((1 / 6, 1 / 6))
    assert total("share") == pytest.approx((1.0,))


def test_orphan_key_counts_in_totals_and_under_the_empty_member() -> None:
    # 5 loans point at real branches, 1 at branch 7: the total is 6, the empty member has 1.
    assert total("loans_n", "fees") == (6, 22)
    assert by_city("loans_n", "fees")[(None,)] == (1, 4)


def test_identical_rows_are_bound_together_in_a_table_iteration() -> None:
    # The two identical visits each bind to both (2 + 2), the event visit to itself (1): 5.
    # Per branch: branch 1 has the two identical visits (2 + 2 = 4), branch 2 the event (1).
    assert total("bound_visits") == (5,)
    model, data = LIBRARY
    per_branch = as_dict(run(model, data, MEASURES, ["bound_visits"], by=["branches.branch_id"]))
    assert per_branch == {(1,): (4,), (2,): (1,)}


def test_column_iteration_includes_the_empty_member() -> None:
    # Members of branches.city: Avon (3), Brook (2) and the empty member (1): 3 non-null values.
    assert total("cities_with_loans") == (3,)
    assert by_city("cities_with_loans")[("Avon",)] == (1,)


def test_iteration_where_keeps_only_matching_rows() -> None:
    # Branches of size >= 20: 2 (1 loan) and 3 (2 loans): 2 non-null values.
    assert total("big_branches") == (2,)


def test_column_iteration_across_tables_reads_the_combinations_of_the_fact() -> None:
    # Combinations in loans: (Avon, crime), (Avon, poetry), (Brook, crime), (Brook, poetry),
    # (empty member, atlas): 5.
    assert total("combos") == (5,)


def test_rank_single_restricted() -> None:
    # Loans per city: Avon 3, Brook 2, empty member 1 -> ranks 1, 2, 3 largest first and 3, 2, 1
    # ascending; null at the total (several members visible). single is the city or null;
    # restricted is true on every city row and false at the total.
    rows = by_city("rank_desc", "rank_asc", "the_city", "is_cut")
    assert rows[("Avon",)] == (1, 3, "Avon", True)
    assert rows[("Brook",)] == (2, 2, "Brook", True)
    assert rows[(None,)] == (3, 1, None, True)
    assert total("rank_desc", "the_city", "is_cut") == (None, None, False)


def test_if_and_two_facts() -> None:
    # busy when at least 3 loans. Repairs per loan: Avon 10/3, Brook 25/2, empty member has no
    # repairs (null / 1 = null), total 35/6.
    rows = by_city("busy", "cost_per_loan")
    assert rows[("Avon",)] == pytest.approx(("busy", 10 / 3))
    assert rows[("Brook",)] == pytest.approx(("quiet", 12.5))
    assert rows[(None,)] == ("quiet", None)
    assert total("cost_per_loan") == pytest.approx((35 / 6,))


# --- time windows ---------------------------------------------------------------------------

# A shop's sales on seven days and a calendar from 2025-01-01 to 2026-03-31 (invented).
_SALES = {
    dt.date(2025, 1, 15): 1,
    dt.date(2025, 2, 28): 2,
    dt.date(2025, 3, 31): 4,
    dt.date(2025, 7, 1): 8,
    dt.date(2026, 1, 10): 16,
    dt.date(2026, 2, 28): 32,
    dt.date(2026, 3, 15): 64,
}
_DAYS = [dt.date(2025, 1, 1) + dt.timedelta(days=i) for i in range(455)]
SHOP = make(
    {
        "calendar": {
            "day": _DAYS,
            "month": [d.strftime("%Y-%m") for d in _DAYS],
            "year": [d.year for d in _DAYS],
        },
        "sales": {"day": list(_SALES), "amount": list(_SALES.values())},
    },
    keys={"calendar": "day"},
    relationships=["sales.day -> calendar.day"],
)
TIME_MEASURES = """
measure amount = sum(sales.amount)
measure ytd = amount given to_date(calendar.day, year)
measure fytd = amount given to_date(calendar.day, year, start "07-01")
measure qtd = amount given to_date(calendar.day, quarter)
measure last_year = amount given shift(calendar.day, -1, year)
measure prev_month = amount given shift(calendar.day, -1, month)
measure next_month = amount given shift(calendar.day, 1, month)
measure t28 = amount given trailing(calendar.day, 28, day)
measure t3m = amount given trailing(calendar.day, 3, month)
measure t1m = amount given trailing(calendar.day, 1, month)
measure ly_ytd = amount given shift(calendar.day, -1, year), to_date(calendar.day, year)
measure year_total = amount given clear calendar but calendar.year
"""


def by_month(*names: str) -> dict[tuple[object, ...], tuple[object, ...]]:
    model, data = SHOP
    return as_dict(run(model, data, TIME_MEASURES, names, by=["calendar.month"]))


def test_to_date_year_quarter_and_fiscal_year() -> None:
    # March 2026: year to date 16+32+64 = 112; the fiscal year from 2025-07-01: 8+112 = 120;
    # quarter to date 112. March 2025: 1+2+4 = 7 for all three (fiscal year from 2024-07-01).
    rows = by_month("ytd", "fytd", "qtd")
    assert rows[("2026-03",)] == (112, 120, 112)
    assert rows[("2025-03",)] == (7, 7, 7)


def test_shift_moves_days_and_clamps_month_ends() -> None:
    # March 2026 a year back: March 2025 = 4. March 2026 a month back: 1-28 Feb, and 29-31 March
    # clamp to 28 Feb: 32. February 2025 a month on: 1-28 March 2025, no sale (the sale is on
    # the 31st): null. March 2025 a year back is outside the calendar: null.
    rows = by_month("last_year", "prev_month", "next_month")
    assert rows[("2026-03",)] == (4, 32, None)
    assert rows[("2025-02",)] == (None, 1, None)
    assert rows[("2025-03",)] == (None, 2, None)


def test_trailing_windows() -> None:
    # March 2026, last day 31 March: 28 days = 4-31 March: 64; 3 months = after 31 Dec: 112.
    rows = by_month("t28", "t3m")
    assert rows[("2026-03",)] == (64, 112)


def test_time_windows_on_one_day_clamp_month_ends() -> None:
    # On 31 March 2025: a month back is 28 February 2025 (2); the trailing month is the days
    # after 28 February up to 31 March: 4.
    model, data = SHOP
    result = run(
        model, data, TIME_MEASURES, ["prev_month", "t1m"], where=['calendar.day = date "2025-03-31"']
    )
    assert result.rows == [(2, 4)]


def test_time_modifiers_compose_left_to_right() -> None:
    # March 2026 a year back is March 2025; its year to date is 1+2+4 = 7.
    assert by_month("ly_ytd")[("2026-03",)] == (7,)


def test_clear_table_but_keeps_the_named_columns() -> None:
    # By year and month, clearing the calendar but the year gives the year's total on each month:
    # 2025: 1+2+4+8 = 15, 2026: 112.
    model, data = SHOP
    result = run(model, data, TIME_MEASURES, ["year_total"], by=["calendar.year", "calendar.month"])
    got = as_dict(result)
    assert got[(2025, "2025-02")] == (15,)
    assert got[(2026, "2026-03")] == (112,)
    # 15 months in the calendar, each shown.
    assert len(got) == 15
