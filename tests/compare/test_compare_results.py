"""compare_results on hand-made result tables (invented values; every expectation worked out by hand)."""

from __future__ import annotations

import datetime as dt

import pytest

from measureport.compare import compare_results, restrict_levels
from measureport.query import ResultTable

BY = ("tools.name",)
MEASURES = ("loans", "fees")


def table(rows: list[tuple[object, ...]], levels: list[int] | None = None,
          measures: tuple[str, ...] = MEASURES) -> ResultTable:
    return ResultTable(BY, measures, rows, levels or [])


EXPECTED = table([("Drill", 4, 15.75), ("Sander", 1, 12.5), (None, 1, 1.75)])


def test_equal_results_in_another_order_and_types() -> None:
    # Rows match by key, not by position; 4.0 is 4, Decimal-free floats alike.
    actual = table([(None, 1.0, 1.75), ("Sander", 1, 12.5), ("Drill", 4.0, 15.75)])
    comparison = compare_results(EXPECTED, actual)
    assert comparison.equal
    assert (comparison.expected_rows, comparison.actual_rows, comparison.matched_rows) == (3, 3, 3)


def test_measures_match_by_name_not_position() -> None:
    actual = table([("Drill", 15.75, 4), ("Sander", 12.5, 1), (None, 1.75, 1)], measures=("fees", "loans"))
    assert compare_results(EXPECTED, actual).equal


def test_a_differing_cell_with_its_errors() -> None:
    actual = table([("Drill", 4, 16.0), ("Sander", 1, 12.5), (None, 1, 1.75)])
    comparison = compare_results(EXPECTED, actual)
    assert not comparison.equal
    (difference,) = comparison.differences
    assert (difference.key, difference.measure, difference.expected, difference.actual) == (
        ("Drill",), "fees", 15.75, 16.0
    )
    # |16.0 - 15.75| = 0.25; relative to 15.75: 0.25 / 15.75 = 1/63.
    assert difference.error is not None
    assert difference.error.absolute == 0.25
    assert difference.error.relative == pytest.approx(1 / 63)
    assert comparison.differing_rows == 1


def test_missing_and_extra_rows() -> None:
    # Sander is not in the actual result; Ladder is not in the expected one.
    actual = table([("Drill", 4, 15.75), ("Ladder", 2, 3.0), (None, 1, 1.75)])
    comparison = compare_results(EXPECTED, actual)
    assert [(r.key, r.values) for r in comparison.missing] == [(("Sander",), (1, 12.5))]
    assert [(r.key, r.values) for r in comparison.extra] == [(("Ladder",), (2, 3.0))]
    assert comparison.differences == ()
    assert comparison.matched_rows == 2


def test_the_empty_member_is_a_key_like_any_other() -> None:
    # The empty member (None) on one side and the text "" on the other are different members.
    actual = table([("Drill", 4, 15.75), ("Sander", 1, 12.5), ("", 1, 1.75)])
    comparison = compare_results(EXPECTED, actual)
    assert [r.key for r in comparison.missing] == [(None,)]
    assert [r.key for r in comparison.extra] == [("",)]


def test_null_cells() -> None:
    # Sander's fees: null expected, 0 actual — a difference without a numeric error.
    expected = table([("Sander", 1, None)])
    comparison = compare_results(expected, table([("Sander", 1, 0)]))
    (difference,) = comparison.differences
    assert (difference.expected, difference.actual, difference.error) == (None, 0, None)
    assert compare_results(expected, table([("Sander", 1, None)])).equal


def test_date_keys_typed_differently() -> None:
    days = ("loans.day",)
    expected = ResultTable(days, ("loans",), [(dt.date(2025, 3, 1), 3), (dt.date(2025, 3, 2), 3)])
    actual = ResultTable(days, ("loans",), [("2025-03-01", 3), (dt.datetime(2025, 3, 2), 3)])
    assert compare_results(expected, actual).equal


def test_tolerance_is_relative() -> None:
    expected = table([("Drill", 4, 1000.0)])
    # 1000.0001 is a relative 1e-7 away: within 1e-6, outside the default 1e-9.
    actual = table([("Drill", 4, 1000.0001)])
    assert compare_results(expected, actual, tolerance=1e-6).equal
    assert not compare_results(expected, actual).equal


def test_totals_rows_match_by_level() -> None:
    # A subtotal row (level 0, the key rolled up) is not the empty member (level 1, key None).
    expected = table([("Drill", 4, 15.75), (None, 1, 1.75), (None, 5, 17.5)], [1, 1, 0])
    actual = table([("Drill", 4, 15.75), (None, 5, 17.5), (None, 1, 1.75)], [1, 0, 1])
    assert compare_results(expected, actual).equal
    wrong_total = table([("Drill", 4, 15.75), (None, 1, 1.75), (None, 5, 99.0)], [1, 1, 0])
    (difference,) = compare_results(expected, wrong_total).differences
    assert (difference.level, difference.expected, difference.actual) == (0, 17.5, 99.0)


def test_a_repeated_key_matches_once() -> None:
    # Drill twice in the actual result: the second copy is extra.
    actual = table([("Drill", 4, 15.75), ("Drill", 4, 15.75), ("Sander", 1, 12.5), (None, 1, 1.75)])
    comparison = compare_results(EXPECTED, actual)
    assert [r.key for r in comparison.extra] == [("Drill",)]
    assert comparison.missing == ()


def test_results_of_different_queries_cannot_be_compared() -> None:
    with pytest.raises(ValueError, match="measures"):
        compare_results(EXPECTED, table([("Drill", 4)], measures=("loans",)))
    with pytest.raises(ValueError, match="grouping columns"):
        compare_results(EXPECTED, ResultTable((), MEASURES, [(8, 1260.25)]))


def test_no_grouping_columns() -> None:
    expected = ResultTable((), ("loans",), [(8,)])
    assert compare_results(expected, ResultTable((), ("loans",), [(8.0,)])).equal
    (difference,) = compare_results(expected, ResultTable((), ("loans",), [(7,)])).differences
    assert (difference.expected, difference.actual) == (8, 7)


def test_restrict_levels() -> None:
    result = ResultTable(("a", "b"), ("m",), [("x", "p", 1), ("x", None, 1), (None, None, 1)], [2, 1, 0])
    kept = restrict_levels(result, {2, 0})
    assert (kept.rows, kept.levels) == ([("x", "p", 1), (None, None, 1)], [2, 0])
