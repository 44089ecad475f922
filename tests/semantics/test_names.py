"""Names: measures, tables, columns, measures defined twice, and let scoping (invented bike-share model)."""

from __future__ import annotations

import pytest

from measureport.errors import MeasureportError
from measureport.language import ast
from measureport.semantics.binder import bind_model
from semantics.bikes import BIKES, FILE, bind, only_problem, parse, problems, where


def test_unknown_measure_suggests_a_close_name() -> None:
    found = only_problem(
        """measure trips = count(rides)
measure per_trip = sum(rides.fare) /
  trps
"""
    )
    assert found.message == "unknown measure trps; did you mean trips?"
    assert where(found) == (3, 3)
    assert found.span.file == FILE


def test_unknown_measure_without_a_close_name_gets_no_suggestion() -> None:
    found = only_problem("measure a = zebra_crossing\n")
    assert found.message == "unknown measure zebra_crossing"
    assert where(found) == (1, 13)  # "measure a = " is 12 characters


def test_a_table_used_as_a_value_says_how_to_count_it() -> None:
    found = only_problem("measure a =\n  rides + 1\n")
    assert found.message == "rides is a table, not a measure or a let value; count(rides) counts its rows"
    assert where(found) == (2, 3)


def test_unknown_table_points_at_the_table_name() -> None:
    found = only_problem("measure fares =\n  sum(ride.fare)\n")
    assert found.message == "unknown table ride; did you mean rides?"
    assert where(found) == (2, 7)  # after "  sum("
    assert (found.span.end_line, found.span.end_column) == (2, 10)  # "ride" is 4 characters


def test_unknown_column_points_at_the_column_name() -> None:
    found = only_problem("measure fares =\n  sum(rides.fair)\n")
    assert found.message == "table rides has no column fair; did you mean fare?"
    assert where(found) == (2, 13)  # after "  sum(rides."


def test_count_of_an_unknown_table() -> None:
    found = only_problem("measure n =\n  count(ridez)\n")
    assert found.message == "unknown table ridez; did you mean rides?"
    assert where(found) == (2, 9)  # after "  count("


def test_count_of_a_measure_is_not_a_count_of_rows() -> None:
    found = only_problem("measure trips = count(rides)\nmeasure twice =\n  count(trips)\n")
    assert found.message == "trips is a measure, not a table: count(...) takes a table or a column"
    assert where(found) == (3, 9)


def test_count_of_a_let_value_is_not_a_count_of_rows() -> None:
    found = only_problem("measure n =\n  let r = 2\n  count(r)\n")
    assert found.message == "r is a let value, not a table: count(...) takes a table or a column"
    assert where(found) == (3, 9)


def test_several_errors_come_out_together_in_source_order() -> None:
    found = problems("measure b = zzz_two\nmeasure a =\n  sum(rides.nope) + zzz_one\n")
    assert [(d.message, where(d)) for d in found] == [
        ("unknown measure zzz_two", (1, 13)),
        ("table rides has no column nope", (3, 13)),
        ("unknown measure zzz_one", (3, 21)),  # "  sum(rides.nope) + " is 20 characters
    ]


def test_a_measure_defined_in_two_files_names_both_places() -> None:
    first = parse("measure trips = count(rides)\n", "a.measures")
    second = parse("measure fares = sum(rides.fare)\nmeasure trips = count(rides.ride_id)\n", "b.measures")
    with pytest.raises(MeasureportError) as raised:
        bind_model(BIKES, [first, second])
    error, note = raised.value.diagnostics
    assert error.message == "measure trips is defined twice; the first definition is at a.measures:1:9"
    assert (error.span.file, where(error)) == ("b.measures", (2, 9))
    assert note.severity == "note"
    assert note.message == "measure trips is first defined here"
    assert (note.span.file, where(note)) == ("a.measures", (1, 9))


# --- let scoping ----------------------------------------------------------------------------


def test_let_values_and_measures_resolve_to_their_references() -> None:
    bound = bind("measure trips = count(rides)\nmeasure x =\n  let t = trips\n  t * 2 + trips\n")
    assert bound.measures["x"].expr == ast.Let(
        "t",
        ast.MeasureRef("trips"),
        ast.Binary("+", ast.Binary("*", ast.LocalRef("t"), ast.Number(2)), ast.MeasureRef("trips")),
    )


def test_a_let_may_not_take_a_measure_name() -> None:
    found = only_problem("measure trips = count(rides)\nmeasure x =\n  let trips = 2\n  trips\n")
    assert found.message == "let trips reuses the name of a measure; pick another name"
    assert where(found) == (3, 7)  # the name after "  let "


def test_a_let_may_not_take_the_name_of_an_enclosing_let() -> None:
    found = only_problem("measure x =\n  let a = 1\n  let a = 2\n  a\n")
    assert (
        found.message
        == "let a reuses the name of an enclosing let (at bikes.measures:2:7); pick another name"
    )
    assert where(found) == (3, 7)


def test_lets_side_by_side_may_share_a_name() -> None:
    bound = bind("measure x = (let a = 1 a) + (let a = 2 a * 3)\n")
    assert bound.measures["x"].expr == ast.Binary(
        "+",
        ast.Let("a", ast.Number(1), ast.LocalRef("a")),
        ast.Let("a", ast.Number(2), ast.Binary("*", ast.LocalRef("a"), ast.Number(3))),
    )


def test_a_let_is_not_visible_after_its_body() -> None:
    found = only_problem("measure x = (let a = 1 a) + a\n")
    assert found.message == "unknown measure a"
    assert where(found) == (1, 29)  # "measure x = (let a = 1 a) + " is 28 characters


def test_a_let_value_does_not_see_its_own_name() -> None:
    found = only_problem("measure x =\n  let a = a + 1\n  a\n")
    assert found.message == "unknown measure a"
    assert where(found) == (2, 11)


def test_an_inner_let_sees_the_outer_one() -> None:
    bound = bind("measure x =\n  let a = 1\n  let b = a + 1\n  b\n")
    inner = bound.measures["x"].expr
    assert isinstance(inner, ast.Let) and isinstance(inner.body, ast.Let)
    assert inner.body.value == ast.Binary("+", ast.LocalRef("a"), ast.Number(1))
