"""Reading a CSV export: UTF-8 (a byte-order mark is skipped), a header line, then one record a row.

The delimiter is whichever of comma, semicolon and tab occurs most often in the header line outside
quotes (comma when none does), since exports that write decimal commas often separate fields with
semicolons. Blank lines are skipped. Every cell stays text; :mod:`measureport.exports.cells` parses it.
"""

from __future__ import annotations

import csv
from pathlib import Path

from measureport.errors import MeasureportError, Span, remember_source
from measureport.exports.table import ExportRow, ExportTable

_DELIMITERS = (",", ";", "\t")


def _decode(path: Path, data: bytes) -> str:
    try:
        return data.decode("utf-8-sig")
    except UnicodeDecodeError as error:
        line = data[: error.start].count(b"\n") + 1
        raise MeasureportError(
            f"the export {path} is not UTF-8 text (byte {error.start + 1} cannot be read)",
            Span(str(path), line, 1),
            hint="save the export as UTF-8 and run the diff again",
        ) from None


def field_columns(line: str, delimiter: str) -> list[tuple[int, int]]:
    """The 1-based first and last column of each field of one physical line of CSV."""
    fields: list[tuple[int, int]] = []
    i, n = 0, len(line)
    while True:
        start = i
        if i < n and line[i] == '"':
            i += 1
            while i < n:
                if line[i] == '"' and i + 1 < n and line[i + 1] == '"':
                    i += 2
                elif line[i] == '"':
                    i += 1
                    break
                else:
                    i += 1
        while i < n and line[i] != delimiter:
            i += 1
        fields.append((start + 1, max(start + 1, i)))
        if i >= n:
            return fields
        i += 1


def sniff_delimiter(header_line: str) -> str:
    """The delimiter of a CSV export, judged from its header line (see the module docstring)."""
    outside: list[str] = []
    quoted = False
    for char in header_line:
        if char == '"':
            quoted = not quoted
        elif not quoted:
            outside.append(char)
    counts = {d: outside.count(d) for d in _DELIMITERS}
    best = max(_DELIMITERS, key=lambda d: counts[d])
    return best if counts[best] > 0 else ","


def _spans(source: str, lines: list[str], first: int, last: int, width: int, delimiter: str) -> list[Span]:
    """Cell spans of a record on lines ``first``..``last`` (1-based); a record that spans several
    lines points every cell at the start of its first line."""
    if first == last:
        columns = field_columns(lines[first - 1], delimiter)
        if len(columns) == width:
            return [Span(source, first, a, first, b) for a, b in columns]
    return [Span(source, first, 1)] * width


def read_csv_export(path: Path) -> ExportTable:
    """The header and rows of a CSV export; a malformed file is a :class:`MeasureportError`."""
    source = str(path)
    text = _decode(path, path.read_bytes())
    remember_source(source, text)
    lines = text.splitlines()
    if not lines or not lines[0].strip():
        raise MeasureportError(f"the export {path} has no header line", Span(source, 1, 1))
    delimiter = sniff_delimiter(lines[0])
    reader = csv.reader(text.splitlines(keepends=True), delimiter=delimiter, strict=True)
    records: list[tuple[list[str], int, int]] = []
    last_line = 0
    try:
        for fields in reader:
            first, last_line = last_line + 1, reader.line_num
            if fields:
                records.append((fields, first, last_line))
    except csv.Error as error:
        raise MeasureportError(
            f"line {reader.line_num} of the export cannot be read as CSV ({error})",
            Span(source, reader.line_num, 1),
        ) from None
    (header, header_line, header_last), *body = records
    headers = tuple(name.strip() for name in header)
    header_spans = tuple(_spans(source, lines, header_line, header_last, len(headers), delimiter))
    rows: list[ExportRow] = []
    for number, (fields, first, last) in enumerate(body, start=1):
        if len(fields) != len(headers):
            raise MeasureportError(
                f"row {number} of the export has {len(fields)} fields, but the header has {len(headers)}",
                Span(source, first, 1),
            )
        spans = _spans(source, lines, first, last, len(fields), delimiter)
        rows.append(ExportRow(number, tuple(fields), tuple(spans)))
    return ExportTable(path, "csv", headers, header_spans, tuple(rows))
