"""Fixtures for the views tests: the orchard model of orchard.py (invented data), the command
line, and a throwaway PostgreSQL server for the slow tests."""

from __future__ import annotations

import uuid
from collections.abc import Callable, Iterator
from pathlib import Path

import pytest
from click.testing import CliRunner

from measureport.cli.main import main
from views.orchard import PORTABLE_VIEWS, write_orchard

Invoke = Callable[..., tuple[int, str, str]]


def invoke(*args: str | Path) -> tuple[int, str, str]:
    """Run ``measureport ARGS``: exit code, stdout, stderr."""
    result = CliRunner().invoke(main, [str(arg) for arg in args])
    return result.exit_code, result.stdout, result.stderr


@pytest.fixture
def orchard(tmp_path: Path) -> Path:
    """The orchard model file with its portable views."""
    return write_orchard(tmp_path / "orchard", PORTABLE_VIEWS)


@pytest.fixture(scope="session")
def postgres_server() -> Iterator[str]:
    """The URL of a throwaway PostgreSQL server for the whole session (skipped where none can run)."""
    from measureport.engines.pgserver import ThrowawayPostgres, unavailable_reason

    reason = unavailable_reason()
    if reason is not None:
        pytest.skip(reason)
    with ThrowawayPostgres() as server:
        yield server.url


@pytest.fixture
def postgres_database(postgres_server: str) -> str:
    """The URL of a new, empty database on the throwaway server, one per test."""
    import psycopg

    name = f"views_{uuid.uuid4().hex[:12]}"
    with psycopg.connect(postgres_server, autocommit=True) as connection:
        connection.execute(f'CREATE DATABASE "{name}"')
    return postgres_server.rpartition("/")[0] + "/" + name
