"""What the binder knows at a point of an expression: let values and enclosing iterations."""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field

from measureport.errors import Span
from measureport.language import ast
from measureport.semantics.bound import ValueType


@dataclass(frozen=True)
class LetValue:
    """A ``let`` in scope: the type of its value and where it is named."""

    type: ValueType
    span: Span


@dataclass(frozen=True)
class Frame:
    """One enclosing ``for each``: the rows of ``table`` (with the tables it reaches), or the
    distinct combinations of ``columns``."""

    label: str
    table: str | None = None
    reached: frozenset[str] = frozenset()
    columns: frozenset[tuple[str, str]] = frozenset()

    def gives_value(self, column: ast.ColumnRef) -> bool:
        """True when ``column`` has a value on the current row of this iteration."""
        if self.table is not None:
            return column.table in self.reached
        return (column.table, column.column) in self.columns

    def binds(self, column: ast.ColumnRef) -> bool:
        """True when row binding sets a filter on ``column`` (rule 3 of the language)."""
        if self.table is not None:
            return column.table == self.table
        return (column.table, column.column) in self.columns


@dataclass(frozen=True)
class Scope:
    """The binding state at one point.

    ``row_bound``: the innermost iteration's row is bound here (under a ``given`` or in a value
    evaluated in a revised context). ``tested``: inside a filter condition, the list that
    collects the columns it reads row by row. ``report_filter``: inside a report filter, where
    only columns, literals and scalar operations are allowed.
    """

    lets: Mapping[str, LetValue] = field(default_factory=dict)
    frames: tuple[Frame, ...] = ()
    row_bound: bool = False
    tested: list[ast.ColumnRef] | None = None
    report_filter: bool = False

    @property
    def in_iteration(self) -> bool:
        return bool(self.frames)
