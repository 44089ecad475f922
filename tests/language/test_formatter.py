"""The canonical text of syntax trees: expected texts written by hand from the grammar's levels."""

from __future__ import annotations

import datetime as dt

import pytest

from measureport.language import ast
from measureport.language.formatter import format_expr, format_measure

a, b, c = ast.Name("a"), ast.Name("b"), ast.Name("c")
ROW = ast.RowBinding()
YEAR = ast.Condition(ast.Binary("=", ast.ColumnRef("calendar", "year"), ast.Number(2025)))


def binary(op: ast.BinaryOp, left: ast.Expr, right: ast.Expr) -> ast.Binary:
    return ast.Binary(op, left, right)


@pytest.mark.parametrize(
    ("tree", "text"),
    [
        # Arithmetic is left-associative: a right operand of the same level needs parentheses.
        (binary("-", binary("-", a, b), c), "a - b - c"),
        (binary("-", a, binary("-", b, c)), "a - (b - c)"),
        (binary("+", a, binary("+", b, c)), "a + (b + c)"),
        (binary("*", binary("+", a, b), c), "(a + b) * c"),
        (binary("+", a, binary("*", b, c)), "a + b * c"),
        # Unary minus binds tighter than a product.
        (ast.Unary("-", binary("*", a, b)), "-(a * b)"),
        (binary("*", ast.Unary("-", a), b), "-a * b"),
        (ast.Unary("-", ast.Unary("-", a)), "- -a"),
        (binary("-", a, ast.Number(-3)), "a - -3"),
        # Comparisons do not chain, so a comparison inside a comparison is parenthesized.
        (binary("=", binary("<", a, b), ast.Boolean(True)), "(a < b) = true"),
        (ast.Unary("not", binary("=", a, b)), "not a = b"),
        (binary("=", ast.Unary("not", a), b), "(not a) = b"),
        (binary("or", a, binary("and", b, c)), "a or b and c"),
        (binary("and", binary("or", a, b), c), "(a or b) and c"),
        # given takes everything on its left; a revised part needs parentheses.
        (ast.Given(binary("/", a, b), (ROW,)), "a / b given row"),
        (binary("/", a, ast.Given(b, (ROW,))), "a / (b given row)"),
        (ast.Given(ast.Given(a, (ROW,)), (YEAR,)), "a given row given calendar.year = 2025"),
        # An if without else would swallow a following `given` or `else`.
        (ast.Given(ast.If(a, b), (ROW,)), "(if a then b) given row"),
        (ast.Given(ast.If(a, b, c), (ROW,)), "if a then b else c given row"),
        (ast.If(a, ast.If(b, c), ast.Number(0)), "if a then (if b then c) else 0"),
        (ast.If(a, b, ast.Given(c, (ROW,))), "if a then b else (c given row)"),
        # Inside a list of values a comma ends the item: a given with several modifiers is wrapped.
        (ast.Call("coalesce", (ast.Given(a, (ROW,)), ast.Number(0))), "coalesce(a given row, 0)"),
        (
            ast.Call("coalesce", (ast.Given(a, (ROW, YEAR)), ast.Number(0))),
            "coalesce((a given row, calendar.year = 2025), 0)",
        ),
        # A bare column right after `clear t but ...` would join the kept list.
        (
            ast.Given(
                a,
                (
                    ast.Clear("bikes", keep=(ast.ColumnRef("bikes", "model"),)),
                    ast.Condition(ast.ColumnRef("bikes", "is_electric")),
                ),
            ),
            "a given clear bikes but bikes.model, (bikes.is_electric)",
        ),
        # A let body starting with a minus would continue the value.
        (ast.Let("x", ast.Number(1), ast.Unary("-", a)), "let x = 1\n(-a)"),
        (ast.Let("x", ast.Number(1), binary("+", ast.Name("x"), a)), "let x = 1\nx + a"),
        (ast.Given(ast.Let("x", a, b), (ROW,)), "(let x = a\nb) given row"),
        # Literals.
        (ast.String('say "hi"'), '"say ""hi"""'),
        (ast.DateLiteral(dt.date(2026, 3, 1)), 'date "2026-03-01"'),
        (ast.Number(2.5e-7), "2.5e-07"),
        (ast.Number(1000.0), "1000.0"),
        (ast.Null(), "null"),
        # Aggregates, iteration, rank, time modifiers.
        (ast.Aggregate("count", ast.TableRef("rides")), "count(rides)"),
        (
            ast.Aggregate(
                "sum",
                ast.ColumnRef("rides", "fare"),
                ast.Iteration(
                    table=ast.TableRef("rides"), where=binary(">", ast.ColumnRef("rides", "fare"), a)
                ),
            ),
            "sum(rides.fare for each rides where rides.fare > a)",
        ),
        (
            ast.Aggregate(
                "max",
                a,
                ast.Iteration(
                    columns=(ast.ColumnRef("calendar", "year"), ast.ColumnRef("calendar", "month"))
                ),
            ),
            "max(a for each calendar.year, calendar.month)",
        ),
        (
            ast.Rank(a, ast.ColumnRef("stations", "name"), ascending=True),
            "rank(a over stations.name ascending)",
        ),
        (ast.Rank(a, ast.ColumnRef("stations", "name")), "rank(a over stations.name)"),
        (
            ast.Given(
                a,
                (
                    ast.ToDate(ast.ColumnRef("calendar", "day"), "year", "04-01"),
                    ast.Shift(ast.ColumnRef("calendar", "day"), -1, "year"),
                    ast.Trailing(ast.ColumnRef("calendar", "day"), 28, "day"),
                    ast.Narrow(ast.ColumnRef("bikes", "is_electric")),
                    ast.Clear("stations", "name"),
                ),
            ),
            'a given to_date(calendar.day, year, start "04-01"), shift(calendar.day, -1, year), '
            "trailing(calendar.day, 28, day), narrow bikes.is_electric, clear stations.name",
        ),
        (ast.InList(a, (ast.Number(1), ast.Number(2)), negated=True), "a not in (1, 2)"),
        (ast.Between(binary("+", a, b), ast.Number(1), ast.Number(2)), "a + b between 1 and 2"),
        (ast.IsNull(a, negated=True), "a is not null"),
        (ast.Like(a, ast.String("A%"), negated=True), 'a not like "A%"'),
        # Names the binder puts in place print as the names they stand for.
        (binary("+", ast.MeasureRef("trips"), ast.LocalRef("docks")), "trips + docks"),
    ],
)
def test_canonical_text(tree: ast.Expr, text: str) -> None:
    assert format_expr(tree) == text


def test_format_measure_with_description_and_continuation_lines() -> None:
    measure = ast.MeasureDef(
        "dock_use",
        ast.Let(
            "docks",
            ast.Aggregate("sum", ast.ColumnRef("stations", "capacity")),
            binary("/", a, ast.Name("docks")),
        ),
        description="Rides per dock.\n\nInvented for the demo.",
    )
    assert format_measure(measure) == (
        "# Rides per dock.\n#\n# Invented for the demo.\n"
        "measure dock_use = let docks = sum(stations.capacity)\n"
        "  a / docks"
    )


def test_a_number_without_a_literal_is_refused() -> None:
    with pytest.raises(ValueError, match="no literal"):
        format_expr(ast.Number(float("nan")))
