"""The statements that create one view in a dialect, built as sqlglot trees and rendered."""

from __future__ import annotations

from sqlglot import exp
from sqlglot.errors import ErrorLevel, SqlglotError

from measureport.errors import MeasureportError
from measureport.views.dialects import ViewDialect


def view_name(name: str) -> exp.Table:
    """The view's name as a one-part, quoted table name."""
    return exp.Table(this=exp.to_identifier(name, quoted=True))


def drop_view(name: str) -> exp.Drop:
    """``DROP VIEW IF EXISTS name`` (no cascade: a view other objects depend on is not dropped)."""
    return exp.Drop(tables=[view_name(name)], kind="VIEW", exists=True)


def create_view(name: str, select: exp.Expression, dialect: ViewDialect) -> tuple[exp.Expression, ...]:
    """The statements that (re)create view ``name`` as ``select``: ``CREATE OR REPLACE VIEW`` where
    the dialect has it, else ``DROP VIEW IF EXISTS`` followed by ``CREATE VIEW``."""
    body = select.copy()
    if dialect.replace:
        return (exp.Create(kind="VIEW", replace=True, this=view_name(name), expression=body),)
    return (drop_view(name), exp.Create(kind="VIEW", this=view_name(name), expression=body))


def render(statement: exp.Expression, dialect: ViewDialect, view: str, pretty: bool = True) -> str:
    """One statement's text in the dialect, identifiers quoted. A construct the dialect cannot
    express is a :class:`MeasureportError` naming the view and the dialect."""
    try:
        text: str = statement.sql(
            dialect=dialect.sqlglot, identify=True, pretty=pretty, unsupported_level=ErrorLevel.RAISE
        )
    except SqlglotError as problem:
        first = str(problem).strip().splitlines()[0] if str(problem).strip() else type(problem).__name__
        raise MeasureportError(f"view {view} cannot be written in {dialect.name}: {first}") from None
    return text
