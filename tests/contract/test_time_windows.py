"""Time windows after ``given``: ``to_date`` (year, quarter, month, a fiscal start), ``shift``
(day, month, quarter, year; month ends clamp) and ``trailing`` (day, month, year), on invented
data. Each window first clears every calendar filter, the report filters included.

Sailing days (trips): 2024-02-29 (1), 2024-03-10 (1), 2024-03-20 (1), 2024-11-30 (1),
2025-01-05 (1), 2025-01-20 (2), 2025-02-10 (1), 2025-02-28 (1), 2025-03-01 (1),
2025-03-15 (1), 2025-03-31 (1). Numbered 1..12 in that order (2025-01-20 holds 6 and 7).
Expected values are worked out by hand; the rules are common practice, no source.
"""

from __future__ import annotations

import pytest

from contract.bench import Outcome, run_args
from contract.harbour import topic_files
from contract.tables import assert_column

TOPIC = "windows"
MEASURES = """\
measure ytd = trips given to_date(calendar.day, year)
measure qtd = trips given to_date(calendar.day, quarter)
measure mtd = trips given to_date(calendar.day, month)
measure fiscal_ytd = trips given to_date(calendar.day, year, start "07-01")
measure fiscal_qtd = trips given to_date(calendar.day, quarter, start "08-01")
measure year_before = trips given shift(calendar.day, -1, year)
measure month_before = trips given shift(calendar.day, -1, month)
measure quarter_after = trips given shift(calendar.day, 1, quarter)
measure day_before = trips given shift(calendar.day, -1, day)
measure ytd_year_before = trips given shift(calendar.day, -1, year), to_date(calendar.day, year)
measure last_28_days = trips given trailing(calendar.day, 28, day)
measure last_month = trips given trailing(calendar.day, 1, month)
measure last_3_months = trips given trailing(calendar.day, 3, month)
measure last_year = trips given trailing(calendar.day, 1, year)
"""
FILES = topic_files(TOPIC, MEASURES)
MODEL = f"{TOPIC}.yaml"
MONTHLY = [
    "trips", "ytd", "qtd", "mtd", "fiscal_ytd", "fiscal_qtd", "year_before", "month_before",
    "quarter_after", "day_before", "ytd_year_before", "last_28_days", "last_month",
    "last_3_months", "last_year",
]
DAILY = ["trips", "mtd", "day_before", "month_before", "last_28_days", "last_month"]
DAYS = ["2024-03-01", "2025-01-21", "2025-03-01", "2025-03-31"]
COMMANDS = {
    "monthly": run_args(
        MODEL, MONTHLY, ["calendar.year", "calendar.month"],
        ['calendar.day between date "2024-11-01" and date "2025-03-31"'],
    ),
    "daily": run_args(
        MODEL, DAILY, ["calendar.day"], ["calendar.day in (" + ", ".join(f'date "{d}"' for d in DAYS) + ")"]
    ),
}

