"""Turns lark's parse tree into the syntax tree of :mod:`measureport.language.ast`, bottom-up.

One method per grammar rule (or alias). Checks that the grammar cannot express — valid dates,
the number of arguments of a function, the kind of a number — raise :class:`MeasureportError`
at the offending text.
"""

from __future__ import annotations

import datetime as dt
import math
import re
from typing import Any, cast

from lark import Token, Transformer, v_args
from lark.tree import Meta

from measureport.errors import MeasureportError, Span
from measureport.language import ast
from measureport.language.spans import joined, meta_span, token_span
from measureport.language.syntax_errors import unknown_function_message
from measureport.language.words import RESERVED_WORDS

_DATE_TEXT = re.compile(r"(\d{4})-(\d{2})-(\d{2})")
_START_TEXT = re.compile(r"(\d{2})-(\d{2})")
_TRAILING_WORD = re.compile(r"(?<![.\w])[A-Za-z_]\w*$")
_MONTH_NAMES = (
    "January", "February", "March", "April", "May", "June",
    "July", "August", "September", "October", "November", "December",
)  # fmt: skip

# How many values each scalar function takes: (fewest, most); None means no upper bound.
_ARITY: dict[str, tuple[int, int | None]] = {
    "coalesce": (2, None),
    "least": (2, None),
    "greatest": (2, None),
    "abs": (1, 1),
    "round": (2, 2),
}
_ARITY_RULE: dict[str, str] = {
    "coalesce": "`coalesce` needs at least two values: coalesce(x, 0)",
    "least": "`least` needs at least two values: least(a, b)",
    "greatest": "`greatest` needs at least two values: greatest(a, b)",
    "abs": "`abs` takes exactly one value: abs(x)",
    "round": "`round` takes a value and a number of digits: round(x, 2)",
}

Children = list[Any]


def text_value(token: Token) -> str:
    """The text of a ``"..."`` literal, with its doubled quotes undone."""
    return str(token.value)[1:-1].replace('""', '"')


