"""The embedded DuckDB engine: model tables as views over their data files, compiled SQL run on them.

    engine = DuckDBEngine(bound)                  # views over the model's CSV and Parquet files
    result = engine.run(query)                    # a ResultTable, shaped like the reference's
    table = engine.arrow(query)                   # the same rows as a pyarrow Table
    frame = engine.pandas(query)                  # ... or a pandas DataFrame

Each table is named as in the model (or, for a ``from:`` that names an engine table, read from
the connection given), with every column cast to its model type (``integer`` read as ``BIGINT``,
so that products and sums do not overflow where the reference's int64 do not). A Parquet file is
a view over the file; a CSV file is read once into an in-memory table, since a view over it would
parse the text again at every scan.
"""

from __future__ import annotations

from pathlib import Path
from typing import TYPE_CHECKING, Any

import duckdb

from measureport.compile import CompiledQuery, compile_query
from measureport.engines.values import python_value
from measureport.errors import MeasureportError
from measureport.model.datafiles import file_format
from measureport.model.schema import DataType, Model
from measureport.model.tabledata import Dataset, TableData
from measureport.model.typenames import duckdb_name
from measureport.query import Query, ResultTable
from measureport.semantics.bound import BoundModel

if TYPE_CHECKING:
    import pandas as pd
    import pyarrow as pa

    from measureport.workspace import Workspace


def engine_type(data_type: DataType) -> str:
    """The DuckDB type a model column is read as."""
    if data_type.sql == "integer":
        return "BIGINT"
    return duckdb_name(data_type)


class DuckDBEngine:
    """Runs compiled queries on an in-process DuckDB database holding the model's tables."""

    def __init__(
        self,
        bound: BoundModel,
        dataset: Dataset | None = None,
        connection: duckdb.DuckDBPyConnection | None = None,
    ) -> None:
        """Views over the model's data files, or over ``dataset`` when it is given (in-memory
        data, for tests and notebooks). ``connection`` is a DuckDB database holding the tables
        that the model names by ``schema.table``; by default a new in-memory one."""
        self.bound = bound
        self.model: Model = bound.model
        self.connection = connection if connection is not None else duckdb.connect()
        self._owns_connection = connection is None
        self.connection.execute("SET default_null_order = 'nulls_last'")
        for name, table in self.model.tables.items():
            if dataset is not None and name in dataset.tables:
                self._view_over_data(name, dataset.tables[name])
            elif table.path is not None:
                self._view_over_file(name, table.path, table.source)

    @classmethod
    def for_workspace(cls, workspace: Workspace) -> DuckDBEngine:
        """The engine of a workspace: its data files when they exist, else its dataset."""
        model = workspace.model
        files_present = all(t.path is not None and Path(t.path).is_file() for t in model.tables.values())
        dataset = None if files_present else workspace.dataset
        return cls(workspace.bound, dataset)

    # --- tables -------------------------------------------------------------------------------

    def _types(self, name: str) -> dict[str, str]:
        return {c: engine_type(col.type) for c, col in self.model.tables[name].columns.items()}

    def _view_over_file(self, name: str, path: Path, source: str) -> None:
        types = self._types(name)
        try:
            if file_format(source) == "csv":
                # Parsed once: a view over a CSV file would parse it again at every scan.
                self.connection.read_csv(str(path), header=True, columns=types).create(name)
            else:
                self._cast(self.connection.read_parquet(str(path)), types).create_view(name, replace=True)
        except duckdb.Error as exc:
            raise MeasureportError(
                f"DuckDB could not read the data of table {name} from {path}: {str(exc).splitlines()[0]}",
                self.model.tables[name].source_span,
            ) from None

    def _view_over_data(self, name: str, data: TableData) -> None:
        import pyarrow as pa

        arrays = {}
        for column, values in data.columns.items():
            arrays[column] = pa.array(values.values, mask=values.null)
        table = pa.table(arrays) if arrays else pa.table({})
        holder = f"{name}__data"
        self.connection.register(holder, table)
        self._cast(self.connection.table(holder), self._types(name)).create_view(name, replace=True)

    def _cast(self, relation: duckdb.DuckDBPyRelation, types: dict[str, str]) -> duckdb.DuckDBPyRelation:
        return relation.select(
            *(duckdb.ColumnExpression(c).cast(duckdb.sqltype(t)).alias(c) for c, t in types.items())
        )

    # --- queries ------------------------------------------------------------------------------

    def compile(self, query: Query) -> CompiledQuery:
        return compile_query(self.bound, query, "duckdb")

    def run(self, query: Query) -> ResultTable:
        """The result of ``query``: rows ordered as the contract says, subtotal levels filled."""
        return self.run_compiled(self.compile(query))

    def run_compiled(self, compiled: CompiledQuery) -> ResultTable:
        rows = self._execute(compiled.run_sql())
        n = len(compiled.query.by) + len(compiled.query.measures)
        return ResultTable(
            by=tuple(str(c) for c in compiled.query.by),
            measures=tuple(compiled.query.measures),
            rows=[tuple(python_value(v) for v in row[:n]) for row in rows],
            levels=[int(row[-1]) for row in rows],
        )

    def arrow(self, query: Query) -> pa.Table:
        """The rows of ``query`` as printed by ``run``, as a pyarrow Table."""
        return self._relation(self.compile(query).sql).to_arrow_table()

    def pandas(self, query: Query) -> pd.DataFrame:
        """The rows of ``query`` as printed by ``run``, as a pandas DataFrame."""
        frame: pd.DataFrame = self._relation(self.compile(query).sql).df()
        return frame

    def _relation(self, sql: str) -> duckdb.DuckDBPyRelation:
        try:
            return self.connection.sql(sql)
        except duckdb.Error as exc:
            raise _run_error(exc) from None

    def _execute(self, sql: str) -> list[tuple[Any, ...]]:
        try:
            return self.connection.execute(sql).fetchall()
        except duckdb.Error as exc:
            raise _run_error(exc) from None

    def close(self) -> None:
        if self._owns_connection:
            self.connection.close()


def _run_error(exc: duckdb.Error) -> MeasureportError:
    first = str(exc).splitlines()[0] if str(exc) else type(exc).__name__
    return MeasureportError(f"DuckDB could not run the statement: {first}")
