"""Reading data files and engine tables with DuckDB, and turning DuckDB's errors into plain ones.

CSV files are read with a header line and DuckDB's detection of the delimiter and quoting; an
empty field, quoted or not, is null. Parquet files are read as they are, each column cast to the
model's type.
"""

from __future__ import annotations

import re
from collections.abc import Mapping
from pathlib import Path
from typing import Literal

import duckdb

from measureport.model.schema import DataType
from measureport.model.typenames import duckdb_name

FileFormat = Literal["csv", "parquet"]

_FORMATS: dict[str, FileFormat] = {".csv": "csv", ".parquet": "parquet"}
_CSV_LINE = re.compile(r"CSV Error on Line: (\d+)")
_CONVERSION = re.compile(r"""Could not convert string ["'](.*?)["'] to '?(\w+)'?""")
_CSV_COLUMN = re.compile(r'converting column "([^"]+)"|casting from source column (\w+)')


class DataReadError(Exception):
    """DuckDB could not read a file or table: a plain sentence, and the line and column when known."""

    def __init__(self, message: str, line: int | None = None, column: str | None = None) -> None:
        super().__init__(message)
        self.message = message
        self.line = line
        self.column = column


def file_format(source: str) -> FileFormat | None:
    """``csv`` or ``parquet`` for a ``from:`` that names a data file, None for an engine table."""
    return _FORMATS.get(Path(source).suffix.lower())


def read_file_columns(
    connection: duckdb.DuckDBPyConnection, path: Path, fmt: FileFormat
) -> list[tuple[str, str]]:
    """The columns of a data file in file order, each with the DuckDB type read from the data."""
    try:
        if fmt == "csv":
            relation = connection.read_csv(str(path), header=True, sample_size=-1)
        else:
            relation = connection.read_parquet(str(path))
        return [(name, str(kind)) for name, kind in zip(relation.columns, relation.types, strict=True)]
    except duckdb.Error as exc:
        raise plain_read_error(exc) from None


def open_file(
    connection: duckdb.DuckDBPyConnection,
    path: Path,
    fmt: FileFormat,
    columns: Mapping[str, DataType],
) -> duckdb.DuckDBPyRelation:
    """A relation over a data file with every column read as its model type."""
    try:
        if fmt == "csv":
            types = {name: duckdb_name(kind) for name, kind in columns.items()}
            return connection.read_csv(str(path), header=True, columns=types)
        return cast_columns(connection.read_parquet(str(path)), columns)
    except duckdb.Error as exc:
        raise plain_read_error(exc, columns) from None


def open_engine_table(
    connection: duckdb.DuckDBPyConnection, name: str, columns: Mapping[str, DataType]
) -> duckdb.DuckDBPyRelation:
    """A relation over a table of a connected DuckDB database, columns cast to their model types."""
    try:
        return cast_columns(connection.table(name), columns)
    except duckdb.Error as exc:
        raise plain_read_error(exc, columns) from None


def cast_columns(
    relation: duckdb.DuckDBPyRelation, columns: Mapping[str, DataType]
) -> duckdb.DuckDBPyRelation:
    """The model's columns of ``relation``, in model order, each cast to its model type."""
    return relation.select(
        *(
            duckdb.ColumnExpression(name).cast(duckdb.sqltype(duckdb_name(kind))).alias(name)
            for name, kind in columns.items()
        )
    )


def plain_read_error(exc: duckdb.Error, columns: Mapping[str, DataType] | None = None) -> DataReadError:
    """A plain sentence for a DuckDB read error: what could not be read, never DuckDB's report.

    ``columns`` gives the model types, so a value that does not convert is named with its
    column's model type rather than DuckDB's."""
    said = str(exc)
    line_match = _CSV_LINE.search(said)
    line = int(line_match.group(1)) if line_match else None
    conversion = _CONVERSION.search(said)
    if conversion:
        value, kind = conversion.group(1), conversion.group(2).lower()
        found = _CSV_COLUMN.search(said)
        column = (found.group(1) or found.group(2)) if found else None
        if column is not None and columns is not None and column in columns:
            kind = columns[column].sql
        where = f" in column {column}" if column else ""
        return DataReadError(f'the value "{value}"{where} cannot be read as {kind}', line, column)
    if "No files found" in said:
        return DataReadError("the file does not exist", line)
    if "magic bytes" in said:
        return DataReadError("the file is not a Parquet file", line)
    if "Sniffer" in said or "sniff" in said:
        return DataReadError("the file could not be read as CSV with a header line (is it empty?)", line)
    if isinstance(exc, duckdb.CatalogException):
        return DataReadError("the table does not exist on the connected engine", line)
    if isinstance(exc, duckdb.BinderException):
        column = re.search(r'column "([^"]+)" not found', said)
        if column:
            return DataReadError(f"the table has no column {column.group(1)}", line)
    first = said.splitlines()[0] if said else type(exc).__name__
    first = re.sub(r"^[A-Za-z ]*Error: ", "", first)
    return DataReadError(f"it could not be read ({first})", line)