@v_args(meta=True)
class TreeBuilder(Transformer[Token, Any]):
    """Builds syntax tree nodes whose spans point into ``file``."""

    def __init__(self, file: str, text: str) -> None:
        super().__init__()
        self.file = file
        self.lines = text.split("\n")

    # --- helpers -----------------------------------------------------------------------------

    def _span(self, meta: Meta) -> Span:
        return meta_span(self.file, meta)

    def _token_span(self, token: Token) -> Span:
        return token_span(self.file, token)

    def _error(self, message: str, span: Span, hint: str | None = None) -> MeasureportError:
        return MeasureportError(message, span, hint)

    def _binary(self, op: ast.BinaryOp, meta: Meta, children: Children) -> ast.Binary:
        left, right = children[0], children[-1]
        return ast.Binary(op, left, right, span=self._span(meta))

    # --- files ---------------------------------------------------------------------------------

    def measure_file(self, meta: Meta, children: Children) -> tuple[ast.MeasureDef, ...]:
        return tuple(children)

    def measure_def(self, meta: Meta, children: Children) -> ast.MeasureDef:
        name, expr = children
        return ast.MeasureDef(name.value, expr, span=self._span(meta), name_span=self._token_span(name))

    def expression(self, meta: Meta, children: Children) -> ast.Expr:
        return cast(ast.Expr, children[0])

    # --- loose forms ---------------------------------------------------------------------------

    def let_expr(self, meta: Meta, children: Children) -> ast.Let:
        name, value, body = children
        self._check_not_a_call(value.span)
        return ast.Let(name.value, value, body, span=self._span(meta), name_span=self._token_span(name))

    def _check_not_a_call(self, value: Span) -> None:
        # A name written straight against `(` is meant as a function call, even though the
        # grammar can read the parentheses as the body of a `let`.
        line = self.lines[value.end_line - 1]
        if line[value.end_column : value.end_column + 1] != "(":
            return
        word = _TRAILING_WORD.search(line[: value.end_column])
        if word is not None and word.group(0) not in RESERVED_WORDS:
            span = Span(self.file, value.end_line, word.start() + 1, value.end_line, value.end_column)
            raise self._error(unknown_function_message(word.group(0)), span)

    def if_expr(self, meta: Meta, children: Children) -> ast.If:
        condition, then, otherwise = children
        return ast.If(condition, then, otherwise, span=self._span(meta))

    def given(self, meta: Meta, children: Children) -> ast.Given:
        body, *modifiers = children
        return ast.Given(body, _merge_kept_columns(modifiers), span=self._span(meta))

    # --- modifiers -----------------------------------------------------------------------------

    def condition(self, meta: Meta, children: Children) -> ast.Condition:
        return ast.Condition(children[0], span=self._span(meta))

    def narrow(self, meta: Meta, children: Children) -> ast.Narrow:
        return ast.Narrow(children[0], span=self._span(meta))

    def clear_table(self, meta: Meta, children: Children) -> ast.Clear:
        return ast.Clear(children[0].value, span=self._span(meta))

    def clear_column(self, meta: Meta, children: Children) -> ast.Clear:
        column: ast.ColumnRef = children[0]
        return ast.Clear(column.table, column.column, span=self._span(meta))

    def clear_but(self, meta: Meta, children: Children) -> ast.Clear:
        table, kept = children
        return ast.Clear(table.value, keep=(kept,), span=self._span(meta))

    def row(self, meta: Meta, children: Children) -> ast.RowBinding:
        return ast.RowBinding(span=self._span(meta))

    def to_date(self, meta: Meta, children: Children) -> ast.ToDate:
        column, period, start = children
        start_text = None
        if start is not None:
            if period.value == "month":
                raise self._error(
                    "`start` applies to a year or a quarter, not to a month", self._token_span(start)
                )
            start_text = self._start_text(start)
        return ast.ToDate(column, period.value, start_text, span=self._span(meta))

    def _start_text(self, token: Token) -> str:
        text = text_value(token)
        match = _START_TEXT.fullmatch(text)
        if match is None:
            raise self._error('a start must look like start "07-01" (month-day)', self._token_span(token))
        month, day = int(match[1]), int(match[2])
        try:
            dt.date(2001, month, day)  # a year without 29 February: a start must exist every year
        except ValueError:
            raise self._error(f'"{text}" is not a day that every year has', self._token_span(token)) from None
        return text

    def shift(self, meta: Meta, children: Children) -> ast.Shift:
        column, offset, unit = children
        return ast.Shift(column, offset, unit.value, span=self._span(meta))

    def trailing(self, meta: Meta, children: Children) -> ast.Trailing:
        column, count, unit = children
        periods = self._whole_number(count, "the number of periods")
        if periods < 1:
            raise self._error("the number of periods must be at least 1", self._token_span(count))
        return ast.Trailing(column, periods, unit.value, span=self._span(meta))

    def signed_count(self, meta: Meta, children: Children) -> int:
        minus, number = children
        value = self._whole_number(number, "the shift")
        return -value if minus is not None else value

    def _whole_number(self, token: Token, what: str) -> int:
        if not token.value.isdigit():
            raise self._error(f"{what} must be a whole number, such as 1", self._token_span(token))
        return int(token.value)

    def period(self, meta: Meta, children: Children) -> Token:
        return cast(Token, children[0])

    def unit(self, meta: Meta, children: Children) -> Token:
        return cast(Token, children[0])

    # --- logic and comparison ------------------------------------------------------------------

    def or_(self, meta: Meta, children: Children) -> ast.Binary:
        return self._binary("or", meta, children)

    def and_(self, meta: Meta, children: Children) -> ast.Binary:
        return self._binary("and", meta, children)

    def not_(self, meta: Meta, children: Children) -> ast.Unary:
        return ast.Unary("not", children[0], span=self._span(meta))

    def eq(self, meta: Meta, children: Children) -> ast.Binary:
        return self._binary("=", meta, children)

    def ne(self, meta: Meta, children: Children) -> ast.Binary:
        return self._binary("!=", meta, children)

    def lt(self, meta: Meta, children: Children) -> ast.Binary:
        return self._binary("<", meta, children)

    def le(self, meta: Meta, children: Children) -> ast.Binary:
        return self._binary("<=", meta, children)

    def gt(self, meta: Meta, children: Children) -> ast.Binary:
        return self._binary(">", meta, children)

    def ge(self, meta: Meta, children: Children) -> ast.Binary:
        return self._binary(">=", meta, children)

    def in_list(self, meta: Meta, children: Children) -> ast.InList:
        operand, *items = children
        return ast.InList(operand, tuple(items), span=self._span(meta))

    def not_in_list(self, meta: Meta, children: Children) -> ast.InList:
        operand, *items = children
        return ast.InList(operand, tuple(items), negated=True, span=self._span(meta))

    def between(self, meta: Meta, children: Children) -> ast.Between:
        operand, low, high = children
        return ast.Between(operand, low, high, span=self._span(meta))

    def not_between(self, meta: Meta, children: Children) -> ast.Between:
        operand, low, high = children
        return ast.Between(operand, low, high, negated=True, span=self._span(meta))

    def is_null(self, meta: Meta, children: Children) -> ast.IsNull:
        return ast.IsNull(children[0], span=self._span(meta))

    def is_not_null(self, meta: Meta, children: Children) -> ast.IsNull:
        return ast.IsNull(children[0], negated=True, span=self._span(meta))

    def like(self, meta: Meta, children: Children) -> ast.Like:
        operand, pattern = children
        return ast.Like(operand, pattern, span=self._span(meta))

    def not_like(self, meta: Meta, children: Children) -> ast.Like:
        operand, pattern = children
        return ast.Like(operand, pattern, negated=True, span=self._span(meta))

    # --- arithmetic ----------------------------------------------------------------------------

    def add(self, meta: Meta, children: Children) -> ast.Binary:
        return self._binary("+", meta, children)

    def sub(self, meta: Meta, children: Children) -> ast.Binary:
        return self._binary("-", meta, children)

    def mul(self, meta: Meta, children: Children) -> ast.Binary:
        return self._binary("*", meta, children)

    def div(self, meta: Meta, children: Children) -> ast.Binary:
        return self._binary("/", meta, children)

    def neg(self, meta: Meta, children: Children) -> ast.Expr:
        operand = children[-1]
        if isinstance(operand, ast.Number):
            # A minus written before a number is part of the literal: -3 is the number -3.
            return ast.Number(-operand.value, span=self._span(meta))
        return ast.Unary("-", operand, span=self._span(meta))

    # --- primaries -----------------------------------------------------------------------------

    def column(self, meta: Meta, children: Children) -> ast.ColumnRef:
        table, column = children
        return ast.ColumnRef(table.value, column.value, span=self._span(meta))

    def column_name(self, meta: Meta, children: Children) -> Token:
        return cast(Token, children[0])

    def name(self, meta: Meta, children: Children) -> ast.Name:
        return ast.Name(children[0].value, span=self._span(meta))

    def number(self, meta: Meta, children: Children) -> ast.Number:
        token: Token = children[0]
        text = token.value
        if text.isdigit():
            return ast.Number(int(text), span=self._span(meta))
        value = float(text)
        if math.isinf(value):
            raise self._error(f"the number {text} is too large", self._token_span(token))
        return ast.Number(value, span=self._span(meta))

    def string(self, meta: Meta, children: Children) -> ast.String:
        return ast.String(text_value(children[0]), span=self._span(meta))

    def date(self, meta: Meta, children: Children) -> ast.DateLiteral:
        token: Token = children[0]
        text = text_value(token)
        match = _DATE_TEXT.fullmatch(text)
        if match is None:
            raise self._error('a date literal must look like date "2026-03-01"', self._span(meta))
        year, month, day = (int(part) for part in match.groups())
        try:
            value = dt.date(year, month, day)
        except ValueError:
            raise self._error(_bad_date_message(text, year, month, day), self._span(meta)) from None
        return ast.DateLiteral(value, span=self._span(meta))

    def true(self, meta: Meta, children: Children) -> ast.Boolean:
        return ast.Boolean(True, span=self._span(meta))

    def false(self, meta: Meta, children: Children) -> ast.Boolean:
        return ast.Boolean(False, span=self._span(meta))

    def null(self, meta: Meta, children: Children) -> ast.Null:
        return ast.Null(span=self._span(meta))

    def aggregate_function(self, meta: Meta, children: Children) -> Token:
        return cast(Token, children[0])

    def scalar_function(self, meta: Meta, children: Children) -> Token:
        return cast(Token, children[0])

    def direction(self, meta: Meta, children: Children) -> Token:
        return cast(Token, children[0])

    def aggregate(self, meta: Meta, children: Children) -> ast.Aggregate:
        function, argument, iteration = children
        if function.value == "count" and iteration is None and isinstance(argument, ast.Name):
            # `count(t)`: a bare name inside count is a table (LANGUAGE.md section 2).
            argument = ast.TableRef(argument.name, span=argument.span)
        return ast.Aggregate(function.value, argument, iteration, span=self._span(meta))

    def iterate_table(self, meta: Meta, children: Children) -> ast.Iteration:
        table, where = children
        return ast.Iteration(
            table=ast.TableRef(table.value, span=self._token_span(table)), where=where, span=self._span(meta)
        )

    def iterate_columns(self, meta: Meta, children: Children) -> ast.Iteration:
        *columns, where = children
        return ast.Iteration(columns=tuple(columns), where=where, span=self._span(meta))

    def call(self, meta: Meta, children: Children) -> ast.Call:
        function, *args = children
        fewest, most = _ARITY[function.value]
        if len(args) < fewest or (most is not None and len(args) > most):
            raise self._error(_ARITY_RULE[function.value], self._span(meta))
        return ast.Call(function.value, tuple(args), span=self._span(meta))

    def rank(self, meta: Meta, children: Children) -> ast.Rank:
        expr, over, direction = children
        ascending = direction is not None and direction.value == "ascending"
        return ast.Rank(expr, over, ascending, span=self._span(meta))

    def single(self, meta: Meta, children: Children) -> ast.Single:
        return ast.Single(children[0], span=self._span(meta))

    def restricted(self, meta: Meta, children: Children) -> ast.Restricted:
        return ast.Restricted(children[0], span=self._span(meta))


