"""An export read as the expected result of a diff (invented exports; values worked out by hand)."""

from __future__ import annotations

import datetime as dt
from collections.abc import Sequence
from pathlib import Path

import pytest

from measureport.errors import MeasureportError
from measureport.exports import (
    ColumnKind,
    ExpectedResult,
    KnownMembers,
    ValueFormat,
    map_headers,
    read_expected,
    read_export,
)
from measureport.query import ResultTable

TRANSLATED = ResultTable(
    ("tools.kind", "tools.name"), ("loans", "fees"),
    [("power", "Drill", 4, 15.75), ("power", "Sander", 1, 12.5), (None, None, 1, 1.75)],
)
KINDS: tuple[ColumnKind, ...] = ("text", "text", "number", "number")


def expected_from(
    tmp_path: Path, text: str, skip_totals: bool = False, fmt: ValueFormat | None = None,
    translated: ResultTable = TRANSLATED, kinds: Sequence[ColumnKind] = KINDS,
) -> ExpectedResult:
    path = tmp_path / "e.csv"
    path.write_text(text, encoding="utf-8")
    export = read_export(path)
    mapping = map_headers(export, translated.by, translated.measures)
    return read_expected(export, mapping, kinds, fmt or ValueFormat(), KnownMembers(translated), skip_totals)


EXPORT = """\
tools.kind,tools.name,loans,fees
power,Drill,4,15.75
power,Sander,1,12.5
power,Total,5,28.25
,,1,1.75
Grand total,,6,"1,030.00"
"""


def test_rows_values_and_totals_levels(tmp_path: Path) -> None:
    expected = expected_from(tmp_path, EXPORT)
    assert expected.result.rows == [
        ("power", "Drill", 4, 15.75),
        ("power", "Sander", 1, 12.5),
        ("power", None, 5, 28.25),
        (None, None, 1, 1.75),
        (None, None, 6, 1030.0),
    ]
    # power/Total rolls up the name (level 1); the empty row is the real empty member (level 2);
    # Grand total rolls up both columns (level 0).
    assert expected.result.levels == [2, 2, 1, 2, 0]
    assert (expected.totals_rows, expected.dropped_rows) == ((3, 5), ())
    assert expected.totals_levels == {0, 1}


def test_skip_totals_drops_them(tmp_path: Path) -> None:
    expected = expected_from(tmp_path, EXPORT, skip_totals=True)
    assert expected.result.levels == [2, 2, 2]
    assert expected.dropped_rows == (3, 5)
    assert expected.totals_levels == set()


def test_an_unreadable_number_names_row_and_column(tmp_path: Path) -> None:
    text = "tools.kind,tools.name,loans,fees\npower,Drill,4,15.75\npower,Sander,one,12.5\n"
    with pytest.raises(MeasureportError) as raised:
        expected_from(tmp_path, text)
    error = raised.value
    assert error.message == (
        "row 2 of the export has 'one' in column 'loans' (measure loans), which is not a number"
    )
    # 'one' sits on line 3, after "power,Sander," (13 characters): column 14.
    assert (error.span.line, error.span.column, error.span.end_column) == (3, 14, 16)


def test_a_key_of_the_wrong_type(tmp_path: Path) -> None:
    translated = ResultTable(("loans.day",), ("loans",), [(dt.date(2025, 3, 1), 3)])
    text = "loans.day,loans\nDrill,3\n"
    with pytest.raises(MeasureportError) as raised:
        expected_from(tmp_path, text, translated=translated, kinds=("date", "number"))
    assert raised.value.message == (
        "the grouping column loans.day holds dates, but row 1 of the export has 'Drill' in column "
        "'loans.day', which is not a date in ISO form (YYYY-MM-DD)"
    )
    assert raised.value.hint is not None and "--date-format" in raised.value.hint


def test_dates_in_another_format(tmp_path: Path) -> None:
    translated = ResultTable(("loans.day",), ("loans",), [(dt.date(2025, 3, 1), 3)])
    expected = expected_from(tmp_path, "loans.day,loans\n01/03/2025,3\n", translated=translated,
                             kinds=("date", "number"), fmt=ValueFormat(date_format="%d/%m/%Y"))
    assert expected.result.rows == [(dt.date(2025, 3, 1), 3)]


def test_duplicate_keys(tmp_path: Path) -> None:
    text = "tools.kind,tools.name,loans,fees\npower,Drill,4,15.75\npower,Sander,1,12.5\npower,Drill,4,15.75\n"
    with pytest.raises(MeasureportError) as raised:
        expected_from(tmp_path, text)
    assert raised.value.message == (
        "rows 1 and 3 of the export have the same grouping values (tools.kind = power, "
        "tools.name = Drill), so they cannot both be matched"
    )
    assert raised.value.span.line == 4


def test_an_empty_total_that_collides_with_the_empty_member(tmp_path: Path) -> None:
    # The translated result has the empty member, so both all-empty rows read as it.
    text = "tools.kind,tools.name,loans,fees\n,,1,1.75\n,,6,1030\n"
    with pytest.raises(MeasureportError, match="rows 1 and 2") as raised:
        expected_from(tmp_path, text)
    assert raised.value.hint is not None and "label it Total" in raised.value.hint
