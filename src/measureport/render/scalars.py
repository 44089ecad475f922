"""Plan scalars to sqlglot expressions, through sqlglot's node classes only.

Every non-leaf operand goes through :func:`operand`, which parenthesises it: sqlglot adds no
parentheses of its own to a hand-built tree. The language's ``/`` is
``CAST(a AS DOUBLE) / NULLIF(b, 0)``: true division, null on a zero divisor, in every dialect.
"""

from __future__ import annotations

import datetime as dt
import functools
import math
from collections.abc import Callable, Mapping
from typing import NamedTuple

from sqlglot import exp

from measureport.errors import MeasureportError
from measureport.plan import scalar as S


class ColumnRef(NamedTuple):
    """A column of a FROM item, by the item's alias: its sqlglot node is built where it is used,
    so the many columns a relation offers and nobody reads cost no nodes."""

    table: str
    name: str

    def build(self) -> exp.Column:
        table = exp.Identifier(this=self.table, quoted=True)
        return exp.Column(this=exp.Identifier(this=self.name, quoted=True), table=table)


ColumnLookup = Mapping[str, exp.Expression | ColumnRef]
SubqueryRenderer = Callable[[object], exp.Expression]

_COMPARE: dict[str, type[exp.Expression]] = {
    "=": exp.EQ,
    "!=": exp.NEQ,
    "<": exp.LT,
    "<=": exp.LTE,
    ">": exp.GT,
    ">=": exp.GTE,
}
_ARITH: dict[str, type[exp.Expression]] = {"+": exp.Add, "-": exp.Sub, "*": exp.Mul}
_KIND_TYPES = {"number": "DOUBLE", "text": "TEXT", "date": "DATE", "boolean": "BOOLEAN"}
_LEAVES = (exp.Column, exp.Literal, exp.Null, exp.Boolean, exp.Func, exp.Paren)


@functools.cache
def _parsed_type(sql: str) -> exp.DataType:
    return exp.DataType.build(sql)


def sql_type(sql: str) -> exp.DataType:
    """A fresh SQL type node for the type written ``sql`` (each text is parsed once)."""
    return _parsed_type(sql).copy()


def cast(node: exp.Expression, sql: str) -> exp.Cast:
    """``CAST(node AS sql)``, taking ``node`` itself into the tree (no copy of it is made)."""
    return exp.cast(node, sql_type(sql), copy=False)


def operand(node: exp.Expression) -> exp.Expression:
    """``node`` wrapped in parentheses unless it is a leaf or a function call."""
    if isinstance(node, _LEAVES):
        return node
    return exp.Paren(this=node)


def literal(value: S.ConstValue, kind: str | None = None) -> exp.Expression:
    """A SQL literal for a Python value; numbers are formatted here, never taken as text."""
    if value is None:
        if kind in _KIND_TYPES:
            return cast(exp.Null(), _KIND_TYPES[kind])
        return exp.Null()
    if isinstance(value, bool):
        return exp.Boolean(this=value)
    if isinstance(value, int):
        return exp.Literal.number(str(value)) if value >= 0 else exp.Neg(this=exp.Literal.number(str(-value)))
    if isinstance(value, float):
        if not math.isfinite(value):
            raise MeasureportError(f"the number {value} cannot be written in SQL")
        number = exp.Literal.number(repr(abs(value)))
        return number if value >= 0 else exp.Neg(this=number)
    if isinstance(value, dt.date):
        return cast(exp.Literal.string(value.isoformat()), "DATE")
    return exp.Literal.string(value)


