"""Fixtures of the verify tests: the bakery model (invented data), the command line, and the
test doubles of engines."""

from __future__ import annotations

from collections.abc import Callable, Iterator
from pathlib import Path

import pytest
from click.testing import CliRunner

from measureport.cli.main import main
from measureport.workspace import Workspace
from verify.bakery import write_bakery
from verify.doubles import register_doubles

Invoke = Callable[..., tuple[int, str, str]]


def invoke(*args: str | Path) -> tuple[int, str, str]:
    """Run ``measureport ARGS``: exit code, stdout, stderr."""
    result = CliRunner().invoke(main, [str(arg) for arg in args])
    return result.exit_code, result.stdout, result.stderr


@pytest.fixture(scope="session", autouse=True)
def doubles() -> None:
    register_doubles()


@pytest.fixture
def bakery(tmp_path: Path) -> Path:
    """The bakery model file."""
    return write_bakery(tmp_path / "bakery")


@pytest.fixture
def bakery_workspace(bakery: Path) -> Iterator[Workspace]:
    with Workspace.open(bakery) as workspace:
        yield workspace
