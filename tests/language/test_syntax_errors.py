"""Every syntax error is a MeasureportError at the offending text, in a plain sentence.

Each case gives the text, the message, and the span (line, first column, last column) counted
by hand on the text.
"""

from __future__ import annotations

import re

import pytest

from measureport.errors import MeasureportError
from measureport.language.parser import parse_expression, parse_measures

# Columns:     123456789012345678901234567890123456789012345678901234567890
CASES: list[tuple[str, str, tuple[int, int, int]]] = [
    # Something missing at the end: reported just after the last token.
    ("measure a =", "expected an expression after `=`", (1, 12, 12)),
    ("measure a = 1 +", "expected an expression after `+`", (1, 16, 16)),
    ("measure a = not", "expected an expression after `not`", (1, 16, 16)),
    ("measure a = x given", "expected a modifier after `given`", (1, 20, 20)),
    (
        "measure a = 1 measure",
        "the text ends too early: expected a name for the measure after `measure`",
        (1, 22, 22),
    ),
    (
        "measure a = x given clear",
        "the text ends too early: expected a table or a column after `clear`",
        (1, 26, 26),
    ),
    ("measure a = let x = 1", "`let x = ...` must be followed by the expression that uses `x`", (1, 22, 22)),
    # Brackets: an unclosed `(` is reported at the `(` itself.
    ("measure a = sum(t.x", "this `(` is never closed", (1, 16, 16)),
    ("measure a = (1 + 2", "this `(` is never closed", (1, 13, 13)),
    ("measure a = ((1)\nmeasure b = 2", "this `(` is never closed", (1, 13, 13)),
    ("measure a = 1)", "this `)` has no matching `(`", (1, 14, 14)),
    # Keywords in the wrong place.
    ("measure a = if then 1", "unexpected `then`: an `if` needs a condition first", (1, 16, 19)),
    ("measure a = b then", "unexpected `then`: `then` follows the condition of an `if`", (1, 15, 18)),
    ("measure a = 1 else 2", "unexpected `else`: an `else` follows `if ... then ...`", (1, 15, 18)),
    (
        "measure a = sum(t.x) for each t",
        "unexpected `for`: `for each` belongs inside an aggregate, as in sum(rides.fare for each rides)",
        (1, 22, 24),
    ),
    (
        "measure a = x over t.c",
        "unexpected `over`: `over` belongs inside rank, as in rank(trips over stations.name)",
        (1, 15, 18),
    ),
    (
        "measure a = to_date(t.d, year)",
        "unexpected `to_date`: `to_date` is a modifier: it stands after `given`, "
        "modifiers separated by commas",
        (1, 13, 19),
    ),
    ("measure if = 1", "`if` is a reserved word and cannot name a measure", (1, 9, 10)),
    ("measure a = let then = 1 then", "`then` is a reserved word and cannot name a `let` value", (1, 17, 20)),
    ("measure a = sum(x for each if)", "`if` is a reserved word and cannot name a table", (1, 28, 29)),
    ("measure a = x given clear sum", "`sum` is a reserved word and cannot name a table", (1, 27, 29)),
    (
        "measure a = if a then b else let x = 1 x",
        "a `let` here must be in parentheses, together with the expression that uses its value",
        (1, 30, 32),
    ),
    # Functions.
    ("measure a = summ(t.x)", "unknown function `summ` — did you mean `sum`?", (1, 13, 16)),
    (
        "measure a = Sum(t.x)",
        "unknown function `Sum` — did you mean `sum`? (functions are written in lower case)",
        (1, 13, 15),
    ),
    (
        "measure a = x given to_dat(t.d, year)",
        "unknown function `to_dat` — did you mean `to_date`?",
        (1, 21, 26),
    ),
    # A name against `(` is a call even where a `let` body could start with `(`.
    ("measure a = let x = summ(t.x)", "unknown function `summ` — did you mean `sum`?", (1, 21, 24)),
    ("measure a = let x = summ(t.x) x", "unknown function `summ` — did you mean `sum`?", (1, 21, 24)),
    ("measure a = sum + 1", "expected `(` after `sum`, found `+`", (1, 17, 17)),
    ("measure a = round(1)", "`round` takes a value and a number of digits: round(x, 2)", (1, 13, 20)),
    ("measure a = abs(1, 2)", "`abs` takes exactly one value: abs(x)", (1, 13, 21)),
    ("measure a = coalesce(x)", "`coalesce` needs at least two values: coalesce(x, 0)", (1, 13, 23)),
    ("measure a = least(1)", "`least` needs at least two values: least(a, b)", (1, 13, 20)),
    ("measure a = rank(x over t)", "expected a column here, written `t.column`", (1, 25, 25)),
    ("measure a = single(x)", "expected a column here, written `x.column`", (1, 20, 20)),
    ("measure a = rank(x)", "unexpected `)`: expected `over` or an operator", (1, 19, 19)),
    ("measure a = sum(t.x for each)", "expected a table or a column after `each`, found `)`", (1, 29, 29)),
    ("measure a = sum(t.x for t)", "expected `each` after `for`, found `t`", (1, 25, 25)),
    # Operators.
    ("measure a = 1 == 2", "equality is written with a single `=`", (1, 16, 16)),
    ("measure a = 1 <> 2", "write `!=` for not equal", (1, 15, 16)),
    (
        "measure a = 1 < 2 < 3",
        "comparisons do not chain: join them with `and`, as in a < b and b < c",
        (1, 19, 19),
    ),
    ("measure a = x is 3", "expected `not` or `null` after `is`, found `3`", (1, 18, 18)),
    ("measure a = x in 1", "expected `(` after `in`, found `1`", (1, 18, 18)),
    ("measure a 1", "expected `=` after `a`, found `1`", (1, 11, 11)),
    (
        "measure a = 1 2",
        "unexpected `2`: expected an operator, a new `measure` or the end of the file",
        (1, 15, 15),
    ),
    ("measure a = sum(t.x t.y)", "unexpected `t`: expected `)`, `for each` or an operator", (1, 21, 21)),
    # Characters that start nothing.
    ("measure a = !x", "unexpected `!`: write `not`, or `!=` for not equal", (1, 13, 13)),
    ("measure a = x & y", "unexpected `&`: write `and`", (1, 15, 15)),
    ("measure a = x | y", "unexpected `|`: write `or`", (1, 15, 15)),
    ("measure a = [1]", "unexpected character `[`", (1, 13, 13)),
    ("measure a = 'x'", 'text is written in double quotes, as in "North Pier"', (1, 13, 13)),
    # Literals.
    ('measure a = "abc\nmeasure b = 1', "text literal never closed", (1, 13, 16)),
    ("measure a = 12abc", "`12abc` is not a number", (1, 13, 17)),
    ("measure a = 1.", "`1.` is not a number", (1, 13, 14)),
    ("measure a = date 2026", 'a date literal must look like date "2026-03-01"', (1, 13, 21)),
    ("measure a = date", 'a date literal must look like date "2026-03-01"', (1, 17, 17)),
    ('measure a = date "2026-02-30"', '"2026-02-30" is not a date: February 2026 has no day 30', (1, 13, 29)),
    # Time modifiers.
    (
        "measure a = x given to_date(t.d, week)",
        "expected `year`, `quarter` or `month` after `,`, found `week`",
        (1, 34, 37),
    ),
    (
        "measure a = x given trailing(t.d, 2, week)",
        "expected `year`, `quarter`, `month` or `day` after `,`, found `week`",
        (1, 38, 41),
    ),
    ("measure a = x given trailing(t.d, 0, day)", "the number of periods must be at least 1", (1, 35, 35)),
    ("measure a = x given shift(t.d, 1.5, year)", "the shift must be a whole number, such as 1", (1, 32, 34)),
    (
        'measure a = x given to_date(t.d, month, start "07-01")',
        "`start` applies to a year or a quarter, not to a month",
        (1, 47, 53),
    ),
    (
        'measure a = x given to_date(t.d, year, start "7-1")',
        'a start must look like start "07-01" (month-day)',
        (1, 46, 50),
    ),
    (
        'measure a = x given to_date(t.d, year, start "02-29")',
        '"02-29" is not a day that every year has',
        (1, 46, 52),
    ),
    ("measure a = x given to_date(t.d, year, start 7)", 'a start must look like start "07-01"', (1, 40, 46)),
    (
        "measure a = x given row row",
        "unexpected `row`: `row` is a modifier: it stands after `given`, modifiers separated by commas",
        (1, 25, 27),
    ),
    (
        "measure a = x given clear u but t.x",
        "`clear u but` can only keep columns of `u`, not `t.x`",
        (1, 33, 35),
    ),
    # Errors on a later line point there.
    ("measure a = 1\n\nmeasure b =\n  sum(t.x) +\n", "expected an expression after `+`", (4, 13, 13)),
]


