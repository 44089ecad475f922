"""SQLite through the standard library's ``sqlite3``, in memory: the model's tables loaded, SQL run on them.

    engine = SQLiteEngine(bound)             # tables from the model's data files (or a Dataset)
    result = engine.run(query)               # a ResultTable, shaped like the reference's
    rows = engine.execute(sql, kinds)        # any statement, values typed by kind

Type mapping (model type → SQLite column → Python value read back):

========================  ===============================  =====================================
model type                stored as                        read back as
========================  ===============================  =====================================
``integer``, ``bigint``   ``INTEGER`` (64-bit)             ``int``
``decimal(p,s)``          ``REAL`` (a double)              ``float``, as the reference keeps it
``double``                ``REAL``                         ``float``
``text``                  ``TEXT``                         ``str``
``date``                  ``TEXT``, ISO ``YYYY-MM-DD``     ``datetime.date`` (by the column kind)
``boolean``               ``INTEGER`` 0 or 1               ``bool`` (by the column kind)
========================  ===============================  =====================================

Nulls are stored as NULL. ``REAL`` rather than ``NUMERIC`` affinity for decimals: SQLite would
store ``12.00`` under ``NUMERIC`` as the integer 12 and change the type of sums. Adapters for
``datetime.date`` (ISO text), ``Decimal`` (float) and ``bool`` (0/1) are registered with
``sqlite3``. ``PRAGMA case_sensitive_like`` is on, so ``like`` is case-sensitive, as the language
says (SQLite's default ignores case for ASCII letters).

SQLite reads a double-quoted name that names no column as a text literal, for compatibility.
Where Python's ``sqlite3`` allows it (3.12 and later) the adapter turns that off, so a wrong
name is an error; on older Pythons such a statement returns the name as text (a wrong result
that the comparison with the other engines shows).
"""

from __future__ import annotations

import datetime as dt
import decimal
import sqlite3
from collections.abc import Sequence
from typing import TYPE_CHECKING, Any

import pyarrow as pa

from measureport.engines.ddl import create_table, insert_placeholders
from measureport.engines.sqlengine import SqlEngine, workspace_dataset
from measureport.model.schema import DataType
from measureport.model.tabledata import Dataset
from measureport.semantics.bound import BoundModel

if TYPE_CHECKING:
    from measureport.workspace import Workspace

_COLUMN_TYPES = {
    "integer": "INTEGER",
    "bigint": "INTEGER",
    "double": "REAL",
    "text": "TEXT",
    "date": "TEXT",
    "boolean": "INTEGER",
}


def column_type(data_type: DataType) -> str:
    """The SQLite column type a model column is stored as."""
    if data_type.precision is not None:
        return "REAL"
    return _COLUMN_TYPES[data_type.sql]


def register_adapters() -> None:
    """Teach ``sqlite3`` to store dates as ISO text, decimals as doubles, booleans as 0/1."""
    sqlite3.register_adapter(dt.date, dt.date.isoformat)
    sqlite3.register_adapter(decimal.Decimal, float)
    sqlite3.register_adapter(bool, int)


def refuse_quoted_strings(connection: sqlite3.Connection) -> bool:
    """Make a double-quoted name that names no column an error, not a text literal; False where
    this Python's ``sqlite3`` cannot (``Connection.setconfig`` came with Python 3.12)."""
    setconfig = getattr(connection, "setconfig", None)
    if setconfig is None:
        return False
    for option in ("SQLITE_DBCONFIG_DQS_DML", "SQLITE_DBCONFIG_DQS_DDL"):
        setconfig(getattr(sqlite3, option), False)
    return True


class SQLiteEngine(SqlEngine):
    """Runs statements on an in-memory SQLite database holding the model's tables."""

    title = "SQLite"
    dialect = "sqlite"
    sqlglot_dialect = "sqlite"

    def __init__(self, bound: BoundModel, dataset: Dataset | None = None, database: str = ":memory:") -> None:
        """The model's tables (from ``dataset`` when given, else from the data files) in a new
        SQLite database at ``database`` (in memory by default)."""
        super().__init__(bound)
        register_adapters()
        self.connection = sqlite3.connect(database)
        self.connection.execute("PRAGMA case_sensitive_like = ON")
        refuse_quoted_strings(self.connection)
        self.load_tables(dataset)

    @classmethod
    def for_workspace(cls, workspace: Workspace) -> SQLiteEngine:
        """The engine of a workspace, over the workspace's data."""
        return cls(workspace.bound, workspace_dataset(workspace))

    def load_table(self, name: str, table: pa.Table) -> None:
        columns = {c: column_type(col.type) for c, col in self.model.tables[name].columns.items()}
        with self.connection:
            self.connection.execute(create_table(name, columns, self.sqlglot_dialect))
            rows = zip(*(table.column(c).to_pylist() for c in columns), strict=True) if columns else ()
            self.connection.executemany(insert_placeholders(name, list(columns), self.sqlglot_dialect), rows)

    def fetch(self, sql: str) -> Sequence[Sequence[Any]]:
        try:
            return self.connection.execute(sql).fetchall()
        except sqlite3.Error as exc:
            raise self.run_error(exc) from None

    def shutdown(self) -> None:
        self.connection.close()
