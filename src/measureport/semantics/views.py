"""The views of a model: their measures, grouping columns and filters, and measures no view uses."""

from __future__ import annotations

from collections.abc import Mapping, Sequence

from measureport.errors import NO_SPAN, MeasureportError, Span
from measureport.language import ast
from measureport.model.schema import Model, View, ViewCondition
from measureport.query import Query
from measureport.semantics.conditions import bind_report_filter
from measureport.semantics.findings import Findings
from measureport.semantics.sources import parse_inline
from measureport.semantics.suggest import did_you_mean
from measureport.semantics.walker import ExpressionBinder


def bind_view(binder: ExpressionBinder, view: View) -> Query:
    """The query a view stands for; its problems go to ``binder.findings``."""
    findings = binder.findings
    for index, name in enumerate(view.measures):
        if name not in binder.measure_names:
            hint = did_you_mean(name, binder.measure_names)
            findings.error(
                f"view {view.name} asks for unknown measure {name}{hint}",
                _nth_span(view.measure_spans, index, view.span),
            )
    by = []
    for index, (table, column) in enumerate(view.by):
        ref = ast.ColumnRef(table, column, span=_nth_span(view.by_spans, index, view.span))
        binder.lookup.column(ref)
        by.append(ref)
    where = [bound for bound in (_bind_view_condition(binder, view, c) for c in view.where) if bound]
    return Query(measures=view.measures, by=tuple(by), where=tuple(where))


def _bind_view_condition(binder: ExpressionBinder, view: View, condition: ViewCondition) -> ast.Expr | None:
    span = condition.span
    if span == NO_SPAN:
        span = Span(f"<view {view.name}>", 1, 1)
    try:
        expr = parse_inline(condition.text, span.file, span.line, span.column)
    except MeasureportError as problem:
        binder.findings.absorb(problem)
        return None
    return bind_report_filter(binder, expr, "a where condition of a view")


def warn_unused_measures(
    model: Model, depends_on: Mapping[str, Sequence[str]], spans: Mapping[str, Span], findings: Findings
) -> None:
    """When the model has views, warn about each measure that no view uses, even indirectly."""
    if not model.views:
        return
    used: set[str] = set()
    waiting = [name for view in model.views.values() for name in view.measures]
    while waiting:
        name = waiting.pop()
        if name not in used:
            used.add(name)
            waiting.extend(depends_on.get(name, ()))
    for name in depends_on:
        if name not in used:
            findings.warn(f"measure {name} is not used by any view", spans[name])


def _nth_span(spans: Sequence[Span], index: int, fallback: Span) -> Span:
    return spans[index] if index < len(spans) else fallback
