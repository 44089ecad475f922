"""Machine-readable results: CSV and JSON, as LANGUAGE.md section 4 and docs/semantics-choices.md say."""

from __future__ import annotations

import json

from measureport.cli.layout import TOTALS_COLUMN, totals_marker
from measureport.cli.values import JsonValue, cell_text, json_value
from measureport.query import ResultTable

_NEEDS_QUOTES = frozenset(',"\r\n')


def csv_field(value: object) -> str:
    """One CSV field: null is an empty field, an empty text is ``""``, and a field holding a comma, a
    quote or a line break is quoted with its quotes doubled."""
    if isinstance(value, str) and not value:
        return '""'
    text = cell_text(value)
    if _NEEDS_QUOTES.intersection(text) or text != text.strip():
        return '"' + text.replace('"', '""') + '"'
    return text


def to_csv(result: ResultTable, totals: bool = False) -> str:
    """A header (grouping columns, then measures, then ``totals`` when asked), then one line per row."""
    header = [*result.columns, *([TOTALS_COLUMN] if totals else [])]
    lines = [",".join(csv_field(name) for name in header)]
    for index, row in enumerate(result.rows):
        fields = [csv_field(value) for value in row]
        if totals:
            marker = totals_marker(result, index)
            fields.append(csv_field(marker) if marker else "")
        lines.append(",".join(fields))
    return "\n".join(lines) + "\n"


def to_json(result: ResultTable, totals: bool = False) -> str:
    """A JSON list with one object per row, keys in column order; ``totals`` is null on detail rows."""
    records: list[dict[str, JsonValue]] = []
    for index, row in enumerate(result.rows):
        record = {name: json_value(value) for name, value in zip(result.columns, row, strict=True)}
        if totals:
            record[TOTALS_COLUMN] = totals_marker(result, index) or None
        records.append(record)
    return json.dumps(records, indent=2, ensure_ascii=False) + "\n"
