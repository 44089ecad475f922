"""A whole query as one plan: the result grid (rule 6), every measure per grid row, totals by
re-evaluation at each level, rows ordered as the contract says."""

from __future__ import annotations

from dataclasses import dataclass, field

from measureport.errors import MeasureportError
from measureport.language import ast
from measureport.plan.build import Builder, Strategy
from measureport.plan.context import Context, EqFilter, TableCol
from measureport.plan.frames import Frame, Request
from measureport.plan.lower import Lowering, State
from measureport.plan.names import Names
from measureport.plan.nodes import (
    Distinct,
    Filter,
    Join,
    OneRow,
    PlanNode,
    Project,
    Result,
    SortKey,
    UnionAll,
)
from measureport.plan.scalar import Case, Col, Compare, Const, IsNullTest, Or, Scalar, TypedNull, columns_used
from measureport.query import Query
from measureport.semantics.bound import BoundModel

LEVEL_COLUMN = "__level"
TOTALS_COLUMN = "totals"


@dataclass
class QueryPlan:
    """The plan of one query: ``root`` gives the columns and rows ``run`` prints; ``executable``
    is the same statement with one more column, ``__level`` (how many grouping columns a row
    keeps), from which engines fill ``ResultTable.levels``."""

    query: Query
    root: Result
    executable: Result
    strategies: list[Strategy] = field(default_factory=list)
    askers: dict[int, list[str]] = field(default_factory=dict)
    requests: list[Request] = field(default_factory=list)
    notes: list[str] = field(default_factory=list)

    def strategies_for(self, measure: str) -> list[Strategy]:
        """How the relational steps that ``measure`` needed were chosen."""
        return [s for s in self.strategies if measure in self.askers.get(id(s.request), [])]


def plan_query(bound: BoundModel, query: Query) -> QueryPlan:
    """Lower ``query`` (its measures by its grouping columns under its report filters) to a plan."""
    names = Names()
    lowering = Lowering(bound, names)
    builder = Builder(lowering, names)
    _check_output_names(query)
    levels = [len(query.by)]
    if query.totals:
        levels += list(range(len(query.by) - 1, -1, -1))
    parts: list[PlanNode] = []
    requests: list[Request] = []
    for level in levels:
        parts.append(_level_part(lowering, builder, query, level, requests))
    union = parts[0] if len(parts) == 1 else UnionAll(tuple(parts), label="levels of totals")
    public = tuple((c, Col(c)) for c in _public_columns(query))
    keys = _order(query)
    root = Result(union, public, keys, label="result")
    executable = Result(union, (*public, (LEVEL_COLUMN, Col(LEVEL_COLUMN))), keys, label="result")
    return QueryPlan(query, root, executable, builder.strategies, lowering.askers, requests, builder.notes)


def _check_output_names(query: Query) -> None:
    reserved = {LEVEL_COLUMN, *(str(c) for c in query.by)}
    if query.totals:
        reserved.add(TOTALS_COLUMN)
    clash = [m for m in query.measures if m in reserved]
    if clash:
        raise MeasureportError(f"measure {clash[0]} has the name of an output column of this query")


def _public_columns(query: Query) -> list[str]:
    columns = [str(c) for c in query.by] + list(query.measures)
    if query.totals:
        columns.append(TOTALS_COLUMN)
    return columns


def _order(query: Query) -> tuple[SortKey, ...]:
    keys: list[SortKey] = []
    for i, column in enumerate(query.by):
        if query.totals:
            rolled = Case(
                ((Compare("<=", Col(LEVEL_COLUMN), Const(i, "number")), Const(1, "number")),),
                Const(0, "number"),
            )
            keys.append(SortKey(rolled))
        keys.append(SortKey(Col(str(column))))
    return tuple(keys)