class ScalarRenderer:
    """Renders the scalars of one relation: ``columns`` gives the SQL of each plan column."""

    def __init__(self, columns: ColumnLookup, subquery: SubqueryRenderer) -> None:
        self.columns = columns
        self.subquery = subquery

    def render(self, node: S.Scalar) -> exp.Expression:
        method: Callable[[S.Scalar], exp.Expression] | None = getattr(self, "_" + type(node).__name__, None)
        if method is None:
            raise NotImplementedError(f"no SQL for plan scalar {type(node).__name__}")
        return method(node)

    def _op(self, node: S.Scalar) -> exp.Expression:
        return operand(self.render(node))

    def _Col(self, node: S.Col) -> exp.Expression:
        value = self.columns[node.name]
        if isinstance(value, ColumnRef):
            return value.build()
        if isinstance(value, exp.Column) and set(value.args) <= {"this", "table"}:
            # A fresh reference is much cheaper to build than a deep copy of one.
            table = value.args.get("table")
            return exp.Column(
                this=exp.Identifier(this=value.name, quoted=True),
                table=exp.Identifier(this=table.name, quoted=True) if table is not None else None,
            )
        return value.copy()

    def _Const(self, node: S.Const) -> exp.Expression:
        return literal(node.value, node.kind)

    def _TypedNull(self, node: S.TypedNull) -> exp.Expression:
        return cast(exp.Null(), node.sql)

    def _Arith(self, node: S.Arith) -> exp.Expression:
        if node.op == "/":
            numerator = cast(self.render(node.left), "DOUBLE")
            divisor = exp.Nullif(this=self.render(node.right), expression=exp.Literal.number("0"))
            return exp.Div(this=numerator, expression=divisor)
        return _ARITH[node.op](this=self._op(node.left), expression=self._op(node.right))

    def _Negate(self, node: S.Negate) -> exp.Expression:
        return exp.Neg(this=self._op(node.operand))

    def _Compare(self, node: S.Compare) -> exp.Expression:
        return _COMPARE[node.op](this=self._op(node.left), expression=self._op(node.right))

    def _NullSafeEq(self, node: S.NullSafeEq) -> exp.Expression:
        return exp.NullSafeEQ(this=self._op(node.left), expression=self._op(node.right))

    def _And(self, node: S.And) -> exp.Expression:
        return self._chain(exp.And, node.items)

    def _Or(self, node: S.Or) -> exp.Expression:
        return self._chain(exp.Or, node.items)

    def _chain(self, kind: type[exp.Expression], items: tuple[S.Scalar, ...]) -> exp.Expression:
        result = self._op(items[0])
        for item in items[1:]:
            result = kind(this=result, expression=self._op(item))
        return result

    def _Not(self, node: S.Not) -> exp.Expression:
        return exp.Not(this=self._op(node.operand))

    def _negated(self, node: exp.Expression, negated: bool) -> exp.Expression:
        return exp.Not(this=exp.Paren(this=node)) if negated else node

    def _InValues(self, node: S.InValues) -> exp.Expression:
        test = exp.In(this=self._op(node.operand), expressions=[self._op(i) for i in node.items])
        return self._negated(test, node.negated)

    def _BetweenValues(self, node: S.BetweenValues) -> exp.Expression:
        test = exp.Between(this=self._op(node.operand), low=self._op(node.low), high=self._op(node.high))
        return self._negated(test, node.negated)

    def _IsNullTest(self, node: S.IsNullTest) -> exp.Expression:
        return self._negated(exp.Is(this=self._op(node.operand), expression=exp.Null()), node.negated)

    def _LikeTest(self, node: S.LikeTest) -> exp.Expression:
        return self._negated(
            exp.Like(this=self._op(node.operand), expression=self._op(node.pattern)), node.negated
        )

    def _Case(self, node: S.Case) -> exp.Expression:
        ifs = [exp.If(this=self.render(c), true=self.render(v)) for c, v in node.whens]
        return exp.Case(ifs=ifs, default=self.render(node.otherwise))

    def _Func(self, node: S.Func) -> exp.Expression:
        args = [self.render(a) for a in node.args]
        if node.name == "coalesce":
            return exp.Coalesce(this=args[0], expressions=args[1:])
        if node.name == "abs":
            return exp.Abs(this=args[0])
        if node.name == "round":
            digits = args[1] if len(args) > 1 else exp.Literal.number("0")
            return exp.Round(this=cast(args[0], "DOUBLE"), decimals=digits)
        if node.name == "least":
            return exp.Least(this=args[0], expressions=args[1:], ignore_nulls=True)
        return exp.Greatest(this=args[0], expressions=args[1:], ignore_nulls=True)

    def _DatePartOf(self, node: S.DatePartOf) -> exp.Expression:
        kinds: dict[str, type[exp.Expression]] = {"year": exp.Year, "month": exp.Month, "day": exp.Day}
        return kinds[node.part](this=self.render(node.operand))

    def _MakeDate(self, node: S.MakeDate) -> exp.Expression:
        return exp.DateFromParts(
            year=self.render(node.year), month=self.render(node.month), day=self.render(node.day)
        )

    def _AddDays(self, node: S.AddDays) -> exp.Expression:
        moved = exp.DateAdd(this=self._op(node.operand), expression=self._op(node.days), unit=exp.var("DAY"))
        return cast(moved, "DATE")

    def _LastDayOf(self, node: S.LastDayOf) -> exp.Expression:
        return exp.LastDay(this=self.render(node.operand))

    def _IntDiv(self, node: S.IntDiv) -> exp.Expression:
        return exp.IntDiv(this=self._op(node.left), expression=self._op(node.right))

    def _Mod(self, node: S.Mod) -> exp.Expression:
        return exp.Mod(this=self._op(node.left), expression=self._op(node.right))

    def _AggCall(self, node: S.AggCall) -> exp.Expression:
        if node.func == "count_rows":
            return exp.Count(this=exp.Star())
        assert node.argument is not None
        arg = self.render(node.argument)
        if node.func == "sum":
            return exp.Sum(this=arg)
        if node.func == "mean":
            return exp.Avg(this=cast(arg, "DOUBLE"))
        if node.func == "min":
            return exp.Min(this=arg)
        if node.func == "max":
            return exp.Max(this=arg)
        if node.func == "count":
            return exp.Count(this=arg)
        return exp.Count(this=exp.Distinct(expressions=[arg]))

    def _Exists(self, node: S.Exists) -> exp.Expression:
        return exp.Exists(this=self.subquery(node.node))
