"""`measureport views` writes the demo's views (invented bike-share data) for every dialect with a
profile, in the form the profile's view_ddl names."""

from __future__ import annotations

import pytest
import sqlglot
from sqlglot import exp

from measureport.dialects import load_profile
from measureport.views import generate_views
from measureport.views.dialects import VIEW_DIALECTS

from .conftest import DIALECTS, demo

# view_ddl -> the kinds of the statements of one view file, in order.
STATEMENT_KINDS = {
    "create_or_replace": ["create_replace"],
    "create_or_replace_same_columns": ["create_replace"],
    "create_or_alter": ["create_replace"],
    "drop_then_create": ["drop", "create"],
}


def _kind(statement: exp.Expression) -> str:
    if isinstance(statement, exp.Drop):
        return "drop"
    assert isinstance(statement, exp.Create) and statement.kind == "VIEW"
    return "create_replace" if statement.args.get("replace") else "create"


def test_every_profile_can_have_views() -> None:
    assert sorted(VIEW_DIALECTS) == sorted(DIALECTS)


@pytest.mark.parametrize("dialect", DIALECTS)
def test_view_files_parse_back_in_the_profiles_form(dialect: str) -> None:
    profile = load_profile(dialect)
    generated = generate_views(demo().bound, dialect)
    assert generated.views
    for view in generated.views:
        statements = [sqlglot.parse_one(sql, read=profile.sqlglot) for sql in view.statements]
        assert [_kind(s) for s in statements] == STATEMENT_KINDS[profile.quirks.view_ddl]
        if profile.quirks.view_ddl == "create_or_alter":
            assert view.statements[-1].lstrip().upper().startswith("CREATE OR ALTER VIEW")


def test_postgres_views_are_dropped_before_apply_and_sqlite_files_drop_first() -> None:
    # dialects/postgres.yaml: create_or_replace_same_columns; dialects/sqlite.yaml: drop_then_create.
    assert VIEW_DIALECTS["postgres"].drop_before_apply and VIEW_DIALECTS["postgres"].replace
    assert not VIEW_DIALECTS["sqlite"].replace
    assert not any(v.drop_before_apply for name, v in VIEW_DIALECTS.items() if name != "postgres")
