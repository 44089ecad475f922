"""Any text gives a tree or a MeasureportError with a span: never another exception, never slow.

Texts are random characters, random sequences of the language's words, and valid measures of an
invented bike-share network with characters deleted, inserted or swapped. A parse takes
milliseconds; the one-second deadline flags anything pathological and leaves room for a loaded
machine.
"""

from __future__ import annotations

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from measureport.errors import MeasureportError
from measureport.language import ast
from measureport.language.grammar import measure_parser
from measureport.language.parser import parse_expression, parse_measures

measure_parser()  # build the parser before hypothesis starts timing examples

VALID = [
    "measure trips = count(rides)",
    "# Revenue.\nmeasure revenue = sum(rides.fare)\nmeasure per_trip = revenue / trips",
    'measure cargo = trips given bikes.model like "%Cargo%", clear stations but stations.name',
    "measure share = trips / (trips given clear calendar but calendar.year, calendar.quarter)",
    'measure ytd = revenue given to_date(calendar.day, year, start "04-01"), shift(calendar.day, -1, year)',
    "measure busy = count(stations.name for each stations.name where trips > 100)",
    "measure growth =\n  let a = revenue\n  let b = revenue given trailing(calendar.day, 28, day)\n"
    "  if b > 0 then round(100 * (a - b) / b, 1) else null",
    'measure tag = if rides.fare between 1.5 and 2e1 then "mid ""fare""" else if not rides.fare is null '
    'then "other"',
    "measure r = rank(trips over stations.name ascending) + coalesce(single(stations.id), -1)",
    'measure d = trips given narrow calendar.day >= date "2025-03-01" and rides.rating not in (1, 2), row',
    "measure m = mean((trips given row, calendar.is_weekend = true) for each stations)",
    "measure g = greatest(least(abs(-revenue), 3), 0) given restricted(stations.name) != false",
]

WORDS = sorted(
    {
        "measure", "let", "if", "then", "else", "given", "for", "each", "where", "over", "ascending",
        "narrow", "clear", "but", "row", "and", "or", "not", "in", "between", "is", "null", "like",
        "true", "false", "date", "sum", "count", "coalesce", "round", "rank", "single", "restricted",
        "to_date", "shift", "trailing", "year", "month", "day", "start", "rides", "rides.fare", "x",
        "(", ")", ",", ".", "=", "!=", "<", "<=", ">", ">=", "+", "-", "*", "/", "1", "2.5", "1e3",
        '"a"', '"2026-03-01"', '"07-01"', "#", "\n", '"', "'", "!", "==",
    }
)  # fmt: skip


def check_outcome(text: str) -> None:
    """A tree, or a MeasureportError whose span is a real place in the text."""
    try:
        result = parse_measures(text, "fuzz.measures")
    except MeasureportError as error:
        assert error.message
        assert error.span.file == "fuzz.measures"
        lines = text.removeprefix("\ufeff").split("\n")
        assert 1 <= error.span.line <= len(lines)
        assert 1 <= error.span.column <= len(lines[error.span.line - 1]) + 1
        error.render()  # quoting the line must work too
    else:
        assert isinstance(result, ast.MeasureFile)


@st.composite
def mutated(draw: st.DrawFn) -> str:
    text = draw(st.sampled_from(VALID))
    for _ in range(draw(st.integers(1, 4))):
        position = draw(st.integers(0, len(text)))
        action = draw(st.sampled_from(["delete", "insert", "swap"]))
        if action == "delete" and position < len(text):
            text = text[:position] + text[position + 1 :]
        elif action == "insert":
            text = text[:position] + draw(st.sampled_from('()",.=<>-#\n a1"')) + text[position:]
        elif position + 1 < len(text):
            text = text[:position] + text[position + 1] + text[position] + text[position + 2 :]
    return text


def test_the_valid_texts_are_valid() -> None:
    # The mutations start from texts that parse; a broken seed would weaken the test below.
    for text in VALID:
        assert parse_measures(text, "seed.measures").measures


@settings(max_examples=200, deadline=1000)
@given(mutated())
def test_mutated_measures(text: str) -> None:
    check_outcome(text)


@settings(max_examples=200, deadline=1000)
@given(st.lists(st.sampled_from(WORDS), max_size=25).map(" ".join))
def test_word_soup(text: str) -> None:
    check_outcome("measure m = " + text)


@settings(max_examples=150, deadline=1000)
@given(st.text(max_size=60))
def test_random_text(text: str) -> None:
    check_outcome(text)


@settings(max_examples=150, deadline=1000)
@given(st.text(max_size=40), st.integers(1, 30), st.integers(1, 30))
def test_random_expressions_placed_in_a_file(text: str, line: int, column: int) -> None:
    try:
        parse_expression(text, "placed.yaml", line, column)
    except MeasureportError as error:
        assert error.span.file == "placed.yaml"
        assert error.span.line >= line
        assert error.span.line > line or error.span.column >= column


@pytest.mark.slow
@settings(max_examples=20000, deadline=1000)
@given(mutated() | st.lists(st.sampled_from(WORDS), max_size=40).map(lambda w: "measure m = " + " ".join(w)))
def test_long_fuzz(text: str) -> None:
    check_outcome(text)
