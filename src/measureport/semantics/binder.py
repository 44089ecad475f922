"""Binding a model's measures: names, columns, types, lints and dependency order.

``bind_model`` is the entry point for whole models; ``bind_condition`` binds one report filter;
``build_query`` and ``view_query`` (from :mod:`measureport.semantics.queries`) turn command-line
options and views into queries.
"""

from __future__ import annotations

from collections.abc import Sequence

from measureport.language import ast
from measureport.model.schema import Model
from measureport.semantics.bound import BoundMeasure, BoundModel, ValueType
from measureport.semantics.conditions import bind_report_filter
from measureport.semantics.definitions import collect_definitions, definition_span
from measureport.semantics.describe import written_text
from measureport.semantics.findings import Findings
from measureport.semantics.order import dependency_order, find_cycles, referenced_measures
from measureport.semantics.queries import build_query, view_query
from measureport.semantics.sources import read_measure_files
from measureport.semantics.views import bind_view, warn_unused_measures
from measureport.semantics.walker import ExpressionBinder

__all__ = ["bind_condition", "bind_model", "build_query", "view_query"]


def bind_model(model: Model, files: Sequence[ast.MeasureFile] | None = None) -> BoundModel:
    """Bind every measure of ``model`` (from ``files``, or else read from ``model.measure_files``)
    and check its views. All errors found are raised together as one ``MeasureportError``."""
    if files is None:
        files = read_measure_files(model)
    findings = Findings(file_order=[file.path for file in files])
    definitions = collect_definitions(files, findings)
    names = list(definitions)
    depends_on = {name: referenced_measures(d.expr, definitions) for name, d in definitions.items()}
    for cycle in find_cycles(names, depends_on):
        findings.error("measures form a cycle: " + " -> ".join(cycle), definition_span(definitions[cycle[0]]))
    types: dict[str, ValueType] = {}
    binder = ExpressionBinder(model, findings, definitions.keys(), types)
    measures: dict[str, BoundMeasure] = {}
    for name in dependency_order(names, depends_on):
        definition = definitions[name]
        expr, kind, referenced = binder.bind_measure(definition.expr)
        types[name] = kind
        source = written_text(definition.expr.span, one_line=False) or ""
        measures[name] = BoundMeasure(
            name, expr, kind, referenced, definition.description, source, definition.span
        )
    for view in model.views.values():
        bind_view(binder, view)
    spans = {name: definition_span(d) for name, d in definitions.items()}
    warn_unused_measures(model, depends_on, spans, findings)
    findings.raise_if_any()
    return BoundModel(model, measures, findings.sorted_warnings())


def bind_condition(bound: BoundModel, expr: ast.Expr) -> ast.Expr:
    """Bind a report filter (``--where``, a view's ``where:``): a condition over the columns of
    one table, with no aggregate or measure."""
    findings = Findings()
    types = {name: measure.type for name, measure in bound.measures.items()}
    binder = ExpressionBinder(bound.model, findings, bound.measures.keys(), types)
    bound_expr = bind_report_filter(binder, expr)
    findings.raise_if_any()
    return bound_expr
