"""Reading exported cells as exports write them (invented values; the formats are common practice,
no source: thousands separators, percent signs, decimal commas, parentheses for negatives)."""

from __future__ import annotations

import datetime as dt
from decimal import Decimal

import pytest

from measureport.exports.cells import (
    CellError,
    ValueFormat,
    is_blank,
    parse_date,
    parse_number,
    read_cell,
)

POINT = ValueFormat()
COMMA = ValueFormat(decimal_comma=True)


@pytest.mark.parametrize(
    ("text", "value"),
    [
        ("1234", 1234),
        ("1,234", 1234),
        ("1,234,567", 1234567),
        ("1,234.5", 1234.5),
        ("-0.25", -0.25),
        ("+7", 7),
        ("\u22123", -3),  # the minus sign
        (".5", 0.5),
        ("1.5e3", 1500.0),
        ("56.25%", 0.5625),
        ("56.25 %", 0.5625),
        ("100%", 1.0),
        ("(12.50)", -12.5),
        ("1 234.5", 1234.5),
        ("  42  ", 42),
    ],
)
def test_numbers_with_a_decimal_point(text: str, value: float) -> None:
    parsed = parse_number(text, POINT)
    assert parsed == value
    assert type(parsed) is type(value)


@pytest.mark.parametrize(
    ("text", "value"),
    [("1.234,5", 1234.5), ("1.234", 1234), ("0,5625", 0.5625), ("12,5%", 0.125), ("1\u00a0234,5", 1234.5)],
)
def test_numbers_with_a_decimal_comma(text: str, value: float) -> None:
    assert parse_number(text, COMMA) == value


def test_a_percentage_is_exact_in_decimal() -> None:
    # 33.33% is 0.3333 exactly as decimal, read as the nearest double of 0.3333.
    assert parse_number("33.33%", POINT) == 0.3333


@pytest.mark.parametrize("text", ["1,23", "12,34,567", "abc", "1.2.3", "", "-", "%", "1,234.5.6", "NaN"])
def test_not_numbers(text: str) -> None:
    with pytest.raises(CellError, match="is not a number"):
        parse_number(text, POINT)


def test_a_decimal_comma_without_the_option_gets_a_hint() -> None:
    with pytest.raises(CellError) as raised:
        parse_number("1.234,5", POINT)
    assert raised.value.hint is not None and "--decimal-comma" in raised.value.hint


def test_a_decimal_point_with_the_comma_option_is_refused() -> None:
    # With --decimal-comma, 1,234.5 mixes both marks the wrong way round.
    with pytest.raises(CellError):
        parse_number("1,234.5", COMMA)


def test_dates() -> None:
    assert parse_date("2025-03-01", POINT) == dt.date(2025, 3, 1)
    assert parse_date("2025-03-01T00:00:00", POINT) == dt.date(2025, 3, 1)
    assert parse_date("01/03/2025", ValueFormat(date_format="%d/%m/%Y")) == dt.date(2025, 3, 1)


def test_bad_dates() -> None:
    with pytest.raises(CellError) as raised:
        parse_date("01/03/2025", POINT)
    assert "ISO" in raised.value.reason and raised.value.hint is not None
    with pytest.raises(CellError, match="time of day"):
        parse_date("2025-03-01 09:30", POINT)
    with pytest.raises(CellError, match="calendar"):
        parse_date("2025-02-30", POINT)
    with pytest.raises(CellError, match="--date-format"):
        parse_date("2025-03-01", ValueFormat(date_format="%d/%m/%Y"))


@pytest.mark.parametrize("cell", [None, "", "   ", "(blank)", "(Blank)", " (BLANK) "])
def test_blanks_are_null(cell: object) -> None:
    assert is_blank(cell)
    assert read_cell(cell, "number", POINT) is None


def test_typed_cells_from_parquet_or_json() -> None:
    assert read_cell(Decimal("15.75"), "number", POINT) == 15.75
    assert read_cell(dt.datetime(2025, 3, 1), "date", POINT) == dt.date(2025, 3, 1)
    assert read_cell(True, "boolean", POINT) is True
    assert read_cell("1,230.25", "number", POINT) == 1230.25
    with pytest.raises(CellError, match="is not a number"):
        read_cell("Drill", "number", POINT)
    with pytest.raises(CellError, match="is a number, not text"):
        read_cell(7, "text", POINT)
    with pytest.raises(CellError, match="is true or false, not a number"):
        read_cell(True, "number", POINT)


def test_text_is_kept_as_written() -> None:
    assert read_cell(" Drill ", "text", POINT) == " Drill "
    assert read_cell("1,234", "text", POINT) == "1,234"


def test_booleans() -> None:
    assert read_cell("TRUE", "boolean", POINT) is True
    assert read_cell("false", "boolean", POINT) is False
    with pytest.raises(CellError):
        read_cell("yes", "boolean", POINT)


def test_unknown_kind_reads_a_number_a_date_or_text() -> None:
    assert read_cell("1,234", None, POINT) == 1234
    assert read_cell("2025-03-01", None, POINT) == dt.date(2025, 3, 1)
    assert read_cell("Drill", None, POINT) == "Drill"
