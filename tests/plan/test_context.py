"""Context revision while compiling (LANGUAGE.md section 3, modifiers after given): replace,
narrow, clear, clear but. Filters here are written by hand; the values are frame columns."""

from __future__ import annotations

from measureport.plan.context import CondFilter, Context, EqFilter, TableCol
from measureport.plan.scalar import Col, Compare, Const

NAME = EqFilter("stops", "name", Col("grid_name_1"))
ZONE = EqFilter("stops", "zone", Col("grid_zone_2"))
YEAR = CondFilter("days", frozenset({"year"}), Compare("=", TableCol("days", "year"), Const(2025, "number")))
BOTH = CondFilter(
    "stops",
    frozenset({"name", "zone"}),
    Compare("=", TableCol("stops", "name"), TableCol("stops", "zone")),
)


def test_equal_filter_sets_are_equal_contexts_whatever_the_order() -> None:
    assert Context.of([NAME, ZONE, YEAR]) == Context.of([YEAR, ZONE, NAME])
    assert hash(Context.of([NAME, YEAR])) == hash(Context.of([YEAR, NAME]))


def test_a_condition_replaces_the_filters_on_the_columns_it_names() -> None:
    a_name = CondFilter(
        "stops", frozenset({"name"}), Compare("=", TableCol("stops", "name"), Const("A", "text"))
    )
    revised = Context.of([NAME, ZONE, YEAR]).replace(a_name)
    assert set(revised.filters) == {a_name, ZONE, YEAR}


def test_replacing_one_column_removes_a_filter_that_names_it_with_others() -> None:
    # BOTH names stops.name and stops.zone: replacing stops.zone removes it entirely.
    revised = Context.of([BOTH, YEAR]).replace(ZONE)
    assert set(revised.filters) == {ZONE, YEAR}


def test_narrow_adds_without_removing() -> None:
    revised = Context.of([NAME]).add(BOTH)
    assert set(revised.filters) == {NAME, BOTH}


def test_clear_a_column_or_a_table() -> None:
    ctx = Context.of([NAME, ZONE, YEAR])
    assert set(ctx.without_columns("stops", ["name"]).filters) == {ZONE, YEAR}
    assert set(ctx.clear_table("stops").filters) == {YEAR}


def test_clear_but_keeps_filters_naming_only_kept_columns() -> None:
    # Keeping stops.zone keeps ZONE, but not BOTH, which also names stops.name.
    ctx = Context.of([NAME, ZONE, BOTH, YEAR])
    assert set(ctx.clear_table("stops", ["zone"]).filters) == {ZONE, YEAR}


def test_restricted_reads_the_static_context() -> None:
    ctx = Context.of([BOTH])
    assert ctx.restricts("stops", "name") and ctx.restricts("stops", "zone")
    assert not ctx.restricts("days", "year")
