"""The syntax tree of the measure language: frozen dataclasses, each with a source span.

Spans do not take part in equality, so two trees written alike compare equal wherever they
stand. The parser produces every node here except :class:`MeasureRef` and :class:`LocalRef`,
which the binder puts in place of :class:`Name` once it knows what a name means.
"""

from __future__ import annotations

import datetime as _dt
from dataclasses import dataclass, field
from typing import Literal

from measureport.errors import NO_SPAN, Span

AggregateFunction = Literal["sum", "mean", "min", "max", "count", "distinct"]
AGGREGATE_FUNCTIONS: tuple[str, ...] = ("sum", "mean", "min", "max", "count", "distinct")
ScalarFunction = Literal["coalesce", "abs", "round", "least", "greatest"]
SCALAR_FUNCTIONS: tuple[str, ...] = ("coalesce", "abs", "round", "least", "greatest")
Period = Literal["year", "quarter", "month"]
Unit = Literal["day", "month", "quarter", "year"]
BinaryOp = Literal["+", "-", "*", "/", "=", "!=", "<", "<=", ">", ">=", "and", "or"]
UnaryOp = Literal["-", "not"]


@dataclass(frozen=True)
class Node:
    """Base of every syntax tree node."""

    span: Span = field(default=NO_SPAN, compare=False, repr=False, kw_only=True)


class Expr(Node):
    """Base of every expression node."""


# --- literals ---------------------------------------------------------------------------


@dataclass(frozen=True)
class Number(Expr):
    """A numeric literal; ``value`` is an int when written without a point or exponent."""

    value: int | float


@dataclass(frozen=True)
class String(Expr):
    """A text literal, with doubled quotes already undone."""

    value: str


@dataclass(frozen=True)
class DateLiteral(Expr):
    """``date "2026-03-01"``."""

    value: _dt.date


@dataclass(frozen=True)
class Boolean(Expr):
    value: bool


@dataclass(frozen=True)
class Null(Expr):
    pass


# --- references ---------------------------------------------------------------------------


@dataclass(frozen=True)
class ColumnRef(Expr):
    """``table.column``."""

    table: str
    column: str

    def __str__(self) -> str:
        return f"{self.table}.{self.column}"


@dataclass(frozen=True)
class TableRef(Expr):
    """A bare name where the language expects a table: in ``count(t)``, after ``for each``/``clear``."""

    table: str


@dataclass(frozen=True)
class Name(Expr):
    """A bare name elsewhere: a measure or a ``let`` value, not yet resolved."""

    name: str


@dataclass(frozen=True)
class MeasureRef(Expr):
    """A reference to another measure (produced by the binder)."""

    name: str


@dataclass(frozen=True)
class LocalRef(Expr):
    """A reference to a ``let`` value (produced by the binder)."""

    name: str


# --- operators and scalar functions --------------------------------------------------------


@dataclass(frozen=True)
class Unary(Expr):
    op: UnaryOp
    operand: Expr


@dataclass(frozen=True)
class Binary(Expr):
    op: BinaryOp
    left: Expr
    right: Expr


@dataclass(frozen=True)
class InList(Expr):
    """``x in (a, b)`` / ``x not in (a, b)``."""

    operand: Expr
    items: tuple[Expr, ...]
    negated: bool = False


@dataclass(frozen=True)
class Between(Expr):
    """``x between low and high`` (inclusive)."""

    operand: Expr
    low: Expr
    high: Expr
    negated: bool = False


@dataclass(frozen=True)
class IsNull(Expr):
    """``x is null`` / ``x is not null``."""

    operand: Expr
    negated: bool = False


@dataclass(frozen=True)
class Like(Expr):
    """``x like "A%"`` (SQL wildcards ``%`` and ``_``, case-sensitive)."""

    operand: Expr
    pattern: Expr
    negated: bool = False


