"""The model's tables as Arrow tables with one fixed Arrow type per model type, for engines to load.

Every engine adapter loads the same data as the reference evaluator: the rows of
:func:`measureport.model.data.read_table` (integers read strictly, keys checked), or the rows of an
in-memory :class:`Dataset`. The Arrow types are:

========================  ==========================
model type                Arrow type
========================  ==========================
``integer``, ``bigint``   ``int64``
``decimal(p,s)``          ``decimal128(p, s)``
``double``                ``float64``
``text``                  ``string``
``date``                  ``date32``
``boolean``               ``bool``
========================  ==========================

``integer`` is widened to 64 bits, as DuckDB reads it, so that sums and products do not overflow
where the reference's int64 do not. Nulls stay nulls. A dataset keeps decimals as float64; they
are turned back into decimals of the column's scale through their shortest decimal spelling, so
``12.34`` is loaded as ``12.34`` and not as the binary fraction nearest to it.
"""

from __future__ import annotations

import decimal
from collections.abc import Iterable

import duckdb
import numpy as np
import pyarrow as pa

from measureport.errors import MeasureportError
from measureport.model.data import check_key, read_table
from measureport.model.schema import DataType, Model, Table
from measureport.model.tabledata import ColumnData, Dataset, TableData
from measureport.model.typenames import MAX_DECIMAL_PRECISION


def arrow_type(data_type: DataType) -> pa.DataType:
    """The Arrow type that a column of ``data_type`` is loaded as."""
    if data_type.precision is not None:
        return pa.decimal128(data_type.precision, data_type.scale or 0)
    types: dict[str, pa.DataType] = {
        "integer": pa.int64(),
        "bigint": pa.int64(),
        "double": pa.float64(),
        "text": pa.string(),
        "date": pa.date32(),
        "boolean": pa.bool_(),
    }
    return types[data_type.sql]


def arrow_schema(table: Table) -> pa.Schema:
    """The Arrow schema of a model table: its columns in model order, every one nullable."""
    return pa.schema([pa.field(name, arrow_type(col.type)) for name, col in table.columns.items()])


def loadable_tables(model: Model, dataset: Dataset | None = None) -> dict[str, pa.Table]:
    """Every table an engine must load, by model name: each table of ``dataset`` when one is
    given, else each table with a data file. Tables whose ``from:`` names a table on the engine
    itself are left out (the statement refers to them by that name)."""
    if dataset is not None:
        chosen: Iterable[Table] = (t for t in model.tables.values() if t.name in dataset.tables)
        return {t.name: table_to_arrow(t, dataset.tables[t.name]) for t in chosen}
    with_files = [t for t in model.tables.values() if t.path is not None]
    tables: dict[str, pa.Table] = {}
    with duckdb.connect() as files:
        for table in with_files:
            data = read_table(files, None, table)
            check_key(table, data)
            tables[table.name] = table_to_arrow(table, data)
    return tables


def table_to_arrow(table: Table, data: TableData) -> pa.Table:
    """One table's columns as an Arrow table with :func:`arrow_schema`'s types."""
    schema = arrow_schema(table)
    missing = [name for name in table.columns if name not in data.columns]
    if missing:
        raise MeasureportError(
            f"the data of table {table.name} has no column {missing[0]}", table.source_span
        )
    arrays = [column_to_arrow(data.columns[field.name], field.type) for field in schema]
    return pa.Table.from_arrays(arrays, schema=schema)


def column_to_arrow(column: ColumnData, target: pa.DataType) -> pa.Array:
    """One column's values as an Arrow array of type ``target``, null where ``column.null`` is set."""
    mask = np.asarray(column.null, dtype=np.bool_)
    if pa.types.is_decimal(target):
        return pa.array(_decimals(column, target.scale), type=target)
    if pa.types.is_date32(target):
        days = np.asarray(column.values).astype("datetime64[D]")
        return pa.array(days, mask=mask, type=target)
    if pa.types.is_string(target):
        texts = np.asarray(column.values, dtype=object)
        return pa.array(np.where(mask, "", texts).astype(object), mask=mask, type=target)
    return pa.array(np.asarray(column.values), mask=mask, type=target)


def _decimals(column: ColumnData, scale: int) -> list[decimal.Decimal | None]:
    step = decimal.Decimal(1).scaleb(-scale)
    values: list[decimal.Decimal | None] = []
    with decimal.localcontext() as wide:
        wide.prec = 2 * MAX_DECIMAL_PRECISION
        for value, null in zip(column.values.tolist(), column.null.tolist(), strict=True):
            values.append(None if null else decimal.Decimal(repr(float(value))).quantize(step))
    return values
