"""`measureport sql` and `explain` on the canal-hire model of conftest.py (invented data)."""

from __future__ import annotations

from pathlib import Path

import duckdb
import sqlglot
from click.testing import CliRunner

from measureport.cli.main import main


def invoke(*args: str) -> tuple[int, str, str]:
    result = CliRunner().invoke(main, list(args))
    return result.exit_code, result.stdout, result.stderr


def test_sql_runs_on_the_model_tables_and_gives_the_rows_of_run(canal_model: Path) -> None:
    code, out, err = invoke("sql", str(canal_model), "-m", "hires,hours", "--by", "boats.name")
    assert (code, err) == (0, "")
    sqlglot.parse_one(out, read="duckdb")
    # LANGUAGE.md section 4: the statement names each table by its model name.
    data = canal_model.parent / "data"
    connection = duckdb.connect()
    for table in ("hires", "boats"):
        connection.execute(f"CREATE VIEW {table} AS SELECT * FROM read_csv('{data / table}.csv')")
    cursor = connection.execute(out)
    assert [column[0] for column in cursor.description] == ["boats.name", "hires", "hours"]
    # As in test_run: Heron 2 hires / 5 hours, Kingfisher 2 / 1, the orphan hire 4 last.
    assert cursor.fetchall() == [("Heron", 2, 5), ("Kingfisher", 2, 1), (None, 1, 4)]


def test_unknown_dialect_is_bad_input(canal_model: Path) -> None:
    code, out, err = invoke("sql", str(canal_model), "-m", "hires", "--dialect", "nosuch")
    assert (code, out) == (2, "")
    assert err.startswith("error: there is no dialect named 'nosuch'")


def test_explain_names_each_measure_and_prints_a_plan(canal_model: Path) -> None:
    code, out, err = invoke("explain", str(canal_model), "-m", "hires,fee_per_hour", "--by", "boats.kind")
    assert (code, err) == (0, "")
    lines = out.splitlines()
    assert "measure hires = count(hires)" in lines
    assert "measure fee_per_hour = fee / hours" in lines
    assert "plan of the query:" in lines