@dataclass(frozen=True)
class If(Expr):
    """``if C then A else B``; ``otherwise`` is None when ``else`` is left out (null)."""

    condition: Expr
    then: Expr
    otherwise: Expr | None = None


@dataclass(frozen=True)
class Call(Expr):
    """A scalar function: coalesce, abs, round, least, greatest."""

    function: ScalarFunction
    args: tuple[Expr, ...]


# --- aggregation and iteration --------------------------------------------------------------


@dataclass(frozen=True)
class Iteration(Node):
    """What ``for each`` walks: the rows of ``table``, or the distinct combinations of ``columns``.

    Exactly one of ``table`` and ``columns`` is set.
    """

    table: TableRef | None = None
    columns: tuple[ColumnRef, ...] = ()
    where: Expr | None = None


@dataclass(frozen=True)
class Aggregate(Expr):
    """``sum(c)``, ``count(t)``, or ``AGG(EXPR for each ...)`` when ``iteration`` is set."""

    function: AggregateFunction
    argument: Expr
    iteration: Iteration | None = None


@dataclass(frozen=True)
class Rank(Expr):
    """``rank(EXPR over t.c)``: dense rank, largest first unless ``ascending``."""

    expr: Expr
    over: ColumnRef
    ascending: bool = False


@dataclass(frozen=True)
class Single(Expr):
    """``single(t.c)``: the one visible value of the column, else null."""

    column: ColumnRef


@dataclass(frozen=True)
class Restricted(Expr):
    """``restricted(t.c)``: true when the current context filters the column."""

    column: ColumnRef


@dataclass(frozen=True)
class Let(Expr):
    """``let NAME = VALUE`` followed by the expression ``body`` that may use NAME."""

    name: str
    value: Expr
    body: Expr
    name_span: Span = field(default=NO_SPAN, compare=False, repr=False, kw_only=True)


# --- context revision ---------------------------------------------------------------------------


class Modifier(Node):
    """Base of the modifiers written after ``given``."""


@dataclass(frozen=True)
class Condition(Modifier):
    """A condition over columns of one table: replaces the filters on the columns it names."""

    expr: Expr


@dataclass(frozen=True)
class Narrow(Modifier):
    """``narrow COND``: intersects with the existing filters."""

    expr: Expr


@dataclass(frozen=True)
class Clear(Modifier):
    """``clear t``, ``clear t.c`` (``column`` set) or ``clear t but t.c1, t.c2`` (``keep`` set)."""

    table: str
    column: str | None = None
    keep: tuple[ColumnRef, ...] = ()


@dataclass(frozen=True)
class RowBinding(Modifier):
    """``row``: makes the row binding explicit; no change of its own."""


@dataclass(frozen=True)
class ToDate(Modifier):
    """``to_date(t.d, year|quarter|month [, start "MM-DD"])``."""

    column: ColumnRef
    period: Period
    start: str | None = None


@dataclass(frozen=True)
class Shift(Modifier):
    """``shift(t.d, N, day|month|quarter|year)``."""

    column: ColumnRef
    offset: int
    unit: Unit


@dataclass(frozen=True)
class Trailing(Modifier):
    """``trailing(t.d, N, day|month|year)``."""

    column: ColumnRef
    count: int
    unit: Unit


@dataclass(frozen=True)
class Given(Expr):
    """``body given m1, m2, ...``."""

    body: Expr
    modifiers: tuple[Modifier, ...]


# --- files ----------------------------------------------------------------------------------------


@dataclass(frozen=True)
class MeasureDef(Node):
    """``measure NAME = EXPRESSION`` with the comment block above it as its description."""

    name: str
    expr: Expr
    description: str | None = None
    name_span: Span = field(default=NO_SPAN, compare=False, repr=False, kw_only=True)


@dataclass(frozen=True)
class MeasureFile(Node):
    """All the measures of one file, in the order written."""

    path: str
    measures: tuple[MeasureDef, ...]
