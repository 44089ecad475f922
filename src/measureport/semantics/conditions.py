"""Filter conditions: which table a condition filters and which of its columns it tests."""

from __future__ import annotations

from dataclasses import dataclass, replace
from typing import TYPE_CHECKING

from measureport.language import ast
from measureport.semantics.kinds import fits, phrase
from measureport.semantics.nodes import joined
from measureport.semantics.scope import Scope

if TYPE_CHECKING:
    from measureport.semantics.walker import ExpressionBinder


@dataclass(frozen=True)
class BoundFilter:
    """A bound condition, the table whose columns it tests (None after an error), and those columns."""

    expr: ast.Expr
    table: str | None
    tested: tuple[ast.ColumnRef, ...]


def bind_filter(binder: ExpressionBinder, expr: ast.Expr, scope: Scope, usage: str) -> BoundFilter:
    """Bind a condition that filters the columns of one table.

    Columns it reads row by row belong to the filtered table, except that a column with a
    value on the current row of an enclosing iteration is a constant of the condition.
    ``usage`` names the condition in messages, e.g. ``a condition after given``.
    """
    tested: list[ast.ColumnRef] = []
    errors_before = len(binder.findings.errors)
    bound, kind = binder.bind(expr, replace(scope, tested=tested))
    if not fits(kind, "boolean"):
        binder.findings.error(f"{usage} must be true or false; this is {phrase(kind)}", expr.span)
    tables = list(dict.fromkeys(column.table for column in tested))
    if not tables:
        if len(binder.findings.errors) == errors_before:
            binder.findings.error(f"{usage} must test a column, written table.column", expr.span)
        return BoundFilter(bound, None, ())
    free = [table for table in tables if not _all_row_values(tested, table, scope)]
    if len(tables) == 1:
        table = tables[0]
    elif len(free) == 1:
        table = free[0]
    else:
        message = (
            f"{usage} tests the columns of one table, but this one names columns of {joined(free or tables)}"
        )
        if not free:
            message += "; to compare with a value of the current row, put that value in a let first"
        binder.findings.error(message, expr.span)
        return BoundFilter(bound, None, ())
    return BoundFilter(bound, table, tuple(column for column in tested if column.table == table))


def _all_row_values(tested: list[ast.ColumnRef], table: str, scope: Scope) -> bool:
    columns = [column for column in tested if column.table == table]
    return all(any(frame.gives_value(column) for frame in scope.frames) for column in columns)


def bind_report_filter(binder: ExpressionBinder, expr: ast.Expr, usage: str = "a report filter") -> ast.Expr:
    """Bind a report filter: a condition over the columns of one table, with no aggregate,
    measure or ``given``."""
    return bind_filter(binder, expr, Scope(report_filter=True), usage).expr
