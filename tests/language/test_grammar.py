"""The grammar itself: its known parser choices, its words, and its speed."""

from __future__ import annotations

import logging
import re
import time
from importlib.resources import files

import pytest
from lark import Lark, logger
from lark.lexer import PatternStr

from measureport.language.grammar import measure_parser
from measureport.language.parser import parse_measures
from measureport.language.words import CONTEXT_WORDS, RESERVED_WORDS
from measureport.model.names import RESERVED_WORDS as MODEL_RESERVED_WORDS

GRAMMAR = files("measureport.language").joinpath("grammar.lark").read_text(encoding="utf-8")


def test_the_only_shift_reduce_choices_are_the_documented_ones(caplog: pytest.LogCaptureFixture) -> None:
    # grammar.lark resolves exactly these as shift: a `let` body starting with `-` or `not`
    # continues the value, a dangling `else`, and `given` after a then-branch. Any new
    # conflict would be resolved silently by lark, so it must show up here.
    with caplog.at_level(logging.DEBUG, logger=logger.name):
        Lark(GRAMMAR, parser="lalr", lexer="contextual", start=["measure_file", "expression"], debug=True)
    conflicts = set(re.findall(r"Shift/Reduce conflict for terminal (\w+)", caplog.text))
    assert conflicts == {"MINUS", "NOT", "ELSE", "GIVEN"}


def test_keywords_of_the_grammar_are_the_reserved_and_context_words() -> None:
    keywords = {
        t.pattern.value
        for t in measure_parser().terminals
        if isinstance(t.pattern, PatternStr) and t.pattern.value.isidentifier()
    }
    assert keywords == RESERVED_WORDS | CONTEXT_WORDS


def test_the_model_reserves_the_same_words() -> None:
    # Tables cannot take a reserved word (the model checks it); both lists must agree.
    assert MODEL_RESERVED_WORDS == RESERVED_WORDS


def test_the_parser_is_built_once() -> None:
    assert measure_parser() is measure_parser()


# Twenty measures of an invented bike-share network, in the shapes the demo uses.
TWENTY = "\n".join(
    [
        "# Trips.\nmeasure trips = count(rides)",
        "measure revenue = sum(rides.fare)",
        "measure per_trip = revenue / trips",
        "measure mean_time = round(mean(rides.minutes), 1)",
        "measure bikes_used = distinct(rides.bike_id)",
        'measure cargo = trips given bikes.model like "%Cargo%"',
        "measure happy = (trips given rides.rating between 4 and 5) / count(rides.rating)",
        "measure overtime = sum(greatest(rides.minutes - plans.minutes, 0) for each rides)",
        "measure peak = (trips given rides.hour in (7, 8, 9, 16, 17, 18)) / trips",
        "measure electric = coalesce((trips given narrow bikes.is_electric = true), 0) / trips",
        "measure share = trips / (trips given clear stations, clear districts)",
        "measure of_year = trips / (trips given clear calendar but calendar.year)",
        "measure ytd = revenue given to_date(calendar.day, year)",
        'measure fiscal = revenue given to_date(calendar.day, year, start "04-01")',
        "measure last_year = revenue given shift(calendar.day, -1, year)",
        "measure growth =\n  let now = revenue\n  let before = last_year\n"
        "  if before > 0 then round(100 * (now - before) / before, 1)",
        "measure recent = trips given trailing(calendar.day, 28, day)",
        "measure daily = mean(coalesce(trips, 0) for each calendar.day)",
        "measure station_rank = rank(trips over stations.name)",
        "measure weekend = mean((trips given row, calendar.is_weekend = true) for each stations)",
    ]
)


def test_parsing_twenty_measures_takes_milliseconds() -> None:
    measure_parser()
    assert len(parse_measures(TWENTY, "twenty.measures").measures) == 20
    started = time.perf_counter()
    for _ in range(5):
        parse_measures(TWENTY, "twenty.measures")
    per_parse = (time.perf_counter() - started) / 5
    # Measured about 13 ms on a shared two-core machine under heavy load; the bound leaves room.
    assert per_parse < 0.1
