"""clear and the time modifiers after given (invented bike-share model).

The parser already refuses some of these (a start on a month, a malformed start, a trailing
count below 1, kept columns of another table); the binder checks them again for syntax trees
built by other means, so those tests build their trees by hand.
"""

from __future__ import annotations

import pytest

from measureport.errors import MeasureportError, Span
from measureport.language import ast
from measureport.semantics.binder import bind_model
from semantics.bikes import BIKES, bind, only_problem, where


def one(expression_lines: str) -> tuple[str, tuple[int, int]]:
    """Bind ``measure m =`` followed by the given lines; the one error and where it is."""
    found = only_problem("measure trips = count(rides)\nmeasure m =\n" + expression_lines)
    return found.message, where(found)


HERE = Span("hand.measures", 1, 20, 1, 40)
DAY = ast.ColumnRef("calendar", "day", span=Span("hand.measures", 1, 30, 1, 41))


def hand_error(*modifiers: ast.Modifier) -> tuple[str, Span]:
    """The one error of ``count(rides) given MODIFIERS`` built by hand."""
    expr = ast.Given(ast.Aggregate("count", ast.TableRef("rides")), modifiers)
    tree = ast.MeasureFile("hand.measures", (ast.MeasureDef("m", expr),))
    with pytest.raises(MeasureportError) as raised:
        bind_model(BIKES, [tree])
    assert raised.value.more == []
    return raised.value.message, raised.value.span


def test_modifiers_that_bind() -> None:
    bound = bind(
        "measure trips = count(rides)\n"
        "measure m = trips given clear stations but stations.name, stations.district_id,\n"
        "  clear calendar.month, narrow calendar.year = 2025,\n"
        '  to_date(calendar.day, year, start "07-01"), shift(calendar.day, -1, quarter),\n'
        "  trailing(calendar.day, 28, day)\n"
    )
    assert bound.measures["m"].type == "number"


def test_clear_of_an_unknown_table() -> None:
    assert one("  trips given\n  clear ridez\n") == ("unknown table ridez; did you mean rides?", (4, 3))


def test_clear_of_an_unknown_column() -> None:
    assert one("  trips given\n  clear stations.nam\n") == (
        "table stations has no column nam; did you mean name?",
        (4, 3),
    )


def test_clear_of_a_measure() -> None:
    assert one("  trips given\n  clear trips\n") == (
        "trips is a measure, not a table: clear takes a table or a column written table.column",
        (4, 3),
    )


def test_clear_but_keeps_columns_of_the_cleared_table_only() -> None:
    kept = ast.ColumnRef("bikes", "model", span=Span("hand.measures", 1, 35, 1, 45))
    assert hand_error(ast.Clear("stations", keep=(kept,), span=HERE)) == (
        "clear stations but keeps columns of stations; bikes.model is a column of bikes",
        kept.span,
    )


def test_clear_but_keeps_known_columns() -> None:
    assert one("  trips given clear stations but\n  stations.nme\n") == (
        "table stations has no column nme; did you mean name?",
        (4, 12),  # after "  stations."
    )


def test_a_time_modifier_needs_a_date_column() -> None:
    assert one("  trips given to_date(\n  calendar.month, year)\n") == (
        "to_date needs a date column; calendar.month is a number",
        (4, 3),
    )
    message, _ = one("  trips given shift(stations.name, 1, year)\n")
    assert message == "shift needs a date column; stations.name is text"


def test_trailing_does_not_take_quarters() -> None:
    assert one("  trips given\n  trailing(calendar.day, 2, quarter)\n") == (
        "trailing takes day, month or year, not quarter",
        (4, 3),
    )


def test_to_date_takes_only_the_listed_periods() -> None:
    assert hand_error(ast.ToDate(DAY, "week", span=HERE)) == (  # type: ignore[arg-type]
        "to_date takes year, quarter or month, not week",
        HERE,
    )


def test_shift_takes_only_the_listed_units() -> None:
    assert hand_error(ast.Shift(DAY, 1, "week", span=HERE)) == (  # type: ignore[arg-type]
        "shift takes day, month, quarter or year, not week",
        HERE,
    )


def test_start_does_not_apply_to_a_month() -> None:
    assert hand_error(ast.ToDate(DAY, "month", "07-01", span=HERE)) == (
        "start applies to year and quarter; a month always starts on its first day",
        HERE,
    )


@pytest.mark.parametrize(
    ("start", "message"),
    [
        ("7-1", 'start "7-1" must be written "MM-DD", e.g. "07-01"'),
        ("13-01", 'start "13-01" has no month 13; months run from 01 to 12'),
        ("00-10", 'start "00-10" has no month 00; months run from 01 to 12'),
        ("04-31", 'start "04-31" has no day 31 in month 04'),  # April has 30 days
        ("02-29", 'start "02-29" exists only in leap years; pick another day'),
        ("01-00", 'start "01-00" has no day 00 in month 01'),
    ],
)
def test_a_bad_start(start: str, message: str) -> None:
    assert hand_error(ast.ToDate(DAY, "year", start, span=HERE)) == (message, HERE)


def test_a_good_start_on_a_quarter() -> None:
    # 02-28 exists every year; quarters may start in any month.
    expr = ast.Given(ast.Aggregate("count", ast.TableRef("rides")), (ast.ToDate(DAY, "quarter", "02-28"),))
    bound = bind_model(BIKES, [ast.MeasureFile("hand.measures", (ast.MeasureDef("m", expr),))])
    assert bound.measures["m"].type == "number"


@pytest.mark.parametrize("count", [0, -3])
def test_trailing_needs_a_positive_count(count: int) -> None:
    assert hand_error(ast.Trailing(DAY, count, "day", span=HERE)) == (
        f"trailing needs a positive number of periods, not {count}",
        HERE,
    )
