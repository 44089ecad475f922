"""The round-trip engine: checks a dialect that no engine here runs, on DuckDB.

    engine = RoundTripEngine(bound, "snowflake", duckdb_engine)
    result = engine.run(query)          # a ResultTable, shaped like every other engine's

A query is compiled in the dialect; the statement must parse back with
``sqlglot.parse_one(sql, read=dialect)``; the tree read back is transpiled to DuckDB and run on
the DuckDB engine's connection, over the same tables. This proves that the SQL is well formed
in the dialect and that sqlglot's reading of it computes the same numbers. It cannot prove what
the dialect's own engine does with it: the profile's quirks say where those may differ.

Where sqlglot's reading of a dialect differs from what the dialect means, the profile lists
*read-back repairs* (``readback_repairs``), applied to the tree before it is transpiled; each is
one small function in :data:`REPAIRS`.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from typing import TYPE_CHECKING

import duckdb
import sqlglot
from sqlglot import exp
from sqlglot.errors import ErrorLevel, ParseError, UnsupportedError

from measureport.compile import CompiledQuery, compile_query
from measureport.dialects import DialectProfile, load_profile
from measureport.engines.duckdb import DuckDBEngine
from measureport.engines.typed_rows import result_kinds, typed_rows
from measureport.errors import MeasureportError
from measureport.query import Query, ResultTable
from measureport.semantics.bound import BoundModel

if TYPE_CHECKING:
    from measureport.workspace import Workspace

Repair = Callable[[exp.Expr], None]

_INTEGER_TYPES = exp.DataType.INTEGER_TYPES - {exp.DataType.Type.BIT}


def _sized_max(data_type: exp.DataType) -> bool:
    return any(isinstance(p, exp.DataTypeParam) and p.name.upper() == "MAX" for p in data_type.expressions)


def repair_text_length_max(tree: exp.Expr) -> None:
    """``VARCHAR(MAX)`` (read back as ``TEXT(MAX)``, which DuckDB refuses) becomes plain text."""
    for data_type in tree.find_all(exp.DataType):
        if _sized_max(data_type):
            data_type.set("expressions", [])


def repair_float_is_double(tree: exp.Expr) -> None:
    """``FLOAT`` without a size is the dialect's 8-byte float: DOUBLE, not DuckDB's 4-byte FLOAT."""
    for data_type in tree.find_all(exp.DataType):
        if data_type.this == exp.DataType.Type.FLOAT and not data_type.expressions:
            data_type.set("this", exp.DataType.Type.DOUBLE)


def _gives_fraction(node: exp.Expression) -> bool:
    inner = node.unnest()
    if isinstance(inner, exp.Div):
        return True
    return isinstance(inner, exp.Cast) and inner.to.is_type(*exp.DataType.REAL_TYPES)


def repair_integer_cast_truncates(tree: exp.Expr) -> None:
    """A cast of a division or of a float to an integer type truncates in the dialect; DuckDB's
    cast rounds, so the operand is truncated first."""
    for cast in list(tree.find_all(exp.Cast)):
        if cast.to.is_type(*_INTEGER_TYPES) and _gives_fraction(cast.this):
            cast.set("this", exp.Trunc(this=cast.this))


def repair_decimal_keeps_scale(tree: exp.Expr) -> None:
    """``DECIMAL`` without precision (the dialect's NUMERIC) is DECIMAL(38,9), not DuckDB's (18,3)."""
    for data_type in tree.find_all(exp.DataType):
        if data_type.this == exp.DataType.Type.DECIMAL and not data_type.expressions:
            precision, scale = (exp.DataTypeParam(this=exp.Literal.number(n)) for n in (38, 9))
            data_type.set("expressions", [precision, scale])


def repair_bit_is_boolean(tree: exp.Expr) -> None:
    """``BIT``, the dialect's boolean, is BOOLEAN (DuckDB's BIT is a string of bits)."""
    for data_type in tree.find_all(exp.DataType):
        if data_type.this == exp.DataType.Type.BIT:
            data_type.set("this", exp.DataType.Type.BOOLEAN)


#: Each read-back repair a profile may list (see ``measureport.dialects.READBACK_REPAIRS``).
REPAIRS: dict[str, Repair] = {
    "text_length_max": repair_text_length_max,
    "float_is_double": repair_float_is_double,
    "integer_cast_truncates": repair_integer_cast_truncates,
    "decimal_keeps_scale": repair_decimal_keeps_scale,
    "bit_is_boolean": repair_bit_is_boolean,
}


@dataclass(frozen=True)
class ReadBack:
    """A statement as written for the dialect and as DuckDB runs it after the round-trip."""

    dialect_sql: str
    duckdb_sql: str


def read_back(sql: str, profile: DialectProfile, pretty: bool = False) -> ReadBack:
    """Parse ``sql`` back in the profile's sqlglot dialect, repair it and write it for DuckDB. A
    statement that does not parse back, or that DuckDB's dialect cannot express, raises
    :class:`MeasureportError`."""
    try:
        tree = sqlglot.parse_one(sql, read=profile.sqlglot)
    except ParseError as exc:
        first = (str(exc).splitlines() or ["no reason given"])[0]
        raise MeasureportError(
            f"the SQL written for {profile.name} does not parse back with sqlglot: {first}"
        ) from None
    for name in profile.readback_repairs:
        REPAIRS[name](tree)
    try:
        duck = tree.sql(dialect="duckdb", pretty=pretty, unsupported_level=ErrorLevel.RAISE)
    except UnsupportedError as exc:
        raise MeasureportError(
            f"the SQL written for {profile.name}, read back, cannot be written for DuckDB: {exc}"
        ) from None
    return ReadBack(sql, duck)


class RoundTripEngine:
    """Runs queries compiled for a dialect on DuckDB, through sqlglot's reading of that dialect."""

    def __init__(self, bound: BoundModel, dialect: str | DialectProfile, duckdb_engine: DuckDBEngine) -> None:
        """Round-trips for ``dialect`` (a profile or its name) on the tables of ``duckdb_engine``,
        which stays the caller's to close."""
        self.bound = bound
        self.profile = dialect if isinstance(dialect, DialectProfile) else load_profile(dialect)
        self.duckdb = duckdb_engine
        self.title = f"{self.profile.title} (round-trip on DuckDB)"

    @classmethod
    def for_workspace(cls, workspace: Workspace, dialect: str | DialectProfile) -> RoundTripEngine:
        """Round-trips for ``dialect`` on the workspace's DuckDB engine."""
        engine = workspace.engine("duckdb")
        if not isinstance(engine, DuckDBEngine):
            raise MeasureportError("the round-trip needs the embedded DuckDB engine as 'duckdb'")
        return cls(workspace.bound, dialect, engine)

    def compile(self, query: Query) -> CompiledQuery:
        """``query`` compiled for the dialect (a construct it cannot express raises)."""
        return compile_query(self.bound, query, self.profile.name)

    def read_back(self, compiled: CompiledQuery, pretty: bool = False) -> ReadBack:
        """The statement that runs for ``compiled``: its SQL in the dialect and on DuckDB."""
        return read_back(compiled.run_sql(pretty=pretty), self.profile, pretty)

    def statement(self, compiled: CompiledQuery) -> str:
        """The statement of ``compiled`` in the dialect, then as DuckDB runs it, formatted."""
        both = self.read_back(compiled, pretty=True)
        return (
            f"-- written for {self.profile.name}\n{both.dialect_sql}\n\n"
            f"-- read back with sqlglot and run on DuckDB\n{both.duckdb_sql}"
        )

    def run(self, query: Query) -> ResultTable:
        """The result of ``query``: rows ordered as the contract says, subtotal levels filled."""
        return self.run_compiled(self.compile(query))

    def run_compiled(self, compiled: CompiledQuery) -> ResultTable:
        """Round-trip and run a compiled query's statement (with its ``__level`` column)."""
        statement = self.read_back(compiled).duckdb_sql
        try:
            raw = self.duckdb.connection.execute(statement).fetchall()
        except duckdb.Error as exc:
            first = (str(exc).splitlines() or [type(exc).__name__])[0]
            raise MeasureportError(
                f"DuckDB could not run the {self.profile.name} statement read back: {first}"
            ) from None
        rows = typed_rows(raw, result_kinds(self.bound, compiled.query))
        return ResultTable(
            by=tuple(str(c) for c in compiled.query.by),
            measures=tuple(compiled.query.measures),
            rows=[row[:-1] for row in rows],
            levels=[int(row[-1]) for row in rows],
        )

    def close(self) -> None:
        """Nothing to release: the DuckDB engine belongs to the caller."""
