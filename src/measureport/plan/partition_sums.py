"""Iterations that add up an additive aggregate over the rows it partitions.

``mean(coalesce(trips, 0) for each calendar.day)`` binds each visible day and counts its rides;
the days partition the rides, so the counts add up to the rides of the context, and the mean is
that total over the number of days: one aggregate at the grid's grain instead of one per day.

It is exact when the iteration is over columns, with no ``where``; its body is the one
aggregate (a count or a sum, which add up), alone or as ``coalesce(..., 0)``; that aggregate's
rows are its context's rows with every iterated column bound to the current row, and keep every
filter that decided which combinations are iterated. Then every row the aggregate could see
without the binding has its combination among the iterated ones (it reaches a visible row of
the iterated table, or that table's empty member, through the same filters), so the partial
values over the combinations add up to the aggregate without the binding.
"""

from __future__ import annotations

from dataclasses import dataclass, replace
from typing import Literal

from measureport.plan.context import EqFilter
from measureport.plan.frames import AggRequest, Frame, RowSet
from measureport.plan.scalar import AggCall, Col, Const, Func, Scalar

Form = Literal["sum", "sum_or_zero", "mean_or_zero"]


@dataclass(frozen=True)
class PartitionSum:
    """An iteration rewritten: the aggregate ``value`` over ``rows`` (the binding dropped), and
    ``combinations`` (the iterated rows, distinct) to count them, combined as ``form`` says."""

    rows: RowSet
    value: Scalar
    combinations: RowSet
    form: Form


def as_partition_sum(
    child: Frame, function: str, argument: Scalar, where: Scalar | None
) -> PartitionSum | None:
    """The rewrite of ``function(argument for each ...)`` over ``child``, or None when not exact."""
    if child.kind != "columns" or child.rows is None or child.rows.where is not None or where is not None:
        return None
    if child.children or len(child.requests) != 1 or not isinstance(child.requests[0], AggRequest):
        return None
    request = child.requests[0]
    form = _form(function, argument, request.out)
    if form is None:
        return None
    value = request.value
    if not isinstance(value, AggCall) or value.func not in ("sum", "count", "count_rows"):
        return None
    rows = request.rows
    if rows.where is not None or rows.distinct is not None or rows.with_empty:
        return None
    bound = [f for f in rows.filters if isinstance(f, EqFilter) and f.binding == child.id]
    expected = {(tc.table, tc.column): child.env.get((tc.table, tc.column)) for tc in child.iterated}
    if len(bound) != len(expected):
        return None
    for f in bound:
        if not isinstance(f.value, Col) or expected.get((f.table, f.column)) != f.value.name:
            return None
    rest = tuple(f for f in rows.filters if f not in bound)
    if any(f.frame_columns() & child.owned for f in rest):
        return None
    if not set(child.rows.filters) <= set(rest):
        return None
    combinations = replace(child.rows, distinct=child.iterated)
    return PartitionSum(RowSet(rows.table, False, rest), value, combinations, form)


def _form(function: str, argument: Scalar, out: str) -> Form | None:
    if argument == Col(out):
        return "sum" if function == "sum" else None
    if not (isinstance(argument, Func) and argument.name == "coalesce" and len(argument.args) == 2):
        return None
    first, second = argument.args
    if first != Col(out) or not _is_zero(second):
        return None
    if function == "sum":
        return "sum_or_zero"
    if function == "mean":
        return "mean_or_zero"
    return None


def _is_zero(value: Scalar) -> bool:
    return isinstance(value, Const) and not isinstance(value.value, bool) and value.value == 0
