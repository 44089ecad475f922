"""DataFusion in this process, through its Python package: the model's tables registered from Arrow.

    engine = DataFusionEngine(bound)          # tables from the model's data files (or a Dataset)
    result = engine.run(query)

DataFusion reads Arrow natively, so each table is registered as the Arrow record batches that
:mod:`measureport.engines.loading` builds, in one partition (an empty table keeps its schema
through one empty batch). sqlglot has no DataFusion dialect: statements are written in the
PostgreSQL dialect, which DataFusion's parser accepts for what measureport renders.

Type mapping (model type → DataFusion (Arrow) type → Python value read back):

========================  ======================  =========================================
model type                column type             read back as
========================  ======================  =========================================
``integer``, ``bigint``   ``Int64``               ``int``
``decimal(p,s)``          ``Decimal128(p,s)``     ``float``; with no fractional digits ``int``
``double``                ``Float64``             ``float``
``text``                  ``Utf8``                ``str``
``date``                  ``Date32``              ``datetime.date``; a ``Timestamp`` (what
                                                  ``date_trunc`` returns) cut to its day
``boolean``               ``Boolean``             ``bool``
========================  ======================  =========================================
"""

from __future__ import annotations

from collections.abc import Sequence
from typing import TYPE_CHECKING, Any

import pyarrow as pa

from measureport.engines.loading import arrow_type
from measureport.engines.sqlengine import SqlEngine, workspace_dataset
from measureport.errors import MeasureportError
from measureport.model.schema import DataType
from measureport.model.tabledata import Dataset
from measureport.semantics.bound import BoundModel

if TYPE_CHECKING:
    from measureport.workspace import Workspace


def column_type(data_type: DataType) -> pa.DataType:
    """The Arrow type DataFusion holds a model column as (the loading type itself)."""
    return arrow_type(data_type)


class DataFusionEngine(SqlEngine):
    """Runs statements on an in-process DataFusion session over the model's tables."""

    title = "DataFusion"
    dialect = "datafusion"
    sqlglot_dialect = "postgres"

    def __init__(self, bound: BoundModel, dataset: Dataset | None = None) -> None:
        """The model's tables (from ``dataset`` when given, else from the data files) registered
        in a new DataFusion session."""
        super().__init__(bound)
        try:
            from datafusion import SessionContext
        except ImportError:
            raise MeasureportError(
                "the DataFusion engine needs the datafusion package; install it with: pip install datafusion"
            ) from None
        self.context = SessionContext()
        self.load_tables(dataset)

    @classmethod
    def for_workspace(cls, workspace: Workspace) -> DataFusionEngine:
        """The engine of a workspace, over the workspace's data."""
        return cls(workspace.bound, workspace_dataset(workspace))

    def load_table(self, name: str, table: pa.Table) -> None:
        columns = self.model.tables[name].columns
        schema = pa.schema([pa.field(c, column_type(col.type)) for c, col in columns.items()])
        batches = table.cast(schema).to_batches() or [pa.RecordBatch.from_pylist([], schema=schema)]
        self.context.register_record_batches(name, [batches])

    def fetch(self, sql: str) -> Sequence[Sequence[Any]]:
        try:
            result = self.context.sql(sql).to_arrow_table()
        except Exception as exc:  # DataFusion raises plain ValueError, and Exception, for every error
            raise self.run_error(exc) from None
        columns = [result.column(i).to_pylist() for i in range(result.num_columns)]
        return list(zip(*columns, strict=True)) if columns else []

    def shutdown(self) -> None:
        for name in self.loaded:
            self.context.deregister_table(name)
