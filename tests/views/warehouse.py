"""Test helpers: put a model's tables into a real database, read a view back, and compare it
with the reference evaluator cell by cell."""

from __future__ import annotations

import math
from collections.abc import Sequence
from pathlib import Path
from typing import Any

import duckdb
import pyarrow as pa

from measureport.engines.ddl import create_table
from measureport.engines.loading import loadable_tables
from measureport.engines.typed_rows import result_kinds, typed_rows
from measureport.workspace import Workspace

Row = tuple[Any, ...]

# Relative tolerance for numbers: engines sum decimals exactly and the reference in doubles.
TOLERANCE = 1e-9


def model_tables(model: Path) -> dict[str, pa.Table]:
    """The model's tables as the engines load them (the reference evaluator's data)."""
    with Workspace.open(model) as workspace:
        return loadable_tables(workspace.model, workspace.dataset)


def create_duckdb_tables(model: Path, database: Path, skip: Sequence[str] = ()) -> None:
    """Create each table of the model (but those in ``skip``) in the DuckDB file ``database``."""
    with duckdb.connect(str(database)) as connection:
        for name, table in model_tables(model).items():
            if name not in skip:
                connection.register("incoming", table)
                connection.execute(f'CREATE TABLE "{name}" AS SELECT * FROM incoming')
                connection.unregister("incoming")


def create_postgres_tables(model: Path, url: str) -> None:
    """Create and fill each table of the model, as permanent tables, in the database at ``url``."""
    import psycopg
    from psycopg import sql as pgsql

    from measureport.engines.postgres import column_type

    with Workspace.open(model) as workspace, psycopg.connect(url) as connection:
        for name, table in loadable_tables(workspace.model, workspace.dataset).items():
            columns = {c: column_type(col.type) for c, col in workspace.model.tables[name].columns.items()}
            connection.execute(create_table(name, columns, "postgres"))
            copy = pgsql.SQL("COPY {} FROM STDIN").format(pgsql.Identifier(name))
            with connection.cursor() as cursor, cursor.copy(copy) as sink:
                for row in zip(*(table.column(c).to_pylist() for c in columns), strict=True):
                    sink.write_row(row)


def reference_rows(model: Path, view: str) -> tuple[tuple[str, ...], list[Row]]:
    """The column names and rows of ``run`` (the reference engine) for the model's view."""
    with Workspace.open(model) as workspace:
        result = workspace.run(workspace.view_query(view))
    return result.columns, result.rows


def typed_view_rows(model: Path, view: str, rows: Sequence[Sequence[Any]]) -> list[Row]:
    """Rows read from a view, each value typed by its column's kind (SQLite's dates are text)."""
    with Workspace.open(model) as workspace:
        kinds = result_kinds(workspace.bound, workspace.view_query(view), level_column=False)
    return typed_rows(rows, kinds)


def same_cell(actual: Any, expected: Any) -> bool:
    """Equal values; numbers within :data:`TOLERANCE` of each other (ints and floats alike)."""
    if _is_number(actual) and _is_number(expected):
        return math.isclose(actual, expected, rel_tol=TOLERANCE, abs_tol=TOLERANCE)
    return bool(actual == expected) and type(actual) is type(expected)


def sorted_rows(rows: Sequence[Row]) -> list[Row]:
    """Rows in one order whatever order the engine gave them in (nulls last, as the contract)."""
    return sorted(rows, key=lambda row: tuple((v is None, "" if v is None else str(v)) for v in row))


def differences(actual: Sequence[Row], expected: Sequence[Row]) -> list[str]:
    """Every cell where ``actual`` differs from ``expected`` (both sorted first); empty when equal."""
    left, right = sorted_rows(actual), sorted_rows(expected)
    if len(left) != len(right):
        return [f"{len(left)} rows, expected {len(right)}: {left} against {right}"]
    found = []
    for number, (got, wanted) in enumerate(zip(left, right, strict=True)):
        if len(got) != len(wanted):
            found.append(f"row {number}: {got} against {wanted}")
            continue
        for column, (a, b) in enumerate(zip(got, wanted, strict=True)):
            if not same_cell(a, b):
                found.append(f"row {number} column {column}: {a!r}, expected {b!r}")
    return found


def _is_number(value: Any) -> bool:
    return isinstance(value, int | float) and not isinstance(value, bool)
