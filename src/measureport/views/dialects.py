"""How each dialect creates a view: the sqlglot dialect to write it in, and whether it can replace one.

Adding a dialect to ``measureport views`` is adding a row to :data:`VIEW_DIALECTS`.
"""

from __future__ import annotations

from dataclasses import dataclass

from measureport.errors import MeasureportError


@dataclass(frozen=True)
class ViewDialect:
    """``title`` is how messages name the dialect. ``replace``: the dialect has
    ``CREATE OR REPLACE VIEW``; without it a view file drops the old view first (``DROP VIEW IF
    EXISTS`` then ``CREATE VIEW``: two statements). ``drop_before_apply``: the dialect refuses to
    replace a view whose columns changed, so ``--apply`` drops the old view first, in the same
    transaction."""

    name: str
    sqlglot: str
    title: str
    replace: bool = True
    drop_before_apply: bool = False


VIEW_DIALECTS: dict[str, ViewDialect] = {
    "duckdb": ViewDialect("duckdb", "duckdb", "DuckDB"),
    "postgres": ViewDialect("postgres", "postgres", "PostgreSQL", drop_before_apply=True),
    "sqlite": ViewDialect("sqlite", "sqlite", "SQLite", replace=False),
}


def view_dialect(name: str) -> ViewDialect:
    """The view form of dialect ``name``; a dialect views cannot be written for is a
    :class:`MeasureportError` naming it."""
    found = VIEW_DIALECTS.get(name)
    if found is None:
        known = ", ".join(sorted(VIEW_DIALECTS))
        raise MeasureportError(
            f"views cannot be written for the dialect '{name}' yet; the dialects they can be written "
            f"for are {known}"
        )
    return found
