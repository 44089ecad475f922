"""Contexts as the lowering sees them: filters whose structure is known when compiling and whose
values are columns of the frame being evaluated (grid cells, current rows, computed values).

A filter names columns of one table. :class:`TableCol` stands for a column of the rows being
filtered; every other column in a filter is a frame column (``Col``), a value that is constant
for one frame row (LANGUAGE.md rule 4).
"""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass, field

from measureport.language import ast
from measureport.plan.scalar import Col, Scalar, columns_used


@dataclass(frozen=True)
class TableCol(Scalar):
    """Column ``column`` of table ``table`` on the row being tested or aggregated."""

    table: str
    column: str

    def __str__(self) -> str:
        return f"{self.table}.{self.column}"


def table_columns(expr: Scalar) -> set[TableCol]:
    """Every :class:`TableCol` the expression reads."""
    found: set[TableCol] = set()
    stack = [expr]
    while stack:
        item = stack.pop()
        if isinstance(item, TableCol):
            found.add(item)
        stack.extend(item.children())
    return found


class Filter:
    """Base of filters: ``table`` and ``columns`` say what the filter names."""

    table: str

    @property
    def columns(self) -> frozenset[str]:
        raise NotImplementedError

    def frame_columns(self) -> set[str]:
        """The frame columns the filter's values come from."""
        raise NotImplementedError


@dataclass(frozen=True)
class EqFilter(Filter):
    """``table.column`` null-safe equal to ``value`` (grid cells, row binding).

    ``binding`` is the id of the iteration whose current row put it there, if any."""

    table: str
    column: str
    value: Scalar
    binding: int | None = None

    @property
    def columns(self) -> frozenset[str]:
        return frozenset({self.column})

    def frame_columns(self) -> set[str]:
        return columns_used(self.value)


@dataclass(frozen=True)
class CondFilter(Filter):
    """A condition over columns of ``table`` (``TableCol`` leaves) that a row must make true."""

    table: str
    named: frozenset[str]
    predicate: Scalar

    @property
    def columns(self) -> frozenset[str]:
        return self.named

    def frame_columns(self) -> set[str]:
        return columns_used(self.predicate)


@dataclass(frozen=True)
class ShiftFilter(Filter):
    """``table.column`` among the days visible in ``source`` moved by ``offset`` ``unit``s."""

    table: str
    column: str
    source: Context
    offset: int
    unit: ast.Unit

    @property
    def columns(self) -> frozenset[str]:
        return frozenset({self.column})

    def frame_columns(self) -> set[str]:
        return self.source.frame_columns()


def _order_key(f: Filter) -> str:
    return repr(f)


@dataclass(frozen=True)
class Context:
    """A set of filters that all hold, kept in a canonical order so that equal contexts compare
    and render alike. ``bound`` holds the iterations whose current row is already bound."""

    filters: tuple[Filter, ...] = ()
    bound: frozenset[int] = field(default_factory=frozenset)

    @staticmethod
    def of(filters: Iterable[Filter], bound: frozenset[int] = frozenset()) -> Context:
        unique = {_order_key(f): f for f in filters}
        return Context(tuple(unique[k] for k in sorted(unique)), bound)

    def add(self, *filters: Filter) -> Context:
        return Context.of((*self.filters, *filters), self.bound)

    def without_columns(self, table: str, columns: Iterable[str]) -> Context:
        """Remove every filter that names one of ``columns`` of ``table``."""
        cols = frozenset(columns)
        kept = [f for f in self.filters if not (f.table == table and f.columns & cols)]
        return Context.of(kept, self.bound)

    def replace(self, new: Filter) -> Context:
        """Remove the filters naming the columns ``new`` names, then add ``new``."""
        return self.without_columns(new.table, new.columns).add(new)

    def clear_table(self, table: str, keep: Iterable[str] = ()) -> Context:
        """Remove the filters on ``table`` except those naming only columns in ``keep``."""
        kept_cols = frozenset(keep)
        kept = [f for f in self.filters if f.table != table or (kept_cols and f.columns <= kept_cols)]
        return Context.of(kept, self.bound)

    def restricts(self, table: str, column: str) -> bool:
        return any(f.table == table and column in f.columns for f in self.filters)

    def mark_bound(self, iteration: int) -> Context:
        return Context(self.filters, self.bound | {iteration})

    def relevant_to(self, tables: Iterable[str]) -> tuple[Filter, ...]:
        """The filters on any of ``tables`` (the tables a row set reaches)."""
        wanted = set(tables)
        return tuple(f for f in self.filters if f.table in wanted)

    def frame_columns(self) -> set[str]:
        found: set[str] = set()
        for f in self.filters:
            found |= f.frame_columns()
        return found


def frame_columns_of(filters: Iterable[Filter]) -> set[str]:
    """Frame columns that a set of filters reads."""
    found: set[str] = set()
    for f in filters:
        found |= f.frame_columns()
    return found


__all__ = [
    "Col",
    "CondFilter",
    "Context",
    "EqFilter",
    "Filter",
    "ShiftFilter",
    "TableCol",
    "frame_columns_of",
    "table_columns",
]
