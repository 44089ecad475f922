"""Tying export columns to result columns, by name or with --map (invented exports)."""

from __future__ import annotations

from pathlib import Path

import pytest

from measureport.errors import MeasureportError, Span
from measureport.exports import map_headers, parse_maps, read_export
from measureport.exports.headers import MAP_SOURCE
from measureport.exports.table import ExportTable

BY = ("tools.name",)
MEASURES = ("loans", "fees")


def export_with(tmp_path: Path, header: str) -> ExportTable:
    path = tmp_path / "e.csv"
    path.write_text(header + "\n", encoding="utf-8")
    return read_export(path)


def test_by_name_in_any_order(tmp_path: Path) -> None:
    mapping = map_headers(export_with(tmp_path, "fees, tools.name ,loans"), BY, MEASURES)
    # tools.name is column 1, loans column 2, fees column 0 (surrounding spaces ignored).
    assert mapping.names == ("tools.name", "loans", "fees")
    assert (mapping.positions, mapping.width) == ((1, 2, 0), 1)


def test_with_map(tmp_path: Path) -> None:
    maps = parse_maps(["Tool=tools.name", " Fees (EUR) = fees"])
    mapping = map_headers(export_with(tmp_path, "Tool,loans,Fees (EUR)"), BY, MEASURES, maps)
    assert mapping.positions == (0, 1, 2)


def test_map_splits_at_the_last_equals_sign(tmp_path: Path) -> None:
    (item,) = parse_maps(["a=b=fees"])
    assert (item.header, item.name) == ("a=b", "fees")
    assert item.name_span == Span(MAP_SOURCE, 1, 5, 1, 8)


def test_unknown_header(tmp_path: Path) -> None:
    export = export_with(tmp_path, "tools.name,loans,fees,Region")
    with pytest.raises(MeasureportError) as raised:
        map_headers(export, BY, MEASURES)
    error = raised.value
    assert error.message == (
        "the export column 'Region' is neither a grouping column of --by nor a measure of -m"
    )
    # Region starts at column 23 of the header line.
    assert (error.span.line, error.span.column) == (1, 23)
    assert error.hint is not None and '--map "Region=NAME"' in error.hint


def test_unknown_header_close_to_a_name(tmp_path: Path) -> None:
    with pytest.raises(MeasureportError) as raised:
        map_headers(export_with(tmp_path, "tools.name,loan,fees"), BY, MEASURES)
    assert raised.value.hint == "did you mean loans?"


def test_a_result_column_without_an_export_column(tmp_path: Path) -> None:
    with pytest.raises(MeasureportError, match="the export has no column for fees"):
        map_headers(export_with(tmp_path, "tools.name,loans"), BY, MEASURES)


def test_two_export_columns_for_one_name(tmp_path: Path) -> None:
    maps = parse_maps(["Fee total=fees"])
    with pytest.raises(MeasureportError, match="two columns for fees"):
        map_headers(export_with(tmp_path, "tools.name,loans,fees,Fee total"), BY, MEASURES, maps)


@pytest.mark.parametrize(
    ("maps", "message"),
    [
        (["Tool"], 'has no "="'),
        (["=fees"], "the header is empty"),
        (["Tool="], "the name is empty"),
    ],
)
def test_malformed_maps(maps: list[str], message: str) -> None:
    with pytest.raises(MeasureportError, match=message):
        parse_maps(maps)


def test_map_to_an_unknown_name_or_header(tmp_path: Path) -> None:
    export = export_with(tmp_path, "Tool,loans,fees")
    with pytest.raises(MeasureportError, match="neither a grouping column") as raised:
        map_headers(export, BY, MEASURES, parse_maps(["Tool=tools.nme"]))
    assert raised.value.hint == "did you mean tools.name?"
    assert raised.value.span == Span(MAP_SOURCE, 1, 6, 1, 14)
    with pytest.raises(MeasureportError, match="no column named 'Tol'"):
        map_headers(export, BY, MEASURES, parse_maps(["Tol=tools.name"]))
