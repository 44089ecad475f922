"""The few statements adapters send to set up an engine, built with sqlglot (identifiers quoted)."""

from __future__ import annotations

from collections.abc import Mapping, Sequence

from sqlglot import exp
from sqlglot.errors import ErrorLevel


def table_name(name: str) -> exp.Table:
    """A one-part table name, quoted."""
    return exp.Table(this=exp.to_identifier(name, quoted=True))


def create_table(
    name: str,
    columns: Mapping[str, str],
    dialect: str,
    temporary: bool = False,
    engine: str | None = None,
) -> str:
    """``CREATE [TEMPORARY] TABLE name (column type, ...) [ENGINE = engine]``; each type is written
    in ``dialect``'s own spelling (for example ``Nullable(Int64)``, ``NUMERIC(12,2)``)."""
    schema = exp.Schema(
        this=table_name(name),
        expressions=[
            exp.ColumnDef(
                this=exp.to_identifier(column, quoted=True), kind=exp.DataType.build(kind, dialect=dialect)
            )
            for column, kind in columns.items()
        ],
    )
    properties: list[exp.Expression] = []
    if temporary:
        properties.append(exp.TemporaryProperty())
    if engine is not None:
        properties.append(exp.EngineProperty(this=exp.var(engine)))
    create = exp.Create(
        this=schema, kind="TABLE", properties=exp.Properties(expressions=properties) if properties else None
    )
    return render(create, dialect)


def insert_placeholders(name: str, columns: Sequence[str], dialect: str) -> str:
    """``INSERT INTO name (columns) VALUES (?, ?, ...)`` with one placeholder per column."""
    values = exp.values([tuple(exp.Placeholder() for _ in columns)])
    insert = exp.insert(
        values, table_name(name), columns=[exp.to_identifier(c, quoted=True) for c in columns]
    )
    return render(insert, dialect)


def create_schema(name: str, dialect: str) -> str:
    """``CREATE SCHEMA name`` (``CREATE DATABASE`` where the dialect calls it so)."""
    return render(exp.Create(this=table_name(name), kind="SCHEMA"), dialect)


def drop_schema(name: str, dialect: str) -> str:
    """``DROP SCHEMA IF EXISTS name`` (``DROP DATABASE`` where the dialect calls it so)."""
    return render(exp.Drop(tables=[table_name(name)], kind="SCHEMA", exists=True), dialect)


def use_schema(name: str, dialect: str) -> str:
    """``USE name``: make ``name`` the schema that unqualified table names resolve in."""
    return render(exp.Use(this=table_name(name)), dialect)


def set_settings(settings: Mapping[str, int], dialect: str) -> str:
    """``SET name = value, ...``: session settings of whole-number values."""
    items = [
        exp.SetItem(this=exp.EQ(this=exp.var(name), expression=exp.Literal.number(int(value))))
        for name, value in settings.items()
    ]
    return render(exp.Set(expressions=items), dialect)


def render(expression: exp.Expression, dialect: str) -> str:
    """One statement in ``dialect``; a construct the dialect cannot express raises."""
    return expression.sql(dialect=dialect, identify=True, unsupported_level=ErrorLevel.RAISE)
