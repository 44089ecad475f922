"""Calendar arithmetic of the time modifiers as plan scalars, spelled out from year, month and day
numbers so that month-end clamping never depends on an engine's interval rules.

A month is numbered ``year * 12 + month - 1`` (its *index*); moving by months is adding to the
index; a day past the end of the target month clamps to its last day.
"""

from __future__ import annotations

from measureport.language import ast
from measureport.plan.scalar import (
    AddDays,
    Arith,
    Case,
    Compare,
    Const,
    DatePartOf,
    Func,
    IntDiv,
    MakeDate,
    Mod,
    Scalar,
)

_MONTHS = {"month": 1, "quarter": 3, "year": 12}


def _n(value: int) -> Const:
    return Const(value, "number")


def month_index(day: Scalar) -> Scalar:
    """``year * 12 + month - 1`` of a date."""
    return Arith(
        "+",
        Arith("*", DatePartOf("year", day), _n(12)),
        Arith("-", DatePartOf("month", day), _n(1)),
    )


def last_day_of_month(index: Scalar) -> Scalar:
    """The number of days of the month with this index (the day before the next month's first)."""
    following = Arith("+", index, _n(1))
    first_next = MakeDate(IntDiv(following, _n(12)), Arith("+", Mod(following, _n(12)), _n(1)), _n(1))
    return DatePartOf("day", AddDays(first_next, _n(-1)))


def on_day(index: Scalar, day: Scalar) -> Scalar:
    """Day ``day`` of the month with this index, clamped to that month's last day."""
    return MakeDate(
        IntDiv(index, _n(12)),
        Arith("+", Mod(index, _n(12)), _n(1)),
        Func("least", (day, last_day_of_month(index))),
    )


def add_months(day: Scalar, months: int) -> Scalar:
    """``day`` moved by ``months`` months, clamped at month ends."""
    return on_day(Arith("+", month_index(day), _n(months)), DatePartOf("day", day))


def shift_date(day: Scalar, offset: int, unit: ast.Unit) -> Scalar:
    """``day`` moved by ``offset`` days, months, quarters or years."""
    if unit == "day":
        return AddDays(day, _n(offset))
    return add_months(day, offset * _MONTHS[unit])


def period_start(last: Scalar, period: ast.Period, start: str | None) -> Scalar:
    """The first day of the year, quarter or month that holds ``last``; years and quarters begin
    on ``start`` ("MM-DD") when it is given."""
    if period == "month":
        return MakeDate(DatePartOf("year", last), DatePartOf("month", last), _n(1))
    start_month, start_day = (1, 1) if start is None else (int(p) for p in start.split("-"))
    step = 12 if period == "year" else 3
    index = month_index(last)
    candidate = Arith("-", index, Mod(Arith("-", index, _n(start_month - 1)), _n(step)))
    first = on_day(candidate, _n(start_day))
    if start_day == 1:
        return first
    earlier = on_day(Arith("-", candidate, _n(step)), _n(start_day))
    return Case(((Compare(">", first, last), earlier),), first)


def trailing_start(last: Scalar, count: int, unit: ast.Unit) -> Scalar:
    """The first day of ``trailing(..., count, unit)`` that ends on ``last``."""
    return AddDays(shift_date(last, -count, unit), _n(1))
