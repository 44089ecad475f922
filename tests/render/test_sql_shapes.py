"""Golden shapes of the SQL for each lowering strategy, read back with sqlglot and checked as
trees (never compared as text). Invented data: the tram network of tests/differential/tram.py.
"""

from __future__ import annotations

from collections.abc import Iterator

import pytest
import sqlglot
from sqlglot import exp

from differential.harness import Differential
from differential.tram import tram_differential

MEASURES = """
measure riders = sum(boardings.riders)
measure boardings_n = count(boardings)
measure faults = sum(inspections.faults)
measure line_share = riders / (riders given clear stops)
measure mean_ratio = mean(boardings.riders) / (mean(boardings.riders) given clear stops)
measure zone_a_share = riders / (riders given clear stops, stops.zone = "A")
measure ytd = riders given to_date(days.day, year)
measure last_year = riders given shift(days.day, -1, year)
measure per_stop = mean(riders for each stops)
measure doubled = sum(boardings.riders * 2 for each boardings)
measure stop_rank = rank(riders over stops.name)
measure nested_minus = riders - (boardings_n - faults)
measure busiest_day = max(riders for each days.day)
measure riders_or_zero = coalesce(riders, 0)
measure zone_a_boardings = boardings_n given narrow stops.zone = "A"
measure zone_a_or_zero = coalesce(boardings_n given narrow stops.zone = "A", 0)
measure zone_b_or_zero = coalesce(boardings_n given narrow stops.zone = "B", 0)
measure big_boardings = riders given narrow boardings.riders > 5, narrow stops.zone = "A"
measure stop_weighted =
  sum(boardings.riders * (riders given clear boardings but boardings.stop_id) for each boardings)
"""


@pytest.fixture(scope="module")
def tram() -> Iterator[Differential]:
    yield from tram_differential(MEASURES)


def parsed(
    tram: Differential,
    measures: list[str],
    by: list[str],
    totals: bool = False,
    where: list[str] | None = None,
) -> exp.Select:
    """The statement for the query, parsed back from its DuckDB text (and checked against the
    reference on the way, so every shape below is also a right answer)."""
    tram.check(measures, by, where or [], totals=totals)
    sql = tram.engine.compile(tram.query(measures, by, where or [], totals=totals)).sql
    statements = sqlglot.parse(sql, read="duckdb")
    assert len(statements) == 1
    tree = statements[0]
    assert isinstance(tree, exp.Select)
    return tree


def is_partial(select: exp.Select, table: str) -> bool:
    """An eager pre-aggregation: ``table`` grouped by the keys it points with (the subquery or
    common table the plan names after that step)."""
    parent = select.parent
    alias = parent.alias if isinstance(parent, exp.Subquery | exp.CTE) else ""
    return (
        bool(select.args.get("group"))
        and _reads_directly(select, table)
        and alias.startswith(f"{table}_by_the_keys_it_points_with")
    )


def _reads_directly(select: exp.Select, table: str) -> bool:
    sources = [select.args.get("from_"), *list(select.args.get("joins") or [])]
    return any(isinstance(s.this, exp.Table) and s.this.name == table for s in sources if s is not None)


def _source_select(source: exp.Expression, ctes: dict[str, exp.Expression]) -> exp.Expression | None:
    if isinstance(source, exp.Subquery):
        return source.this
    if isinstance(source, exp.Table):
        return ctes.get(source.name)
    return None


def reads(select: exp.Select, table: str, ctes: dict[str, exp.Expression] | None = None) -> bool:
    """Whether ``select`` reads ``table`` in its own FROM or JOINs, directly or as partial rows."""
    if _reads_directly(select, table):
        return True
    sources = [select.args.get("from_"), *list(select.args.get("joins") or [])]
    for s in sources:
        inner = _source_select(s.this, ctes or {}) if s is not None else None
        if isinstance(inner, exp.Select) and is_partial(inner, table):
            return True
    return False


