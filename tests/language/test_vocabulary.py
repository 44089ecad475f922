"""Every row of the vocabulary tables of LANGUAGE.md section 2 parses to the tree it means.

The expected trees are written by hand from the contract; the measures are invented bike-share
examples.
"""

from __future__ import annotations

import datetime as dt

import pytest

from measureport.language import ast
from measureport.language.parser import parse_expression

C = ast.ColumnRef
N = ast.Number
T = ast.TableRef


def name(text: str) -> ast.Name:
    return ast.Name(text)


def given(body: ast.Expr, *modifiers: ast.Modifier) -> ast.Given:
    return ast.Given(body, modifiers)


def cond(expr: ast.Expr) -> ast.Condition:
    return ast.Condition(expr)


def eq(left: ast.Expr, right: ast.Expr) -> ast.Binary:
    return ast.Binary("=", left, right)


FARE = C("rides", "fare")
DAY = C("calendar", "day")

VOCABULARY: list[tuple[str, ast.Expr]] = [
    # The six aggregates over a column.
    ("sum(rides.fare)", ast.Aggregate("sum", FARE)),
    ("mean(rides.fare)", ast.Aggregate("mean", FARE)),
    ("min(rides.fare)", ast.Aggregate("min", FARE)),
    ("max(rides.fare)", ast.Aggregate("max", FARE)),
    ("count(rides.rating)", ast.Aggregate("count", C("rides", "rating"))),
    ("distinct(rides.bike_id)", ast.Aggregate("distinct", C("rides", "bike_id"))),
    # count(t): a bare name inside count is a table.
    ("count(rides)", ast.Aggregate("count", T("rides"))),
    # AGG(EXPR for each T)
    (
        "sum(rides.fare * 2 for each rides)",
        ast.Aggregate("sum", ast.Binary("*", FARE, N(2)), ast.Iteration(table=T("rides"))),
    ),
    # AGG(EXPR for each t.c1, t.c2)
    (
        "max(revenue for each calendar.year, calendar.month_number)",
        ast.Aggregate(
            "max",
            name("revenue"),
            ast.Iteration(columns=(C("calendar", "year"), C("calendar", "month_number"))),
        ),
    ),
    # ... for each T where COND
    (
        "count(rides.fare for each rides where rides.rating >= 4)",
        ast.Aggregate(
            "count",
            FARE,
            ast.Iteration(table=T("rides"), where=ast.Binary(">=", C("rides", "rating"), N(4))),
        ),
    ),
    (
        "mean(trips for each stations.name where trips > 10)",
        ast.Aggregate(
            "mean",
            name("trips"),
            ast.Iteration(columns=(C("stations", "name"),), where=ast.Binary(">", name("trips"), N(10))),
        ),
    ),
    # A measure inside for each is a name, not a table, even inside count.
    (
        "count(trips for each stations)",
        ast.Aggregate("count", name("trips"), ast.Iteration(table=T("stations"))),
    ),
    # EXPR given MOD, MOD
    (
        'trips given stations.name = "Harbour Gate", calendar.year = 2025',
        given(
            name("trips"),
            cond(eq(C("stations", "name"), ast.String("Harbour Gate"))),
            cond(eq(C("calendar", "year"), N(2025))),
        ),
    ),
    (
        "trips given rides.start_hour in (7, 8)",
        given(name("trips"), cond(ast.InList(C("rides", "start_hour"), (N(7), N(8))))),
    ),
    ("trips given narrow bikes.is_electric", given(name("trips"), ast.Narrow(C("bikes", "is_electric")))),
    ("trips given clear stations.name", given(name("trips"), ast.Clear("stations", "name"))),
    ("trips given clear stations", given(name("trips"), ast.Clear("stations"))),
    (
        "trips given clear calendar but calendar.year, calendar.quarter",
        given(name("trips"), ast.Clear("calendar", keep=(C("calendar", "year"), C("calendar", "quarter")))),
    ),
    ("trips given row", given(name("trips"), ast.RowBinding())),
    ("revenue given to_date(calendar.day, year)", given(name("revenue"), ast.ToDate(DAY, "year"))),
    ("revenue given to_date(calendar.day, quarter)", given(name("revenue"), ast.ToDate(DAY, "quarter"))),
    ("revenue given to_date(calendar.day, month)", given(name("revenue"), ast.ToDate(DAY, "month"))),
    (
        'revenue given to_date(calendar.day, year, start "07-01")',
        given(name("revenue"), ast.ToDate(DAY, "year", "07-01")),
    ),
    (
        'revenue given to_date(calendar.day, quarter, start "02-01")',
        given(name("revenue"), ast.ToDate(DAY, "quarter", "02-01")),
    ),
    ("revenue given shift(calendar.day, -1, year)", given(name("revenue"), ast.Shift(DAY, -1, "year"))),
    ("revenue given shift(calendar.day, 7, day)", given(name("revenue"), ast.Shift(DAY, 7, "day"))),
    ("revenue given shift(calendar.day, -3, month)", given(name("revenue"), ast.Shift(DAY, -3, "month"))),
    ("revenue given shift(calendar.day, 1, quarter)", given(name("revenue"), ast.Shift(DAY, 1, "quarter"))),
    ("trips given trailing(calendar.day, 28, day)", given(name("trips"), ast.Trailing(DAY, 28, "day"))),
    ("trips given trailing(calendar.day, 3, month)", given(name("trips"), ast.Trailing(DAY, 3, "month"))),
    ("trips given trailing(calendar.day, 1, year)", given(name("trips"), ast.Trailing(DAY, 1, "year"))),
    # rank
    ("rank(trips over stations.name)", ast.Rank(name("trips"), C("stations", "name"))),
    ("rank(trips over stations.name ascending)", ast.Rank(name("trips"), C("stations", "name"), True)),
    ("rank(trips over stations.name descending)", ast.Rank(name("trips"), C("stations", "name"), False)),
    # let
    (
        "let docks = sum(stations.capacity)\ntrips / docks",
        ast.Let(
            "docks",
            ast.Aggregate("sum", C("stations", "capacity")),
            ast.Binary("/", name("trips"), name("docks")),
        ),
    ),
    # if / then / else, else optional
    (
        'if trips > 100 then "busy" else "quiet"',
        ast.If(ast.Binary(">", name("trips"), N(100)), ast.String("busy"), ast.String("quiet")),
    ),
    ("if trips > 100 then trips", ast.If(ast.Binary(">", name("trips"), N(100)), name("trips"))),
    # arithmetic
    ("a + b", ast.Binary("+", name("a"), name("b"))),
    ("a - b", ast.Binary("-", name("a"), name("b"))),
    ("a * b", ast.Binary("*", name("a"), name("b"))),
    ("a / b", ast.Binary("/", name("a"), name("b"))),
    # comparisons and logic
    ("a = b", ast.Binary("=", name("a"), name("b"))),
    ("a != b", ast.Binary("!=", name("a"), name("b"))),
    ("a < b", ast.Binary("<", name("a"), name("b"))),
    ("a <= b", ast.Binary("<=", name("a"), name("b"))),
    ("a > b", ast.Binary(">", name("a"), name("b"))),
    ("a >= b", ast.Binary(">=", name("a"), name("b"))),
    ("a and b", ast.Binary("and", name("a"), name("b"))),
    ("a or b", ast.Binary("or", name("a"), name("b"))),
    ("not a", ast.Unary("not", name("a"))),
    (
        'bikes.model in ("City", "Cargo")',
        ast.InList(C("bikes", "model"), (ast.String("City"), ast.String("Cargo"))),
    ),
    ("rides.rating not in (1, 2)", ast.InList(C("rides", "rating"), (N(1), N(2)), negated=True)),
    ("rides.rating between 4 and 5", ast.Between(C("rides", "rating"), N(4), N(5))),
    ("rides.rating not between 4 and 5", ast.Between(C("rides", "rating"), N(4), N(5), negated=True)),
    ("rides.rating is null", ast.IsNull(C("rides", "rating"))),
    ("rides.rating is not null", ast.IsNull(C("rides", "rating"), negated=True)),
    ('bikes.model like "A%"', ast.Like(C("bikes", "model"), ast.String("A%"))),
    ('bikes.model not like "A%"', ast.Like(C("bikes", "model"), ast.String("A%"), negated=True)),
    # scalar functions
    ("coalesce(trips, 0)", ast.Call("coalesce", (name("trips"), N(0)))),
    ("coalesce(a, b, 0)", ast.Call("coalesce", (name("a"), name("b"), N(0)))),
    ("abs(a)", ast.Call("abs", (name("a"),))),
    ("round(a, 2)", ast.Call("round", (name("a"), N(2)))),
    ("least(a, 1.0)", ast.Call("least", (name("a"), N(1.0)))),
    ("greatest(a, b, 0)", ast.Call("greatest", (name("a"), name("b"), N(0)))),
    # single, restricted
    ("single(stations.district_id)", ast.Single(C("stations", "district_id"))),
    ("restricted(stations.name)", ast.Restricted(C("stations", "name"))),
    # literals
    ("42", N(42)),
    ("3.5", N(3.5)),
    ('"text"', ast.String("text")),
    ('"a ""quoted"" word"', ast.String('a "quoted" word')),
    ('date "2026-03-01"', ast.DateLiteral(dt.date(2026, 3, 1))),
    ("true", ast.Boolean(True)),
    ("false", ast.Boolean(False)),
    ("null", ast.Null()),
]


