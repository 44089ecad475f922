"""Scalar expressions of the plan: values computed per row of a relation.

They name the columns of the relation they are evaluated on (``Col``) and never hold SQL text.
Aggregate calls (``AggCall``) may only appear as the values of an :class:`Aggregate` node.
"""

from __future__ import annotations

import dataclasses
import datetime as _dt
from collections.abc import Callable, Sequence
from dataclasses import dataclass
from typing import Literal

from measureport.model.schema import ValueKind

ConstValue = int | float | str | bool | _dt.date | None
ArithOp = Literal["+", "-", "*", "/"]
CompareOp = Literal["=", "!=", "<", "<=", ">", ">="]
AggFunc = Literal["sum", "mean", "min", "max", "count", "count_distinct", "count_rows"]
DatePart = Literal["year", "month", "day"]


class Scalar:
    # Subclasses are frozen dataclasses; ``cache_hashes`` below keeps each one's hash, since
    # plans are deep trees that are used as dictionary keys many times over.
    """Base of every scalar expression."""

    def children(self) -> tuple[Scalar, ...]:
        return ()


@dataclass(frozen=True)
class Col(Scalar):
    """The value of column ``name`` of the relation."""

    name: str


@dataclass(frozen=True)
class Const(Scalar):
    """A literal; ``kind`` says how to type a null or a date."""

    value: ConstValue
    kind: ValueKind | None = None


@dataclass(frozen=True)
class TypedNull(Scalar):
    """A null of a model type (``integer``, ``decimal(12,2)``, ``text``, ...)."""

    sql: str


@dataclass(frozen=True)
class Arith(Scalar):
    """``+ - * /``; ``/`` is true division that gives null on a zero or null divisor."""

    op: ArithOp
    left: Scalar
    right: Scalar

    def children(self) -> tuple[Scalar, ...]:
        return (self.left, self.right)


@dataclass(frozen=True)
class Negate(Scalar):
    operand: Scalar

    def children(self) -> tuple[Scalar, ...]:
        return (self.operand,)


@dataclass(frozen=True)
class Compare(Scalar):
    """A comparison with SQL null semantics."""

    op: CompareOp
    left: Scalar
    right: Scalar

    def children(self) -> tuple[Scalar, ...]:
        return (self.left, self.right)


@dataclass(frozen=True)
class NullSafeEq(Scalar):
    """True when both sides are equal or both are null; never null."""

    left: Scalar
    right: Scalar

    def children(self) -> tuple[Scalar, ...]:
        return (self.left, self.right)


@dataclass(frozen=True)
class And(Scalar):
    items: tuple[Scalar, ...]

    def children(self) -> tuple[Scalar, ...]:
        return self.items


@dataclass(frozen=True)
class Or(Scalar):
    items: tuple[Scalar, ...]

    def children(self) -> tuple[Scalar, ...]:
        return self.items


@dataclass(frozen=True)
class Not(Scalar):
    operand: Scalar

    def children(self) -> tuple[Scalar, ...]:
        return (self.operand,)


@dataclass(frozen=True)
class InValues(Scalar):
    operand: Scalar
    items: tuple[Scalar, ...]
    negated: bool = False

    def children(self) -> tuple[Scalar, ...]:
        return (self.operand, *self.items)


@dataclass(frozen=True)
class BetweenValues(Scalar):
    operand: Scalar
    low: Scalar
    high: Scalar
    negated: bool = False

    def children(self) -> tuple[Scalar, ...]:
        return (self.operand, self.low, self.high)


@dataclass(frozen=True)
class IsNullTest(Scalar):
    operand: Scalar
    negated: bool = False

    def children(self) -> tuple[Scalar, ...]:
        return (self.operand,)


@dataclass(frozen=True)
class LikeTest(Scalar):
    operand: Scalar
    pattern: Scalar
    negated: bool = False

    def children(self) -> tuple[Scalar, ...]:
        return (self.operand, self.pattern)


@dataclass(frozen=True)
class Case(Scalar):
    """``CASE WHEN c1 THEN v1 ... ELSE otherwise END``."""

    whens: tuple[tuple[Scalar, Scalar], ...]
    otherwise: Scalar = Const(None)

    def children(self) -> tuple[Scalar, ...]:
        flat: list[Scalar] = []
        for cond, value in self.whens:
            flat += [cond, value]
        return (*flat, self.otherwise)


@dataclass(frozen=True)
class Func(Scalar):
    """A scalar function of the language: coalesce, abs, round, least, greatest."""

    name: Literal["coalesce", "abs", "round", "least", "greatest"]
    args: tuple[Scalar, ...]

    def children(self) -> tuple[Scalar, ...]:
        return self.args


