"""The engines the real-engine tests run on, and how a test asks for one."""

from __future__ import annotations

from collections.abc import Callable
from typing import Any

import pytest

from measureport.engines.sqlengine import SqlEngine
from measureport.model.tabledata import Dataset
from measureport.semantics.bound import BoundModel

FAST_ENGINES = ("sqlite", "clickhouse", "datafusion")
SLOW_ENGINES = ("postgres", "spark")
ALL_ENGINES = FAST_ENGINES + SLOW_ENGINES

OpenEngine = Callable[[str, BoundModel, Dataset], SqlEngine]


def engine_params(names: tuple[str, ...] = ALL_ENGINES) -> list[Any]:
    """One pytest parameter per engine, the slow ones marked slow."""
    return [pytest.param(n, id=n, marks=pytest.mark.slow) if n in SLOW_ENGINES else n for n in names]
