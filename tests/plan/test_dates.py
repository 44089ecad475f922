"""Calendar arithmetic of the time modifiers, rendered to SQL and run on DuckDB.

Month ends clamp (LANGUAGE.md: 31 March − 1 month = 28/29 February); fiscal years and quarters
start on a given "MM-DD". Expected dates are worked out by hand beside each case; the property
test checks against the rule "same day number, or the month's last day when the month is
shorter" written here with the standard library (common practice, no source).
"""

from __future__ import annotations

import calendar
import datetime as dt

import duckdb
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from sqlglot import exp

from measureport.plan import dates
from measureport.plan.scalar import Col, Scalar
from measureport.render.scalars import ScalarRenderer, literal

D = dt.date
_CON = duckdb.connect()


def run(expr: Scalar, day: dt.date) -> object:
    """The value of ``expr`` for the date column ``d`` holding ``day``, computed by DuckDB."""
    sql_expr = ScalarRenderer({"d": literal(day)}, lambda node: exp.Null()).render(expr)
    sql = exp.Select(expressions=[sql_expr]).sql("duckdb")
    return _CON.execute(sql).fetchone()[0]  # type: ignore[index]


@pytest.mark.parametrize(
    ("day", "months", "expected"),
    [
        (D(2024, 3, 31), -1, D(2024, 2, 29)),  # leap February: clamps to the 29th
        (D(2023, 3, 31), -1, D(2023, 2, 28)),  # common February: the 28th
        (D(2024, 1, 31), 1, D(2024, 2, 29)),
        (D(2024, 2, 29), 12, D(2025, 2, 28)),  # a year after a leap day
        (D(2024, 12, 15), 1, D(2025, 1, 15)),  # across a year end
        (D(2025, 1, 10), -1, D(2024, 12, 10)),
        (D(2025, 5, 31), -3, D(2025, 2, 28)),  # a quarter back from a 31st
    ],
)
def test_months_move_with_month_end_clamping(day: dt.date, months: int, expected: dt.date) -> None:
    assert run(dates.add_months(Col("d"), months), day) == expected


@pytest.mark.parametrize(
    ("day", "period", "start", "expected"),
    [
        (D(2025, 3, 15), "year", None, D(2025, 1, 1)),
        (D(2025, 3, 15), "year", "04-01", D(2024, 4, 1)),  # before April: last year's start
        (D(2025, 4, 1), "year", "04-01", D(2025, 4, 1)),  # the start day itself
        (D(2025, 3, 10), "year", "02-29", D(2025, 2, 28)),  # no 29 February in 2025: clamps
        (D(2025, 5, 20), "quarter", None, D(2025, 4, 1)),
        (D(2025, 12, 31), "quarter", None, D(2025, 10, 1)),
        (D(2025, 2, 10), "quarter", "02-15", D(2024, 11, 15)),  # quarters start 2-15, 5-15, 8-15, 11-15
        (D(2025, 2, 20), "quarter", "02-15", D(2025, 2, 15)),
        (D(2025, 7, 1), "quarter", "02-01", D(2025, 5, 1)),  # quarters start Feb, May, Aug, Nov
        (D(2025, 3, 31), "month", None, D(2025, 3, 1)),
    ],
)
def test_period_starts(day: dt.date, period: str, start: str | None, expected: dt.date) -> None:
    assert run(dates.period_start(Col("d"), period, start), day) == expected  # type: ignore[arg-type]


@pytest.mark.parametrize(
    ("day", "count", "unit", "expected"),
    [
        (D(2025, 3, 31), 28, "day", D(2025, 3, 4)),  # the 28 days Mar 4 .. Mar 31
        (D(2025, 3, 31), 1, "month", D(2025, 3, 1)),  # 31 March − 1 month = 28 Feb, then + 1 day
        (D(2024, 3, 31), 1, "year", D(2023, 4, 1)),
    ],
)
def test_trailing_window_starts(day: dt.date, count: int, unit: str, expected: dt.date) -> None:
    assert run(dates.trailing_start(Col("d"), count, unit), day) == expected  # type: ignore[arg-type]


def _clamped(day: dt.date, months: int) -> dt.date:
    year, month0 = divmod(day.year * 12 + day.month - 1 + months, 12)
    last = calendar.monthrange(year, month0 + 1)[1]
    return dt.date(year, month0 + 1, min(day.day, last))


@settings(max_examples=60, deadline=None)
@given(st.dates(min_value=D(1990, 1, 1), max_value=D(2090, 12, 31)), st.integers(-30, 30))
def test_months_move_like_the_clamping_rule(day: dt.date, months: int) -> None:
    assert run(dates.add_months(Col("d"), months), day) == _clamped(day, months)
