"""Fixtures every suite may use: one throwaway PostgreSQL server and one local Spark session for
the whole test session. Each is defined here only: a session fixture imported into a second
conftest would be a second instance, and two instances would share (and both stop) one JVM."""

from __future__ import annotations

import os
import shutil
from collections.abc import Iterator
from typing import Any

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


@pytest.fixture(scope="session")
def spark_session() -> Iterator[Any]:
    """One local Spark session (local[2]) for every Spark test; the JVM ends with the session."""
    pytest.importorskip("pyspark")
    if shutil.which("java") is None and not os.environ.get("JAVA_HOME"):
        pytest.skip("Spark needs Java (17), and there is none on this machine")
    from measureport.engines.spark import end_local_jvm, local_session

    session = local_session()
    try:
        yield session
    finally:
        session.stop()
        end_local_jvm()
