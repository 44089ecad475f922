"""A spinner on stderr for long work, shown only when stderr is a terminal."""

from __future__ import annotations

import sys
from collections.abc import Iterator
from contextlib import contextmanager

from rich.console import Console


@contextmanager
def working(message: str) -> Iterator[None]:
    """Show ``message`` with a spinner on stderr while the block runs (nothing when stderr is not a
    terminal, so logs and pipes stay clean)."""
    if not sys.stderr.isatty():
        yield
        return
    with Console(stderr=True).status(message):
        yield
