"""The star-schema model as loaded from the model file: tables, columns, relationships, views."""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path
from typing import Literal

from measureport.errors import NO_SPAN, Span

ValueKind = Literal["number", "text", "date", "boolean"]


@dataclass(frozen=True)
class DataType:
    """A column's type: the kind the language checks against, and the SQL type it stores.

    ``sql`` is one of ``integer``, ``bigint``, ``double``, ``decimal(p,s)``, ``text``, ``date``,
    ``boolean`` — the spellings accepted in the model file.
    """

    kind: ValueKind
    sql: str
    precision: int | None = None
    scale: int | None = None

    def __str__(self) -> str:
        return self.sql


INTEGER = DataType("number", "integer")
BIGINT = DataType("number", "bigint")
DOUBLE = DataType("number", "double")
TEXT = DataType("text", "text")
DATE = DataType("date", "date")
BOOLEAN = DataType("boolean", "boolean")


def decimal(precision: int, scale: int) -> DataType:
    """The ``decimal(p,s)`` type."""
    return DataType("number", f"decimal({precision},{scale})", precision, scale)


@dataclass(frozen=True)
class Column:
    name: str
    type: DataType
    span: Span = field(default=NO_SPAN, compare=False)


@dataclass(frozen=True)
class Table:
    """A table of the model. ``source`` is the ``from:`` text; ``path`` the resolved data file,
    or None when ``source`` names a table on a connected engine."""

    name: str
    source: str
    columns: dict[str, Column]
    key: str | None = None
    path: Path | None = None
    span: Span = field(default=NO_SPAN, compare=False)
    key_span: Span = field(default=NO_SPAN, compare=False)
    source_span: Span = field(default=NO_SPAN, compare=False)


@dataclass(frozen=True)
class Relationship:
    """``many_table.many_column -> one_table.one_column`` (many-to-one)."""

    many_table: str
    many_column: str
    one_table: str
    one_column: str
    span: Span = field(default=NO_SPAN, compare=False)

    def __str__(self) -> str:
        return f"{self.many_table}.{self.many_column} -> {self.one_table}.{self.one_column}"


@dataclass(frozen=True)
class ViewCondition:
    """One entry of a view's ``where:`` list, with the span of its YAML scalar."""

    text: str
    span: Span = field(default=NO_SPAN, compare=False)


@dataclass(frozen=True)
class View:
    name: str
    measures: tuple[str, ...]
    by: tuple[tuple[str, str], ...]
    where: tuple[ViewCondition, ...] = ()
    span: Span = field(default=NO_SPAN, compare=False)
    measure_spans: tuple[Span, ...] = field(default=(), compare=False)
    by_spans: tuple[Span, ...] = field(default=(), compare=False)


@dataclass(frozen=True)
class Model:
    """A whole model file. ``path`` is the model file; relative paths in it resolve against its folder."""

    name: str
    path: Path
    tables: dict[str, Table]
    relationships: tuple[Relationship, ...]
    measure_files: tuple[Path, ...]
    views: dict[str, View]
    measure_file_spans: tuple[Span, ...] = field(default=(), compare=False)

    @property
    def base_dir(self) -> Path:
        return self.path.parent

    def relationships_from(self, table: str) -> tuple[Relationship, ...]:
        """The relationships whose many side is ``table`` (the tables it points to)."""
        return tuple(r for r in self.relationships if r.many_table == table)

    def relationships_to(self, table: str) -> tuple[Relationship, ...]:
        """The relationships whose one side is ``table`` (the tables pointing at it)."""
        return tuple(r for r in self.relationships if r.one_table == table)
