"""Per dialect profile: the demo's views and every measure render, parse back with sqlglot in the
dialect, and the dialect forms hold (read from the parsed tree, not from the text)."""

from __future__ import annotations

from collections.abc import Iterator
from pathlib import Path

import pytest
import sqlglot
from sqlglot import exp

from measureport.demo.writer import write_demo
from measureport.dialects import load_profile, profile_names
from measureport.workspace import Workspace

DIALECTS = profile_names()


@pytest.fixture(scope="module")
def demo(tmp_path_factory: pytest.TempPathFactory) -> Iterator[Workspace]:
    folder: Path = tmp_path_factory.mktemp("demo")
    write_demo(folder, rides=20, seed=3)  # invented data; only the SQL is looked at
    workspace = Workspace.open(folder / "model.yaml")
    yield workspace
    workspace.close()


def _parsed(demo: Workspace, dialect: str) -> exp.Expression:
    query = demo.query(list(demo.measure_names), ["calendar.year", "calendar.month"], [], False)
    compiled = demo.compile(query, dialect)
    parsed = sqlglot.parse_one(compiled.sql, read=load_profile(dialect).sqlglot)
    assert isinstance(parsed, exp.Query)
    return parsed


def _function_names(tree: exp.Expression) -> set[str]:
    names = {node.name.upper() for node in tree.find_all(exp.Anonymous)}
    return names | {
        node.sql_name() for node in tree.find_all(exp.Func) if not isinstance(node, exp.Anonymous)
    }


@pytest.mark.parametrize("dialect", DIALECTS)
def test_views_render_and_parse_back(demo: Workspace, dialect: str) -> None:
    sqlglot_name = load_profile(dialect).sqlglot
    for view in ("monthly_performance", "district_summary_2025"):
        sql = demo.compile(demo.view_query(view), dialect).sql
        assert isinstance(sqlglot.parse_one(sql, read=sqlglot_name), exp.Query)


@pytest.mark.parametrize("dialect", DIALECTS)
def test_no_function_the_profile_says_is_missing(demo: Workspace, dialect: str) -> None:
    profile = load_profile(dialect)
    used = _function_names(_parsed(demo, dialect))
    # sqlglot reads some names back as its own nodes (DATE_FROM_PARTS -> DATEFROMPARTS, LAST_DAY).
    aliases = {"DATE_FROM_PARTS": "DATEFROMPARTS"}
    for missing in profile.missing_functions:
        if profile.is_roundtrip or profile.engine == "duckdb":
            continue
        assert missing.upper() not in used and aliases.get(missing.upper()) not in used, missing


def test_sqlite_builds_dates_from_text(demo: Workspace) -> None:
    # dialects/sqlite.yaml: dates are ISO text; no YEAR, MAKE_DATE or LAST_DAY.
    tree = _parsed(demo, "sqlite")
    anonymous = {node.name.upper() for node in tree.find_all(exp.Anonymous)}
    assert "PRINTF" in anonymous
    assert list(tree.find_all(exp.TimeToStr))  # STRFTIME('%Y', d), read back as sqlglot's node
    month_ends = [
        node
        for node in tree.find_all(exp.Anonymous, exp.Date)
        if "start of month" in node.sql(dialect="sqlite")
    ]
    assert month_ends


def test_postgres_makes_dates_of_integers(demo: Workspace) -> None:
    # dialects/postgres.yaml: MAKE_DATE exists, and EXTRACT gives numeric, so each part is cast.
    tree = _parsed(demo, "postgres")
    calls = [n for n in tree.find_all(exp.Anonymous) if n.name.upper() == "MAKE_DATE"]
    calls += list(tree.find_all(exp.DateFromParts))
    assert calls
    for call in tree.find_all(exp.Anonymous):
        if call.name.upper() == "MAKE_DATE":
            assert all(isinstance(a, exp.Cast) and a.to.is_type("int") for a in call.expressions)
    assert not list(tree.find_all(exp.LastDay))


def test_datafusion_divides_integers_without_div(demo: Workspace) -> None:
    # dialects/datafusion.yaml: no DIV function; integer / integer truncates there.
    sql = demo.compile(demo.query(list(demo.measure_names), ["calendar.year"], [], False), "datafusion").sql
    assert "DIV(" not in sql.upper()


def test_clickhouse_uses_its_make_date(demo: Workspace) -> None:
    tree = _parsed(demo, "clickhouse")
    assert "MAKEDATE" in {n.name.upper() for n in tree.find_all(exp.Anonymous)}


@pytest.mark.parametrize("dialect", ["postgres", "sqlite", "clickhouse", "spark"])
def test_rounding_is_half_away_from_zero_by_hand(dialect: str) -> None:
    # ROUND(x, 1) outside the DuckDB baseline: sign * FLOOR(ABS(x) * 10 + 0.5) / 10; no decimal cast.
    from measureport.render.dialect_forms import DialectForms

    forms = DialectForms(load_profile(dialect))
    node = forms.round(exp.column("x"), exp.Literal.number("1"))
    sql = node.sql(dialect=load_profile(dialect).sqlglot)
    assert "FLOOR" in sql.upper() and "DECIMAL" not in sql.upper()
