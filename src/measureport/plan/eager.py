"""Eager aggregation: aggregate a table's rows by the keys it points with, then join the few
partial rows to the dimensions and combine the partials.

``sum(rides.fare)`` by a district is the sum over the rides' stations of each station's sum: the
rides are grouped by ``station_id`` (no join), the partial rows joined to stations and districts
(left joins, so that orphan keys still reach the empty member), then summed per district. The
dimensions' columns depend only on the keys, so every filter and grouping column on them means
the same on a partial row as on each ride it stands for.

It is exact for aggregates that combine: a count or sum is the sum of the partial counts or
sums, a minimum the minimum of the partial minima, a mean the summed sums over the summed counts.
An aggregate of a dimension's column weighs its value by the number of rows behind the partial
row (``distinct`` needs no weight). ``distinct`` of the table's own column does not combine, so
such a row set is aggregated as usual.
"""

from __future__ import annotations

from collections.abc import Callable, Sequence
from dataclasses import dataclass

from measureport.model.graph import reachable
from measureport.model.schema import Model
from measureport.plan.context import CondFilter, EqFilter, Filter, ShiftFilter, TableCol, table_columns
from measureport.plan.frames import RowSet
from measureport.plan.nodes import Aggregate, Join, PlanNode, Project, Scan
from measureport.plan.nodes import Filter as FilterNode
from measureport.plan.predicates import rejects_nulls
from measureport.plan.scalar import (
    AggCall,
    Arith,
    Case,
    Col,
    Compare,
    Const,
    IsNullTest,
    Scalar,
    columns_used,
    conjunction,
    transform,
)

ROWS = "n"  # the partial rows' row count


@dataclass
class EagerParts:
    """A pre-aggregated table: ``node`` holds one partial row per combination of the table's
    ``group`` columns (canonical names), with the partial values; ``finals`` are the request
    values over the joined partial rows."""

    node: PlanNode
    group: list[TableCol]
    finals: list[Scalar]
    narrowed_by: str | None = None  # the dimension whose passing keys the rows were joined to


def eager_parts(
    model: Model,
    rows: RowSet,
    values: Sequence[Scalar],
    canonical: Callable[[str, str], str],
    scan: Callable[[str, list[str]], Scan],
    local: Callable[[Filter, dict[TableCol, str]], Scalar],
    correlated: bool = False,
) -> EagerParts | None:
    """The eager form of ``values`` (over ``TableCol``s and aggregate calls) for ``rows``, or
    None where it would not be exact or would likely gain nothing. With ``correlated``, filters
    on a dimension that read frame values (day ranges, shifted days, values from outside) are
    allowed: they test only the dimension's columns, which a partial row has as the rows it
    stands for, so the caller may apply them to the joined partial rows."""
    table = rows.table
    if rows.where is not None or rows.distinct is not None or rows.with_empty:
        return None
    for f in rows.filters:
        dynamic = isinstance(f, ShiftFilter) or (f.frame_columns() and not isinstance(f, EqFilter))
        if dynamic and (not correlated or f.table == table):
            return None
    if any(columns_used(v) for v in values):
        return None  # values carrying frame columns join parameters: not here
    own_filters = [f for f in rows.filters if f.table == table]
    dims_read = {tc.table for v in values for tc in table_columns(v) if tc.table != table}
    dims_read |= {f.table for f in rows.filters if f.table != table}
    if not dims_read:
        return None  # nothing is joined: the plain aggregate is already one pass
    partials: dict[AggCall, str] = {}

    def partial(call: AggCall) -> str:
        if call not in partials:
            partials[call] = f"q{len(partials)}"
        return partials[call]

    finals: list[Scalar] = []
    for value in values:
        final = _combine(value, table, partial)
        if final is None:
            return None
        finals.append(final)
    # Group by the keys that lead to the dimensions read, and the table's own grouping columns.
    paths = reachable(model, table)
    group = sorted(
        {TableCol(table, paths[d][0].many_column) for d in dims_read}
        | {TableCol(f.table, f.column) for f in own_filters if isinstance(f, EqFilter) and f.frame_columns()},
        key=str,
    )
    if len(group) != 1:
        # Partial rows by two keys or more may be nearly as many as the rows: joining first is
        # then the cheaper plan.
        return None
    (key,) = group
    pointed = next((r for r in model.relationships_from(table) if r.many_column == key.column), None)
    if pointed is not None and _grouped_by_key(rows, pointed.one_table, pointed.one_column):
        return None  # grouped by the pointed dimension's key anyway: the partial rows would be the groups
    read = {tc.column for tc in group}
    for call in partials:
        read |= {tc.column for tc in table_columns(call)}
    static_own = [f for f in own_filters if not f.frame_columns()]
    for f in static_own:
        read |= {tc.column for tc in _filter_columns(f)}
    source: PlanNode = scan(table, sorted(read))
    columns = {TableCol(table, c): canonical(table, c) for c in read}
    predicate = conjunction([local(f, columns) for f in static_own])
    if predicate is not None:
        source = FilterNode(source, predicate)
    narrowed = _narrow_by_dimension(model, rows, key, columns, canonical, scan, local)
    if narrowed is not None:
        source = Join(source, narrowed[0], "inner", narrowed[1])
    keys = tuple((columns[tc], Col(columns[tc])) for tc in group)
    values_out: list[tuple[str, Scalar]] = [(ROWS, AggCall("count_rows"))]
    for call, name in partials.items():
        assert call.argument is not None
        argument = transform(call.argument, lambda n: Col(columns[n]) if isinstance(n, TableCol) else None)
        values_out.append((name, AggCall(call.func, argument)))
    node = Aggregate(source, keys, tuple(values_out), label=f"{table} by the keys it points with")
    return EagerParts(node, group, finals, narrowed[2] if narrowed is not None else None)


