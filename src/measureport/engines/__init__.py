"""engines stage: one small adapter per real engine. Importing this package registers them with
the workspace's engine registry (``duckdb``: the embedded DuckDB engine)."""

from __future__ import annotations

from typing import TYPE_CHECKING

from measureport.workspace import register_engine, register_url_engine

if TYPE_CHECKING:
    from measureport.engines.duckdb import DuckDBEngine
    from measureport.workspace import Workspace


def _duckdb(workspace: Workspace) -> DuckDBEngine:
    from measureport.engines.duckdb import DuckDBEngine

    return DuckDBEngine.for_workspace(workspace)


register_engine("duckdb", _duckdb)

# The real engines: each loads the model's tables into the engine it names and runs the SQL
# compiled for that engine's dialect. postgres uses $MEASUREPORT_POSTGRES_URL or, without it, a
# throwaway server of its own; spark starts Spark in local mode (local[2]).

if TYPE_CHECKING:
    from measureport.engines.clickhouse import ClickHouseEngine
    from measureport.engines.datafusion import DataFusionEngine
    from measureport.engines.postgres import PostgresEngine
    from measureport.engines.spark import SparkEngine
    from measureport.engines.sqlite import SQLiteEngine


def _sqlite(workspace: Workspace) -> SQLiteEngine:
    from measureport.engines.sqlite import SQLiteEngine

    return SQLiteEngine.for_workspace(workspace)


def _postgres(workspace: Workspace) -> PostgresEngine:
    from measureport.engines.postgres import PostgresEngine

    return PostgresEngine.for_workspace(workspace)


def _spark(workspace: Workspace) -> SparkEngine:
    from measureport.engines.spark import SparkEngine

    return SparkEngine.for_workspace(workspace)


def _clickhouse(workspace: Workspace) -> ClickHouseEngine:
    from measureport.engines.clickhouse import ClickHouseEngine

    return ClickHouseEngine.for_workspace(workspace)


def _datafusion(workspace: Workspace) -> DataFusionEngine:
    from measureport.engines.datafusion import DataFusionEngine

    return DataFusionEngine.for_workspace(workspace)


register_engine("sqlite", _sqlite)
register_engine("postgres", _postgres)
register_engine("spark", _spark)
register_engine("clickhouse", _clickhouse)
register_engine("datafusion", _datafusion)


def _postgres_at(workspace: Workspace, url: str) -> PostgresEngine:
    from measureport.engines.postgres import PostgresEngine

    return PostgresEngine.for_workspace(workspace, url=url)


def _spark_at(workspace: Workspace, url: str) -> SparkEngine:
    from measureport.engines.spark import SparkEngine

    return SparkEngine.for_workspace(workspace, url=url)


register_url_engine("postgresql", _postgres_at)
register_url_engine("postgres", _postgres_at)
register_url_engine("sc", _spark_at)
