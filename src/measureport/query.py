"""A query (measures by grouping columns under report filters) and its result, shared by every engine."""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

from measureport.language import ast


@dataclass(frozen=True)
class Query:
    """``measures`` by the grouping columns ``by`` under the report filters ``where`` (bound
    conditions, all of which hold). With ``totals``, subtotal rows are added for each prefix of ``by``."""

    measures: tuple[str, ...]
    by: tuple[ast.ColumnRef, ...] = ()
    where: tuple[ast.Expr, ...] = ()
    totals: bool = False


@dataclass
class ResultTable:
    """Rows of grouping values then measure values, ordered by the grouping columns (nulls last).

    ``levels[i]`` is how many leading grouping columns row ``i`` keeps: ``len(by)`` for a detail
    row, fewer for a subtotal row (the columns past the level are rolled up, shown as None in
    ``rows`` but not the empty member), 0 for the grand total. Values are Python ``int``,
    ``float``, ``str``, ``datetime.date``, ``bool`` or None.
    """

    by: tuple[str, ...]
    measures: tuple[str, ...]
    rows: list[tuple[Any, ...]] = field(default_factory=list)
    levels: list[int] = field(default_factory=list)

    @property
    def columns(self) -> tuple[str, ...]:
        return self.by + self.measures
