"""What every real-engine adapter shares: load the model's tables, compile, run, type the rows.

An adapter subclasses :class:`SqlEngine`, opens its connection, calls :meth:`load_tables`, and
implements three methods: ``load_table`` (one Arrow table into the engine with its type mapping),
``fetch`` (run one statement, return raw rows) and ``shutdown`` (release the connection). The
rest — compiling a query for the adapter's dialect, the ``__level`` column, typing the values
by the kinds the model and the binder know — is done here, the same for all.
"""

from __future__ import annotations

from abc import ABC, abstractmethod
from collections.abc import Sequence
from types import TracebackType
from typing import TYPE_CHECKING, Any, ClassVar

import pyarrow as pa

from measureport.compile import CompiledQuery, compile_query
from measureport.engines.loading import loadable_tables
from measureport.engines.typed_rows import Kinds, result_kinds, typed_rows, typed_value
from measureport.errors import MeasureportError
from measureport.model.schema import Model
from measureport.model.tabledata import Dataset
from measureport.query import Query, ResultTable
from measureport.semantics.bound import BoundModel

if TYPE_CHECKING:
    from measureport.workspace import Workspace


class SqlEngine(ABC):
    """An engine that runs SQL text on tables it loaded from the model's data."""

    #: What the engine is called in messages.
    title: ClassVar[str]
    #: The dialect profile that queries are compiled with for this engine.
    dialect: ClassVar[str]
    #: The sqlglot dialect of the statements it runs (for statements built outside compile).
    sqlglot_dialect: ClassVar[str]

    def __init__(self, bound: BoundModel) -> None:
        self.bound = bound
        self.model: Model = bound.model
        self.loaded: tuple[str, ...] = ()
        self._closed = False

    # --- loading ------------------------------------------------------------------------------

    def load_tables(self, dataset: Dataset | None) -> None:
        """Load every table of ``dataset`` (else of the model's data files) into the engine."""
        tables = loadable_tables(self.model, dataset)
        for name, table in tables.items():
            self.load_table(name, table)
        self.loaded = tuple(tables)

    @abstractmethod
    def load_table(self, name: str, table: pa.Table) -> None:
        """Create table ``name`` on the engine with the adapter's type mapping and load ``table``."""

    # --- statements ---------------------------------------------------------------------------

    @abstractmethod
    def fetch(self, sql: str) -> Sequence[Sequence[Any]]:
        """Run one statement and return its rows as the driver gives them. An engine error is a
        :class:`MeasureportError` (see :meth:`run_error`)."""

    def execute(self, sql: str, kinds: Kinds | None = None) -> list[tuple[Any, ...]]:
        """Run one statement; its rows with values typed by ``kinds`` (one per column; the
        values' own types when None): ``int``, ``float``, ``str``, ``datetime.date``, ``bool``, None."""
        return typed_rows(self.fetch(sql), kinds)

    def run_error(self, exc: BaseException) -> MeasureportError:
        """The engine's complaint about a statement, as one plain sentence."""
        said = str(exc).strip()
        first = said.splitlines()[0] if said else type(exc).__name__
        return MeasureportError(f"{self.title} could not run the statement: {first}")

    # --- queries ------------------------------------------------------------------------------

    def compile(self, query: Query) -> CompiledQuery:
        """``query`` compiled for this engine's dialect."""
        return compile_query(self.bound, query, self.dialect)

    def run(self, query: Query) -> ResultTable:
        """The result of ``query``: rows ordered as the contract says, subtotal levels filled."""
        return self.run_compiled(self.compile(query))

    def run_compiled(self, compiled: CompiledQuery) -> ResultTable:
        """Run a compiled query's statement and shape the result: the grouping columns and the
        measures come first in each row, the ``__level`` column last (columns between them, such
        as the totals marker, are for printing and are left out)."""
        rows = self.fetch(compiled.run_sql())
        n = len(compiled.query.by) + len(compiled.query.measures)
        kinds = result_kinds(self.bound, compiled.query, level_column=False)
        return ResultTable(
            by=tuple(str(c) for c in compiled.query.by),
            measures=tuple(compiled.query.measures),
            rows=typed_rows((row[:n] for row in rows), kinds),
            levels=[int(typed_value(row[-1], "number")) for row in rows],
        )

    # --- lifetime -----------------------------------------------------------------------------

    @abstractmethod
    def shutdown(self) -> None:
        """Release the connection (and whatever the adapter started)."""

    def close(self) -> None:
        """Release the engine; a second call does nothing."""
        if not self._closed:
            self._closed = True
            self.shutdown()

    def __enter__(self) -> SqlEngine:
        return self

    def __exit__(
        self,
        exc_type: type[BaseException] | None,
        exc: BaseException | None,
        tb: TracebackType | None,
    ) -> None:
        self.close()


def workspace_dataset(workspace: Workspace) -> Dataset | None:
    """The data an adapter built for ``workspace`` loads: the workspace's dataset (read once and
    shared with the reference evaluator, or given in memory); or None when it cannot be read
    because some table's ``from:`` names a table on an engine. Then the adapter reads the data
    files there are, and the statement reads the other tables on the engine itself."""
    if all(t.path is not None for t in workspace.model.tables.values()):
        return workspace.dataset
    try:
        return workspace.dataset
    except MeasureportError:
        return None
