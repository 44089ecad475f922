"""Telling totals rows from detail rows (invented results; the rule is ours, written in
measureport.exports.totals: common practice, no source)."""

from __future__ import annotations

from collections.abc import Sequence

import pytest

from measureport.exports.cells import CellError, ColumnKind, ValueFormat, read_cell
from measureport.exports.totals import KnownMembers, is_totals_label, totals_level, trailing_start
from measureport.query import ResultTable

KIND_BY_NAME = ResultTable(
    ("tools.kind", "tools.name"), ("loans",),
    [("access", "Scaffold tower", 2), ("power", "Drill", 4), ("power", "Sander", 1), (None, None, 1)],
)


def level(
    cells: Sequence[str], members: KnownMembers, kinds: Sequence[ColumnKind] = ("text", "text")
) -> int:
    def read(j: int) -> object:
        return read_cell(cells[j], kinds[j], ValueFormat())

    kept = [read(j) for j in range(trailing_start(cells))]
    return totals_level(cells, kept, read, members)


def test_labels() -> None:
    labels = ("Total", "GRAND TOTAL", " grand  total ", "Subtotal", "Sub-total")
    assert all(is_totals_label(t) for t in labels)
    assert not is_totals_label("Totally")
    assert not is_totals_label(None)


def test_detail_rows() -> None:
    members = KnownMembers(KIND_BY_NAME)
    assert level(["power", "Drill"], members) == 2
    # A member the translated result lacks is still a detail row (it will be reported missing).
    assert level(["power", "Hammer"], members) == 2


def test_the_empty_member_is_not_a_total_when_it_is_real() -> None:
    # The translated result has (empty, empty): an export row of two empty cells is that row.
    assert level(["", ""], KnownMembers(KIND_BY_NAME)) == 2


def test_empty_cells_are_totals_when_no_empty_member_is_there() -> None:
    without_empty = ResultTable(KIND_BY_NAME.by, KIND_BY_NAME.measures, KIND_BY_NAME.rows[:3])
    members = KnownMembers(without_empty)
    assert level(["power", ""], members) == 1
    assert level(["", ""], members) == 0


def test_labels_roll_up() -> None:
    members = KnownMembers(KIND_BY_NAME)
    assert level(["power", "Total"], members) == 1
    assert level(["Grand total", ""], members) == 0
    assert level(["Total", "Total"], members) == 0
    # power has no empty name, so its empty cell rolls up too.
    assert level(["power", "(blank)"], members) == 1


def test_a_label_that_is_a_real_member_is_a_member() -> None:
    named_total = ResultTable(("tools.name",), ("loans",), [("Total", 3), ("Drill", 4)])
    assert level(["Total"], KnownMembers(named_total), ("text",)) == 1


def test_only_trailing_cells_roll_up() -> None:
    # An empty kind followed by a real name: a member row, not a total.
    assert level(["", "Drill"], KnownMembers(KIND_BY_NAME)) == 2


def test_a_label_in_a_number_column() -> None:
    by_id = ResultTable(("tools.tool_id",), ("loans",), [(1, 4), (2, 2)])
    assert level(["Total"], KnownMembers(by_id), ("number",)) == 0
    assert level(["1"], KnownMembers(by_id), ("number",)) == 1


def test_subtotal_rows_of_the_result_are_not_members() -> None:
    # The translated subtotal (level 1) of power is not a detail row with an empty name.
    with_totals = ResultTable(
        KIND_BY_NAME.by, KIND_BY_NAME.measures, [("power", "Drill", 4), ("power", None, 4)], [2, 1]
    )
    assert level(["power", ""], KnownMembers(with_totals)) == 1


def test_a_kept_cell_that_does_not_read_raises() -> None:
    by_id = ResultTable(("tools.tool_id", "tools.name"), ("loans",), [(1, "Drill", 4)])
    with pytest.raises(CellError, match="is not a number"):
        level(["Drill", ""], KnownMembers(by_id), ("number", "text"))