def grouped_selects(tree: exp.Expression, table: str) -> list[exp.Select]:
    """The aggregates over ``table`` (an eager pre-aggregation counts as part of its aggregate)."""
    with_ = tree.args.get("with_")
    ctes = {cte.alias: cte.this for cte in with_.expressions} if with_ is not None else {}
    return [
        s
        for s in tree.find_all(exp.Select)
        if s.args.get("group") and reads(s, table, ctes) and not is_partial(s, table)
    ]


def group_width(select: exp.Select) -> int:
    return len(select.args["group"].expressions)


def test_plain_aggregate_is_grouped_by_the_grid_column_and_its_groups_are_the_rows(
    tram: Differential,
) -> None:
    # The riders are null in any cell without boardings, so the aggregate's groups are the
    # result rows: no grid of the members (no DISTINCT over stops, no join back).
    tree = parsed(tram, ["riders"], ["stops.name"])
    (aggregate,) = grouped_selects(tree, "boardings")
    assert group_width(aggregate) == 1
    assert any(isinstance(n, exp.Sum) for n in aggregate.find_all(exp.Sum))
    assert tree.find(exp.NullSafeEQ) is None
    assert not any(s.args.get("distinct") for s in tree.find_all(exp.Select))
    assert tree.args.get("order") is not None


def test_a_value_without_rows_is_joined_to_the_grid_null_safe(tram: Differential) -> None:
    # coalesce(riders, 0) is 0 at stops without boardings (Quarry): the grid of the stops (with
    # the empty member) is built and joined to the aggregate with IS NOT DISTINCT FROM.
    tree = parsed(tram, ["riders_or_zero"], ["stops.name"])
    (aggregate,) = grouped_selects(tree, "boardings")
    assert group_width(aggregate) == 1
    assert tree.find(exp.NullSafeEQ) is not None
    assert any(s.args.get("distinct") for s in tree.find_all(exp.Select))
    rows = tram.check(["riders_or_zero"], ["stops.name"]).rows
    # Quarry has no boardings: 0, not dropped.
    assert ("Quarry", 0) in rows


def test_clear_on_a_grid_column_of_a_sum_is_a_window_over_the_grid(tram: Differential) -> None:
    # The sum over the line is the sum of the grid's own per-stop sums over the grid rows of that
    # line: one aggregate over boardings, then SUM(...) OVER (PARTITION BY the line).
    tree = parsed(tram, ["line_share"], ["lines.name", "stops.name"])
    assert [group_width(s) for s in grouped_selects(tree, "boardings")] == [2]
    window = tree.find(exp.Window)
    assert window is not None and isinstance(window.this, exp.Sum)
    assert len(window.args["partition_by"]) == 1


def test_clear_on_a_grid_column_of_a_mean_is_a_join_back_at_the_coarser_grain(tram: Differential) -> None:
    # A mean of means is not the mean: the coarse value is its own aggregate, grouped by the
    # line only, and joined back to the grid on it.
    tree = parsed(tram, ["mean_ratio"], ["lines.name", "stops.name"])
    widths = sorted(group_width(s) for s in grouped_selects(tree, "boardings"))
    assert widths == [1, 2]
    assert tree.find(exp.Window) is None


def test_a_condition_after_clear_is_its_own_aggregate(tram: Differential) -> None:
    # Not the grid's rows minus a grid column (a zone condition is added): no window.
    tree = parsed(tram, ["zone_a_share"], ["lines.name", "stops.name"])
    assert sorted(group_width(s) for s in grouped_selects(tree, "boardings")) == [1, 2]


def test_division_is_true_division_with_a_null_for_a_zero_divisor(tram: Differential) -> None:
    tree = parsed(tram, ["line_share"], ["stops.name"])
    division = tree.find(exp.Div)
    assert division is not None
    assert isinstance(division.this, exp.Cast) and division.this.to.this == exp.DataType.Type.DOUBLE
    assert isinstance(division.expression, exp.Nullif)


