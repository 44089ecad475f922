"""Per dialect profile: the demo's views and every measure render, parse back with sqlglot in the
dialect, and the dialect forms hold (read from the parsed tree, not from the text)."""

from __future__ import annotations

import dataclasses
import sqlite3
from collections.abc import Iterator
from pathlib import Path

import duckdb
import pytest
import sqlglot
from sqlglot import exp

from measureport.demo.writer import write_demo
from measureport.dialects import DialectProfile, all_profiles, load_profile, profile_names
from measureport.render.dialect_forms import DialectForms
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
    # Their profiles' rounding is not the language's (checked here: ties on the decimal text or to
    # even): sign * FLOOR(ABS(x) * 10 + 0.5) / 10; no decimal cast.
    forms = DialectForms(load_profile(dialect))
    node = forms.round(exp.column("x"), exp.Literal.number("1"))
    sql = node.sql(dialect=load_profile(dialect).sqlglot)
    assert "FLOOR" in sql.upper() and "DECIMAL" not in sql.upper()


def _with_quirks(dialect: str, **quirks: str) -> DialectProfile:
    profile = load_profile(dialect)
    return dataclasses.replace(profile, quirks=dataclasses.replace(profile.quirks, **quirks))


@pytest.mark.parametrize(
    ("dialect", "rounding", "style"),
    [
        ("duckdb", "away_from_zero_scaled", "native"),
        ("duckdb", "away_from_zero_binary", "scaled_floor"),
        ("sqlite", "away_from_zero_scaled", "native"),
        ("sqlite", "away_from_zero", "scaled_floor"),
        ("postgres", "not_stated", "scaled_floor"),
    ],
)
def test_the_rounding_form_follows_the_profiles_quirk_not_its_name(
    dialect: str, rounding: str, style: str
) -> None:
    assert DialectForms(_with_quirks(dialect, rounding=rounding)).round_style() == style


def test_no_engine_checked_here_keeps_sqlglots_round() -> None:
    # Checked here (dialects/*.yaml): DuckDB rounds ties on the exact binary value, SQLite,
    # PostgreSQL, Spark and DataFusion on the decimal text, ClickHouse to even; none as the language.
    here = [p for p in all_profiles() if not p.is_roundtrip]
    assert here and all(DialectForms(p).round_style() == "scaled_floor" for p in here)


# (x, places, the language's round) by hand, on the double x * 10^n: 0.015 * 100 is 1.5 and
# 2.675 * 100 is 267.5 in doubles (away from zero: 0.02, 2.68), 1.005 * 100 is 100.49999999999999
# (1.0); 0.125 and 2.5 are exact ties.
ROUNDINGS = [
    (2.5, 0, 3.0), (-2.5, 0, -3.0), (0.125, 2, 0.13), (-0.125, 2, -0.13), (2.675, 2, 2.68),
    (0.015, 2, 0.02), (-0.015, 2, -0.02), (1.005, 2, 1.0),
]


def _fetch_one(connection: sqlite3.Connection | duckdb.DuckDBPyConnection, sql: str) -> object:
    row = connection.execute(sql).fetchone()
    assert row is not None
    return row[0]


@pytest.mark.parametrize(("value", "places", "expected"), ROUNDINGS)
@pytest.mark.parametrize("dialect", ["sqlite", "duckdb"])
def test_the_scaled_floor_form_rounds_as_the_language(
    dialect: str, value: float, places: int, expected: float
) -> None:
    # Checked here: SQLite's own ROUND gives 1.01 for 1.005, DuckDB's 0.01 for 0.015; the form
    # rendered for them must give the language's values.
    forms = DialectForms(load_profile(dialect))
    literal = exp.cast(exp.Literal.number(repr(value)), exp.DataType.build("DOUBLE"))
    sql = exp.select(forms.round(literal, exp.Literal.number(str(places)))).sql(dialect=dialect)
    connection = sqlite3.connect(":memory:") if dialect == "sqlite" else duckdb.connect()
    assert _fetch_one(connection, sql) == pytest.approx(expected, abs=1e-12)


def _extreme_sql(kind: type[exp.Greatest | exp.Least], dialect: str, values: tuple[int | None, ...]) -> str:
    literals = [exp.Null() if v is None else exp.Literal.number(str(v)) for v in values]
    node = kind(this=literals[0], expressions=literals[1:], ignore_nulls=True)
    return exp.select(DialectForms(load_profile(dialect)).extreme(node)).sql(dialect="duckdb")


@pytest.mark.parametrize(
    ("values", "greatest", "least"),
    [((None, 2, 5), 5, 2), ((4, None, 1), 4, 1), ((7, None, None), 7, 7), ((None, None, None), None, None)],
)
@pytest.mark.parametrize("dialect", ["mysql", "bigquery", "trino"])
def test_greatest_and_least_skip_nulls_where_the_engine_propagates_them(
    dialect: str, values: tuple[int | None, ...], greatest: int | None, least: int | None
) -> None:
    # The profiles say GREATEST/LEAST are null on a null argument there. DuckDB, given sqlglot's
    # form of a null-propagating GREATEST (CASE WHEN ... IS NULL THEN NULL ...), behaves as those
    # engines do; the rendering must still skip nulls (expected values by hand).
    connection = duckdb.connect()
    assert _fetch_one(connection, _extreme_sql(exp.Greatest, dialect, values)) == greatest
    assert _fetch_one(connection, _extreme_sql(exp.Least, dialect, values)) == least


def test_greatest_is_left_to_engines_that_skip_nulls() -> None:
    # PostgreSQL skips nulls in GREATEST (checked here): the call is kept as it is.
    forms = DialectForms(load_profile("postgres"))
    node = exp.Greatest(this=exp.column("a"), expressions=[exp.column("b")], ignore_nulls=True)
    assert forms.extreme(node) is node
