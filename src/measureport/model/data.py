"""Reading every table of a model into columnar arrays, with DuckDB, and checking the keys.

Numbers become int64 (``integer``, ``bigint``) or float64 (``double``, ``decimal``), text an
object array of ``str``, dates ``datetime64[D]``, booleans ``bool``; each column has a null mask.
Null entries hold a placeholder (0, "", 1970-01-01, False).
"""

from __future__ import annotations

import datetime as dt
from typing import Any

import duckdb
import numpy as np
import numpy.typing as npt

from measureport.errors import Diagnostic, MeasureportError, Span
from measureport.model.datafiles import (
    DataReadError,
    file_format,
    open_engine_table,
    open_file,
    plain_read_error,
)
from measureport.model.integers import IntegerValueError, to_int64
from measureport.model.schema import DataType, Model, Table
from measureport.model.tabledata import ColumnData, Dataset, TableData


def load_dataset(model: Model, connection: duckdb.DuckDBPyConnection | None = None) -> Dataset:
    """The data of every table of ``model``. Data files are read with an own DuckDB connection;
    tables named on a connected engine are read from ``connection`` (a DuckDB database)."""
    with duckdb.connect() as files:
        tables = {name: read_table(files, connection, table) for name, table in model.tables.items()}
    for table in model.tables.values():
        check_key(table, tables[table.name])
    return Dataset(tables)


def read_table(
    files: duckdb.DuckDBPyConnection, engine: duckdb.DuckDBPyConnection | None, table: Table
) -> TableData:
    """One table's data: from its data file with ``files``, else from the ``engine`` connection."""
    types = {name: column.type for name, column in table.columns.items()}
    try:
        if table.path is not None:
            fmt = file_format(table.source)
            assert fmt is not None  # the loader gives a path only to .csv and .parquet sources
            relation = open_file(files, table.path, fmt, types)
        elif engine is not None:
            relation = open_engine_table(engine, table.source, types)
        else:
            raise MeasureportError(
                f"table {table.name} is read from the engine table '{table.source}', "
                "and no engine connection was given",
                table.source_span,
            )
        try:
            fetched = relation.fetchnumpy()
        except duckdb.Error as exc:
            raise plain_read_error(exc, types) from None
    except DataReadError as exc:
        raise _read_error(table, exc) from None
    columns: dict[str, ColumnData] = {}
    for name, kind in types.items():
        try:
            columns[name] = column_data(fetched[name], kind)
        except IntegerValueError as exc:
            message = (
                f"the value {describe_value(exc.value)} in column {name} (data row {exc.row}) {exc.reason}"
            )
            raise _read_error(table, DataReadError(message, column=name)) from None
    n_rows = len(next(iter(fetched.values()))) if fetched else 0
    return TableData(table.name, n_rows, columns)


def column_data(raw: npt.NDArray[Any], data_type: DataType) -> ColumnData:
    """A column fetched from DuckDB (a plain or masked array) as values and a null mask."""
    null = np.ma.getmaskarray(raw).copy()
    data = np.ma.getdata(raw)
    values: npt.NDArray[Any]
    if data_type.sql in ("integer", "bigint"):
        values = to_int64(data, null, data_type)
    elif data_type.kind == "number":
        values = np.where(null, 0, data).astype(np.float64)
    elif data_type.kind == "text":
        values = np.where(null, "", data).astype(object)
    elif data_type.kind == "date":
        values = data.astype("datetime64[D]")
        values[null] = np.datetime64(0, "D")
    else:
        values = np.where(null, False, data).astype(np.bool_)
    return ColumnData(values, null)


def check_key(table: Table, data: TableData) -> None:
    """Raise :class:`MeasureportError`, at the table's ``key:``, when its key has nulls or repeats."""
    if table.key is None:
        return
    column = data.columns[table.key]
    rule = "a key must be unique and not null"
    nulls = int(column.null.sum())
    if nulls:
        values = "value" if nulls == 1 else "values"
        raise MeasureportError(f"{table.name}.{table.key} has {nulls} null {values}; {rule}", table.key_span)
    distinct, first_index, counts = np.unique(column.values, return_index=True, return_counts=True)
    repeated = counts > 1
    if repeated.any():
        earliest = int(np.argmin(np.where(repeated, first_index, len(column.values))))
        others = int(repeated.sum()) - 1
        also = ""
        if others:
            also = " (1 other value also repeats)" if others == 1 else f" ({others} other values also repeat)"
        raise MeasureportError(
            f"{table.name}.{table.key} has duplicate values: {describe_value(distinct[earliest])} appears "
            f"{int(counts[earliest])} times{also}; {rule}",
            table.key_span,
        )


def describe_value(value: object) -> str:
    """A value as the messages show it: text in double quotes, dates as YYYY-MM-DD."""
    if isinstance(value, np.datetime64):
        value = value.astype("datetime64[D]").item()
    elif isinstance(value, np.generic):
        value = value.item()
    if isinstance(value, str):
        return '"' + value.replace('"', '""') + '"'
    if isinstance(value, dt.date):
        return value.isoformat()
    return str(value)


def _read_error(table: Table, exc: DataReadError) -> MeasureportError:
    where = table.source if table.path is not None else f"the engine table '{table.source}'"
    at_line = f", line {exc.line}" if exc.line is not None else ""
    more: list[Diagnostic] = []
    if exc.line is not None and table.path is not None:
        more.append(Diagnostic("this line cannot be read", Span(str(table.path), exc.line, 1), "note"))
    hint = None
    column = table.columns.get(exc.column) if exc.column is not None else None
    if column is not None and column.span != table.source_span and column.span.line > 0:
        hint = f"column {column.name} is declared {column.type} at {column.span}"
    elif column is not None:
        hint = f"declare the type of column {column.name} under 'columns:' (it was read as {column.type})"
    return MeasureportError(f"cannot read {where}{at_line}: {exc.message}", table.source_span, hint, more)
