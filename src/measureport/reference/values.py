"""Scalar operations with SQL's null rules, on plain Python values.

Values are ``int``, ``float``, ``str``, ``datetime.date``, ``bool`` or ``None`` (null). Every
function here takes and returns single values; the evaluator maps them over rows.
"""

from __future__ import annotations

import math
import re
from collections.abc import Callable, Sequence
from decimal import Decimal, localcontext
from functools import lru_cache
from typing import Any

Value = Any


def arithmetic(op: str, a: Value, b: Value) -> Value:
    """``+ - * /``; null in, null out; ``/`` is true division and null for a zero divisor."""
    if a is None or b is None:
        return None
    if op in ("+", "-", "*") and (isinstance(a, float) or isinstance(b, float)):
        # Sums of decimal columns arrive as floats; engines add, subtract and multiply decimals
        # exactly, so do the same on the values as written, then round once to a float.
        return float(_exact(op, Decimal(repr(a)), Decimal(repr(b))))
    if op == "+":
        return a + b
    if op == "-":
        return a - b
    if op == "*":
        return a * b
    if op == "/":
        if b == 0:
            return None
        return float(a) / float(b)
    raise ValueError(op)


def _exact(op: str, a: Decimal, b: Decimal) -> Decimal:
    with localcontext() as ctx:
        ctx.prec = 60
        if op == "+":
            return a + b
        if op == "-":
            return a - b
        return a * b


def compare(op: str, a: Value, b: Value) -> bool | None:
    """``= != < <= > >=`` with null giving null (unknown)."""
    if a is None or b is None:
        return None
    if op == "=":
        return bool(a == b)
    if op == "!=":
        return bool(a != b)
    if op == "<":
        return bool(a < b)
    if op == "<=":
        return bool(a <= b)
    if op == ">":
        return bool(a > b)
    if op == ">=":
        return bool(a >= b)
    raise ValueError(op)


def logical_and(a: bool | None, b: bool | None) -> bool | None:
    """Three-valued AND."""
    if a is False or b is False:
        return False
    if a is None or b is None:
        return None
    return True


def logical_or(a: bool | None, b: bool | None) -> bool | None:
    """Three-valued OR."""
    if a is True or b is True:
        return True
    if a is None or b is None:
        return None
    return False


def logical_not(a: bool | None) -> bool | None:
    return None if a is None else not a


def in_list(x: Value, items: Sequence[Value]) -> bool | None:
    """SQL ``x IN (...)``: true on a match, null when no match but x or an item is null."""
    if x is None:
        return None
    if any(i is not None and i == x for i in items):
        return True
    if any(i is None for i in items):
        return None
    return False


@lru_cache(maxsize=256)
def _like_regex(pattern: str) -> re.Pattern[str]:
    parts = []
    for ch in pattern:
        if ch == "%":
            parts.append(".*")
        elif ch == "_":
            parts.append(".")
        else:
            parts.append(re.escape(ch))
    return re.compile("".join(parts), re.DOTALL)


def like(x: Value, pattern: Value) -> bool | None:
    """SQL ``LIKE``: ``%`` any run, ``_`` one character, case-sensitive, whole string."""
    if x is None or pattern is None:
        return None
    return _like_regex(pattern).fullmatch(x) is not None


def round_half_away(x: Value, digits: int) -> Value:
    """``round(x, n)``, half away from zero, computed on the scaled binary value as engines do."""
    if x is None:
        return None
    if isinstance(x, int) and not isinstance(x, bool) and digits >= 0:
        return x
    scale = 10.0**digits
    y = float(x) * scale
    rounded = math.copysign(math.floor(abs(y) + 0.5), y)
    result = rounded / scale
    if isinstance(x, int) and not isinstance(x, bool):
        return int(result)
    return result


def coalesce(values: Sequence[Value]) -> Value:
    for v in values:
        if v is not None:
            return v
    return None


def least(values: Sequence[Value]) -> Value:
    """The smallest non-null argument (null only when all are null)."""
    present = [v for v in values if v is not None]
    return min(present) if present else None


def greatest(values: Sequence[Value]) -> Value:
    """The largest non-null argument (null only when all are null)."""
    present = [v for v in values if v is not None]
    return max(present) if present else None


def absolute(x: Value) -> Value:
    return None if x is None else abs(x)


def aggregate(function: str, values: Sequence[Value], weights: Sequence[int] | None = None) -> Value:
    """Aggregate per-row values; null over no rows (rule 5), SQL rules otherwise.

    ``weights`` repeat each value that many times (rows bound together as identical rows)."""
    if len(values) == 0:
        return None
    if weights is None:
        pairs = [(v, 1) for v in values if v is not None]
    else:
        pairs = [(v, w) for v, w in zip(values, weights, strict=True) if v is not None]
    if function == "count":
        return sum(w for _, w in pairs)
    if function == "distinct":
        return len({v for v, _ in pairs})
    if not pairs:
        return None
    if function == "sum":
        return _sum(pairs)
    if function == "mean":
        total = _sum(pairs)
        n = sum(w for _, w in pairs)
        return float(total) / n
    if function == "min":
        return min(v for v, _ in pairs)
    if function == "max":
        return max(v for v, _ in pairs)
    raise ValueError(function)


def _sum(pairs: Sequence[tuple[Value, int]]) -> Value:
    if all(isinstance(v, int) and not isinstance(v, bool) for v, _ in pairs):
        return sum(v * w for v, w in pairs)
    return math.fsum(float(v) * w for v, w in pairs)


def elementwise(fn: Callable[..., Value], *columns: Sequence[Value]) -> list[Value]:
    """Apply ``fn`` position by position over equally long sequences."""
    return [fn(*args) for args in zip(*columns, strict=True)]
