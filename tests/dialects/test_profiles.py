"""The profiles shipped in dialects/: each loads, names what it should, and agrees with the code
that reads it (the renderer's profile lookup, the round-trip repairs, the view writer)."""

from __future__ import annotations

import pytest
from sqlglot import exp

from measureport.dialects import (
    NO_FUNCTION,
    QUIRK_VALUES,
    READBACK_REPAIRS,
    ROUNDTRIP,
    all_profiles,
    load_profile,
    profile_names,
)
from measureport.engines.roundtrip import REPAIRS
from measureport.errors import MeasureportError
from measureport.render.dialects import dialect_profile
from measureport.views.dialects import VIEW_DIALECTS
from measureport.workspace import engine_names

from .conftest import DIALECTS

# The dialects the issue asks for, plus DataFusion (which runs the postgres rendering).
REQUIRED = (
    "bigquery", "clickhouse", "databricks", "datafusion", "duckdb", "mysql", "postgres",
    "redshift", "snowflake", "spark", "sqlite", "trino", "tsql",
)


def test_every_required_dialect_has_a_profile() -> None:
    assert set(REQUIRED) <= set(profile_names())


@pytest.mark.parametrize("name", DIALECTS)
def test_profile_names_its_engine_and_every_quirk(name: str) -> None:
    profile = load_profile(name)
    assert profile.name == name
    assert profile.engine == ROUNDTRIP or profile.engine in engine_names()
    for quirk, choices in QUIRK_VALUES.items():
        value = profile.quirks.value(quirk)
        assert value, quirk
        if choices is not None:
            assert value in choices, (quirk, value)


@pytest.mark.parametrize("name", DIALECTS)
def test_float_type_is_read_by_sqlglot_as_a_float(name: str) -> None:
    profile = load_profile(name)
    assert exp.DataType.build(profile.float_type, dialect=profile.sqlglot).is_type(*exp.DataType.FLOAT_TYPES)


@pytest.mark.parametrize("name", DIALECTS)
def test_a_dialect_with_no_engine_here_marks_every_quirk_not_checked(name: str) -> None:
    # The rule of the profiles: only what ran on this machine counts as checked here.
    profile = load_profile(name)
    if profile.is_roundtrip:
        assert all(not profile.checked_here(quirk) for quirk in QUIRK_VALUES)
    else:
        assert all(profile.checked_here(quirk) for quirk in QUIRK_VALUES)


@pytest.mark.parametrize("name", DIALECTS)
def test_renderer_lookup_reads_the_same_profile(name: str) -> None:
    mine, theirs = load_profile(name), dialect_profile(name)
    assert (theirs.name, theirs.sqlglot, theirs.engine) == (mine.name, mine.sqlglot, mine.engine)


def test_every_readback_repair_is_implemented_by_the_roundtrip() -> None:
    assert set(REPAIRS) == set(READBACK_REPAIRS)


@pytest.mark.parametrize("name", sorted(VIEW_DIALECTS))
def test_view_ddl_agrees_with_the_view_writer(name: str) -> None:
    view_ddl = load_profile(name).quirks.view_ddl
    writer = VIEW_DIALECTS[name]
    replacing = ("create_or_replace", "create_or_replace_same_columns", "create_or_alter")
    assert writer.replace == (view_ddl in replacing)
    assert writer.drop_before_apply == (view_ddl == "create_or_replace_same_columns")


def test_a_function_quirk_named_none_means_the_engine_lacks_it() -> None:
    # sqlite has neither MAKE_DATE nor LAST_DAY (checked on SQLite 3.40 here).
    sqlite = load_profile("sqlite")
    assert sqlite.quirks.make_date == NO_FUNCTION and not sqlite.quirks.has_function("make_date")
    assert sqlite.lacks_function("last_day") and sqlite.lacks_function("LAST_DAY")
    assert not sqlite.lacks_function("ROUND")


def test_unknown_dialect_names_the_known_ones_and_the_closest() -> None:
    with pytest.raises(MeasureportError) as caught:
        load_profile("snowflak")
    assert "there is no dialect named 'snowflak'" in caught.value.message
    assert "tsql" in caught.value.message
    assert caught.value.hint == "did you mean 'snowflake'?"


def test_all_profiles_are_sorted_by_name() -> None:
    names = [p.name for p in all_profiles()]
    assert names == sorted(names) and len(names) == len(DIALECTS)


def test_engine_url_schemes_name_their_dialect() -> None:
    # The engine registry answers postgresql:// (and postgres://) and sc:// URLs.
    assert load_profile("postgres").url_schemes == ("postgresql", "postgres")
    assert load_profile("spark").url_schemes == ("sc",)
    assert all(not p.url_schemes for p in all_profiles() if p.name not in ("postgres", "spark"))
