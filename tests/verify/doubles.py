"""Test doubles of engines, each wrapping the DuckDB engine and breaking it in one known way.

They are registered in the workspace's engine registry under names of their own, so `verify`
runs them only when named with --engines.
"""

from __future__ import annotations

from typing import Any

from sqlglot import exp

from measureport.compile import CompiledQuery
from measureport.engines.duckdb import DuckDBEngine
from measureport.engines.values import python_value
from measureport.errors import MeasureportError
from measureport.query import Query, ResultTable
from measureport.workspace import Workspace, register_engine

DROPS_FILTER = "double-drops-year-filter"
PERTURBS = "double-adds-one"
REFUSES = "double-refuses-share"
CRASHES = "double-crashes"


def _mentions_year(node: exp.Expression) -> bool:
    return any(column.name == "year" for column in node.find_all(exp.Column))


class DropsYearFilter:
    """Runs the DuckDB statement with every WHERE that tests a ``year`` column removed: a
    rendering that loses the report filter ``calendar.year = 2026``."""

    def __init__(self, workspace: Workspace) -> None:
        self.duckdb = DuckDBEngine.for_workspace(workspace)

    def compile(self, query: Query) -> CompiledQuery:
        return self.duckdb.compile(query)

    def broken_sql(self, compiled: CompiledQuery) -> str:
        tree = compiled.run_expression.copy()
        for where in list(tree.find_all(exp.Where)):
            if _mentions_year(where):
                where.pop()
        return tree.sql(dialect="duckdb", pretty=True)

    def statement(self, compiled: CompiledQuery) -> str:
        return self.broken_sql(compiled)

    def run_compiled(self, compiled: CompiledQuery) -> ResultTable:
        rows = self.duckdb.connection.execute(self.broken_sql(compiled)).fetchall()
        width = len(compiled.query.by) + len(compiled.query.measures)
        return ResultTable(
            tuple(str(c) for c in compiled.query.by),
            tuple(compiled.query.measures),
            [tuple(python_value(v) for v in row[:width]) for row in rows],
            [int(row[-1]) for row in rows],
        )

    def run(self, query: Query) -> ResultTable:
        return self.run_compiled(self.compile(query))


class AddsOne:
    """The DuckDB result with 1 added to the first measure of the first row."""

    def __init__(self, workspace: Workspace) -> None:
        self.duckdb = DuckDBEngine.for_workspace(workspace)

    def run(self, query: Query) -> ResultTable:
        result = self.duckdb.run(query)
        first = list(result.rows[0])
        first[len(result.by)] += 1
        result.rows[0] = tuple(first)
        return result


class RefusesShare:
    """The DuckDB engine, except that its dialect cannot express the measure share_of_town."""

    def __init__(self, workspace: Workspace) -> None:
        self.duckdb = DuckDBEngine.for_workspace(workspace)

    def compile(self, query: Query) -> CompiledQuery:
        if "share_of_town" in query.measures:
            raise MeasureportError("measure share_of_town: the test dialect cannot clear a grouping column")
        return self.duckdb.compile(query)

    def run_compiled(self, compiled: CompiledQuery) -> ResultTable:
        return self.duckdb.run_compiled(compiled)

    def run(self, query: Query) -> ResultTable:
        return self.run_compiled(self.compile(query))


class Crashes:
    """An engine whose every statement fails with an error that is not measureport's."""

    def __init__(self, workspace: Workspace) -> None:
        pass

    def run(self, query: Query) -> Any:
        raise RuntimeError("the test engine lost its connection")


def register_doubles() -> None:
    """Register every double (a second registration of a name replaces the first)."""
    register_engine(DROPS_FILTER, DropsYearFilter)
    register_engine(PERTURBS, AddsOne)
    register_engine(REFUSES, RefusesShare)
    register_engine(CRASHES, Crashes)
