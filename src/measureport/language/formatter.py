"""Canonical text of syntax trees: parses back to an equal tree, with only the parentheses needed.

Used for `explain`, for hashing measures and in messages. The rules mirror grammar.lark: each
node has a binding level; a child looser than its place allows is put in parentheses, and so is
a child whose last part would swallow what follows it (an `if` without `else` before `else` or
`given`, a `given` with several modifiers inside a list of arguments).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from measureport.language import ast

# Binding levels, loosest first (grammar.lark).
LET, GIVEN, IF, OR, AND, NOT, COMPARISON, SUM, PRODUCT, UNARY, PRIMARY = range(11)

_BINARY_LEVELS: dict[str, int] = {
    "or": OR,
    "and": AND,
    "=": COMPARISON,
    "!=": COMPARISON,
    "<": COMPARISON,
    "<=": COMPARISON,
    ">": COMPARISON,
    ">=": COMPARISON,
    "+": SUM,
    "-": SUM,
    "*": PRODUCT,
    "/": PRODUCT,
}


@dataclass(frozen=True)
class _Piece:
    """Formatted text, the level it binds at, and whether it ends in an `if` without `else`."""

    text: str
    level: int
    open_if: bool = False

    def parenthesized(self) -> _Piece:
        return _Piece(f"({self.text})", PRIMARY)


def format_expr(expr: ast.Expr) -> str:
    """The canonical text of an expression."""
    return _format(expr, in_list=False).text


def format_measure(measure: ast.MeasureDef) -> str:
    """``measure NAME = EXPRESSION``, preceded by its description as `#` comment lines.

    An expression over several lines (a `let`) continues on lines indented by two spaces.
    """
    lines = []
    if measure.description:
        lines = [f"# {line}" if line else "#" for line in measure.description.split("\n")]
    first, *rest = format_expr(measure.expr).split("\n")
    lines.append(f"measure {measure.name} = {first}")
    lines.extend(f"  {line}" for line in rest)  # continuation lines of a `let`, indented
    return "\n".join(lines)


def _at_least(expr: ast.Expr, level: int, in_list: bool) -> _Piece:
    """``expr`` formatted for a place that allows binding levels from ``level`` up."""
    piece = _format(expr, in_list)
    return piece.parenthesized() if piece.level < level else piece


def _closed(piece: _Piece) -> _Piece:
    """``piece`` safe to be followed by `else` or `given`."""
    return piece.parenthesized() if piece.open_if else piece


def _format(expr: ast.Expr, in_list: bool) -> _Piece:
    """``in_list``: the expression is an item of a comma-separated list, where a comma ends it."""
    match expr:
        case ast.Let():
            return _let(expr, in_list)
        case ast.Given():
            return _given(expr, in_list)
        case ast.If():
            return _if(expr, in_list)
        case ast.Binary():
            return _binary(expr)
        case ast.Unary(op="not"):
            return _Piece(f"not {_at_least(expr.operand, NOT, in_list).text}", NOT)
        case ast.Unary():
            operand = _at_least(expr.operand, UNARY, in_list).text
            return _Piece(f"- {operand}" if operand.startswith("-") else f"-{operand}", UNARY)
        case ast.InList():
            items = ", ".join(_format(item, in_list=True).text for item in expr.items)
            keyword = "not in" if expr.negated else "in"
            return _Piece(f"{_operand(expr.operand)} {keyword} ({items})", COMPARISON)
        case ast.Between():
            keyword = "not between" if expr.negated else "between"
            return _Piece(
                f"{_operand(expr.operand)} {keyword} {_operand(expr.low)} and {_operand(expr.high)}",
                COMPARISON,
            )
        case ast.IsNull():
            keyword = "is not null" if expr.negated else "is null"
            return _Piece(f"{_operand(expr.operand)} {keyword}", COMPARISON)
        case ast.Like():
            keyword = "not like" if expr.negated else "like"
            return _Piece(f"{_operand(expr.operand)} {keyword} {_operand(expr.pattern)}", COMPARISON)
        case _:
            return _primary(expr)


def _operand(expr: ast.Expr) -> str:
    """An operand of a comparison: anything that binds at least as tightly as `+`."""
    return _at_least(expr, SUM, in_list=False).text


def _let(expr: ast.Let, in_list: bool) -> _Piece:
    value = _format(expr.value, in_list)
    body = _format(expr.body, in_list)
    if body.text.startswith(("-", "not ")):
        # The value would continue into a body that starts with `-` or `not`.
        body = body.parenthesized()
    return _Piece(f"let {expr.name} = {value.text}\n{body.text}", LET, body.open_if)


def _given(expr: ast.Given, in_list: bool) -> _Piece:
    modifiers = _modifiers(expr.modifiers)
    body = _closed(_at_least(expr.body, GIVEN, in_list))
    piece = _Piece(f"{body.text} given {', '.join(modifiers)}", GIVEN)
    if in_list and (len(expr.modifiers) > 1 or _has_comma(expr.modifiers[0])):
        return piece.parenthesized()
    return piece


def _has_comma(modifier: ast.Modifier) -> bool:
    return isinstance(modifier, ast.Clear) and len(modifier.keep) > 1


def _if(expr: ast.If, in_list: bool) -> _Piece:
    condition = _format(expr.condition, in_list=False)
    then = _format(expr.then, in_list)
    if expr.otherwise is None:
        return _Piece(f"if {condition.text} then {then.text}", IF, open_if=True)
    otherwise = _at_least(expr.otherwise, IF, in_list)
    text = f"if {condition.text} then {_closed(then).text} else {otherwise.text}"
    return _Piece(text, IF, otherwise.open_if)


def _binary(expr: ast.Binary) -> _Piece:
    level = _BINARY_LEVELS[expr.op]
    if level == COMPARISON:
        # Comparisons do not chain: both sides must bind tighter.
        left, right = _operand(expr.left), _operand(expr.right)
    else:
        left = _at_least(expr.left, level, in_list=False).text
        right = _at_least(expr.right, level + 1, in_list=False).text
    return _Piece(f"{left} {expr.op} {right}", level)


def _modifiers(modifiers: tuple[ast.Modifier, ...]) -> list[str]:
    texts: list[str] = []
    previous: ast.Modifier | None = None
    for modifier in modifiers:
        text = _modifier(modifier)
        if (
            isinstance(previous, ast.Clear)
            and previous.keep
            and isinstance(modifier, ast.Condition)
            and isinstance(modifier.expr, ast.ColumnRef)
        ):
            # A bare column right after `clear t but ...` would join the kept columns.
            text = f"({text})"
        texts.append(text)
        previous = modifier
    return texts


def _modifier(modifier: ast.Modifier) -> str:
    match modifier:
        case ast.Condition():
            return _at_least(modifier.expr, OR, in_list=False).text
        case ast.Narrow():
            return f"narrow {_at_least(modifier.expr, OR, in_list=False).text}"
        case ast.Clear(keep=keep) if keep:
            return f"clear {modifier.table} but {', '.join(str(column) for column in keep)}"
        case ast.Clear(column=column) if column is not None:
            return f"clear {modifier.table}.{column}"
        case ast.Clear():
            return f"clear {modifier.table}"
        case ast.RowBinding():
            return "row"
        case ast.ToDate():
            start = f', start "{modifier.start}"' if modifier.start is not None else ""
            return f"to_date({modifier.column}, {modifier.period}{start})"
        case ast.Shift():
            return f"shift({modifier.column}, {modifier.offset}, {modifier.unit})"
        case ast.Trailing():
            return f"trailing({modifier.column}, {modifier.count}, {modifier.unit})"
    raise TypeError(f"not a modifier: {modifier!r}")


def _primary(expr: ast.Expr) -> _Piece:
    match expr:
        case ast.Number():
            return _number(expr.value)
        case ast.String():
            return _Piece(text_literal(expr.value), PRIMARY)
        case ast.DateLiteral():
            return _Piece(f'date "{expr.value.isoformat()}"', PRIMARY)
        case ast.Boolean():
            return _Piece("true" if expr.value else "false", PRIMARY)
        case ast.Null():
            return _Piece("null", PRIMARY)
        case ast.ColumnRef():
            return _Piece(str(expr), PRIMARY)
        case ast.TableRef():
            return _Piece(expr.table, PRIMARY)
        case ast.Name() | ast.MeasureRef() | ast.LocalRef():
            return _Piece(expr.name, PRIMARY)
        case ast.Aggregate():
            iteration = _iteration(expr.iteration) if expr.iteration is not None else ""
            return _Piece(f"{expr.function}({format_expr(expr.argument)}{iteration})", PRIMARY)
        case ast.Call():
            args = ", ".join(_format(arg, in_list=True).text for arg in expr.args)
            return _Piece(f"{expr.function}({args})", PRIMARY)
        case ast.Rank():
            direction = " ascending" if expr.ascending else ""
            return _Piece(f"rank({format_expr(expr.expr)} over {expr.over}{direction})", PRIMARY)
        case ast.Single():
            return _Piece(f"single({expr.column})", PRIMARY)
        case ast.Restricted():
            return _Piece(f"restricted({expr.column})", PRIMARY)
    raise TypeError(f"not an expression: {expr!r}")


def _iteration(iteration: ast.Iteration) -> str:
    if iteration.table is not None:
        walked = iteration.table.table
    else:
        walked = ", ".join(str(column) for column in iteration.columns)
    where = f" where {format_expr(iteration.where)}" if iteration.where is not None else ""
    return f" for each {walked}{where}"


def _number(value: int | float) -> _Piece:
    if isinstance(value, float):
        if not math.isfinite(value):
            raise ValueError(f"{value} has no literal in the measure language")
        text = repr(value)
    else:
        text = str(value)
    return _Piece(text, UNARY if text.startswith("-") else PRIMARY)


def text_literal(value: str) -> str:
    """``value`` as a text literal: in double quotes, each quote doubled."""
    return '"' + value.replace('"', '""') + '"'
