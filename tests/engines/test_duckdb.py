"""The DuckDB engine on model files: CSV and Parquet read by DuckDB with the declared types, a
table named by ``schema.table`` on a connected database, results as a ResultTable, an Arrow
table or a pandas frame, and plain errors. Invented data (a small orchard co-op)."""

from __future__ import annotations

import datetime as dt
from pathlib import Path

import duckdb
import pytest

from differential.harness import differences
from measureport.engines.duckdb import DuckDBEngine
from measureport.errors import MeasureportError
from measureport.workspace import Workspace

MODEL = """
name: orchard
tables:
  picks:
    from: data/picks.csv
    columns:
      farm_id: integer
      day: date
      kilos: decimal(8,2)
      organic: boolean
      note: text
  farms:
    from: data/farms.parquet
    key: farm_id
    columns:
      farm_id: integer
      name: text
relationships:
  - picks.farm_id -> farms.farm_id
measures:
  - orchard.measures
"""

MEASURES = """
measure kilos = sum(picks.kilos)
measure picks_n = count(picks)
measure notes = count(picks.note)
measure mean_kilos = mean(picks.kilos)
measure last_day = max(picks.day)
measure organic_picks = picks_n given picks.organic = true
"""

# picks: farm 1 picks 2.50 and 1.25 kilos, farm 2 picks 4.00, farm 3 (no such farm) 0.75;
# the empty note field of the third row is null.
PICKS = """farm_id,day,kilos,organic,note
1,2025-06-01,2.50,true,early
1,2025-06-02,1.25,false,late
2,2025-06-02,4.00,true,
3,2025-06-03,0.75,true,stray
"""


@pytest.fixture
def orchard(tmp_path: Path) -> Path:
    (tmp_path / "data").mkdir()
    (tmp_path / "model.yaml").write_text(MODEL, encoding="utf-8")
    (tmp_path / "orchard.measures").write_text(MEASURES, encoding="utf-8")
    (tmp_path / "data" / "picks.csv").write_text(PICKS, encoding="utf-8")
    con = duckdb.connect()
    con.execute("CREATE TABLE farms AS SELECT * FROM (VALUES (1, 'Hill'), (2, 'Vale')) t(farm_id, name)")
    con.execute(f"COPY farms TO '{tmp_path / 'data' / 'farms.parquet'}' (FORMAT parquet)")
    con.close()
    return tmp_path / "model.yaml"


def test_files_are_read_with_their_declared_types(orchard: Path) -> None:
    with Workspace.open(orchard) as ws:
        query = ws.query(
            ["kilos", "picks_n", "notes", "mean_kilos", "last_day", "organic_picks"], ["farms.name"]
        )
        result = ws.run(query, "duckdb")
        assert not differences(ws.run(query, "reference"), result)
    # Hill: 2.50 + 1.25 = 3.75 kilos, 2 picks, 2 notes, mean 1.875, last 2 June, 1 organic;
    # Vale: 4.00, 1 pick, its note empty (null): 0 notes; farm 3 is the empty member: 0.75.
    assert result.rows == [
        ("Hill", 3.75, 2, 2, 1.875, dt.date(2025, 6, 2), 1),
        ("Vale", 4.0, 1, 0, 4.0, dt.date(2025, 6, 2), 1),
        (None, 0.75, 1, 1, 0.75, dt.date(2025, 6, 3), 1),
    ]
    assert all(type(row[1]) is float for row in result.rows)  # decimals come back as floats


def test_totals_fill_the_levels(orchard: Path) -> None:
    with Workspace.open(orchard) as ws:
        result = ws.run(ws.query(["picks_n"], ["farms.name"], totals=True), "duckdb")
    assert result.levels == [1, 1, 1, 0]
    assert result.rows[-1] == (None, 4)


def test_arrow_and_pandas_give_the_rows_run_prints(orchard: Path) -> None:
    with Workspace.open(orchard) as ws:
        engine = DuckDBEngine(ws.bound)
        query = ws.query(["kilos", "picks_n"], ["farms.name"], totals=True)
        table = engine.arrow(query)
        frame = engine.pandas(query)
        engine.close()
    assert table.column_names == ["farms.name", "kilos", "picks_n", "totals"]
    assert table.column("picks_n").to_pylist() == [2, 1, 1, 4]
    assert frame["totals"].isna().tolist() == [True, True, True, False]
    assert frame["totals"].iloc[-1] == "total"


def test_a_table_on_a_connected_database_is_read_by_its_schema_and_name(orchard: Path) -> None:
    text = orchard.read_text(encoding="utf-8").replace("from: data/farms.parquet", "from: registry.farms")
    orchard.write_text(text, encoding="utf-8")
    con = duckdb.connect()
    con.execute("CREATE SCHEMA registry")
    con.execute(
        "CREATE TABLE registry.farms AS SELECT * FROM (VALUES (1, 'Hill'), (2, 'Vale')) t(farm_id, name)"
    )
    from measureport.model.loader import load_model
    from measureport.semantics.binder import bind_model, build_query

    bound = bind_model(load_model(orchard))
    engine = DuckDBEngine(bound, connection=con)
    query = build_query(bound, ["picks_n"], ["farms.name"])
    assert '"registry"."farms"' in engine.compile(query).sql
    assert engine.run(query).rows == [("Hill", 2), ("Vale", 1), (None, 1)]
    con.close()


def test_a_data_file_that_disappeared_is_a_plain_error(orchard: Path) -> None:
    from measureport.model.loader import load_model
    from measureport.semantics.binder import bind_model

    bound = bind_model(load_model(orchard))
    (orchard.parent / "data" / "picks.csv").unlink()  # gone between loading and running
    with pytest.raises(MeasureportError) as caught:
        DuckDBEngine(bound)
    assert "could not read the data of table picks" in caught.value.message
    assert "Traceback" not in caught.value.render()
