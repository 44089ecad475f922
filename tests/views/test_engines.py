"""Generated views on real engines, selected back, equal to `measureport run` (the reference
engine) cell by cell (orchard model, invented data)."""

from __future__ import annotations

import sqlite3
from pathlib import Path

import duckdb
import pytest

from measureport.engines.sqlite import SQLiteEngine
from measureport.workspace import Workspace
from views.conftest import invoke
from views.orchard import PORTABLE_VIEWS, TIME_WINDOW_VIEW, write_orchard
from views.warehouse import (
    create_duckdb_tables,
    create_postgres_tables,
    differences,
    reference_rows,
    typed_view_rows,
)

PORTABLE = ("kilos_by_variety", "block_months_2025", "harvest_total")


def assert_view_equals_run(
    model: Path, view: str, columns: list[str], rows: list[tuple[object, ...]]
) -> None:
    expected_columns, expected = reference_rows(model, view)
    assert tuple(columns) == expected_columns
    assert expected, "the reference gives rows, so an empty view cannot pass"
    assert differences(typed_view_rows(model, view, rows), expected) == []


def test_the_reference_rows_are_the_ones_worked_out_by_hand(orchard: Path) -> None:
    # Guards the oracle of this file on two views (from the table in orchard.py):
    # Bramley picks 1, 2, 3, 7: 10.50 + 4.25 + 20.00 = 34.75 kg in 4 picks; Russet 8 + 12 = 20;
    # the orphan pick 5 under the empty member; Pippin never picked, kept by kilos_or_zero = 0.
    # All kilos: 59.75.
    _, rows = reference_rows(orchard, "kilos_by_variety")
    assert [row[:3] for row in rows] == [
        ("Bramley", 34.75, 4), ("Pippin", None, None), ("Russet", 20.0, 2), (None, 5.0, 1)
    ]
    assert [row[4] for row in rows] == [34.75, 0, 20.0, 5.0]
    assert rows[0][3] == pytest.approx(34.75 / 59.75)
    assert reference_rows(orchard, "harvest_total")[1] == [(59.75, 7)]


def test_duckdb_views_applied_from_the_command_line_equal_run(tmp_path: Path) -> None:
    model = write_orchard(tmp_path / "orchard", PORTABLE_VIEWS + TIME_WINDOW_VIEW)
    database = tmp_path / "warehouse.duckdb"
    create_duckdb_tables(model, database)
    code, stdout, stderr = invoke(
        "views", model, "--dialect", "duckdb", "--out", tmp_path / "v", "--apply", database
    )
    assert (code, stderr) == (0, "")
    assert stdout.splitlines()[-1] == (
        f"created 4 views in the DuckDB database {database}: {', '.join((*PORTABLE, 'kilos_to_date'))}"
    )
    with duckdb.connect(str(database), read_only=True) as connection:
        for view in (*PORTABLE, "kilos_to_date"):
            cursor = connection.execute(f'SELECT * FROM "{view}"')
            columns = [c[0] for c in cursor.description]
            assert_view_equals_run(model, view, columns, cursor.fetchall())


def test_duckdb_view_files_run_as_they_are(orchard: Path, tmp_path: Path) -> None:
    # A user may run the files with any client instead of --apply.
    out = tmp_path / "v"
    assert invoke("views", orchard, "--dialect", "duckdb", "--out", out)[0] == 0
    database = tmp_path / "warehouse.duckdb"
    create_duckdb_tables(orchard, database)
    with duckdb.connect(str(database)) as connection:
        for view in PORTABLE:
            connection.execute((out / f"{view}.sql").read_text(encoding="utf-8"))
            cursor = connection.execute(f'SELECT * FROM "{view}"')
            assert_view_equals_run(orchard, view, [c[0] for c in cursor.description], cursor.fetchall())


def test_sqlite_view_files_equal_run(orchard: Path, tmp_path: Path) -> None:
    out = tmp_path / "v"
    assert invoke("views", orchard, "--dialect", "sqlite", "--out", out)[0] == 0
    database = tmp_path / "warehouse.sqlite"
    with Workspace.open(orchard) as workspace:
        SQLiteEngine(workspace.bound, workspace.dataset, database=str(database)).close()
    connection = sqlite3.connect(database)
    try:
        for view in PORTABLE:
            # The file holds two statements (DROP VIEW IF EXISTS, CREATE VIEW); run it twice to
            # show it replaces the view it made before.
            script = (out / f"{view}.sql").read_text(encoding="utf-8")
            connection.executescript(script)
            connection.executescript(script)
            cursor = connection.execute(f'SELECT * FROM "{view}"')
            assert_view_equals_run(orchard, view, [c[0] for c in cursor.description], cursor.fetchall())
    finally:
        connection.close()


@pytest.mark.slow
def test_postgres_views_applied_from_the_command_line_equal_run(
    orchard: Path, tmp_path: Path, postgres_database: str
) -> None:
    create_postgres_tables(orchard, postgres_database)
    code, stdout, stderr = invoke(
        "views", orchard, "--dialect", "postgres", "--out", tmp_path / "v", "--apply", postgres_database
    )
    assert (code, stderr) == (0, "")
    assert stdout.splitlines()[-1].startswith("created 3 views in the PostgreSQL database")
    import psycopg

    with psycopg.connect(postgres_database) as connection:
        for view in PORTABLE:
            cursor = connection.execute(f'SELECT * FROM "{view}"')
            assert cursor.description is not None
            columns = [c.name for c in cursor.description]
            assert_view_equals_run(orchard, view, columns, cursor.fetchall())


@pytest.mark.slow
def test_postgres_apply_replaces_a_view_whose_columns_changed(tmp_path: Path, postgres_database: str) -> None:
    # PostgreSQL cannot CREATE OR REPLACE a view whose columns change; --apply drops it first.
    model = write_orchard(tmp_path / "orchard", PORTABLE_VIEWS)
    create_postgres_tables(model, postgres_database)
    assert invoke("views", model, "--dialect", "postgres", "--apply", postgres_database)[0] == 0
    fewer = PORTABLE_VIEWS.replace("[kilos, picks, variety_share, kilos_or_zero]", "[picks, kilos]")
    write_orchard(model.parent, fewer)
    code, _, stderr = invoke("views", model, "--dialect", "postgres", "--apply", postgres_database)
    assert (code, stderr) == (0, "")
    import psycopg

    with psycopg.connect(postgres_database) as connection:
        cursor = connection.execute('SELECT * FROM "kilos_by_variety"')
        assert cursor.description is not None
        columns = [c.name for c in cursor.description]
        assert columns == ["trees.variety", "picks", "kilos"]
        assert_view_equals_run(model, "kilos_by_variety", columns, cursor.fetchall())
