"""Type rules of operators, ``if`` and the scalar functions."""

from __future__ import annotations

from collections.abc import Callable, Sequence
from dataclasses import replace
from typing import TYPE_CHECKING

from measureport.language import ast
from measureport.semantics.bound import ValueType
from measureport.semantics.kinds import ORDERED_KINDS, fits, phrase
from measureport.semantics.scope import Scope

if TYPE_CHECKING:
    from measureport.semantics.walker import Bound, ExpressionBinder

ARITHMETIC = ("+", "-", "*", "/")
LOGIC = ("and", "or")


def bind_operator(binder: ExpressionBinder, expr: ast.Expr, scope: Scope) -> Bound:
    """Bind an operator, ``if`` or scalar function call and compute its type."""
    match expr:
        case ast.Unary():
            return _unary(binder, expr, scope)
        case ast.Binary():
            return _binary(binder, expr, scope)
        case ast.InList():
            operand, kind = binder.bind(expr.operand, scope)
            items = [binder.bind(item, scope) for item in expr.items]
            _same_kind(binder, [(operand, kind), *items], _cannot_compare)
            return replace(expr, operand=operand, items=tuple(item for item, _ in items)), "boolean"
        case ast.Between():
            parts = [binder.bind(part, scope) for part in (expr.operand, expr.low, expr.high)]
            _same_kind(binder, parts, _cannot_compare)
            operand, low, high = (part for part, _ in parts)
            return replace(expr, operand=operand, low=low, high=high), "boolean"
        case ast.IsNull():
            operand, _ = binder.bind(expr.operand, scope)
            return replace(expr, operand=operand), "boolean"
        case ast.Like():
            operand, kind = binder.bind(expr.operand, scope)
            pattern, pattern_kind = binder.bind(expr.pattern, scope)
            _expect(binder, operand, kind, "text", "like needs text on its left")
            _expect(binder, pattern, pattern_kind, "text", "the pattern of like must be text")
            return replace(expr, operand=operand, pattern=pattern), "boolean"
        case ast.If():
            return _if(binder, expr, scope)
        case ast.Call():
            return _call(binder, expr, scope)
    raise TypeError(f"the binder has no rule for {type(expr).__name__}")


def _unary(binder: ExpressionBinder, expr: ast.Unary, scope: Scope) -> Bound:
    operand, kind = binder.bind(expr.operand, scope)
    if expr.op == "not":
        _expect(binder, operand, kind, "boolean", "not needs true or false")
        return replace(expr, operand=operand), "boolean"
    _expect(binder, operand, kind, "number", "- needs a number")
    return replace(expr, operand=operand), "number"


def _binary(binder: ExpressionBinder, expr: ast.Binary, scope: Scope) -> Bound:
    left, left_kind = binder.bind(expr.left, scope)
    right, right_kind = binder.bind(expr.right, scope)
    bound = replace(expr, left=left, right=right)
    if expr.op in ARITHMETIC or expr.op in LOGIC:
        wanted: ValueType = "number" if expr.op in ARITHMETIC else "boolean"
        need = f"{expr.op} needs {'numbers' if wanted == 'number' else 'true or false'} on both sides"
        _expect(binder, left, left_kind, wanted, need, "the left side")
        _expect(binder, right, right_kind, wanted, need, "the right side")
        return bound, wanted
    if not fits(left_kind, right_kind):
        binder.findings.error(_cannot_compare(left_kind, right_kind), expr.span)
    return bound, "boolean"


def _if(binder: ExpressionBinder, expr: ast.If, scope: Scope) -> Bound:
    condition, condition_kind = binder.bind(expr.condition, scope)
    _expect(binder, condition, condition_kind, "boolean", "the condition of if must be true or false")
    branches = [binder.bind(expr.then, scope)]
    if expr.otherwise is not None:
        branches.append(binder.bind(expr.otherwise, scope))
    kind = _same_kind(binder, branches, lambda a, b: f"the branches of if give {phrase(a)} and {phrase(b)}")
    otherwise = branches[1][0] if expr.otherwise is not None else None
    return replace(expr, condition=condition, then=branches[0][0], otherwise=otherwise), kind


def _call(binder: ExpressionBinder, call: ast.Call, scope: Scope) -> Bound:
    args = [binder.bind(arg, scope) for arg in call.args]
    bound = replace(call, args=tuple(arg for arg, _ in args))
    name = call.function
    if name in ("abs", "round"):
        wanted = 1 if name == "abs" else 2
        if len(args) != wanted:
            usage = (
                "abs takes one number"
                if name == "abs"
                else ("round takes a number and a count of decimal places, e.g. round(x, 2)")
            )
            binder.findings.error(usage, call.span)
            return bound, "number"
        _expect(binder, args[0][0], args[0][1], "number", f"{name} needs a number")
        if name == "round" and not _is_integer_literal(call.args[1]):
            binder.findings.error(
                "the decimal places of round must be a whole number written out, e.g. 2", call.args[1].span
            )
        return bound, "number"
    if not args:
        binder.findings.error(f"{name} needs at least one value", call.span)
        return bound, None
    kind = _same_kind(binder, args, lambda a, b: f"{name} mixes {phrase(a)} and {phrase(b)}")
    if name in ("least", "greatest") and kind is not None and kind not in ORDERED_KINDS:
        binder.findings.error(f"{name} needs numbers, dates or text, not {phrase(kind)}", call.span)
    return bound, kind


def _is_integer_literal(expr: ast.Expr) -> bool:
    if isinstance(expr, ast.Unary) and expr.op == "-":
        expr = expr.operand
    return isinstance(expr, ast.Number) and isinstance(expr.value, int)


def _expect(
    binder: ExpressionBinder,
    expr: ast.Expr,
    kind: ValueType,
    wanted: ValueType,
    need: str,
    subject: str = "this",
) -> None:
    """Report ``need; subject is <kind>`` at ``expr`` unless its type fits ``wanted``."""
    if not fits(kind, wanted):
        binder.findings.error(f"{need}; {subject} is {phrase(kind)}", expr.span)


def _cannot_compare(a: ValueType, b: ValueType) -> str:
    return f"cannot compare {phrase(a)} with {phrase(b)}"


def _same_kind(
    binder: ExpressionBinder, parts: Sequence[Bound], mismatch: Callable[[ValueType, ValueType], str]
) -> ValueType:
    """The one type of ``parts`` (null fits any); each part of another type is an error."""
    kind: ValueType = None
    for part, part_kind in parts:
        if part_kind is None:
            continue
        if kind is None:
            kind = part_kind
        elif part_kind != kind:
            binder.findings.error(mismatch(kind, part_kind), part.span)
    return kind
