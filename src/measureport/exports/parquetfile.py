"""Reading a Parquet export: its columns as headers, its rows as typed values.

Parquet has no lines, so a location ``file:R:C`` in an error names data row R (counted from 1;
row 0 is the header) and column C (counted from 1).
"""

from __future__ import annotations

from pathlib import Path

import pyarrow as pa
import pyarrow.parquet as pq

from measureport.errors import MeasureportError, Span, remember_source
from measureport.exports.table import ExportRow, ExportTable


def read_parquet_export(path: Path) -> ExportTable:
    """The headers and rows of a Parquet export; an unreadable file is a :class:`MeasureportError`."""
    source = str(path)
    # The file is binary: error messages must not try to quote a line of it.
    remember_source(source, "")
    try:
        table = pq.read_table(path)
    except (pa.ArrowException, OSError) as error:
        message = f"the export {path} cannot be read as Parquet: {error}"
        raise MeasureportError(message, Span(source, 0, 0)) from None
    headers = tuple(str(name) for name in table.column_names)
    header_spans = tuple(Span(source, 0, j) for j in range(1, len(headers) + 1))
    columns = [table.column(j).to_pylist() for j in range(len(headers))]
    rows = tuple(
        ExportRow(
            i + 1,
            tuple(column[i] for column in columns),
            tuple(Span(source, i + 1, j) for j in range(1, len(headers) + 1)),
        )
        for i in range(table.num_rows)
    )
    return ExportTable(path, "parquet", headers, header_spans, rows)
