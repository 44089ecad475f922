"""A cell of the matrix: its status text and the largest relative difference (values by hand)."""

from __future__ import annotations

import math

from measureport.query import ResultTable
from measureport.verify import Cell, compared_cell, largest_relative_difference


def table(*rows: tuple[object, ...]) -> ResultTable:
    return ResultTable(("shops.town",), ("loaves", "price"), list(rows), [1] * len(rows))


def test_largest_relative_difference_over_every_number() -> None:
    expected = table(("North", 10, 2.0), ("South", 50, 4.0))
    actual = table(("North", 10, 2.5), ("South", 51, 4.0))
    # |2.5 - 2.0| / 2.0 = 0.25; |51 - 50| / 50 = 0.02; the largest is 0.25.
    assert largest_relative_difference(expected, actual) == 0.25


def test_equal_results_differ_by_nothing() -> None:
    rows = (("North", 10, 2.0),)
    assert largest_relative_difference(table(*rows), table(*rows)) == 0.0


def test_a_number_where_zero_was_expected_is_infinitely_off() -> None:
    assert math.isinf(largest_relative_difference(table(("North", 0, 1.0)), table(("North", 1, 1.0))))


def test_cell_texts() -> None:
    expected = table(("North", 10, 2.0))
    assert compared_cell(expected, table(("North", 10, 2.0)), 1e-9).text() == "pass"
    # 2.0 * (1 + 3e-16): within the tolerance, and shown with its one significant digit.
    nearly = compared_cell(expected, table(("North", 10, 2.0000000000000004)), 1e-9)
    assert nearly.status == "pass" and nearly.text() == "pass 2e-16"
    # 2.6 against 2.0: relative 0.3.
    assert compared_cell(expected, table(("North", 10, 2.6)), 1e-9).text() == "FAIL 3e-01"
    assert compared_cell(expected, table(("South", 10, 2.0)), 1e-9).text() == "FAIL rows"
    steady = ResultTable((), ("trend",), [("steady",)], [0])
    growing = ResultTable((), ("trend",), [("growing",)], [0])
    text_cell = compared_cell(steady, growing, 1e-9)
    assert text_cell.text() == "FAIL values"
    assert Cell("unsupported", "no", unsupported_measures=(("price", "no"),)).text() == "unsupported 1"
    assert Cell("unsupported", "no").text() == "unsupported"
    assert Cell("error", "boom").text() == "ERROR" and Cell("error", "boom").failed
    assert not Cell("unsupported", "no").failed
