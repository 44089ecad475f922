"""Reading a JSON export: a list of objects, one a row, keyed by column header.

The headers are the keys in the order they first appear; a key missing from an object is null
there (exporters often leave nulls out). Values must be plain: text, numbers, booleans or null.
"""

from __future__ import annotations

import json
from pathlib import Path

from measureport.errors import MeasureportError, Span, remember_source
from measureport.exports.table import ExportRow, ExportTable

_DECODER = json.JSONDecoder()
_WHITESPACE = " \t\r\n"


class _Positions:
    """Line and column of a character offset in a text."""

    def __init__(self, text: str, source: str) -> None:
        self._starts = [0]
        self._starts.extend(i + 1 for i, char in enumerate(text) if char == "\n")
        self.source = source

    def span(self, offset: int, length: int = 1) -> Span:
        line = _line_of(self._starts, offset)
        column = offset - self._starts[line - 1] + 1
        return Span(self.source, line, column, line, column + max(1, length) - 1)


def _line_of(starts: list[int], offset: int) -> int:
    low, high = 0, len(starts)
    while high - low > 1:
        middle = (low + high) // 2
        if starts[middle] <= offset:
            low = middle
        else:
            high = middle
    return low + 1


def _skip(text: str, i: int) -> int:
    while i < len(text) and text[i] in _WHITESPACE:
        i += 1
    return i


def _records(text: str, where: _Positions) -> list[tuple[object, int, int]]:
    """Each element of the top-level list with the offsets where it starts and ends."""
    i = _skip(text, 0)
    if i >= len(text) or text[i] != "[":
        raise MeasureportError(
            "a JSON export must be a list of objects, one for each row",
            where.span(min(i, max(len(text) - 1, 0))),
        )
    i = _skip(text, i + 1)
    elements: list[tuple[object, int, int]] = []
    if i < len(text) and text[i] == "]":
        return elements
    while True:
        try:
            value, end = _DECODER.raw_decode(text, i)
        except json.JSONDecodeError as error:
            message = f"the export is not valid JSON: {error.msg}"
            raise MeasureportError(message, where.span(error.pos)) from None
        elements.append((value, i, end))
        i = _skip(text, end)
        if i < len(text) and text[i] == ",":
            i = _skip(text, i + 1)
        elif i < len(text) and text[i] == "]":
            return elements
        else:
            raise MeasureportError(
                "the export is not valid JSON: expected a comma or the end of the list here",
                where.span(min(i, len(text) - 1)),
            )


def _key_span(text: str, key: str, start: int, end: int, where: _Positions) -> Span:
    """Where ``key`` is written inside the object at ``start``..``end`` (the object's start if the
    key is spelled with escapes)."""
    spelled = json.dumps(key, ensure_ascii=False)
    found = text.find(spelled, start, end)
    return where.span(found, len(spelled)) if found >= 0 else where.span(start)


def _plain_value(value: object, span: Span, number: int, key: str) -> object:
    if isinstance(value, dict | list):
        raise MeasureportError(
            f"row {number} of the export holds a {'list' if isinstance(value, list) else 'object'} "
            f"under '{key}', where a single value is needed",
            span,
        )
    return value


def read_json_export(path: Path) -> ExportTable:
    """The headers and rows of a JSON export; a malformed file is a :class:`MeasureportError`."""
    source = str(path)
    try:
        text = path.read_text(encoding="utf-8-sig")
    except UnicodeDecodeError:
        raise MeasureportError(f"the export {path} is not UTF-8 text", Span(source, 1, 1)) from None
    remember_source(source, text)
    where = _Positions(text, source)
    elements = _records(text, where)
    headers: dict[str, None] = {}
    for value, start, _ in elements:
        if not isinstance(value, dict):
            message = "each row of a JSON export must be an object of header: value"
            raise MeasureportError(message, where.span(start))
        headers.update(dict.fromkeys(value))
    names = tuple(headers)
    rows: list[ExportRow] = []
    for number, (value, start, end) in enumerate(elements, start=1):
        assert isinstance(value, dict)
        spans = tuple(_key_span(text, key, start, end, where) for key in names)
        cells = tuple(
            _plain_value(value.get(key), span, number, key) for key, span in zip(names, spans, strict=True)
        )
        rows.append(ExportRow(number, cells, spans))
    header_spans = tuple(rows[0].spans) if rows else ()
    return ExportTable(path, "json", names, header_spans, tuple(rows))
