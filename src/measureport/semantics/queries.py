"""Queries from command-line options and from views."""

from __future__ import annotations

from collections.abc import Iterator, Mapping, Sequence

from measureport.errors import NO_SPAN, MeasureportError, Span, remember_source
from measureport.language import ast
from measureport.query import Query
from measureport.semantics.bound import BoundMeasure, BoundModel, ValueType
from measureport.semantics.conditions import bind_report_filter
from measureport.semantics.findings import Findings
from measureport.semantics.sources import parse_inline
from measureport.semantics.suggest import did_you_mean
from measureport.semantics.views import bind_view
from measureport.semantics.walker import ExpressionBinder

MEASURES_SOURCE = "<-m>"
BY_SOURCE = "<--by>"
WHERE_SOURCE = "<--where>"


def build_query(
    bound: BoundModel,
    measures: Sequence[str],
    by: Sequence[str],
    where: Sequence[str] = (),
    totals: bool = False,
) -> Query:
    """The query of ``-m``, ``--by`` (``table.column`` texts) and ``--where`` (conditions).

    Errors point into the option texts, remembered as sources named ``<-m>``, ``<--by>`` and
    ``<--where>`` (the items of ``-m`` and ``--by`` joined by commas, each ``--where`` a line).
    """
    findings = Findings(file_order=[MEASURES_SOURCE, BY_SOURCE, WHERE_SOURCE])
    binder = _binder_for(bound, findings)
    _check_measures(bound, measures, findings)
    columns = _grouping_columns(binder, by)
    conditions = _report_filters(binder, where)
    findings.raise_if_any()
    return Query(measures=tuple(measures), by=tuple(columns), where=tuple(conditions), totals=totals)


def view_query(bound: BoundModel, view_name: str) -> Query:
    """The query that the view ``view_name`` of the model stands for."""
    view = bound.model.views.get(view_name)
    if view is None:
        hint = did_you_mean(view_name, bound.model.views)
        raise MeasureportError(f"the model has no view {view_name}{hint}")
    findings = Findings()
    query = bind_view(_binder_for(bound, findings), view)
    findings.raise_if_any()
    return query


def _binder_for(bound: BoundModel, findings: Findings) -> ExpressionBinder:
    return ExpressionBinder(bound.model, findings, bound.measures.keys(), _MeasureTypes(bound.measures))


class _MeasureTypes(Mapping[str, ValueType]):
    """The type of each bound measure, read where asked (a query names few of many measures)."""

    def __init__(self, measures: Mapping[str, BoundMeasure]) -> None:
        self._measures = measures

    def __getitem__(self, name: str) -> ValueType:
        return self._measures[name].type

    def __iter__(self) -> Iterator[str]:
        return iter(self._measures)

    def __len__(self) -> int:
        return len(self._measures)


def _check_measures(bound: BoundModel, measures: Sequence[str], findings: Findings) -> None:
    if not measures:
        findings.error("name at least one measure to compute", NO_SPAN)
        return
    remember_source(MEASURES_SOURCE, ",".join(measures))
    seen: set[str] = set()
    for name, column in _items_at(measures):
        span = Span(MEASURES_SOURCE, 1, column, 1, column + max(len(name), 1) - 1)
        if name not in bound.measures:
            findings.error(f"unknown measure {name}{did_you_mean(name, bound.measures)}", span)
        elif name in seen:
            findings.error(f"measure {name} is asked for twice", span)
        seen.add(name)


def _grouping_columns(binder: ExpressionBinder, by: Sequence[str]) -> list[ast.ColumnRef]:
    columns: list[ast.ColumnRef] = []
    try:
        for text, column in _items_at(by):
            try:
                parsed = parse_inline(text, BY_SOURCE, 1, column)
            except MeasureportError as problem:
                binder.findings.absorb(problem)
                continue
            if not isinstance(parsed, ast.ColumnRef):
                binder.findings.error(
                    f"--by takes columns written table.column; {text.strip()} is not one", parsed.span
                )
            elif parsed in columns:
                binder.findings.error(f"{parsed} is in --by twice", parsed.span)
            elif binder.lookup.column(parsed) is not None:
                columns.append(parsed)
    finally:
        remember_source(BY_SOURCE, ",".join(by))
    return columns


def _report_filters(binder: ExpressionBinder, where: Sequence[str]) -> list[ast.Expr]:
    conditions: list[ast.Expr] = []
    try:
        for line, text in enumerate(where, start=1):
            try:
                parsed = parse_inline(text, WHERE_SOURCE, line, 1)
            except MeasureportError as problem:
                binder.findings.absorb(problem)
                continue
            conditions.append(bind_report_filter(binder, parsed))
    finally:
        remember_source(WHERE_SOURCE, "\n".join(where))
    return conditions


def _items_at(items: Sequence[str]) -> list[tuple[str, int]]:
    """Each item with its 1-based column in the items joined by commas."""
    placed = []
    column = 1
    for item in items:
        placed.append((item, column))
        column += len(item) + 1
    return placed
