"""``given`` and its modifiers, with the lint for conditions that undo the row binding."""

from __future__ import annotations

from dataclasses import replace
from typing import TYPE_CHECKING

from measureport.language import ast
from measureport.semantics.conditions import BoundFilter, bind_filter
from measureport.semantics.nodes import joined
from measureport.semantics.scope import Scope
from measureport.semantics.timewindows import check_time_modifier

if TYPE_CHECKING:
    from measureport.semantics.walker import Bound, ExpressionBinder

CLEAR_USAGE = "clear takes a table or a column written table.column"


def bind_given(binder: ExpressionBinder, given: ast.Given, scope: Scope) -> Bound:
    """Bind ``body given m1, m2, ...``. Inside ``for each`` the body sees the bound row (rule 3);
    the modifiers' own values are computed outside the ``given`` (rule 4)."""
    if binder.refuse_in_report_filter(given, scope, "given"):
        return given, None
    # Inside a condition, a given is a value computed outside it, not a part it tests.
    body_scope = replace(scope, row_bound=scope.row_bound or scope.in_iteration, tested=None)
    body, kind = binder.bind(given.body, body_scope)
    bound = tuple(_bind_modifier(binder, modifier, scope) for modifier in given.modifiers)
    return replace(given, body=body, modifiers=bound), kind


def _bind_modifier(binder: ExpressionBinder, modifier: ast.Modifier, scope: Scope) -> ast.Modifier:
    match modifier:
        case ast.Condition(expr=expr):
            found = bind_filter(binder, expr, scope, "a condition after given")
            _warn_if_binding_lost(binder, modifier, found, scope)
            return replace(modifier, expr=found.expr)
        case ast.Narrow(expr=expr):
            return replace(modifier, expr=bind_filter(binder, expr, scope, "a condition after narrow").expr)
        case ast.Clear():
            _check_clear(binder, modifier, scope)
        case ast.RowBinding() if not scope.in_iteration:
            binder.findings.error(
                "row binds the current row of for each, and there is none here", modifier.span
            )
        case ast.ToDate() | ast.Shift() | ast.Trailing():
            check_time_modifier(binder, modifier)
    return modifier


def _warn_if_binding_lost(
    binder: ExpressionBinder, modifier: ast.Condition, found: BoundFilter, scope: Scope
) -> None:
    """A plain condition inside ``for each`` replaces the filters the row binding just set."""
    if not scope.in_iteration:
        return
    frame = scope.frames[-1]
    lost = list(dict.fromkeys(str(column) for column in found.tested if frame.binds(column)))
    if lost:
        binder.findings.warn(
            f"the binding of {joined(lost)} to the current row is lost here; use narrow to keep it",
            modifier.span,
        )


def _check_clear(binder: ExpressionBinder, clear: ast.Clear, scope: Scope) -> None:
    if binder.lookup.table(clear.table, clear.span, CLEAR_USAGE, scope.lets) is None:
        return
    if clear.column is not None:
        binder.lookup.column(ast.ColumnRef(clear.table, clear.column, span=clear.span))
    for kept in clear.keep:
        if kept.table != clear.table:
            binder.findings.error(
                f"clear {clear.table} but keeps columns of {clear.table}; {kept} is a column of {kept.table}",
                kept.span,
            )
        else:
            binder.lookup.column(kept)