MONTHS = [("2024", "11"), ("2024", "12"), ("2025", "1"), ("2025", "2"), ("2025", "3")]
# Last visible day of each cell: 2024-11-30, 2024-12-31, 2025-01-31, 2025-02-28, 2025-03-31.
BY_MONTH: dict[str, list[object]] = {
    "trips": [1, None, 3, 2, 3],
    # From 1 January: 2024 holds four sailings up to November; 2025: 3, 3+2, 3+2+3.
    "ytd": [4, 4, 3, 5, 8],
    # Q4 2024 from 1 October holds only 2024-11-30; Q1 2025 as the year.
    "qtd": [1, 1, 3, 5, 8],
    "mtd": [1, None, 3, 2, 3],
    # The fiscal year from 1 July 2024: 2024-11-30 and then all of 2025.
    "fiscal_ytd": [1, 1, 4, 6, 9],
    # Quarters from August: Nov-Jan, Feb-Apr. Nov 2024 - Jan 2025 holds 1 + 3; Feb 2025 starts anew.
    "fiscal_qtd": [1, 1, 4, 2, 5],
    # 12 months back: 2023-11, 2023-12, 2024-01 (nothing); February 2025's days map to
    # 2024-02-01..28, which misses the leap day 2024-02-29; March 2025 -> March 2024: 2 sailings.
    "year_before": [None, None, None, None, 2],
    # 2024-10 (nothing), 2024-11 (1), 2024-12 (nothing), 2025-01 (3), and March's days map to
    # 1..28 February (29, 30, 31 clamp to 28): 2.
    "month_before": [None, 1, None, 3, 2],
    # Three months on: November 2024 -> 1..28 February 2025 (29 and 30 clamp to 28): 2;
    # December -> March: 3; later months land in April..June 2025: nothing.
    "quarter_after": [2, 3, None, None, None],
    # One day back: Nov -> 10-31..11-29 misses 11-30; Dec -> 11-30..12-30 holds it;
    # Jan -> 12-31..01-30: 3; Feb -> 01-31..02-27: 02-10 only; Mar -> 02-28..03-30: 02-28,
    # 03-01, 03-15.
    "day_before": [None, 1, 3, 1, 3],
    # Shift a year back, then the year to date of that: only March 2025 reaches sailings
    # (2024-01-01..2024-03-31: 3); February's shifted days end on 2024-02-28.
    "ytd_year_before": [None, None, None, None, 3],
    # The 28 days up to the last day: 11-03..11-30 (1), 12-04..12-31 (0), 01-04..01-31 (3),
    # 02-01..02-28 (2), 03-04..03-31 (2).
    "last_28_days": [1, None, 3, 2, 2],
    # After (last day - 1 month): 10-31..11-30, 12-01..12-31 (11-31 clamps to 11-30),
    # 01-01..01-31, 01-29..02-28, 03-01..03-31 (02-31 clamps to 02-28).
    "last_month": [1, None, 3, 2, 3],
    # After (last day - 3 months): 08-31..11-30 (1); 10-01..12-31 (09-31 clamps to 09-30) (1);
    # 11-01..01-31 (4); 2024-11-29..2025-02-28 (6); 01-01..03-31 (8).
    "last_3_months": [1, 1, 4, 6, 8],
    # After (last day - 1 year): 2023-12-01..2024-11-30 (4); 2024 (4); 2024-02-01..2025-01-31
    # (7); 2024-02-29..2025-02-28 (9, the leap day included); 2024-04-01..2025-03-31 (9).
    "last_year": [4, 4, 7, 9, 9],
}

BY_DAY: dict[str, list[object]] = {
    "trips": [None, None, 1, 1],
    # 03-01 alone; 01-01..01-21; 03-01 alone; 03-01..03-31.
    "mtd": [None, 3, 1, 3],
    # 2024-02-29 (the leap day), 2025-01-20 (two sailings), 2025-02-28, 2025-03-30.
    "day_before": [1, 2, 1, None],
    # 2024-02-01, 2024-12-21, 2025-02-01, and 31 March - 1 month = 28 February 2025.
    "month_before": [None, None, None, 1],
    # 2024-02-03..03-01 (the leap day), 2024-12-25..2025-01-21, 02-02..03-01 (3), 03-04..03-31.
    "last_28_days": [1, 3, 3, 2],
    # 2024-02-02..03-01, 2024-12-22..2025-01-21, 02-02..03-01, 03-01..03-31 (02-31 clamps).
    "last_month": [1, 3, 3, 3],
}


def test_month_rows(outcomes: dict[str, Outcome]) -> None:
    # December 2024 has no sailing but other windows are not null there, so it stays (rule 6).
    assert outcomes["monthly"].table().keys(2) == MONTHS


@pytest.mark.parametrize("measure", MONTHLY)
def test_window_by_month(outcomes: dict[str, Outcome], measure: str) -> None:
    assert_column(outcomes["monthly"].table(), measure, BY_MONTH[measure])


def test_day_rows(outcomes: dict[str, Outcome]) -> None:
    assert outcomes["daily"].table().column("calendar.day") == DAYS


@pytest.mark.parametrize("measure", DAILY)
def test_window_by_day(outcomes: dict[str, Outcome], measure: str) -> None:
    assert_column(outcomes["daily"].table(), measure, BY_DAY[measure])
