"""The comparable form of values: what engines spell differently must compare equal, and nothing
else may (invented values; the date, number and null rules are the brief's, common practice)."""

from __future__ import annotations

import datetime as dt
import math
from decimal import Decimal

import numpy as np
import pytest

from measureport.compare import canonical
from measureport.compare.cells import Tolerance, cells_agree, numbers_agree, numeric_error

DAY = dt.date(2025, 3, 1)


@pytest.mark.parametrize(
    "spelling",
    [
        DAY, dt.datetime(2025, 3, 1), "2025-03-01", "2025-03-01T00:00:00", "2025-03-01 00:00",
        np.datetime64("2025-03-01"),
    ],
)
def test_a_date_however_it_is_typed(spelling: object) -> None:
    # Engines return a DATE as a date, a timestamp at midnight, or ISO text.
    assert canonical(spelling) == ("date", DAY)


def test_a_timestamp_with_a_time_of_day_is_not_the_date() -> None:
    assert canonical(dt.datetime(2025, 3, 1, 9, 30)) != canonical(DAY)
    assert canonical("2025-03-01 09:30") == canonical(dt.datetime(2025, 3, 1, 9, 30))


def test_text_that_only_looks_like_a_date_stays_text() -> None:
    # 2025-02-30 is not a day of the calendar.
    assert canonical("2025-02-30") == ("text", "2025-02-30")


@pytest.mark.parametrize("spelling", [3, 3.0, Decimal("3"), Decimal("3.00"), np.int64(3), np.float64(3.0)])
def test_whole_numbers_however_typed(spelling: object) -> None:
    assert canonical(spelling) == ("number", 3)


def test_booleans_are_not_numbers_and_text_is_not_a_number() -> None:
    assert canonical(True) != canonical(1)
    assert canonical("3") != canonical(3)


def test_nan_equals_itself_as_a_key() -> None:
    assert canonical(math.nan) == canonical(float("nan"))
    assert canonical(math.nan) != canonical(None)


def test_relative_tolerance() -> None:
    limits = Tolerance(1e-9)
    # 1e9 and 1e9 + 0.5 differ by 0.5, a relative 5e-10: within 1e-9.
    assert numbers_agree(1e9, 1e9 + 0.5, limits)
    # 1.0 and 1.00001 differ by a relative 1e-5.
    assert not numbers_agree(1.0, 1.00001, limits)
    # Zero agrees with nothing but zero under a relative tolerance alone...
    assert not numbers_agree(0.0, 1e-17, limits)
    # ...unless an absolute floor is given.
    assert numbers_agree(0.0, 1e-17, Tolerance(1e-9, 1e-12))


def test_int_and_float_cells_compare_as_numbers() -> None:
    assert cells_agree(4, 4.0, Tolerance())
    assert cells_agree(Decimal("15.75"), 15.75, Tolerance())


def test_null_agrees_only_with_null() -> None:
    assert cells_agree(None, None, Tolerance())
    assert not cells_agree(None, 0, Tolerance())
    assert not cells_agree("", None, Tolerance())


def test_infinities_and_nan() -> None:
    assert cells_agree(math.inf, math.inf, Tolerance())
    assert not cells_agree(math.inf, -math.inf, Tolerance())
    assert cells_agree(math.nan, math.nan, Tolerance())
    assert not cells_agree(math.nan, 1.0, Tolerance())


def test_numeric_error() -> None:
    error = numeric_error(8, 10)
    # |10 - 8| = 2, relative to the expected 8: 0.25.
    assert error is not None and (error.absolute, error.relative) == (2.0, 0.25)
    zero = numeric_error(0, 0.5)
    # Relative to an expected zero the error has no value.
    assert zero is not None and (zero.absolute, zero.relative) == (0.5, None)
    assert numeric_error("Drill", 3) is None
