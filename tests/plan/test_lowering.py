"""Lowering decisions, checked on the plan itself: fusion, hoisting of bare aggregates out of
``for each``, the printed tree, the explanation, and the error for what cannot be lowered.
Invented data: the tram network of tests/differential/tram.py."""

from __future__ import annotations

from collections.abc import Iterator

import pytest

from differential.harness import Differential
from differential.tram import tram_differential
from measureport.compile import compile_query
from measureport.errors import MeasureportError, Span
from measureport.language import ast
from measureport.plan.nodes import Aggregate, walk
from measureport.plan.printing import format_plan
from measureport.plan.query_plan import plan_query
from measureport.query import Query
from measureport.semantics.bound import BoundMeasure, BoundModel

MEASURES = """
measure riders = sum(boardings.riders)
measure boardings_n = count(boardings)
measure mean_riders = mean(boardings.riders)
measure line_share = riders / (riders given clear stops)
measure mean_ratio = mean_riders / (mean_riders given clear stops)
measure biggest_stop = max(sum(boardings.riders) for each stops)
measure per_stop = mean(riders for each stops)
measure picked = restricted(stops.name)
measure all_riders = riders given clear stops
measure ytd = riders given to_date(days.day, year)
"""


@pytest.fixture(scope="module")
def tram() -> Iterator[Differential]:
    yield from tram_differential(MEASURES)


def test_measures_reading_the_same_rows_in_the_same_context_are_fused(tram: Differential) -> None:
    plan = plan_query(tram.bound, tram.query(["riders", "boardings_n", "mean_riders"], ["stops.zone"]))
    (step,) = plan.strategies_for("riders")
    assert step.shared_with() == ["riders", "boardings_n", "mean_riders"]
    aggregates = [
        n for n in walk(plan.root) if isinstance(n, Aggregate) and n.label == "aggregate of boardings"
    ]
    assert len(aggregates) == 1
    assert [name for name, _ in aggregates[0].values if name.startswith("v")] == ["v0", "v1", "v2"]


def test_the_empty_member_is_found_from_an_aggregate_of_every_row(tram: Differential) -> None:
    # all_riders ignores the stop (not null at the null member's cell), so the grid must know
    # whether the empty member of stops exists. riders reads every boarding, joined to stops:
    # rows without a stop are counted there (o0), and the grid asks that aggregate, not a scan.
    compiled = compile_query(tram.bound, tram.query(["riders", "all_riders"], ["stops.zone"]))
    assert compiled.scans["boardings"] == 1
    assert '"o0" > 0' in compiled.run_sql()  # the grid reads the counted rows
    tram.check(["riders", "all_riders"], ["stops.zone"])


def test_no_existence_test_where_every_measure_is_null_without_a_row(tram: Differential) -> None:
    # riders is null at a zone cell that no stop and no empty member fills, so the grid holds
    # the null zone without asking, and the row is dropped whenever it should not be there.
    compiled = compile_query(tram.bound, tram.query(["riders", "ytd"], ["stops.zone"]))
    sql = compiled.run_sql()
    assert "EXISTS" not in sql and 'AS "o0"' not in sql
    assert "holds the empty member of stops without testing that it exists" in compiled.explain()
    tram.check(["riders", "ytd"], ["stops.zone"])


def test_a_bare_aggregate_inside_for_each_is_computed_once_per_grid_row(tram: Differential) -> None:
    # sum(boardings.riders) does not see the current stop (rule 1): it belongs to the grid row,
    # and the iteration reads nothing of its row, so it is a plain aggregate, not a nested one.
    plan = plan_query(tram.bound, tram.query(["biggest_stop"], ["lines.name"]))
    words = [s.words for s in plan.strategies]
    assert not any("nested aggregation" in w for w in words)
    tram.check(["biggest_stop"], ["lines.name"])


def test_a_bound_measure_inside_for_each_is_a_nested_aggregation(tram: Differential) -> None:
    plan = plan_query(tram.bound, tram.query(["per_stop"], ["lines.name"]))
    assert any("nested aggregation" in s.words for s in plan.strategies)


def test_restricted_is_known_when_compiling(tram: Differential) -> None:
    # Detail rows filter stops.name (true); the grand total does not (false).
    result = tram.check(["picked"], ["stops.name"], totals=True)
    assert [row[1] for row in result.rows] == [True] * (len(result.rows) - 1) + [False]


def test_the_plan_prints_as_an_indented_tree_with_shared_nodes_once(tram: Differential) -> None:
    plan = plan_query(tram.bound, tram.query(["ytd"], ["days.month"]))
    text = format_plan(plan.root)
    lines = text.splitlines()
    assert lines[0].startswith("#1 Result: days.month, ytd")
    assert any(line.startswith("  #2 ") for line in lines)
    assert any("shown above" in line for line in lines)


def test_explain_names_each_measure_and_how_its_parts_became_sql(tram: Differential) -> None:
    query = tram.query(["riders", "line_share", "mean_ratio", "ytd"], ["lines.name", "stops.name"])
    compiled = compile_query(tram.bound, query)
    text = compiled.explain()
    assert "measure line_share = riders / (riders given clear stops)" in text
    assert "fused with" in text
    assert "correlated predicate" in text
    assert "window: the sum of the grid's own aggregate" in text  # clear stops on a sum
    assert "a coarser grain than the grid" in text  # ... and on a mean: a join-back
    assert "eager aggregation" in text
    assert "plan of this measure alone:" in text
    assert "tables read by the statement: " in text and "plan of the query:" in text


def test_what_cannot_be_lowered_exactly_is_an_error_naming_the_measure_and_place(tram: Differential) -> None:
    # A hand-built tree the binder would refuse: an aggregate of an expression without for each.
    span = Span("shop.measures", 3, 18, 3, 40)
    bad = ast.Aggregate(
        "sum",
        ast.Binary("+", ast.ColumnRef("boardings", "riders"), ast.Number(1)),
        span=span,
    )
    bound = BoundModel(
        tram.bound.model,
        {"odd": BoundMeasure("odd", bad, "number", ())},
    )
    with pytest.raises(MeasureportError) as caught:
        compile_query(bound, Query(("odd",)))
    assert caught.value.span == span
    assert "measure odd" in caught.value.message
    assert "an aggregate of an expression without for each" in caught.value.message
