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
    LastDayOf,
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


def on_day(index: Scalar, day: Scalar) -> Scalar:
    """Day ``day`` of the month with this index, clamped to that month's last day."""
    year = IntDiv(index, _n(12))
    month = Arith("+", Mod(index, _n(12)), _n(1))
    if isinstance(day, Const) and isinstance(day.value, int) and day.value <= 28:
        return MakeDate(year, month, day)
    length = DatePartOf("day", LastDayOf(MakeDate(year, month, _n(1))))
    return MakeDate(year, month, Func("least", (day, length)))


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
    year = DatePartOf("year", last)
    if period == "month":
        return MakeDate(year, DatePartOf("month", last), _n(1))
    start_month, start_day = (1, 1) if start is None else (int(p) for p in start.split("-"))
    if period == "year":
        this_year = _day_of_year(year, start_month, start_day)
        if (start_month, start_day) == (1, 1):
            return this_year
        year_before = _day_of_year(Arith("-", year, _n(1)), start_month, start_day)
        return Case(((Compare(">", this_year, last), year_before),), this_year)
    if (start_month, start_day) == (1, 1):
        first_month = Arith(
            "+", Arith("*", IntDiv(Arith("-", DatePartOf("month", last), _n(1)), _n(3)), _n(3)), _n(1)
        )
        return MakeDate(year, first_month, _n(1))
    index = month_index(last)
    candidate = Arith("-", index, Mod(Arith("-", index, _n(start_month - 1)), _n(3)))
    first = on_day(candidate, _n(start_day))
    if start_day == 1:
        return first
    earlier = on_day(Arith("-", candidate, _n(3)), _n(start_day))
    return Case(((Compare(">", first, last), earlier),), first)


def _day_of_year(year: Scalar, month: int, day: int) -> Scalar:
    """Day ``day`` of month ``month`` of ``year`` (clamped to the month's end)."""
    if day <= 28:
        return MakeDate(year, _n(month), _n(day))
    return on_day(Arith("+", Arith("*", year, _n(12)), _n(month - 1)), _n(day))


def trailing_start(last: Scalar, count: int, unit: ast.Unit) -> Scalar:
    """The first day of ``trailing(..., count, unit)`` that ends on ``last``."""
    return AddDays(shift_date(last, -count, unit), _n(1))
