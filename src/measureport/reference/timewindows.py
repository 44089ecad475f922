"""Calendar arithmetic for the time modifiers: period starts, shifts with month-end clamping."""

from __future__ import annotations

import calendar
import datetime as dt

_MONTHS = {"month": 1, "quarter": 3, "year": 12}


def add_months(day: dt.date, months: int) -> dt.date:
    """``day`` moved by ``months``; a day past the end of the target month clamps to its last day."""
    index = day.year * 12 + (day.month - 1) + months
    year, month = divmod(index, 12)
    month += 1
    last = calendar.monthrange(year, month)[1]
    return dt.date(year, month, min(day.day, last))


def shift_day(day: dt.date, offset: int, unit: str) -> dt.date:
    """``day`` moved by ``offset`` units of ``day``, ``month``, ``quarter`` or ``year``."""
    if unit == "day":
        return day + dt.timedelta(days=offset)
    return add_months(day, offset * _MONTHS[unit])


def parse_start(start: str | None) -> tuple[int, int]:
    """``"MM-DD"`` of a fiscal start as (month, day); January 1st when not given."""
    if start is None:
        return 1, 1
    month, day = start.split("-")
    return int(month), int(day)


def period_start(day: dt.date, period: str, start: str | None = None) -> dt.date:
    """The first day of the ``year``/``quarter``/``month`` holding ``day``; years and quarters
    begin on ``start`` ("MM-DD") when given."""
    if period == "month":
        return day.replace(day=1)
    start_month, start_day = parse_start(start)
    step = 12 if period == "year" else 3
    # Candidate starts fall on start_day of months congruent to start_month modulo step.
    month_index = day.year * 12 + day.month - 1
    anchor = start_month - 1
    offset = (month_index - anchor) % step
    candidate_index = month_index - offset
    candidate = _on_day(candidate_index, start_day)
    if candidate > day:
        candidate = _on_day(candidate_index - step, start_day)
    return candidate


def _on_day(month_index: int, day: int) -> dt.date:
    year, month0 = divmod(month_index, 12)
    last = calendar.monthrange(year, month0 + 1)[1]
    return dt.date(year, month0 + 1, min(day, last))


def trailing_start(last: dt.date, count: int, unit: str) -> dt.date:
    """The first day of ``trailing(..., count, unit)`` ending on ``last``: the day after
    ``last`` moved back ``count`` units (month ends clamped)."""
    return shift_day(last, -count, unit) + dt.timedelta(days=1)