def _merge_kept_columns(modifiers: list[ast.Modifier]) -> tuple[ast.Modifier, ...]:
    """Fold the bare columns that follow `clear t but t.c1` into its kept list.

    The grammar reads `clear t but t.c1, t.c2` as a clear keeping t.c1 and then a condition
    `t.c2`; a bare column right after such a clear extends the kept list instead
    (docs/semantics-choices.md, "Syntax"). A column in parentheses is a condition.
    """
    merged: list[ast.Modifier] = []
    for modifier in modifiers:
        previous = merged[-1] if merged else None
        if (
            isinstance(previous, ast.Clear)
            and previous.keep
            and isinstance(modifier, ast.Condition)
            and isinstance(modifier.expr, ast.ColumnRef)
            and modifier.span == modifier.expr.span
        ):
            merged[-1] = ast.Clear(
                previous.table,
                keep=(*previous.keep, modifier.expr),
                span=joined(previous.span, modifier.span),
            )
        else:
            merged.append(modifier)
    for modifier in merged:
        if isinstance(modifier, ast.Clear):
            _check_kept_columns(modifier)
    return tuple(merged)


def _check_kept_columns(clear: ast.Clear) -> None:
    for kept in clear.keep:
        if kept.table != clear.table:
            raise MeasureportError(
                f"`clear {clear.table} but` can only keep columns of `{clear.table}`, not `{kept}`",
                kept.span,
            )


def _bad_date_message(text: str, year: int, month: int, day: int) -> str:
    if not 1 <= month <= 12:
        return f'"{text}" is not a date: there is no month {month}'
    if year < 1:
        return f'"{text}" is not a date: years start at 1'
    return f'"{text}" is not a date: {_MONTH_NAMES[month - 1]} {year} has no day {day}'