def _level_part(
    lowering: Lowering, builder: Builder, query: Query, level: int, requests: list[Request]
) -> PlanNode:
    """The rows of one grouping level: its grid, its measures, rows with a measure kept."""
    by = query.by[:level]
    grid = lowering.new_frame("grid", None, label=f"grid by {', '.join(map(str, by)) or 'nothing'}")
    report = _report_context(lowering, grid, query.where)
    grid_names = [lowering.own(grid, lowering.names.fresh(f"{c.table}_{c.column}")) for c in by]
    grid.key = tuple(grid_names)
    grid.grid_columns = {n: (c.table, c.column) for c, n in zip(by, grid_names, strict=True)}
    grid.report = report.filters
    cell = report.add(*(EqFilter(c.table, c.column, Col(n)) for c, n in zip(by, grid_names, strict=True)))
    values = [lowering.measure(m, cell, grid) for m in query.measures]
    for measure, value in zip(query.measures, values, strict=True):
        _attribute(grid, measure, value, lowering.askers)
    requests.extend(grid.requests)
    final = builder.build_grid(grid, lambda: _grid(lowering, builder, by, grid_names, report), values, report)
    items: list[tuple[str, Scalar]] = []
    for i, column in enumerate(query.by):
        if i < level:
            items.append((str(column), Col(grid_names[i])))
        else:
            items.append((str(column), TypedNull(_column_type(lowering, column))))
    items += list(zip(query.measures, values, strict=True))
    if query.totals:
        marker = None if level == len(query.by) else "total" if level == 0 else "subtotal"
        items.append((TOTALS_COLUMN, Const(marker, "text")))
    items.append((LEVEL_COLUMN, Const(level, "number")))
    projected = Project(final, tuple(items), label=f"measures by {level} column(s)")
    kept = Or(tuple(IsNullTest(Col(m), negated=True) for m in query.measures))
    return Filter(projected, kept if len(query.measures) > 1 else kept.items[0], label="rows with a value")


def _attribute(grid: Frame, measure: str, value: Scalar, askers: dict[int, list[str]]) -> None:
    """Record ``measure`` as an asker of every request its value depends on, directly or through
    the columns those requests read, and of everything inside the iterations it uses."""
    producing: dict[str, Request] = {}
    frames = [grid]
    while frames:
        frame = frames.pop()
        for request in frame.requests:
            producing[request.out] = request
        frames.extend(frame.children)
    pending = sorted(columns_used(value))
    seen: set[str] = set()
    while pending:
        column = pending.pop()
        if column in seen:
            continue
        seen.add(column)
        found = producing.get(column)
        if found is None:
            continue
        request = found
        asked = askers.setdefault(id(request), [])
        if measure not in asked:
            asked.append(measure)
        pending.extend(sorted(request.frame_columns()))
        child = getattr(request, "child", None)
        if isinstance(child, Frame):
            pending.extend(_outs_inside(child))


def _outs_inside(frame: Frame) -> list[str]:
    outs = [r.out for r in frame.requests]
    for child in frame.children:
        outs += _outs_inside(child)
    return outs


def _column_type(lowering: Lowering, column: ast.ColumnRef) -> str:
    return lowering.model.tables[column.table].columns[column.column].type.sql


def _report_context(lowering: Lowering, grid: Frame, where: tuple[ast.Expr, ...]) -> Context:
    ctx = Context()
    outside = State(grid, Context(), {}, None, "")
    for condition in where:
        f = lowering.condition(condition, outside)
        if f.frame_columns():
            raise MeasureportError(
                "a report filter must compare columns with values, not with aggregates", condition.span
            )
        ctx = ctx.add(f)
    return ctx


def _grid(
    lowering: Lowering, builder: Builder, by: tuple[ast.ColumnRef, ...], names: list[str], report: Context
) -> PlanNode:
    """Per table, the distinct visible combinations of its grouping columns (the empty member
    included); across tables, every combination of those (LANGUAGE.md 3.6)."""
    groups: dict[str, list[int]] = {}
    for i, column in enumerate(by):
        groups.setdefault(column.table, []).append(i)
    node: PlanNode | None = None
    for table, positions in groups.items():
        rows = lowering.rowset(report, table, with_empty=True)
        wanted = {TableCol(by[i].table, by[i].column) for i in positions}
        rr = builder.rowsets.rows_relation(rows, None, [], wanted, grid=True)
        items = [(names[i], Col(rr.columns[TableCol(by[i].table, by[i].column)])) for i in positions]
        part = Distinct(Project(rr.node, tuple(items)), label=f"grid of {table}")
        node = part if node is None else Join(node, part, "cross")
    return node if node is not None else OneRow(label="one row")
