"""Fixtures for the views tests: the orchard model of orchard.py (invented data), the command
line, and a PostgreSQL database per slow test."""

from __future__ import annotations

import uuid
from collections.abc import Callable, Iterator
from pathlib import Path
from urllib.parse import urlsplit, urlunsplit

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


# postgres_url: the session's throwaway PostgreSQL server, from tests/conftest.py.


@pytest.fixture
def postgres_database(postgres_url: str) -> Iterator[str]:
    """The URL of a new, empty database on the PostgreSQL server, one per test, dropped after it."""
    import psycopg

    name = f"views_{uuid.uuid4().hex[:12]}"
    with psycopg.connect(postgres_url, autocommit=True) as connection:
        connection.execute(f'CREATE DATABASE "{name}"')
    yield urlunsplit(urlsplit(postgres_url)._replace(path=f"/{name}"))
    with psycopg.connect(postgres_url, autocommit=True) as connection:
        connection.execute(f'DROP DATABASE IF EXISTS "{name}" WITH (FORCE)')
