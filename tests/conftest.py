"""Fixtures every suite may use: one throwaway PostgreSQL server for the whole test session."""

from __future__ import annotations

import os
from collections.abc import Iterator

import pytest


@pytest.fixture(scope="session")
def postgres_url() -> Iterator[str]:
    """A PostgreSQL database: $MEASUREPORT_POSTGRES_URL, else a throwaway server on 127.0.0.1
    for the session (skipped, with the reason, where none can run)."""
    from measureport.engines.pgserver import ThrowawayPostgres, unavailable_reason
    from measureport.engines.postgres import URL_VARIABLE

    given = os.environ.get(URL_VARIABLE)
    if given:
        yield given
        return
    reason = unavailable_reason()
    if reason is not None:
        pytest.skip(reason)
    server = ThrowawayPostgres()
    server.start()
    try:
        yield server.url
    finally:
        server.stop()
