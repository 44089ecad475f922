"""Reading export files: CSV, JSON and Parquet, with the place of every cell (invented exports)."""

from __future__ import annotations

import datetime as dt
from decimal import Decimal
from pathlib import Path

import pyarrow as pa
import pyarrow.parquet as pq
import pytest

from measureport.errors import MeasureportError, Span
from measureport.exports import read_export
from measureport.exports.csvfile import field_columns, sniff_delimiter


def write(folder: Path, name: str, text: str) -> Path:
    path = folder / name
    path.write_text(text, encoding="utf-8")
    return path


def test_csv_headers_rows_and_spans(tmp_path: Path) -> None:
    path = write(tmp_path, "e.csv", 'tools.name,loans,fees\nDrill,4,15.75\n"Scaffold tower",2,"1,230.25"\n')
    export = read_export(path)
    assert export.headers == ("tools.name", "loans", "fees")
    assert [row.cells for row in export.rows] == [
        ("Drill", "4", "15.75"), ("Scaffold tower", "2", "1,230.25")
    ]
    # "Scaffold tower" (16 characters with its quotes), a comma, 2, a comma: "1,230.25" (quotes
    # included, 10 characters) starts at column 20 of line 3 and ends at column 29.
    assert export.rows[1].spans[2] == Span(str(path), 3, 20, 3, 29)
    assert export.header_spans[1] == Span(str(path), 1, 12, 1, 16)


def test_csv_with_semicolons_a_byte_order_mark_and_blank_lines(tmp_path: Path) -> None:
    path = tmp_path / "e.csv"
    path.write_bytes("\ufefftools.name;fees\r\nDrill;15,75\r\n\r\nSander;12,5\r\n".encode())
    export = read_export(path)
    assert export.headers == ("tools.name", "fees")
    assert [row.cells for row in export.rows] == [("Drill", "15,75"), ("Sander", "12,5")]
    # The blank line 3 is skipped, so Sander's row is data row 2 on line 4.
    assert (export.rows[1].number, export.rows[1].spans[0].line) == (2, 4)


def test_csv_field_on_several_lines(tmp_path: Path) -> None:
    path = write(tmp_path, "e.csv", 'name,loans\n"Drill\nbig",4\nSander,1\n')
    export = read_export(path)
    assert export.rows[0].cells == ("Drill\nbig", "4")
    # The record starts on line 2; Sander's starts on line 4.
    assert export.rows[0].spans[1].line == 2
    assert export.rows[1].spans[0] == Span(str(path), 4, 1, 4, 6)


def test_csv_row_with_the_wrong_number_of_fields(tmp_path: Path) -> None:
    path = write(tmp_path, "e.csv", "name,loans\nDrill,4\nSander,1,9\n")
    with pytest.raises(MeasureportError) as raised:
        read_export(path)
    assert raised.value.message == "row 2 of the export has 3 fields, but the header has 2"
    assert raised.value.span.line == 3


def test_csv_that_is_not_utf8(tmp_path: Path) -> None:
    path = tmp_path / "e.csv"
    path.write_bytes("name,loans\nCaf\u00e9,1\n".encode("latin-1"))
    with pytest.raises(MeasureportError, match="not UTF-8") as raised:
        read_export(path)
    assert raised.value.span.line == 2


def test_empty_csv(tmp_path: Path) -> None:
    with pytest.raises(MeasureportError, match="no header line"):
        read_export(write(tmp_path, "e.csv", ""))


def test_delimiter_and_field_columns() -> None:
    assert sniff_delimiter("a;b;c") == ";"
    assert sniff_delimiter('"a,b";c') == ";"
    assert sniff_delimiter("a\tb") == "\t"
    assert sniff_delimiter("single") == ","
    assert field_columns('ab,"c,""d",,e', ",") == [(1, 2), (4, 10), (12, 12), (13, 13)]


def test_json_list_of_objects(tmp_path: Path) -> None:
    text = '[\n  {"tools.name": "Drill", "loans": 4, "fees": 15.75},\n  {"tools.name": null, "loans": 1}\n]\n'
    path = write(tmp_path, "e.json", text)
    export = read_export(path)
    assert export.headers == ("tools.name", "loans", "fees")
    # The second object leaves fees out: null there.
    assert [row.cells for row in export.rows] == [("Drill", 4, 15.75), (None, 1, None)]
    # Line 3 is `  {"tools.name": null, "loans": 1}`: two spaces, {, "tools.name" (12 characters),
    # ": null, " (8): "loans" starts at column 24 and its 7 characters end at column 30.
    assert export.rows[1].spans[1] == Span(str(path), 3, 24, 3, 30)


@pytest.mark.parametrize(
    ("text", "message"),
    [
        ('{"a": 1}', "must be a list of objects"),
        ("[1, 2]", "must be an object"),
        ('[{"a": 1} {"a": 2}]', "expected a comma"),
        ('[{"a": }]', "not valid JSON"),
        ('[{"a": [1]}]', "holds a list"),
    ],
)
def test_bad_json(tmp_path: Path, text: str, message: str) -> None:
    with pytest.raises(MeasureportError, match=message):
        read_export(write(tmp_path, "e.json", text))


def test_parquet_typed_values(tmp_path: Path) -> None:
    path = tmp_path / "e.parquet"
    table = pa.table({
        "loans.day": pa.array([dt.date(2025, 3, 1), None], pa.date32()),
        "fees": pa.array([Decimal("1237.00"), Decimal("21.00")], pa.decimal128(8, 2)),
        "loans": pa.array([3, 3], pa.int64()),
    })
    pq.write_table(table, path)
    export = read_export(path)
    assert export.headers == ("loans.day", "fees", "loans")
    assert export.rows[0].cells == (dt.date(2025, 3, 1), Decimal("1237.00"), 3)
    assert export.rows[1].cells[0] is None
    # Parquet has no lines: the span names data row 2 and column 3.
    assert export.rows[1].spans[2] == Span(str(path), 2, 3)


def test_a_file_that_is_not_parquet(tmp_path: Path) -> None:
    with pytest.raises(MeasureportError, match="cannot be read as Parquet"):
        read_export(write(tmp_path, "e.parquet", "name,loans\n"))


def test_unknown_extension(tmp_path: Path) -> None:
    with pytest.raises(MeasureportError, match=r"\.csv, \.parquet, \.json"):
        read_export(write(tmp_path, "e.xlsx", ""))