def test_a_fact_is_pre_aggregated_by_the_keys_it_points_with(tram: Differential) -> None:
    # Boardings are grouped by stop_id alone (no join), then the partial rows are joined to stops
    # and lines and summed per line.
    tree = parsed(tram, ["riders"], ["lines.name"])
    partial = [s for s in tree.find_all(exp.Select) if is_partial(s, "boardings")]
    assert len(partial) == 1
    assert [c.name for c in partial[0].args["group"].expressions] == ["stop_id"]
    assert not partial[0].args.get("joins")
    (final,) = grouped_selects(tree, "boardings")
    assert final.find(exp.Sum) is not None


def test_measures_over_the_same_rows_share_one_aggregate(tram: Differential) -> None:
    tree = parsed(tram, ["riders", "boardings_n"], ["stops.zone"])
    (aggregate,) = grouped_selects(tree, "boardings")
    assert aggregate.find(exp.Sum) is not None and aggregate.find(exp.Count) is not None


def test_a_year_to_date_is_a_range_join_on_per_row_parameters(tram: Differential) -> None:
    tree = parsed(tram, ["ytd"], ["days.month"])
    (aggregate,) = grouped_selects(tree, "boardings")
    joins = aggregate.args.get("joins") or []
    conditions = [j.args.get("on") for j in joins if j.args.get("on") is not None]
    # The days join distinct (start, last day) parameters on day >= start and day <= last.
    assert any(c.find(exp.GTE) is not None and c.find(exp.LTE) is not None for c in conditions)
    assert any(s.args.get("distinct") for s in aggregate.find_all(exp.Select))
    # Boardings are summed per day once (no join), and only those daily rows meet the ranges.
    (partial,) = [s for s in tree.find_all(exp.Select) if is_partial(s, "boardings")]
    assert [c.name for c in partial.args["group"].expressions] == ["day"]
    assert not partial.args.get("joins")


def test_windows_of_days_over_the_same_rows_share_one_daily_aggregate(tram: Differential) -> None:
    # A year to date and the same months a year before read one partial aggregate of boardings
    # (a common table expression): one scan of the fact table.
    tram.check(["ytd", "last_year", "riders"], ["days.month"])
    compiled = tram.engine.compile(tram.query(["ytd", "last_year", "riders"], ["days.month"]))
    assert compiled.scans["boardings"] == 1


def test_a_shift_joins_the_moved_days_as_a_set(tram: Differential) -> None:
    tree = parsed(tram, ["last_year"], ["days.month"])
    moved = [s for s in tree.find_all(exp.Select) if s.args.get("distinct") and s.find(exp.DateFromParts)]
    assert moved, "the shifted days are a distinct set built with MAKE_DATE"


def test_for_each_with_binding_is_a_nested_aggregation_weighted_by_row_counts(tram: Differential) -> None:
    tree = parsed(tram, ["per_stop"], ["stops.zone"])
    # Stops grouped by their key with a row count, and the outer mean weights by it.
    stop_groups = grouped_selects(tree, "stops")
    assert any(isinstance(c.this, exp.Star) for s in stop_groups for c in s.find_all(exp.Count))
    weighted = [
        m
        for m in tree.find_all(exp.Mul)
        if isinstance(m.parent, exp.Sum) and any(c.name == "w" for c in m.find_all(exp.Column))
    ]
    assert weighted, "SUM(value * w): each value counts as many times as its identical rows"


def test_a_row_expression_iteration_is_one_aggregate_of_the_expression(tram: Differential) -> None:
    # One aggregate over boardings (here pre-aggregated by stop: SUM(riders * 2) per stop_id).
    tree = parsed(tram, ["doubled"], ["stops.name"])
    assert len(grouped_selects(tree, "boardings")) == 1
    sums = [m for m in tree.find_all(exp.Sum) if m.find(exp.Mul) is not None]
    assert any(c.name == "riders" for m in sums for c in m.find_all(exp.Column))


def test_rank_is_a_dense_rank_window_partitioned_by_the_rest_of_the_grid(tram: Differential) -> None:
    tree = parsed(tram, ["stop_rank"], ["lines.name", "stops.name"])
    window = tree.find(exp.Window)
    assert window is not None and isinstance(window.this, exp.DenseRank)
    assert window.args.get("partition_by"), "partitioned by the grid columns other than stops.name"
    (ordered,) = window.args["order"].expressions
    assert ordered.args.get("desc") is True


