"""Where ``--apply`` creates views: a DuckDB database file or a PostgreSQL database, each running
a list of statements in one transaction that is rolled back on the first failure."""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from pathlib import Path
from typing import Protocol
from urllib.parse import urlsplit, urlunsplit

from measureport.errors import MeasureportError

POSTGRES_SCHEMES = ("postgresql://", "postgres://")
CONNECT_TIMEOUT_SECONDS = 10

# One statement of a transaction: the view it belongs to, and its text.
Step = tuple[str, str]


class StepFailed(Exception):
    """A statement creating view ``view`` failed with the engine's message ``said``; the whole
    transaction was rolled back."""

    def __init__(self, view: str, said: str) -> None:
        super().__init__(said)
        self.view = view
        self.said = said


class ViewTarget(Protocol):
    """A database that views can be created in."""

    @property
    def title(self) -> str:
        """The database as messages name it (never with a password)."""
        ...

    @property
    def dialect(self) -> str:
        """The dialect its statements must be written in."""
        ...

    def run_in_transaction(self, steps: Sequence[Step]) -> None:
        """Run every step in one transaction; on the first failure roll all of them back and
        raise :class:`StepFailed`. A database that cannot be opened is a :class:`MeasureportError`."""
        ...


def open_target(text: str) -> ViewTarget:
    """The target ``text`` names: a ``postgresql://`` URL, or the path of a DuckDB database file."""
    if text.startswith(POSTGRES_SCHEMES):
        return PostgresTarget(text)
    return DuckDBTarget(Path(text))


def first_line(error: BaseException) -> str:
    """The first line of an engine's message (its class name when it says nothing)."""
    said = str(error).strip()
    return said.splitlines()[0] if said else type(error).__name__


@dataclass(frozen=True)
class DuckDBTarget:
    """An existing DuckDB database file."""

    path: Path

    @property
    def title(self) -> str:
        return f"the DuckDB database {self.path}"

    @property
    def dialect(self) -> str:
        return "duckdb"

    def run_in_transaction(self, steps: Sequence[Step]) -> None:
        import duckdb

        if not self.path.is_file():
            raise MeasureportError(
                f"there is no DuckDB database file at {self.path}",
                hint="--apply takes the path of an existing DuckDB database, or a postgresql:// URL",
            )
        try:
            connection = duckdb.connect(str(self.path))
        except duckdb.Error as problem:
            raise MeasureportError(f"could not open {self.title}: {first_line(problem)}") from None
        try:
            connection.begin()
            for view, sql in steps:
                try:
                    connection.execute(sql)
                except duckdb.Error as problem:
                    connection.rollback()
                    raise StepFailed(view, first_line(problem)) from None
            connection.commit()
        finally:
            connection.close()


@dataclass(frozen=True)
class PostgresTarget:
    """A PostgreSQL database named by a connection URL."""

    url: str

    @property
    def title(self) -> str:
        return f"the PostgreSQL database {without_password(self.url)}"

    @property
    def dialect(self) -> str:
        return "postgres"

    def run_in_transaction(self, steps: Sequence[Step]) -> None:
        try:
            import psycopg
        except ImportError:
            raise MeasureportError(
                "creating views in PostgreSQL needs the psycopg package, which is not installed",
                hint="pip install 'psycopg[binary]'",
            ) from None
        try:
            connection = psycopg.connect(self.url, connect_timeout=CONNECT_TIMEOUT_SECONDS)
        except psycopg.Error as problem:
            raise MeasureportError(f"could not connect to {self.title}: {first_line(problem)}") from None
        with connection:
            failing = ""
            try:
                with connection.transaction():
                    for view, sql in steps:
                        failing = view
                        # No parameters: the text is sent as it is, so a % in it is not a placeholder.
                        connection.execute(sql)
            except psycopg.Error as problem:
                raise StepFailed(failing, first_line(problem)) from None


def without_password(url: str) -> str:
    """``url`` with the password of its user, if any, replaced by ``***``."""
    parts = urlsplit(url)
    if parts.password is None:
        return url
    host = parts.netloc.rpartition("@")[2]
    return urlunsplit(parts._replace(netloc=f"{parts.username or ''}:***@{host}"))
