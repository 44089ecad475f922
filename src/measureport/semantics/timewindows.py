"""Checks of the time modifiers ``to_date``, ``shift`` and ``trailing``."""

from __future__ import annotations

import calendar
import re
from typing import TYPE_CHECKING

from measureport.language import ast
from measureport.semantics.kinds import phrase

if TYPE_CHECKING:
    from measureport.semantics.walker import ExpressionBinder

TimeModifier = ast.ToDate | ast.Shift | ast.Trailing

UNITS: dict[type[TimeModifier], tuple[str, str, tuple[str, ...]]] = {
    ast.ToDate: ("to_date", "period", ("year", "quarter", "month")),
    ast.Shift: ("shift", "unit", ("day", "month", "quarter", "year")),
    ast.Trailing: ("trailing", "unit", ("day", "month", "year")),
}


def check_time_modifier(binder: ExpressionBinder, modifier: TimeModifier) -> None:
    """Report a non-date column, a unit the modifier does not take, a bad start or count."""
    name, unit_field, allowed = UNITS[type(modifier)]
    column = binder.lookup.column(modifier.column)
    if column is not None and column.type.kind != "date":
        binder.findings.error(
            f"{name} needs a date column; {modifier.column} is {phrase(column.type.kind)}",
            modifier.column.span,
        )
    unit = getattr(modifier, unit_field)
    if unit not in allowed:
        choices = ", ".join(allowed[:-1]) + " or " + allowed[-1]
        binder.findings.error(f"{name} takes {choices}, not {unit}", modifier.span)
    if isinstance(modifier, ast.ToDate) and modifier.start is not None:
        problem = start_problem(modifier.start, modifier.period)
        if problem:
            binder.findings.error(problem, modifier.span)
    if isinstance(modifier, ast.Trailing) and modifier.count <= 0:
        binder.findings.error(
            f"trailing needs a positive number of periods, not {modifier.count}", modifier.span
        )


def start_problem(start: str, period: str) -> str | None:
    """What is wrong with ``start "MM-DD"`` for ``period``, or None."""
    if period == "month":
        return "start applies to year and quarter; a month always starts on its first day"
    found = re.fullmatch(r"(\d\d)-(\d\d)", start)
    if found is None:
        return f'start "{start}" must be written "MM-DD", e.g. "07-01"'
    month, day = int(found.group(1)), int(found.group(2))
    if not 1 <= month <= 12:
        return f'start "{start}" has no month {found.group(1)}; months run from 01 to 12'
    if (month, day) == (2, 29):
        return 'start "02-29" exists only in leap years; pick another day'
    if not 1 <= day <= calendar.monthrange(2001, month)[1]:
        return f'start "{start}" has no day {found.group(2)} in month {found.group(1)}'
    return None
