"""Every node carries the span of its text: file, 1-based line and column, inclusive end."""

from __future__ import annotations

import pytest

from measureport.errors import MeasureportError, Span
from measureport.language import ast
from measureport.language.parser import parse_expression, parse_measures

FILE = "spans.measures"
# Columns counted by hand:      1234567890123456789012345678901234567890
TEXT = "# Fare per trip.\nmeasure fare_per_trip =\n  sum(rides.fare) / count(rides)\n"


def where(span: Span) -> tuple[int, int, int, int]:
    return (span.line, span.column, span.end_line, span.end_column)


@pytest.fixture()
def measure() -> ast.MeasureDef:
    return parse_measures(TEXT, FILE).measures[0]


def test_measure_definition_span(measure: ast.MeasureDef) -> None:
    # From `measure` (line 2, column 1) to the `)` closing count(rides) (line 3, column 32).
    assert measure.span.file == FILE
    assert where(measure.span) == (2, 1, 3, 32)
    # `fare_per_trip` is 13 characters from column 9.
    assert where(measure.name_span) == (2, 9, 2, 21)


def test_nodes_on_line_three(measure: ast.MeasureDef) -> None:
    division = measure.expr
    assert isinstance(division, ast.Binary)
    total, trips = division.left, division.right
    assert isinstance(total, ast.Aggregate)
    assert isinstance(trips, ast.Aggregate)
    # "  sum(rides.fare) / count(rides)": sum( starts at column 3; `)` of sum at column 17.
    assert where(total.span) == (3, 3, 3, 17)
    # rides.fare: columns 7 to 16.
    assert where(total.argument.span) == (3, 7, 3, 16)
    # count(rides): columns 21 to 32; the table name `rides` inside it: 27 to 31.
    assert where(trips.span) == (3, 21, 3, 32)
    assert where(trips.argument.span) == (3, 27, 3, 31)
    assert where(division.span) == (3, 3, 3, 32)


def test_spans_over_several_lines() -> None:
    text = "measure m =\n  trips\n  given clear stations,\n    calendar.year = 2025\n"
    given = parse_measures(text, FILE).measures[0].expr
    assert isinstance(given, ast.Given)
    # From `trips` (2:3) to `2025` (4:24).
    assert where(given.span) == (2, 3, 4, 24)
    clear, year = given.modifiers
    assert where(clear.span) == (3, 9, 3, 22)
    assert where(year.span) == (4, 5, 4, 24)


def test_let_name_span() -> None:
    parsed = parse_expression("let docks = 1\ndocks", FILE)
    assert isinstance(parsed, ast.Let)
    assert where(parsed.name_span) == (1, 5, 1, 9)
    assert where(parsed.body.span) == (2, 1, 2, 5)


def test_parentheses_are_not_part_of_the_inner_node() -> None:
    parsed = parse_expression("(a + b) * c", FILE)
    assert isinstance(parsed, ast.Binary)
    assert where(parsed.left.span) == (1, 2, 1, 6)
    assert where(parsed.span) == (1, 1, 1, 11)


def test_iteration_and_modifier_spans() -> None:
    parsed = parse_expression("sum(rides.fare for each rides where rides.rating > 3) given row", FILE)
    assert isinstance(parsed, ast.Given)
    aggregate = parsed.body
    assert isinstance(aggregate, ast.Aggregate)
    assert aggregate.iteration is not None
    # `for each rides where rides.rating > 3`: columns 16 to 52; `rides` after each: 25 to 29.
    assert where(aggregate.iteration.span) == (1, 16, 1, 52)
    assert aggregate.iteration.table is not None
    assert where(aggregate.iteration.table.span) == (1, 25, 1, 29)
    assert where(parsed.modifiers[0].span) == (1, 61, 1, 63)


def test_expression_placed_inside_a_file_points_into_that_file() -> None:
    # A view's `where:` entry starting at line 5, column 10 of a model file.
    parsed = parse_expression('stations.name = "Quay"', "model.yaml", line=5, column=10)
    assert isinstance(parsed, ast.Binary)
    assert parsed.span.file == "model.yaml"
    # stations.name is 13 characters: columns 10 to 22; the whole condition ends at 10 + 22 - 1.
    assert where(parsed.left.span) == (5, 10, 5, 22)
    assert where(parsed.span) == (5, 10, 5, 31)


def test_error_in_a_placed_expression_points_into_the_file() -> None:
    with pytest.raises(MeasureportError) as caught:
        parse_expression("calendar.year >= ", "model.yaml", line=7, column=14)
    # `>=` sits at offsets 14-15 of the text, so at columns 14 + 14 = 28 and 29; the missing
    # expression is reported just after it, at column 30.
    assert caught.value.span == Span("model.yaml", 7, 30, 7, 30)


def test_error_render_quotes_the_line_with_a_caret() -> None:
    with pytest.raises(MeasureportError) as caught:
        parse_measures("measure a = 1\nmeasure b = summ(rides.fare)\n", "render.measures")
    rendered = caught.value.render()
    assert rendered.splitlines() == [
        "render.measures:2:13: error: unknown function `summ` — did you mean `sum`?",
        "  measure b = summ(rides.fare)",
        "              ^^^^",
    ]
