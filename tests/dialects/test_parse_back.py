"""Per dialect: the SQL of every demo view parses back with sqlglot in that dialect, keeps its
columns, and renders as itself once read back (sqlglot's own "renders as itself" test)."""

from __future__ import annotations

import pytest
import sqlglot

from measureport.dialects import load_profile

from .conftest import DEMO_VIEWS, DIALECTS, compiled_view, demo, read_back


@pytest.mark.parametrize("view", DEMO_VIEWS)
@pytest.mark.parametrize("dialect", DIALECTS)
def test_view_sql_parses_back_with_its_columns(dialect: str, view: str) -> None:
    profile = load_profile(dialect)
    compiled = compiled_view(dialect, view)
    tree = read_back(dialect, view)
    query = demo().view_query(view)
    # One output column per grouping column and per measure, named as `run` names them.
    assert tree.named_selects == [str(c) for c in query.by] + list(query.measures)
    engine_tree = sqlglot.parse_one(compiled.run_sql(), read=profile.sqlglot)
    assert engine_tree.named_selects[-1] == compiled.level_column


@pytest.mark.parametrize("view", DEMO_VIEWS)
@pytest.mark.parametrize("dialect", DIALECTS)
def test_view_sql_read_back_renders_as_itself(dialect: str, view: str) -> None:
    profile = load_profile(dialect)
    tree = read_back(dialect, view)
    again = sqlglot.parse_one(tree.sql(dialect=profile.sqlglot), read=profile.sqlglot)
    assert again.sql(dialect=profile.sqlglot) == tree.sql(dialect=profile.sqlglot)
