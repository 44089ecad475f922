"""An export turned into the expected result of a diff: cells read as their columns' kinds, totals
rows recognised (kept at their level, or dropped), and every grouping key checked to be unique."""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from functools import partial

from measureport.compare.comparison import row_key
from measureport.compare.display import key_text
from measureport.errors import MeasureportError
from measureport.exports.cells import CellError, ColumnKind, ValueFormat, read_cell
from measureport.exports.headers import ColumnMapping
from measureport.exports.table import ExportRow, ExportTable
from measureport.exports.totals import KnownMembers, totals_level, trailing_start
from measureport.query import ResultTable

_KIND_PLURALS = {"number": "numbers", "date": "dates", "boolean": "true or false", "text": "text"}


@dataclass(frozen=True)
class ExpectedResult:
    """The export as a result table. ``totals_rows`` are the export rows kept as totals rows,
    ``dropped_rows`` those dropped as totals (both by row number, counted from 1)."""

    result: ResultTable
    totals_rows: tuple[int, ...]
    dropped_rows: tuple[int, ...]

    @property
    def totals_levels(self) -> set[int]:
        """The levels of the totals rows kept (empty when the export has none, or they were dropped)."""
        width = len(self.result.by)
        return {level for level in self.result.levels if level < width}


def _shown(cell: object) -> str:
    return f"'{cell}'" if isinstance(cell, str) else str(cell)


class _RowReader:
    """Reads the cells of one export row, turning a :class:`CellError` into a located error."""

    def __init__(
        self, export: ExportTable, mapping: ColumnMapping, kinds: Sequence[ColumnKind], fmt: ValueFormat,
        width: int,
    ) -> None:
        self.export, self.mapping, self.kinds, self.fmt, self.width = export, mapping, kinds, fmt, width

    def cell(self, row: ExportRow, j: int) -> object:
        """Result column ``j`` of ``row`` as a value; :class:`CellError` when it cannot be read."""
        return read_cell(row.cells[self.mapping.positions[j]], self.kinds[j], self.fmt)

    def value(self, row: ExportRow, j: int) -> object:
        """Result column ``j`` of ``row`` as a value; a located :class:`MeasureportError` when it
        cannot be read."""
        try:
            return self.cell(row, j)
        except CellError as error:
            raise self._error(row, j, error) from None

    def _error(self, row: ExportRow, j: int, error: CellError) -> MeasureportError:
        position = self.mapping.positions[j]
        header, name = self.export.headers[position], self.mapping.names[j]
        shown = _shown(row.cells[position])
        kind = self.kinds[j]
        if j < self.width and kind is not None:
            message = (
                f"the grouping column {name} holds {_KIND_PLURALS[kind]}, but row {row.number} of the "
                f"export has {shown} in column '{header}', which {error.reason}"
            )
        else:
            about = f" (measure {name})" if j >= self.width else ""
            message = (
                f"row {row.number} of the export has {shown} in column '{header}'{about}, "
                f"which {error.reason}"
            )
        return MeasureportError(message, row.spans[position], hint=error.hint)


def _duplicate(
    reader: _RowReader, row: ExportRow, first: int, key: tuple[object, ...], level: int
) -> MeasureportError:
    by = reader.mapping.by
    hint = None
    if all(value is None for value in key[:level]) and level > 0:
        hint = "a totals row whose grouping cells are empty reads like the empty member; label it Total"
    if by:
        message = (
            f"rows {first} and {row.number} of the export have the same grouping values "
            f"({key_text(by, key, level)}), so they cannot both be matched"
        )
    else:
        message = (
            f"rows {first} and {row.number} of the export are both the one row of a result without "
            "grouping columns"
        )
    return MeasureportError(
        message,
        row.spans[reader.mapping.positions[0]] if by else row.spans[0],
        hint=hint,
    )


def read_expected(
    export: ExportTable,
    mapping: ColumnMapping,
    kinds: Sequence[ColumnKind],
    fmt: ValueFormat,
    members: KnownMembers,
    skip_totals: bool = False,
) -> ExpectedResult:
    """The rows of ``export`` as a result table with the grouping columns and measures of
    ``mapping`` (``kinds[i]`` is the kind of its column ``i``). ``members`` (the translated detail
    rows) tells totals rows from empty members (:mod:`measureport.exports.totals`); totals rows
    are dropped when ``skip_totals``. Unreadable cells and repeated keys are :class:`MeasureportError`."""
    width = mapping.width
    reader = _RowReader(export, mapping, kinds, fmt, width)
    rows: list[tuple[object, ...]] = []
    levels: list[int] = []
    totals: list[int] = []
    dropped: list[int] = []
    seen: dict[object, int] = {}
    for row in export.rows:
        cells = [row.cells[mapping.positions[j]] for j in range(width)]
        kept = [reader.value(row, j) for j in range(trailing_start(cells))]
        level = totals_level(cells, kept, partial(reader.cell, row), members)
        if level < width:
            if skip_totals:
                dropped.append(row.number)
                continue
            totals.append(row.number)
        key = tuple(reader.value(row, j) if j < level else None for j in range(width))
        identity = row_key(key, level)
        if identity in seen:
            raise _duplicate(reader, row, seen[identity], key, level)
        seen[identity] = row.number
        values = tuple(reader.value(row, j) for j in range(width, len(mapping.names)))
        rows.append((*key, *values))
        levels.append(level)
    result = ResultTable(mapping.by, mapping.measures, rows, levels)
    return ExpectedResult(result, tuple(totals), tuple(dropped))
