"""The engine fixture shared with tests/realengines (the server and the Spark session are in
tests/conftest.py), and the time each engine's part of this suite took, printed at the end."""

from __future__ import annotations

import time
from collections import defaultdict
from collections.abc import Iterator

import pytest

from realengines.conftest import open_engine

__all__ = ["open_engine"]

SECONDS: dict[str, float] = defaultdict(float)


@pytest.fixture
def timed() -> Iterator[dict[str, float]]:
    """The seconds spent per engine; a test adds its engine's time to it."""
    yield SECONDS


def pytest_terminal_summary(terminalreporter: pytest.TerminalReporter) -> None:
    """One line per engine: the seconds its differential checks took."""
    if SECONDS:
        terminalreporter.write_line("differential time per engine:")
        for name, seconds in sorted(SECONDS.items()):
            terminalreporter.write_line(f"  {name}: {seconds:.1f} s")


def clock() -> float:
    return time.perf_counter()
