"""Contexts: sets of filters, each on columns of one table, and the revisions of section 3."""

from __future__ import annotations

import datetime as dt
from collections.abc import Iterable
from dataclasses import dataclass
from typing import Any

from measureport.language import ast


@dataclass(frozen=True)
class Filter:
    """Base of filters; ``table`` and ``columns`` say what a filter names."""

    table: str
    columns: frozenset[str]


@dataclass(frozen=True)
class Equals(Filter):
    """``table.column`` equal to ``value``, null-safe (grid cells, row binding of columns)."""

    value: Any


@dataclass(frozen=True)
class Holds(Filter):
    """A condition over the columns of ``table``, its outside values already computed."""

    condition: ast.Expr


@dataclass(frozen=True)
class DayRange(Filter):
    """``first <= table.column <= last`` (to_date, trailing)."""

    first: dt.date
    last: dt.date


@dataclass(frozen=True)
class DaySet(Filter):
    """``table.column`` among ``days`` (shift)."""

    days: frozenset[dt.date]


def equals(table: str, column: str, value: Any) -> Equals:
    return Equals(table, frozenset({column}), value)


@dataclass(frozen=True)
class Context:
    """A set of filters that all hold at once."""

    filters: frozenset[Filter] = frozenset()

    def on_table(self, table: str) -> tuple[Filter, ...]:
        return tuple(f for f in self.filters if f.table == table)

    def restricts(self, table: str, column: str) -> bool:
        return any(f.table == table and column in f.columns for f in self.filters)

    def add(self, *filters: Filter) -> Context:
        return Context(self.filters | frozenset(filters))

    def without_columns(self, table: str, columns: Iterable[str]) -> Context:
        """Remove every filter that names one of ``columns`` of ``table``."""
        cols = frozenset(columns)
        return Context(frozenset(f for f in self.filters if not (f.table == table and f.columns & cols)))

    def replace(self, *filters: Filter) -> Context:
        """Remove the filters naming the columns of ``filters``, then add them."""
        ctx = self
        for f in filters:
            ctx = ctx.without_columns(f.table, f.columns)
        return ctx.add(*filters)

    def clear_table(self, table: str, keep: Iterable[str] = ()) -> Context:
        """Remove the filters on ``table`` except those naming only columns in ``keep``."""
        kept = frozenset(keep)
        return Context(
            frozenset(f for f in self.filters if f.table != table or (kept and f.columns <= kept))
        )
