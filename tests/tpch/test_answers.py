"""Rounding as the answer files print, and the precision rules of the TPC-H specification
(clause 2.1.3.5). Expected values worked out by hand."""

from __future__ import annotations

import datetime as dt
from decimal import Decimal

import pytest

from measureport.tpch import matches_printed, meets_answer_precision, round_as_printed


@pytest.mark.parametrize(
    ("value", "places", "printed"),
    [
        (55909065222.82769, 2, "55909065222.83"),  # .827 rounds up
        (0.04998529583835688, 2, "0.05"),
        (0.125, 2, "0.13"),  # a half goes away from zero
        (-0.125, 2, "-0.13"),
        (2.675, 2, "2.68"),  # by the decimal digits 2.675, not the binary value just below them
        (Decimal("123141078.2283"), 2, "123141078.23"),
        (1478493, 0, "1478493"),
    ],
)
def test_round_as_printed(value: float | Decimal, places: int, printed: str) -> None:
    assert round_as_printed(value, places) == Decimal(printed)


@pytest.mark.parametrize(
    ("value", "printed", "matches"),
    [
        ("BUILDING", "BUILDING     ", True),  # answer files pad text columns
        ("MAIL", "SHIP", False),
        (dt.date(1995, 3, 5), "1995-03-05", True),
        (dt.date(1995, 3, 5), "1995-03-06", False),
        (1478493, "               1478493", True),
        (1478492, "1478493", False),
        (25.522005853257337, "25.52", True),
        (25.525, "25.52", False),  # prints 25.53
        (37734107.0, "37734107.00", True),
        (None, "16.38", False),
        (True, "1", False),
    ],
)
def test_matches_printed(value: object, printed: str, matches: bool) -> None:
    assert matches_printed(value, printed) is matches


def test_sums_may_be_within_one_hundred() -> None:
    published = Decimal("348406.02")
    assert meets_answer_precision("sum", 348406.0542857143, published)
    assert meets_answer_precision("sum", 348506.02, published)  # exactly 100 above
    assert not meets_answer_precision("sum", 348506.03, published)


def test_ratios_and_averages_within_one_percent_once_rounded() -> None:
    published = Decimal("16.38")
    # 1 % of 16.38 is 0.1638: from 16.2162 to 16.5438, so 16.54 passes and 16.55 does not.
    assert meets_answer_precision("ratio", 16.5449, published)  # rounds to 16.54
    assert not meets_answer_precision("ratio", 16.545, published)  # rounds to 16.55
    assert meets_answer_precision("average", 16.22, published)
    assert not meets_answer_precision("average", 16.21, published)


def test_counts_and_singletons_must_be_equal() -> None:
    assert meets_answer_precision("exact", 10594, Decimal("10594"))
    assert not meets_answer_precision("exact", 10595, Decimal("10594"))
    assert not meets_answer_precision("exact", 0.051, Decimal("0.05"))
