"""PostgreSQL through psycopg 3: the model's tables copied into temporary tables, SQL run on them.

    engine = PostgresEngine(bound, "postgresql://me@db.example:5432/sales")   # a user's database
    engine = PostgresEngine.for_workspace(workspace)   # $MEASUREPORT_POSTGRES_URL, else a throwaway server

Tables with a data file (or in the Dataset given) are created as ``TEMPORARY`` tables and filled
with ``COPY ... FROM STDIN``: they live only as long as the engine's connection, touch no schema
of the user's database, and, because PostgreSQL looks in the session's temporary schema first,
stand in for any table of the same name. Tables whose ``from:`` names a table of the database
(``schema.table``) are not loaded; the statement reads them where they are. The connection is in
autocommit mode, so a failed statement does not spoil the next one. Each loaded table is
``ANALYZE``d, since autovacuum never gathers statistics for temporary tables.

Type mapping (model type → PostgreSQL column → Python value read back):

========================  ====================  ===============================================
model type                column type           read back as
========================  ====================  ===============================================
``integer``, ``bigint``   ``BIGINT``            ``int``
``decimal(p,s)``          ``NUMERIC(p,s)``      ``float``; a ``numeric`` with no fractional
                                                digits (a sum of integers) as ``int``
``double``                ``DOUBLE PRECISION``  ``float``
``text``                  ``TEXT``              ``str``
``date``                  ``DATE``              ``datetime.date`` (a timestamp cut to its day)
``boolean``               ``BOOLEAN``           ``bool``
========================  ====================  ===============================================

``integer`` is stored as ``BIGINT``, as the other engines widen it, so that sums and products
do not overflow. Nulls are copied as nulls.
"""

from __future__ import annotations

import os
from collections.abc import Sequence
from typing import TYPE_CHECKING, Any

import psycopg
import pyarrow as pa
from psycopg import sql as pgsql

from measureport.engines.ddl import create_table
from measureport.engines.pgserver import ThrowawayPostgres
from measureport.engines.sqlengine import SqlEngine, workspace_dataset
from measureport.errors import MeasureportError
from measureport.model.schema import DataType
from measureport.model.tabledata import Dataset
from measureport.semantics.bound import BoundModel

if TYPE_CHECKING:
    from measureport.workspace import Workspace

#: The environment variable naming a PostgreSQL database for the ``postgres`` engine.
URL_VARIABLE = "MEASUREPORT_POSTGRES_URL"

_COLUMN_TYPES = {
    "integer": "BIGINT",
    "bigint": "BIGINT",
    "double": "DOUBLE PRECISION",
    "text": "TEXT",
    "date": "DATE",
    "boolean": "BOOLEAN",
}


def column_type(data_type: DataType) -> str:
    """The PostgreSQL column type a model column is stored as."""
    if data_type.precision is not None:
        return f"NUMERIC({data_type.precision},{data_type.scale})"
    return _COLUMN_TYPES[data_type.sql]


def is_postgres_url(target: str) -> bool:
    """True for a ``postgresql://`` (or ``postgres://``) connection URL."""
    return target.startswith(("postgresql://", "postgres://"))


def describe_url(url: str) -> str:
    """``host:port/database`` of a connection URL, without user or password, for messages."""
    try:
        parts = psycopg.conninfo.conninfo_to_dict(url)
    except psycopg.ProgrammingError:
        return "the database given"
    host = parts.get("host") or "localhost"
    port = parts.get("port") or "5432"
    database = parts.get("dbname") or ""
    return f"{host}:{port}/{database}"


class PostgresEngine(SqlEngine):
    """Runs statements on a PostgreSQL database, over the model's tables as temporary tables."""

    title = "PostgreSQL"
    dialect = "postgres"
    sqlglot_dialect = "postgres"

    def __init__(
        self,
        bound: BoundModel,
        url: str,
        dataset: Dataset | None = None,
        server: ThrowawayPostgres | None = None,
    ) -> None:
        """Connect to the database at ``url`` and load the model's tables (from ``dataset`` when
        given, else from the data files). ``server``, when given, is stopped on :meth:`close`."""
        super().__init__(bound)
        self.server = server
        try:
            self.connection = psycopg.connect(url, autocommit=True, connect_timeout=15)
        except psycopg.Error as exc:
            if server is not None:
                server.stop()
            first = (str(exc).strip().splitlines() or ["no reason given"])[0]
            raise MeasureportError(
                f"could not connect to PostgreSQL at {describe_url(url)}: {first}"
            ) from None
        self.load_tables(dataset)

    @classmethod
    def for_workspace(cls, workspace: Workspace, url: str | None = None) -> PostgresEngine:
        """The engine of a workspace: on the database at ``url``, else at ``$MEASUREPORT_POSTGRES_URL``,
        else on a throwaway server of its own (started now, stopped on :meth:`close`)."""
        target = url or os.environ.get(URL_VARIABLE)
        dataset = workspace_dataset(workspace)
        if target:
            return cls(workspace.bound, target, dataset)
        server = ThrowawayPostgres()
        return cls(workspace.bound, server.start(), dataset, server=server)

    def load_table(self, name: str, table: pa.Table) -> None:
        columns = {c: column_type(col.type) for c, col in self.model.tables[name].columns.items()}
        copy = pgsql.SQL("COPY {} ({}) FROM STDIN").format(
            pgsql.Identifier(name), pgsql.SQL(", ").join(pgsql.Identifier(c) for c in columns)
        )
        try:
            with self.connection.transaction(), self.connection.cursor() as cursor:
                cursor.execute(create_table(name, columns, self.sqlglot_dialect, temporary=True))
                with cursor.copy(copy) as sink:
                    for row in zip(*(table.column(c).to_pylist() for c in columns), strict=True):
                        sink.write_row(row)
                # Autovacuum never visits temporary tables: without statistics the planner
                # guesses row counts and can pick nested loops over thousands of rows.
                cursor.execute(pgsql.SQL("ANALYZE {}").format(pgsql.Identifier(name)))
        except psycopg.Error as exc:
            first = (str(exc).strip().splitlines() or ["no reason given"])[0]
            raise MeasureportError(f"PostgreSQL could not load table {name}: {first}") from None

    def fetch(self, sql: str) -> Sequence[Sequence[Any]]:
        try:
            with self.connection.cursor() as cursor:
                cursor.execute(sql)
                return cursor.fetchall() if cursor.description is not None else []
        except psycopg.Error as exc:
            raise self.run_error(exc) from None

    def shutdown(self) -> None:
        try:
            self.connection.close()
        finally:
            if self.server is not None:
                self.server.stop()
