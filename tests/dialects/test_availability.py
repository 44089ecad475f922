"""Whether a profile's engine runs here: registered, with its modules, programs and named checks.

The profiles are built in the test around an imaginary dialect; the module and program names
that cannot exist are invented for it.
"""

from __future__ import annotations

import dataclasses

import pytest

from measureport.dialects import Requirements, availability, engine_status, load_profile, missing_requirement


def test_a_roundtrip_dialect_needs_nothing_here() -> None:
    status = engine_status(load_profile("snowflake"), registered=())
    assert status.kind == "round-trip" and status.runs


def test_an_engine_that_is_not_registered_is_unavailable() -> None:
    status = engine_status(load_profile("sqlite"), registered=("duckdb",))
    assert status.text() == "unavailable: no engine named sqlite is registered"
    assert not status.runs


def test_a_missing_module_is_the_reason() -> None:
    profile = dataclasses.replace(
        load_profile("spark"), requires=Requirements(modules=("pondspark_client_not_here",))
    )
    status = engine_status(profile, registered=("spark",))
    assert status.text() == "unavailable: pondspark_client_not_here is not installed"


def test_a_missing_program_is_the_reason() -> None:
    reason = missing_requirement(Requirements(programs=("pond-engine-server-not-here",)))
    assert reason == "the program pond-engine-server-not-here is not on PATH"


def test_a_named_check_gives_its_reason(monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.setitem(availability.NAMED_CHECKS, "postgres_server", lambda: "no server programs")
    assert missing_requirement(Requirements(checks=("postgres_server",))) == "no server programs"
    monkeypatch.setitem(availability.NAMED_CHECKS, "postgres_server", lambda: None)
    assert missing_requirement(Requirements(checks=("postgres_server",))) is None


def test_a_database_url_makes_postgres_available(monkeypatch: pytest.MonkeyPatch) -> None:
    pytest.importorskip("psycopg")
    monkeypatch.setenv("MEASUREPORT_POSTGRES_URL", "postgresql://pond@127.0.0.1:1/pond")
    assert availability.NAMED_CHECKS["postgres_server"]() is None


def test_the_stdlib_engine_runs_here() -> None:
    # sqlite3 ships with Python, so the SQLite engine can always run when it is registered.
    assert engine_status(load_profile("sqlite"), registered=("sqlite",)).text() == "runs here"
