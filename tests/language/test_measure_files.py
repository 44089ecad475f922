"""Measure files: several definitions, multi-line measures, comments and descriptions (invented data)."""

from __future__ import annotations

import pytest

from measureport.errors import MeasureportError
from measureport.language import ast
from measureport.language.parser import parse_measures


def parse(text: str) -> ast.MeasureFile:
    return parse_measures(text, "fleet.measures")


def test_several_measures_in_the_order_written() -> None:
    parsed = parse("measure trips = count(rides)\nmeasure revenue = sum(rides.fare)\n")
    assert [m.name for m in parsed.measures] == ["trips", "revenue"]
    assert parsed.measures[1].expr == ast.Aggregate("sum", ast.ColumnRef("rides", "fare"))
    assert parsed.path == "fleet.measures"


def test_an_empty_file_and_a_file_of_comments_have_no_measures() -> None:
    assert parse("").measures == ()
    assert parse("# nothing here yet\n\n# still nothing\n").measures == ()


def test_a_measure_may_span_lines() -> None:
    text = "measure fare_per_trip =\n  sum(rides.fare)\n  /\n  count(rides)\nmeasure trips = count(rides)"
    parsed = parse(text)
    assert parsed.measures[0].expr == ast.Binary(
        "/",
        ast.Aggregate("sum", ast.ColumnRef("rides", "fare")),
        ast.Aggregate("count", ast.TableRef("rides")),
    )
    assert parsed.measures[1].name == "trips"


def test_measures_may_share_a_line() -> None:
    parsed = parse("measure a = 1 measure b = a + 1")
    assert [(m.name, m.expr) for m in parsed.measures] == [
        ("a", ast.Number(1)),
        ("b", ast.Binary("+", ast.Name("a"), ast.Number(1))),
    ]


def test_comments_may_stand_anywhere_outside_text() -> None:
    text = "measure a = sum(rides.fare) # fares only\n  # a note inside the measure\n  / 2"
    assert parse(text).measures[0].expr == ast.Binary(
        "/", ast.Aggregate("sum", ast.ColumnRef("rides", "fare")), ast.Number(2)
    )


def test_the_comment_block_right_above_a_measure_is_its_description() -> None:
    text = (
        "# File header, not a description.\n"
        "\n"
        "# Trips: how many rides were taken.\n"
        "# Every ride counts.\n"
        "measure trips = count(rides)\n"
    )
    # The block's lines, `# ` stripped, joined by new lines; the header is cut off by the blank line.
    assert parse(text).measures[0].description == "Trips: how many rides were taken.\nEvery ride counts."


def test_no_comment_block_means_no_description() -> None:
    text = "# About trips.\n\nmeasure trips = count(rides)\nmeasure revenue = sum(rides.fare)\n"
    assert [m.description for m in parse(text).measures] == [None, None]


def test_description_keeps_inner_empty_comment_lines_and_indentation() -> None:
    text = "#\n# Revenue.\n#\n#   fares only\n#\nmeasure revenue = sum(rides.fare)\n"
    # Empty comment lines at the ends are dropped; inside, kept; one space after `#` is stripped.
    assert parse(text).measures[0].description == "Revenue.\n\n  fares only"


def test_description_of_an_indented_definition() -> None:
    text = "  # Indented comment.\n  measure trips = count(rides)\n"
    assert parse(text).measures[0].description == "Indented comment."


def test_a_definition_that_does_not_start_its_line_has_no_description() -> None:
    text = "# About a.\nmeasure a = 1 measure b = 2\n"
    assert [m.description for m in parse(text).measures] == ["About a.", None]


def test_a_comment_after_code_on_the_line_above_is_not_a_description() -> None:
    text = "measure a = 1 # about a\nmeasure b = 2\n"
    assert parse(text).measures[1].description is None


def test_windows_line_endings_and_a_byte_order_mark() -> None:
    text = "\ufeff# Trips.\r\nmeasure trips =\r\n  count(rides)\r\n"
    parsed = parse(text)
    assert parsed.measures[0].description == "Trips."
    assert parsed.measures[0].expr == ast.Aggregate("count", ast.TableRef("rides"))
    assert parsed.measures[0].span.line == 2


def test_a_measure_defined_twice_is_an_error_at_the_second() -> None:
    with pytest.raises(MeasureportError) as caught:
        parse("measure a = 1\nmeasure b = 2\nmeasure a = 3\n")
    assert caught.value.message == (
        "measure `a` is defined twice; the first definition is at fleet.measures:1:9"
    )
    assert (caught.value.span.line, caught.value.span.column) == (3, 9)


def test_lets_over_several_lines() -> None:
    text = (
        "measure dock_use =\n"
        "  let docks = sum(stations.capacity)\n"
        "  let days = count(calendar)\n"
        "  trips / (docks * days)\n"
    )
    expected = ast.Let(
        "docks",
        ast.Aggregate("sum", ast.ColumnRef("stations", "capacity")),
        ast.Let(
            "days",
            ast.Aggregate("count", ast.TableRef("calendar")),
            ast.Binary("/", ast.Name("trips"), ast.Binary("*", ast.Name("docks"), ast.Name("days"))),
        ),
    )
    assert parse(text).measures[0].expr == expected
