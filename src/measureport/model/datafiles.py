"""Reading data files and engine tables with DuckDB, and turning DuckDB's errors into plain ones.

CSV files are read with a header line and DuckDB's detection of the delimiter and quoting; an
empty field, quoted or not, is null. Parquet files and engine tables are read as they are, each
column cast to the model's type (integers excepted: see :func:`fetch_type`).
"""

from __future__ import annotations

import csv
import re
from collections.abc import Mapping
from pathlib import Path
from typing import Literal

import duckdb

from measureport.model.schema import DataType
from measureport.model.typenames import duckdb_name

FileFormat = Literal["csv", "parquet"]

_FORMATS: dict[str, FileFormat] = {".csv": "csv", ".parquet": "parquet"}
_INTEGER_TYPES = frozenset(
    ("TINYINT", "SMALLINT", "INTEGER", "BIGINT", "HUGEINT", "UTINYINT", "USMALLINT", "UINTEGER", "UBIGINT")
)
_CSV_LINE = re.compile(r"CSV Error on Line: (\d+)")
_CONVERSIONS = (
    re.compile(r"""Could not convert string ["'](?P<value>.*?)["'] to '?(?P<kind>\w+)'?"""),
    re.compile(r"""invalid (?P<kind>\w+) field format: ["'](?P<value>.*?)["']"""),
)
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


def read_csv_header(path: Path) -> list[str] | None:
    """The column names of a CSV file's header line, read without DuckDB (quick, for files whose
    columns are all declared); None when the header cannot be read plainly."""
    try:
        with path.open(encoding="utf-8-sig", newline="") as handle:
            first = handle.readline()
    except (OSError, UnicodeDecodeError):
        return None
    if not first.strip():
        return None
    try:
        dialect = csv.Sniffer().sniff(first, delimiters=",;\t|")
    except csv.Error:
        return None
    names = next(csv.reader([first], dialect))
    return [n.strip() for n in names] if names and all(n.strip() for n in names) else None


def read_file_columns(
    connection: duckdb.DuckDBPyConnection, path: Path, fmt: FileFormat
) -> list[tuple[str, str]]:
    """The columns of a data file in file order, each with the DuckDB type read from the data.

    For a CSV file DuckDB judges the types from a sample of rows (its default); a later row that
    does not fit is an error when the data is loaded, with a hint to declare the column's type."""
    try:
        if fmt == "csv":
            relation = connection.read_csv(str(path), header=True)
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
    """A relation over a data file with every column read as :func:`fetch_type` says."""
    try:
        if fmt == "csv":
            types = {name: fetch_type(kind, "VARCHAR") for name, kind in columns.items()}
            return connection.read_csv(str(path), header=True, columns=types)
        return cast_columns(connection.read_parquet(str(path)), columns)
    except duckdb.Error as exc:
        raise plain_read_error(exc, columns) from None


def open_engine_table(
    connection: duckdb.DuckDBPyConnection, name: str, columns: Mapping[str, DataType]
) -> duckdb.DuckDBPyRelation:
    """A relation over a table of a connected DuckDB database, columns read as :func:`fetch_type` says."""
    try:
        return cast_columns(connection.table(name), columns)
    except duckdb.Error as exc:
        raise plain_read_error(exc, columns) from None


def cast_columns(
    relation: duckdb.DuckDBPyRelation, columns: Mapping[str, DataType]
) -> duckdb.DuckDBPyRelation:
    """The model's columns of ``relation``, in model order, each cast as :func:`fetch_type` says."""
    missing = [name for name in columns if name not in relation.columns]
    if missing:
        raise DataReadError(f"there is no column {missing[0]}", column=missing[0])
    stored = {name: str(kind) for name, kind in zip(relation.columns, relation.types, strict=True)}
    return relation.select(
        *(
            duckdb.ColumnExpression(name).cast(duckdb.sqltype(fetch_type(kind, stored[name]))).alias(name)
            for name, kind in columns.items()
        )
    )


def fetch_type(data_type: DataType, stored: str) -> str:
    """The DuckDB type to fetch a column as, given the type it is ``stored`` as.

    DuckDB rounds when it casts text or fractions to an integer type ('3.50' becomes 4), so an
    ``integer``/``bigint`` column stored as anything but an integer is fetched as text or as a
    double, and converted strictly afterwards (see ``integers.py``).
    """
    if data_type.sql not in ("integer", "bigint") or stored in _INTEGER_TYPES:
        return duckdb_name(data_type)
    if stored == "VARCHAR":
        return "VARCHAR"
    if stored in ("FLOAT", "DOUBLE") or stored.startswith("DECIMAL"):
        return "DOUBLE"
    return duckdb_name(data_type)


def plain_read_error(exc: duckdb.Error, columns: Mapping[str, DataType] | None = None) -> DataReadError:
    """A plain sentence for a DuckDB read error: what could not be read, never DuckDB's report.

    ``columns`` gives the model types, so a value that does not convert is named with its
    column's model type rather than DuckDB's."""
    said = str(exc)
    line_match = _CSV_LINE.search(said)
    line = int(line_match.group(1)) if line_match else None
    conversion = next((m for m in (p.search(said) for p in _CONVERSIONS) if m), None)
    if conversion:
        value, kind = conversion.group("value"), conversion.group("kind").lower()
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
