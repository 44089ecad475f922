"""engines stage: one small adapter per real engine. Importing this package registers them with
the workspace's engine registry (``duckdb``: the embedded DuckDB engine)."""

from __future__ import annotations

from typing import TYPE_CHECKING

from measureport.workspace import register_engine

if TYPE_CHECKING:
    from measureport.engines.duckdb import DuckDBEngine
    from measureport.workspace import Workspace


def _duckdb(workspace: Workspace) -> DuckDBEngine:
    from measureport.engines.duckdb import DuckDBEngine

    return DuckDBEngine.for_workspace(workspace)


register_engine("duckdb", _duckdb)