@pytest.mark.parametrize(("text", "expected"), VOCABULARY, ids=[text for text, _ in VOCABULARY])
def test_vocabulary_row_parses_to_its_tree(text: str, expected: ast.Expr) -> None:
    parsed = parse_expression(text, "<vocabulary>")
    assert parsed == expected
    # Equality does not tell 1 from 1.0; the repr does (spans are left out of it).
    assert repr(parsed) == repr(expected)


def test_bare_name_is_a_table_only_where_the_contract_says() -> None:
    # LANGUAGE.md section 2: a table inside count(...), after for each and after clear;
    # a measure or let value everywhere else.
    parsed = parse_expression("sum(trips for each stations) given clear stations", "<names>")
    assert parsed == given(
        ast.Aggregate("sum", name("trips"), ast.Iteration(table=T("stations"))), ast.Clear("stations")
    )
    assert parse_expression("sum(trips)", "<names>") == ast.Aggregate("sum", name("trips"))


def test_reserved_words_may_name_columns() -> None:
    # A column is always written table.column, so `calendar.date` cannot be misread.
    assert parse_expression("max(calendar.date)", "<columns>") == ast.Aggregate("max", C("calendar", "date"))
    assert parse_expression("rides.count + rides.if", "<columns>") == ast.Binary(
        "+", C("rides", "count"), C("rides", "if")
    )


def test_period_words_stay_free_as_names() -> None:
    # year, quarter, month, day and start are words only inside the time modifiers.
    parsed = parse_expression("year + month given to_date(calendar.day, month)", "<periods>")
    assert parsed == given(ast.Binary("+", name("year"), name("month")), ast.ToDate(DAY, "month"))
