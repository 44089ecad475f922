"""Aggregates, ``for each``, ``rank``, ``single`` and ``restricted``: everything that reads the context."""

from __future__ import annotations

from dataclasses import replace
from typing import TYPE_CHECKING

from measureport.errors import Span
from measureport.language import ast
from measureport.model.graph import closest_common_source, nearest_common_sources
from measureport.semantics.bound import ValueType
from measureport.semantics.describe import expr_text, head_text
from measureport.semantics.kinds import ORDERED_KINDS, fits, phrase
from measureport.semantics.nodes import columns_in, joined
from measureport.semantics.scope import Frame, Scope

if TYPE_CHECKING:
    from measureport.semantics.walker import Bound, ExpressionBinder

FOR_EACH_USAGE = "for each takes a table or columns written table.column"
COUNT_USAGE = "count(...) takes a table or a column"


def bind_context_reader(binder: ExpressionBinder, expr: ast.Expr, scope: Scope) -> Bound:
    """Bind an aggregate, ``rank``, ``single`` or ``restricted``, linting rule 1 inside ``for each``."""
    if binder.refuse_in_report_filter(expr, scope, head_text(expr)):
        return expr, None
    binder.warn_if_bare(expr, scope)
    match expr:
        case ast.Aggregate(iteration=None):
            return _plain_aggregate(binder, expr, scope)
        case ast.Aggregate():
            return _iterated_aggregate(binder, expr, scope)
        case ast.Rank():
            return _rank(binder, expr, scope)
        case ast.Single(column=column):
            found = binder.lookup.column(column)
            return expr, found.type.kind if found is not None else None
        case ast.Restricted(column=column):
            binder.lookup.column(column)
            return expr, "boolean"
    raise TypeError(f"not a context reader: {type(expr).__name__}")


def _plain_aggregate(binder: ExpressionBinder, agg: ast.Aggregate, scope: Scope) -> Bound:
    argument = agg.argument
    if isinstance(argument, ast.Name) and (
        agg.function == "count" or _names_only_a_table(binder, argument, scope)
    ):
        argument = ast.TableRef(argument.name, span=argument.span)
    match argument:
        case ast.TableRef(table=name) if agg.function == "count":
            binder.lookup.table(name, argument.span, COUNT_USAGE, scope.lets)
            return replace(agg, argument=argument), "number"
        case ast.TableRef(table=name):
            binder.findings.error(
                f"{agg.function}({name}) needs a column of {name}, written {name}.column; "
                f"count({name}) counts its rows",
                agg.span,
            )
            return agg, _result_kind(agg.function, None)
        case ast.ColumnRef():
            column = binder.lookup.column(argument)
            kind = column.type.kind if column is not None else None
            _check_argument(binder, agg.function, argument, kind)
            return agg, _result_kind(agg.function, kind)
    _explain_for_each(binder, agg)
    return agg, _result_kind(agg.function, None)


def _names_only_a_table(binder: ExpressionBinder, name: ast.Name, scope: Scope) -> bool:
    known_value = name.name in binder.measure_names or name.name in scope.lets
    return name.name in binder.model.tables and not known_value


def _explain_for_each(binder: ExpressionBinder, agg: ast.Aggregate) -> None:
    """An aggregate of an expression without ``for each``: say how to write it."""
    text = expr_text(agg.argument)
    function = agg.function
    mentioned = [column.table for column in columns_in(agg.argument)]
    tables = [table for table in dict.fromkeys(mentioned) if table in binder.model.tables]
    if not tables:
        binder.findings.error(
            f"{function} without for each takes one column; to aggregate {text} over the members "
            f"of a column, write {function}({text} for each table.column)",
            agg.span,
        )
        return
    chosen = closest_common_source(binder.model, tables)
    binder.findings.error(
        f"{function} without for each takes one column; to aggregate an expression row by row, "
        f"write {function}({text} for each {chosen or tables[0]})",
        agg.span,
    )


def _iterated_aggregate(binder: ExpressionBinder, agg: ast.Aggregate, scope: Scope) -> Bound:
    assert agg.iteration is not None
    iteration, frame = _bind_iteration(binder, agg.iteration, scope)
    inner = Scope(lets=scope.lets, frames=(*scope.frames, frame))
    argument, kind = binder.bind(agg.argument, inner)
    _check_argument(binder, agg.function, argument, kind)
    return replace(agg, argument=argument, iteration=iteration), _result_kind(agg.function, kind)


def _bind_iteration(
    binder: ExpressionBinder, iteration: ast.Iteration, scope: Scope
) -> tuple[ast.Iteration, Frame]:
    if iteration.table is not None:
        name = iteration.table.table
        known = binder.lookup.table(name, iteration.table.span, FOR_EACH_USAGE, scope.lets) is not None
        reached = binder.reached(name) if known else frozenset(binder.model.tables)
        frame = Frame(label=name, table=name, reached=reached)
    else:
        found = [column for column in iteration.columns if binder.lookup.column(column) is not None]
        _check_one_source(binder, found, iteration.span)
        frame = Frame(
            label=", ".join(str(column) for column in iteration.columns),
            columns=frozenset((column.table, column.column) for column in iteration.columns),
        )
    if iteration.where is None:
        return iteration, frame
    inner = Scope(lets=scope.lets, frames=(*scope.frames, frame))
    where, kind = binder.bind(iteration.where, inner)
    if not fits(kind, "boolean"):
        binder.findings.error(
            f"the condition after where must be true or false; this is {phrase(kind)}", where.span
        )
    return replace(iteration, where=where), frame


def _check_one_source(binder: ExpressionBinder, columns: list[ast.ColumnRef], span: Span) -> None:
    """The columns of a column iteration must be reachable from one closest table."""
    tables = {column.table for column in columns}
    if len(tables) <= 1:
        return
    candidates = nearest_common_sources(binder.model, tables)
    if len(candidates) == 1:
        return
    listed = joined([str(column) for column in columns])
    if not candidates:
        binder.findings.error(
            f"for each needs columns that one table reaches, and no table reaches all of {listed}", span
        )
        return
    who = "both reach" if len(candidates) == 2 else "all reach"
    binder.findings.error(
        f"for each needs columns that one closest table reaches; {joined(list(candidates))} {who} "
        f"{listed}, so iterate the rows of one table instead, e.g. for each {candidates[0]}",
        span,
    )


def _rank(binder: ExpressionBinder, rank: ast.Rank, scope: Scope) -> Bound:
    binder.lookup.column(rank.over)
    # The members are valued in the context alone: no current row reaches inside rank.
    value, kind = binder.bind(rank.expr, Scope(lets=scope.lets))
    if not fits(kind, "number"):
        binder.findings.error(f"rank orders numbers; {expr_text(rank.expr)} is {phrase(kind)}", value.span)
    return replace(rank, expr=value), "number"


def _check_argument(binder: ExpressionBinder, function: str, argument: ast.Expr, kind: ValueType) -> None:
    if function in ("sum", "mean") and not fits(kind, "number"):
        binder.findings.error(
            f"{function} needs numbers; {expr_text(argument)} is {phrase(kind)}", argument.span
        )
    elif function in ("min", "max") and kind is not None and kind not in ORDERED_KINDS:
        binder.findings.error(
            f"{function} needs numbers, dates or text; {expr_text(argument)} is {phrase(kind)}",
            argument.span,
        )


def _result_kind(function: str, argument_kind: ValueType) -> ValueType:
    return argument_kind if function in ("min", "max") else "number"