def _grouped_by_key(rows: RowSet, dim: str, key: str) -> bool:
    """Whether the row set is grouped by the key of ``dim`` (a cell's or a bound row's value)."""
    return any(
        isinstance(f, EqFilter) and f.frame_columns() and (f.table, f.column) == (dim, key)
        for f in rows.filters
    )


def _narrow_by_dimension(
    model: Model,
    rows: RowSet,
    key: TableCol,
    columns: dict[TableCol, str],
    canonical: Callable[[str, str], str],
    scan: Callable[[str, list[str]], Scan],
    local: Callable[[Filter, dict[TableCol, str]], Scalar],
) -> tuple[PlanNode, Scalar, str] | None:
    """The keys of the dimension that ``key`` points at whose rows pass the row set's fixed
    filters on it, to join the rows to before grouping them (so a selective filter on a
    dimension narrows the rows first), with the join condition and the dimension's name.

    Exact for filters that never keep an empty member: a row whose key finds no row fails them
    anyway, and the key is unique on the dimension, so the join keeps each passing row once."""
    relationship = next(
        (r for r in model.relationships_from(rows.table) if r.many_column == key.column), None
    )
    if relationship is None:
        return None
    dim = relationship.one_table
    chosen = [
        f
        for f in rows.filters
        if f.table == dim
        and isinstance(f, CondFilter)
        and not f.frame_columns()
        and rejects_nulls(f.predicate)
    ]
    if not chosen:
        return None
    read = {relationship.one_column} | {tc.column for f in chosen for tc in table_columns(f.predicate)}
    dim_columns = {TableCol(dim, c): canonical(dim, c) for c in read}
    dim_key = dim_columns[TableCol(dim, relationship.one_column)]
    predicate = conjunction([local(f, dim_columns) for f in chosen])
    assert predicate is not None
    passing = Project(FilterNode(scan(dim, sorted(read)), predicate), ((dim_key, Col(dim_key)),))
    return passing, Compare("=", Col(columns[key]), Col(dim_key)), dim


def _filter_columns(f: Filter) -> set[TableCol]:
    if isinstance(f, EqFilter):
        return {TableCol(f.table, f.column)}
    predicate = getattr(f, "predicate", None)
    return table_columns(predicate) if predicate is not None else set()


def _combine(value: Scalar, table: str, partial: Callable[[AggCall], str]) -> Scalar | None:
    """``value`` over the joined partial rows, or None when an aggregate in it does not combine."""
    failed = False

    def swap(node: Scalar) -> Scalar | None:
        nonlocal failed
        if not isinstance(node, AggCall):
            return None
        combined = _combine_call(node, table, partial)
        if combined is None:
            failed = True
            return node
        return combined

    combined = transform(value, swap)
    return None if failed else combined


def _combine_call(call: AggCall, table: str, partial: Callable[[AggCall], str]) -> Scalar | None:
    rows = Col(ROWS)
    if call.func == "count_rows":
        return AggCall("sum", rows)
    argument = call.argument
    assert argument is not None
    tables = {tc.table for tc in table_columns(argument)}
    if tables == {table}:
        if call.func in ("sum", "count"):
            return AggCall("sum", Col(partial(call)))
        if call.func in ("min", "max"):
            return AggCall(call.func, Col(partial(call)))
        if call.func == "mean":
            total = Col(partial(AggCall("sum", argument)))
            counted = Col(partial(AggCall("count", argument)))
            return Arith("/", AggCall("sum", total), AggCall("sum", counted))
        return None  # distinct of the table's own column does not combine
    if table in tables:
        return None  # a row expression mixing the table's and a dimension's columns
    # A dimension's column (or a constant): its value on the partial row, weighed by the rows.
    present = IsNullTest(argument, negated=True)
    if call.func == "sum":
        return AggCall("sum", Arith("*", argument, rows))
    if call.func == "count":
        return AggCall("sum", Case(((present, rows),), Const(0, "number")))
    if call.func == "mean":
        return Arith(
            "/", AggCall("sum", Arith("*", argument, rows)), AggCall("sum", Case(((present, rows),)))
        )
    if call.func in ("min", "max"):
        return call
    if call.func == "count_distinct":
        return call
    return None
