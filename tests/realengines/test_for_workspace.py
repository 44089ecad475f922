"""Engines built for a workspace, as the engine registry's factories build them (invented data:
the tool library). The engines are the external references, named in each parameter id."""

from __future__ import annotations

import pytest

from measureport.engines.sqlengine import SqlEngine
from measureport.errors import MeasureportError
from measureport.render.dialects import dialect_profile
from measureport.workspace import Workspace
from realengines.engines import engine_params
from realengines.samples import library


def build(engine_name: str, workspace: Workspace) -> SqlEngine:
    """What the registry's factory for ``engine_name`` returns."""
    if engine_name == "sqlite":
        from measureport.engines.sqlite import SQLiteEngine

        return SQLiteEngine.for_workspace(workspace)
    if engine_name == "clickhouse":
        from measureport.engines.clickhouse import ClickHouseEngine

        return ClickHouseEngine.for_workspace(workspace)
    if engine_name == "datafusion":
        from measureport.engines.datafusion import DataFusionEngine

        return DataFusionEngine.for_workspace(workspace)
    if engine_name == "postgres":
        from measureport.engines.postgres import PostgresEngine

        return PostgresEngine.for_workspace(workspace)
    raise ValueError(engine_name)


@pytest.mark.parametrize("engine_name", engine_params(("sqlite", "clickhouse", "datafusion", "postgres")))
def test_an_engine_for_a_workspace_loads_its_dataset(engine_name: str) -> None:
    bound, dataset = library()
    with Workspace(bound.model, bound, dataset) as workspace:
        engine = build(engine_name, workspace)
        try:
            assert set(engine.loaded) == {"loans", "tools"}
            # Six loans in the invented data.
            assert engine.execute('SELECT COUNT(*) FROM "loans"', ["number"]) == [(6,)]
        finally:
            engine.close()


@pytest.mark.parametrize("engine_name", engine_params(("sqlite", "clickhouse", "datafusion")))
def test_run_compiles_for_the_engine_dialect(engine_name: str) -> None:
    bound, dataset = library()
    with Workspace(bound.model, bound, dataset) as workspace:
        engine = build(engine_name, workspace)
        try:
            try:
                dialect_profile(engine.dialect)
            except MeasureportError:
                pytest.skip(f"the dialect profile '{engine.dialect}' does not exist yet")
            result = engine.run(workspace.query(["loans", "loan_days"], by=["tools.kind"]))
        finally:
            engine.close()
    # access: loan 3 (3 days); power: loans 1, 2, 4 (2 + 1 days, loan 4 has none);
    # the empty member: loans 5 and 6 (5 + 1 days).
    assert result.rows == [("access", 1, 3), ("power", 3, 3), (None, 2, 6)]