@dataclass(frozen=True)
class DatePartOf(Scalar):
    """The year, month or day-of-month number of a date."""

    part: DatePart
    operand: Scalar

    def children(self) -> tuple[Scalar, ...]:
        return (self.operand,)


@dataclass(frozen=True)
class MakeDate(Scalar):
    """The date of the given year, month and day numbers (all valid)."""

    year: Scalar
    month: Scalar
    day: Scalar

    def children(self) -> tuple[Scalar, ...]:
        return (self.year, self.month, self.day)


@dataclass(frozen=True)
class AddDays(Scalar):
    """A date moved by a whole number of days."""

    operand: Scalar
    days: Scalar

    def children(self) -> tuple[Scalar, ...]:
        return (self.operand, self.days)


@dataclass(frozen=True)
class LastDayOf(Scalar):
    """The last day of the month of a date."""

    operand: Scalar

    def children(self) -> tuple[Scalar, ...]:
        return (self.operand,)


@dataclass(frozen=True)
class IntDiv(Scalar):
    """Floor division of two integers (both operands non-negative where it is used)."""

    left: Scalar
    right: Scalar

    def children(self) -> tuple[Scalar, ...]:
        return (self.left, self.right)


@dataclass(frozen=True)
class Mod(Scalar):
    """Remainder of integer division, for a non-negative left operand."""

    left: Scalar
    right: Scalar

    def children(self) -> tuple[Scalar, ...]:
        return (self.left, self.right)


@dataclass(frozen=True)
class AggCall(Scalar):
    """An aggregate over the rows of a group; ``argument`` is None for ``count_rows``."""

    func: AggFunc
    argument: Scalar | None = None

    def children(self) -> tuple[Scalar, ...]:
        return () if self.argument is None else (self.argument,)


@dataclass(frozen=True)
class Exists(Scalar):
    """True when the relation ``node`` (a plan node) has at least one row."""

    node: object

    def children(self) -> tuple[Scalar, ...]:
        return ()


def columns_used(expr: Scalar) -> set[str]:
    """Names of every column the expression reads."""
    found: set[str] = set()
    stack = [expr]
    while stack:
        item = stack.pop()
        if isinstance(item, Col):
            found.add(item.name)
        stack.extend(item.children())
    return found


def conjunction(items: Sequence[Scalar]) -> Scalar | None:
    """The AND of ``items`` (None when empty, the item itself when single)."""
    if not items:
        return None
    if len(items) == 1:
        return items[0]
    return And(tuple(items))


def substitute(expr: Scalar, mapping: dict[str, Scalar]) -> Scalar:
    """The expression with each column named in ``mapping`` replaced by the mapped expression."""

    def swap(node: Scalar) -> Scalar | None:
        if isinstance(node, Col):
            return mapping.get(node.name, node)
        return None

    return transform(expr, swap)


def transform(expr: Scalar, fn: Callable[[Scalar], Scalar | None]) -> Scalar:
    """Rebuild ``expr`` top-down: where ``fn`` returns a node it replaces the subtree, where it
    returns None the node is kept and its children are transformed."""
    replaced = fn(expr)
    if replaced is not None:
        return replaced
    if not expr.children() or isinstance(expr, Exists):
        return expr
    changed = {f.name: _transform_field(getattr(expr, f.name), fn) for f in dataclasses.fields(expr)}  # type: ignore[arg-type]
    return type(expr)(**changed)


def _transform_field(value: object, fn: Callable[[Scalar], Scalar | None]) -> object:
    if isinstance(value, Scalar):
        return transform(value, fn)
    if isinstance(value, tuple):
        return tuple(_transform_field(item, fn) for item in value)
    return value


def _cache_hash(cls: type) -> None:
    computed: Callable[[object], int] = vars(cls)["__hash__"]

    def cached(self: object) -> int:
        found: int | None = self.__dict__.get("_hash")
        if found is None:
            found = computed(self)
            object.__setattr__(self, "_hash", found)
        return found

    cls.__hash__ = cached  # type: ignore[assignment]


def _all_subclasses(cls: type) -> list[type]:
    found: list[type] = []
    sub: type
    for sub in cls.__subclasses__():
        found += [sub, *_all_subclasses(sub)]
    return found


for _cls in _all_subclasses(Scalar):
    if "__hash__" in vars(_cls) and vars(_cls)["__hash__"] is not None:
        _cache_hash(_cls)
