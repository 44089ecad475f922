"""Fixtures of the contract suite: one bench for the session, its outcomes per test module."""

from __future__ import annotations

from collections.abc import Iterator
from pathlib import Path
from types import ModuleType

import pytest

from contract.bench import Bench, Outcome
from contract.tables import Grid

HERE = Path(__file__).parent


@pytest.fixture(scope="session")
def bench(request: pytest.FixtureRequest, tmp_path_factory: pytest.TempPathFactory) -> Iterator[Bench]:
    """The shared bench; it starts the commands of every collected contract module at once."""
    modules: dict[str, ModuleType] = {}
    for item in request.session.items:
        module = getattr(item, "module", None)
        if module is not None and Path(module.__file__ or "").parent == HERE:
            modules.setdefault(module.__name__, module)
    shared = Bench(tmp_path_factory.mktemp("harbour"), list(modules.values()))
    yield shared
    shared.close()


@pytest.fixture(scope="module")
def outcomes(request: pytest.FixtureRequest, bench: Bench) -> dict[str, Outcome]:
    """The outcomes of the calling module's ``COMMANDS`` and ``SHARED`` grids, by name."""
    return bench.outcomes(request.module)


@pytest.fixture(params=["run", pytest.param("sql", marks=pytest.mark.slow)])
def grid(request: pytest.FixtureRequest, bench: Bench) -> Grid:
    """Read a shared grid by name: as ``run`` prints it, or (slow) through ``sql`` on DuckDB."""
    path: str = request.param
    return lambda name: bench.shared_table(name, path)