@pytest.mark.parametrize(("text", "message", "place"), CASES, ids=[text for text, _, _ in CASES])
def test_syntax_error_message_and_place(text: str, message: str, place: tuple[int, int, int]) -> None:
    with pytest.raises(MeasureportError) as caught:
        parse_measures(text, "errors.measures")
    error = caught.value
    assert error.message == message
    assert error.span.file == "errors.measures"
    assert (error.span.line, error.span.column, error.span.end_column) == place


_TERMINAL_NAME = re.compile(r"\b(RPAR|LPAR|NAME|NUMBER|STRING|EQUAL|COMMA|\$END|__ANON\w*|[A-Z]{4,})\b")


@pytest.mark.parametrize(("text", "message", "place"), CASES, ids=[text for text, _, _ in CASES])
def test_messages_never_show_grammar_terminal_names(
    text: str, message: str, place: tuple[int, int, int]
) -> None:
    with pytest.raises(MeasureportError) as caught:
        parse_measures(text, "errors.measures")
    assert _TERMINAL_NAME.search(caught.value.render()) is None


@pytest.mark.parametrize(
    ("text", "message", "column"),
    [
        ("", "expected an expression", 1),
        ("   ", "expected an expression", 1),
        ("x given", "expected a modifier after `given`", 8),
        ("1 2", "unexpected `2`: expected an operator or the end of the expression", 3),
        (")", "this `)` has no matching `(`", 1),
        ("measure a = 1", "expected an expression, found `measure`", 1),
    ],
)
def test_expression_errors(text: str, message: str, column: int) -> None:
    with pytest.raises(MeasureportError) as caught:
        parse_expression(text, "<--where>")
    assert caught.value.message == message
    assert (caught.value.span.line, caught.value.span.column) == (1, column)
