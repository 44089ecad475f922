"""How each dialect creates a view: the sqlglot dialect to write it in, and whether it can replace one.

The forms are read from the dialect profiles (``view_ddl`` in ``dialects/*.yaml``): adding a dialect
to ``measureport views`` is adding its profile.
"""

from __future__ import annotations

from dataclasses import dataclass

from measureport.dialects import DialectProfile, all_profiles
from measureport.errors import MeasureportError

#: The ``view_ddl`` values of dialects that replace a view in one statement.
REPLACING_VIEW_DDL = frozenset({"create_or_replace", "create_or_replace_same_columns", "create_or_alter"})

#: The ``view_ddl`` value of dialects that cannot replace a view whose columns changed.
SAME_COLUMNS_VIEW_DDL = "create_or_replace_same_columns"


@dataclass(frozen=True)
class ViewDialect:
    """``title`` is how messages name the dialect. ``replace``: the dialect replaces a view in one
    statement (``CREATE OR REPLACE VIEW``, or the form sqlglot writes for it); without it a view
    file drops the old view first (``DROP VIEW IF EXISTS`` then ``CREATE VIEW``: two statements).
    ``drop_before_apply``: the dialect refuses to replace a view whose columns changed, so
    ``--apply`` drops the old view first, in the same transaction."""

    name: str
    sqlglot: str
    title: str
    replace: bool = True
    drop_before_apply: bool = False


def view_form(profile: DialectProfile) -> ViewDialect:
    """The view form of ``profile``, from its ``view_ddl`` quirk."""
    ddl = profile.quirks.view_ddl
    return ViewDialect(
        name=profile.name,
        sqlglot=profile.sqlglot,
        title=profile.title,
        replace=ddl in REPLACING_VIEW_DDL,
        drop_before_apply=ddl == SAME_COLUMNS_VIEW_DDL,
    )


#: The view form of every dialect with a profile, by name.
VIEW_DIALECTS: dict[str, ViewDialect] = {profile.name: view_form(profile) for profile in all_profiles()}


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
