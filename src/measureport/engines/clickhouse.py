"""ClickHouse in this process through chdb: the model's tables in a database of the engine's own.

    engine = ClickHouseEngine(bound)          # tables from the model's data files (or a Dataset)
    result = engine.run(query)

chdb runs one ClickHouse server inside the Python process, shared by every connection: a table
made on one connection is seen by all. So each engine creates a database of its own, with a
random name, makes it the connection's current database (``USE``), creates the model's tables
there (``ENGINE = Memory``) and drops the database on :meth:`close`. Data are sent as an Arrow
stream (``INSERT ... FORMAT ArrowStream``).

Every statement runs with ``join_use_nulls = 1`` (an unmatched outer-join row has nulls, not
the type's default 0 or '') and ``aggregate_functions_null_for_empty = 1`` (an aggregate over no
rows is null, as in SQL and in the language's rule 5), set once on the connection.

Where one expression mixes integers and floats (``CASE``, ``coalesce``, ``UNION ALL``), ClickHouse
finds no exact common type and makes the column a ``Variant(Float64, Int64)``, which chdb hands
back as text: such a column's values are read back as the numbers they hold.

Type mapping (model type → ClickHouse column → Python value read back); every column is
``Nullable``:

========================  ==============================  ====================================
model type                column type                     read back as
========================  ==============================  ====================================
``integer``, ``bigint``   ``Nullable(Int64)``             ``int``
``decimal(p,s)``          ``Nullable(Decimal(p,s))``      ``float`` (every decimal result)
``double``                ``Nullable(Float64)``           ``float``
``text``                  ``Nullable(String)``            ``str``
``date``                  ``Nullable(Date32)``            ``datetime.date`` (a ``DateTime`` cut
                                                          to its day)
``boolean``               ``Nullable(Bool)``              ``bool``
========================  ==============================  ====================================

``Date32`` (years 1900 to 2299) rather than ``Date`` (1970 to 2149), so that every day a model
holds is stored as it is; some ClickHouse date functions (``toStartOfMonth``, ...) still answer
in ``Date`` and so clamp days before 1970 — a quirk for the rendering, not for the storage.
"""

from __future__ import annotations

import decimal
import io
import re
import uuid
from collections.abc import Sequence
from typing import TYPE_CHECKING, Any

import pyarrow as pa

from measureport.engines.ddl import (
    create_schema,
    create_table,
    drop_schema,
    set_settings,
    table_name,
    use_schema,
)
from measureport.engines.sqlengine import SqlEngine, workspace_dataset
from measureport.errors import MeasureportError
from measureport.model.schema import DataType
from measureport.model.tabledata import Dataset
from measureport.semantics.bound import BoundModel

if TYPE_CHECKING:
    from measureport.workspace import Workspace

#: Settings of every statement, set on the connection.
SETTINGS: dict[str, int] = {"join_use_nulls": 1, "aggregate_functions_null_for_empty": 1}

_COLUMN_TYPES = {
    "integer": "Int64",
    "bigint": "Int64",
    "double": "Float64",
    "text": "String",
    "date": "Date32",
    "boolean": "Bool",
}


def column_type(data_type: DataType) -> str:
    """The ClickHouse column type a model column is stored as."""
    if data_type.precision is not None:
        inner = f"Decimal({data_type.precision},{data_type.scale})"
    else:
        inner = _COLUMN_TYPES[data_type.sql]
    return f"Nullable({inner})"


def _undecimal(value: Any) -> Any:
    # chdb hands decimals back with trailing zeros stripped (12.00 as Decimal('12')), so their
    # written scale cannot tell a decimal from a whole number; and a ClickHouse decimal result
    # only ever comes from decimal data (sums of Int64 stay Int64), which is a float here.
    return float(value) if isinstance(value, decimal.Decimal) else value


_NUMBER_TYPE = re.compile(r"(Nullable\()?(U?Int\d+|Float\d+)\)?")


def is_numeric_variant(type_name: str) -> bool:
    """True for a ``Variant(...)`` type whose every alternative is an integer or float type."""
    if not (type_name.startswith("Variant(") and type_name.endswith(")")):
        return False
    alternatives = [part.strip() for part in type_name[len("Variant(") : -1].split(",")]
    return all(_NUMBER_TYPE.fullmatch(part) for part in alternatives)


def _variant_number(value: Any) -> Any:
    # chdb hands a Variant value back as its text; ClickHouse writes a Float64 in the shortest
    # text that reads back as the same double, so the number is exact either way.
    if not isinstance(value, str):
        return _undecimal(value)
    try:
        return int(value)
    except ValueError:
        return float(value)


class ClickHouseEngine(SqlEngine):
    """Runs statements on chdb's in-process ClickHouse, over the model's tables in a database of its own."""

    title = "ClickHouse"
    dialect = "clickhouse"
    sqlglot_dialect = "clickhouse"

    def __init__(self, bound: BoundModel, dataset: Dataset | None = None) -> None:
        """The model's tables (from ``dataset`` when given, else from the data files) in a new
        database of chdb's in-process server."""
        super().__init__(bound)
        try:
            import chdb
        except ImportError:
            raise MeasureportError(
                "the ClickHouse engine needs chdb; install it with: pip install chdb"
            ) from None
        self.database = f"measureport_{uuid.uuid4().hex[:12]}"
        connect: Any = chdb.connect  # untyped in chdb
        self.connection = connect(":memory:")
        self.cursor = self.connection.cursor()
        self.fetch(set_settings(SETTINGS, self.sqlglot_dialect))
        self.fetch(create_schema(self.database, self.sqlglot_dialect))
        self.fetch(use_schema(self.database, self.sqlglot_dialect))
        self.load_tables(dataset)

    @classmethod
    def for_workspace(cls, workspace: Workspace) -> ClickHouseEngine:
        """The engine of a workspace, over the workspace's data."""
        return cls(workspace.bound, workspace_dataset(workspace))

    def load_table(self, name: str, table: pa.Table) -> None:
        columns = {c: column_type(col.type) for c, col in self.model.tables[name].columns.items()}
        self.fetch(create_table(name, columns, self.sqlglot_dialect, engine="Memory"))
        if table.num_rows == 0:
            return
        stream = io.BytesIO()
        with pa.ipc.new_stream(stream, table.schema) as writer:
            writer.write_table(table)
        target = f"INSERT INTO {table_name(name).sql(dialect=self.sqlglot_dialect, identify=True)}"
        try:
            with self.connection.send_insert(target, "ArrowStream") as inserter:
                inserter.append(stream.getvalue())
                inserter.finish()
        except Exception as exc:
            first = (str(exc).strip().splitlines() or [type(exc).__name__])[0]
            raise MeasureportError(f"ClickHouse could not load table {name}: {first}") from None

    def fetch(self, sql: str) -> Sequence[Sequence[Any]]:
        try:
            self.cursor.execute(sql)
            rows: Sequence[Sequence[Any]] = self.cursor.fetchall()
            types = [str(column[1]) for column in self.cursor.description or ()]
        except Exception as exc:  # chdb raises its own error types, and RuntimeError
            raise self.run_error(exc) from None
        variants = {i for i, name in enumerate(types) if is_numeric_variant(name)}
        return [
            tuple(
                _variant_number(value) if i in variants else _undecimal(value) for i, value in enumerate(row)
            )
            for row in rows
        ]

    def shutdown(self) -> None:
        try:
            self.cursor.execute(drop_schema(self.database, self.sqlglot_dialect))
        finally:
            self.connection.close()