def _union_parts(union: exp.Expression) -> list[exp.Expression]:
    if isinstance(union, exp.Union):
        return _union_parts(union.this) + _union_parts(union.expression)
    return [union]


def test_totals_are_levels_re_evaluated_and_unioned(tram: Differential) -> None:
    tree = parsed(tram, ["riders"], ["lines.name", "stops.name"], totals=True)
    levels = [
        u
        for u in tree.find_all(exp.Union)
        if not isinstance(u.parent, exp.Union)
        and any(p.alias_or_name == "__level" for p in _union_parts(u)[0].expressions)
    ]
    (union,) = levels
    assert union.args.get("distinct") is False  # UNION ALL
    assert len(_union_parts(union)) == 3  # by two columns, by one, by none
    widths = sorted(group_width(s) for s in grouped_selects(tree, "boardings"))
    assert widths == [1, 2]  # the grand total's aggregate has no GROUP BY


def test_a_sub_plan_used_twice_is_one_common_table_expression(tram: Differential) -> None:
    tree = parsed(tram, ["ytd"], ["days.month"])
    with_ = tree.args.get("with_")
    assert with_ is not None
    names = [cte.alias for cte in with_.expressions]
    used = [t.name for t in tree.find_all(exp.Table)]
    assert any(used.count(name) >= 2 for name in names)


def test_nested_subtraction_keeps_its_parentheses(tram: Differential) -> None:
    # riders - (boardings_n - faults) must not become riders - boardings_n - faults.
    tree = parsed(tram, ["nested_minus"], ["stops.zone"])
    outer = [s for s in tree.find_all(exp.Sub) if isinstance(s.expression, exp.Paren)]
    assert outer and isinstance(outer[0].expression.this, exp.Sub)


def test_every_identifier_is_quoted(tram: Differential) -> None:
    tree = parsed(tram, ["line_share", "ytd", "per_stop"], ["stops.name"])
    identifiers = list(tree.find_all(exp.Identifier))
    assert identifiers and all(i.args.get("quoted") for i in identifiers)


def test_empty_members_are_told_from_the_iteration_aggregate_over_every_row(tram: Differential) -> None:
    # The busiest day's riders per line: the boardings are aggregated by day and line over every
    # row, and that aggregate also counts the rows whose stop or day finds no row; the grid's
    # empty line and the iterated days' empty member are told from those counts, so the
    # statement reads boardings once (not once more per existence test).
    result = tram.check(["busiest_day"], ["lines.name"])
    # Red: 14 on 2024-02-02 (the twins); Blue: 4; the empty line: 6 on 2025-03-01.
    assert result.rows == [("Blue", 4), ("Red", 14), (None, 6)]
    assert tram.engine.compile(tram.query(["busiest_day"], ["lines.name"])).scans["boardings"] == 1


def test_a_filter_on_the_pointed_dimension_narrows_the_rows_before_the_pre_aggregation(
    tram: Differential,
) -> None:
    # Zone A's riders by line: boardings are joined to the keys of the zone A stops (an inner
    # join: the empty member never passes a zone test) before they are grouped by stop_id.
    # Red: Harbour 18; Blue: Depot 4.
    tree = parsed(tram, ["riders"], ["lines.name"], where=['stops.zone = "A"'])
    (partial,) = [s for s in tree.find_all(exp.Select) if is_partial(s, "boardings")]
    joins = partial.args.get("joins") or []
    assert len(joins) == 1 and joins[0].args.get("kind") == "INNER"
    assert tram.check(["riders"], ["lines.name"], ['stops.zone = "A"']).rows == [("Blue", 4), ("Red", 18)]


