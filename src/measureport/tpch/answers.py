"""Comparing a result with the TPC-H answer set as the specification asks (clause 2.1.3.5, the
precision of the query validation output), and rounding as the answer files print."""

from __future__ import annotations

import datetime as dt
from decimal import ROUND_HALF_UP, Decimal
from typing import Literal

# The kinds of value that clause 2.1.3.5 gives a precision rule to.
AnswerKind = Literal["exact", "ratio", "sum", "average"]


def as_decimal(value: float | Decimal) -> Decimal:
    """A number as a Decimal; a float by its shortest repr, so 0.1 stays 0.1."""
    if isinstance(value, Decimal):
        return value
    if isinstance(value, int):
        return Decimal(value)
    return Decimal(repr(value))


def round_as_printed(value: float | Decimal, places: int = 2) -> Decimal:
    """``value`` rounded half away from zero to ``places`` decimals, as the answer files print it."""
    return as_decimal(value).quantize(Decimal(1).scaleb(-places), rounding=ROUND_HALF_UP)


def meets_answer_precision(kind: AnswerKind, value: float | Decimal, published: Decimal) -> bool:
    """Whether ``value`` agrees with the published ``published`` within the specification's rule:

    - ``exact`` (singleton column values, counts, sums of 0s and 1s): equal;
    - ``ratio`` and ``average``: rounded to 1/100, within 1 % of the published value;
    - ``sum``: within 100 (currency units) of the published value.
    """
    if kind == "exact":
        return as_decimal(value) == published
    if kind == "sum":
        return abs(as_decimal(value) - published) <= 100
    low, high = sorted((published * Decimal("0.99"), published * Decimal("1.01")))
    return low <= round_as_printed(value, 2) <= high


def matches_printed(value: object, printed: str) -> bool:
    """Whether ``value`` prints as ``printed`` does in an answer file: text without its padding,
    dates as YYYY-MM-DD, numbers rounded to as many decimals as ``printed`` shows."""
    text = printed.strip()
    if isinstance(value, str):
        # Answer files pad text with blanks after it; comparing without blanks at either end
        # also copes with generated values that start with a blank (some addresses do).
        return value.strip() == text
    if isinstance(value, dt.date):
        return value.isoformat() == text
    if isinstance(value, bool) or not isinstance(value, int | float | Decimal):
        return False
    places = len(text.split(".", 1)[1]) if "." in text else 0
    return round_as_printed(value, places) == Decimal(text)
