"""The expression binder: resolves names, checks columns, computes types, walks every node once.

Operators, aggregates and ``given`` have their rules in modules of their own; this one holds
the dispatch, names and ``let`` scoping, columns used as row values, and the lint for
aggregates that do not see the current row.
"""

from __future__ import annotations

from collections.abc import Collection, Mapping
from dataclasses import replace

from measureport.errors import NO_SPAN
from measureport.language import ast
from measureport.model.graph import reachable
from measureport.model.schema import Model
from measureport.semantics import aggregates, modifiers, operators
from measureport.semantics.bound import ValueType
from measureport.semantics.describe import head_text
from measureport.semantics.findings import Findings
from measureport.semantics.lookup import ModelLookup
from measureport.semantics.scope import LetValue, Scope
from measureport.semantics.suggest import did_you_mean

Bound = tuple[ast.Expr, ValueType]


class ExpressionBinder:
    """Binds expressions against one model and a set of measure names.

    ``measure_types`` is read when a measure is referenced: bind measures in dependency order
    and fill it as you go (a measure not in it yet has an unknown type).
    """

    def __init__(
        self,
        model: Model,
        findings: Findings,
        measure_names: Collection[str] = (),
        measure_types: Mapping[str, ValueType] | None = None,
    ) -> None:
        self.model = model
        self.findings = findings
        self.measure_names = measure_names
        self.measure_types: Mapping[str, ValueType] = measure_types if measure_types is not None else {}
        self.lookup = ModelLookup(model, findings, measure_names)
        self.referenced: list[str] = []
        self._reach: dict[str, frozenset[str]] = {}

    def bind_measure(self, expr: ast.Expr) -> tuple[ast.Expr, ValueType, tuple[str, ...]]:
        """Bind a measure's expression: the bound tree, its type, the measures it references."""
        self.referenced = []
        bound, kind = self.bind(expr, Scope())
        return bound, kind, tuple(dict.fromkeys(self.referenced))

    def reached(self, table: str) -> frozenset[str]:
        """``table`` and the tables it points to."""
        if table not in self._reach:
            self._reach[table] = frozenset(reachable(self.model, table))
        return self._reach[table]

    def bind(self, expr: ast.Expr, scope: Scope) -> Bound:
        """Bind one expression in ``scope``: the bound tree and its type."""
        match expr:
            case ast.Number():
                return expr, "number"
            case ast.String():
                return expr, "text"
            case ast.DateLiteral():
                return expr, "date"
            case ast.Boolean():
                return expr, "boolean"
            case ast.Null():
                return expr, None
            case ast.ColumnRef():
                return self._column_value(expr, scope)
            case ast.TableRef():
                self.findings.error(
                    f"{expr.table} is a table, not a value; count({expr.table}) counts its rows", expr.span
                )
                return expr, None
            case ast.Name() | ast.MeasureRef() | ast.LocalRef():
                return self._name(expr, scope)
            case ast.Let():
                return self._let(expr, scope)
            case ast.Aggregate() | ast.Rank() | ast.Single() | ast.Restricted():
                return aggregates.bind_context_reader(self, expr, scope)
            case ast.Given():
                return modifiers.bind_given(self, expr, scope)
        return operators.bind_operator(self, expr, scope)

    def warn_if_bare(self, expr: ast.Expr, scope: Scope) -> None:
        """Warn when ``expr`` reads the context inside ``for each`` without the row bound (rule 1)."""
        if not scope.in_iteration or scope.row_bound:
            return
        text = head_text(expr)
        self.findings.warn(
            f"{text} inside for each {scope.frames[-1].label} does not see the current row: it returns "
            f"the same value on every row; write ({text} given row) or use a measure to evaluate it per row",
            expr.span,
        )

    def refuse_in_report_filter(self, expr: ast.Expr, scope: Scope, what: str) -> bool:
        """In a report filter, report ``what`` (e.g. ``an aggregate``) as not allowed; True if so."""
        if not scope.report_filter:
            return False
        self.findings.error(
            f"a report filter tests the columns of one table row by row; it cannot use {what}", expr.span
        )
        return True

    def _column_value(self, ref: ast.ColumnRef, scope: Scope) -> Bound:
        column = self.lookup.column(ref)
        if column is None:
            return ref, None
        kind = column.type.kind
        if scope.tested is not None:
            scope.tested.append(ref)
        elif not any(frame.gives_value(ref) for frame in scope.frames):
            self._report_unbound(ref, scope, kind)
        return ref, kind

    def _report_unbound(self, ref: ast.ColumnRef, scope: Scope, kind: ValueType) -> None:
        if not scope.frames:
            example = {"number": "sum", "boolean": "count"}.get(kind or "", "max")
            self.findings.error(f"{ref} needs an aggregate here, e.g. {example}({ref})", ref.span)
            return
        frame = scope.frames[-1]
        if frame.table is not None:
            message = (
                f"{ref} has no value on the current row: the iterated table {frame.table} "
                f"does not reach {ref.table}"
            )
        else:
            message = (
                f"{ref} has no value here: inside for each {frame.label} only the iterated columns "
                "have a current value"
            )
        self.findings.error(message, ref.span)

    def _name(self, expr: ast.Name | ast.MeasureRef | ast.LocalRef, scope: Scope) -> Bound:
        name = expr.name
        if name in scope.lets and not isinstance(expr, ast.MeasureRef):
            return ast.LocalRef(name, span=expr.span), scope.lets[name].type
        if name in self.measure_names and not isinstance(expr, ast.LocalRef):
            if self.refuse_in_report_filter(expr, scope, f"the measure {name}"):
                return expr, None
            self.referenced.append(name)
            return ast.MeasureRef(name, span=expr.span), self.measure_types.get(name)
        if name in self.model.tables:
            self.findings.error(
                f"{name} is a table, not a measure or a let value; count({name}) counts its rows", expr.span
            )
        else:
            known = [*self.measure_names, *scope.lets]
            self.findings.error(f"unknown measure {name}{did_you_mean(name, known)}", expr.span)
        return expr, None

    def _let(self, let: ast.Let, scope: Scope) -> Bound:
        span = let.name_span if let.name_span != NO_SPAN else let.span
        if let.name in self.measure_names:
            self.findings.error(f"let {let.name} reuses the name of a measure; pick another name", span)
        elif let.name in scope.lets:
            first = scope.lets[let.name].span
            self.findings.error(
                f"let {let.name} reuses the name of an enclosing let (at {first}); pick another name", span
            )
        value, value_type = self.bind(let.value, scope)
        inner = replace(scope, lets={**scope.lets, let.name: LetValue(value_type, span)})
        body, body_type = self.bind(let.body, inner)
        return replace(let, value=value, body=body), body_type