def test_a_table_iteration_groups_its_rows_by_the_columns_its_body_reads(tram: Differential) -> None:
    # Each boarding's riders times its stop's riders (the rest of the row cleared): the rows are
    # grouped by riders and stop_id alone. Stop 1: 18 * 18; stop 2: 22 * 22; stop 3: 4 * 4;
    # the unknown stop 9: 6 * 6; the null stop: 2 * 2; 324 + 484 + 16 + 36 + 4 = 864.
    tree = parsed(tram, ["stop_weighted"], [])
    weighted = [s for s in tree.find_all(exp.Select) if any(e.alias == "w" for e in s.expressions)]
    assert [group_width(s) for s in weighted] == [2]
    assert tram.check(["stop_weighted"]).rows == [(864,)]


def test_a_narrowed_aggregate_is_computed_in_the_wider_ones_scan(tram: Differential) -> None:
    # Boardings per line, and those at zone A stops: one aggregate, the narrowed count over the
    # rows passing the zone test only, null (not 0) where none passes. Blue: 1 of 1 (Depot);
    # Red: 6, 3 at Harbour; the empty line (Quarry, zone C, and the unknown stops): 2, none.
    result = tram.check(["boardings_n", "zone_a_boardings"], ["lines.name"])
    assert result.rows == [("Blue", 1, 1), ("Red", 6, 3), (None, 2, None)]
    compiled = tram.engine.compile(tram.query(["boardings_n", "zone_a_boardings"], ["lines.name"]))
    assert compiled.scans["boardings"] == 1


def test_narrowings_of_narrowings_share_the_scan_and_agree(tram: Differential) -> None:
    # Riders of boardings over 5 at zone A stops, beside the zone A count: the rows over 5 are
    # the zone A rows narrowed once more, so both come from the zone A aggregate.
    # Red: Harbour's 10; Blue: Depot's 4 is not over 5 (null); the empty line has no zone A.
    measures = ["zone_a_boardings", "big_boardings"]
    result = tram.check(measures, ["lines.name"])
    assert result.rows == [("Blue", 1, None), ("Red", 3, 10)]
    assert tram.engine.compile(tram.query(measures, ["lines.name"])).scans["boardings"] == 1
    for where in ([], ["days.year = 2025"]):
        for more in ([], ["riders"]):
            tram.check([*measures, *more], ["stops.name"], where)
            tram.check([*measures, *more], [], where)
            tram.check([*measures, *more], ["stops.zone", "stops.name"], where, totals=True)


def test_two_narrowings_of_one_row_set_share_a_scan_that_is_also_the_grid(tram: Differential) -> None:
    # Zone A and zone B boardings by fare, zero where none: both are narrowings of the
    # boardings by fare, computed in that one aggregate; fare is a column of the fact, which
    # has no empty member, so that aggregate's groups are the grid's rows too (no scan of the
    # fares apart). Fare 1.0: the unknown stops (no zone); 2.0: Harbour (A) in 2024; 2.5:
    # Harbour twice; 3.0: Market (B) three times; null fare: Depot (A).
    measures = ["zone_a_or_zero", "zone_b_or_zero"]
    result = tram.check(measures, ["boardings.fare"])
    assert result.rows == [(1.0, 0, 0), (2.0, 1, 0), (2.5, 2, 0), (3.0, 0, 3), (None, 1, 0)]
    assert tram.engine.compile(tram.query(measures, ["boardings.fare"])).scans["boardings"] == 1
    tram.check(measures, ["boardings.fare"], ["days.year = 2025"])
    tram.check(measures, ["boardings.fare", "stops.zone"], ["days.year = 2025"], totals=True)


def test_no_pre_aggregation_by_a_key_the_grid_groups_by_anyway(tram: Differential) -> None:
    # By the stops' key, the partial rows by stop_id would be the groups themselves: the plain
    # join and one aggregate. Stop 1: 10 + 5 + 3; stop 2: 8 + 7 + 7; stop 3: 4; Quarry none;
    # the empty member: the unknown stop 9 and the null stop, 6 + 2.
    tree = parsed(tram, ["riders"], ["stops.stop_id"])
    assert not [s for s in tree.find_all(exp.Select) if is_partial(s, "boardings")]
    assert tram.check(["riders"], ["stops.stop_id"]).rows == [(1, 18), (2, 22), (3, 4), (None, 8)]
