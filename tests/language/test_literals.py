"""Literals: numbers (integers, decimals, exponents, negatives), text, dates, true, false, null."""

from __future__ import annotations

import datetime as dt

import pytest

from measureport.errors import MeasureportError
from measureport.language import ast
from measureport.language.parser import parse_expression


def p(text: str) -> ast.Expr:
    return parse_expression(text, "<literal>")


@pytest.mark.parametrize(
    ("text", "value"),
    [
        ("0", 0),
        ("42", 42),
        ("007", 7),
        ("3.5", 3.5),
        ("0.25", 0.25),
        ("1e3", 1000.0),  # an exponent makes a decimal number even without a point
        ("2.5E-2", 0.025),
        ("6e+2", 600.0),
        ("12345678901234567890", 12345678901234567890),  # integers keep every digit
    ],
)
def test_numbers(text: str, value: int | float) -> None:
    parsed = p(text)
    assert isinstance(parsed, ast.Number)
    assert parsed.value == value
    assert type(parsed.value) is type(value)


@pytest.mark.parametrize(("text", "value"), [("-3", -3), ("-2.5", -2.5), ("- 4", -4), ("-1e2", -100.0)])
def test_a_minus_before_a_number_makes_a_negative_number(text: str, value: int | float) -> None:
    assert repr(p(text)) == repr(ast.Number(value))


def test_a_minus_before_anything_else_stays_an_operator() -> None:
    assert p("-trips") == ast.Unary("-", ast.Name("trips"))
    assert p("a - -3") == ast.Binary("-", ast.Name("a"), ast.Number(-3))
    # `-(3)` is still the number -3: the parentheses group, they add nothing.
    assert p("-(3)") == ast.Number(-3)


@pytest.mark.parametrize(
    ("text", "value"),
    [
        ('""', ""),
        ('"Harbour Gate"', "Harbour Gate"),
        ('"say ""hi"""', 'say "hi"'),  # "" inside a text is one quote
        ('""""', '"'),
        ('"50 % off # not a comment"', "50 % off # not a comment"),
        ('"back\\slash"', "back\\slash"),  # no escapes: a backslash is itself
    ],
)
def test_text(text: str, value: str) -> None:
    assert p(text) == ast.String(value)


def test_dates() -> None:
    assert p('date "2026-03-01"') == ast.DateLiteral(dt.date(2026, 3, 1))
    assert p('date "2024-02-29"') == ast.DateLiteral(dt.date(2024, 2, 29))  # 2024 is a leap year


@pytest.mark.parametrize(
    ("text", "message"),
    [
        ('date "2026-02-30"', '"2026-02-30" is not a date: February 2026 has no day 30'),
        ('date "2025-02-29"', '"2025-02-29" is not a date: February 2025 has no day 29'),
        ('date "2026-13-01"', '"2026-13-01" is not a date: there is no month 13'),
        ('date "2026-3-1"', 'a date literal must look like date "2026-03-01"'),
        ('date "yesterday"', 'a date literal must look like date "2026-03-01"'),
        ("date 2026-03-01", 'a date literal must look like date "2026-03-01"'),
    ],
)
def test_invalid_dates_are_errors_at_the_literal(text: str, message: str) -> None:
    with pytest.raises(MeasureportError) as caught:
        parse_expression(f"rides.day = {text}", "<date>")
    assert caught.value.message == message
    # The literal starts after `rides.day = ` (12 characters), at column 13.
    assert (caught.value.span.line, caught.value.span.column) == (1, 13)


def test_booleans_and_null() -> None:
    assert p("true") == ast.Boolean(True)
    assert p("false") == ast.Boolean(False)
    assert p("null") == ast.Null()


def test_a_number_too_large_for_a_decimal_is_an_error() -> None:
    with pytest.raises(MeasureportError) as caught:
        p("1e999")
    assert caught.value.message == "the number 1e999 is too large"
