"""The Python entry point: open a model, ask for measures by columns, run the query on an engine.

    from measureport.workspace import Workspace

    ws = Workspace.open("examples/bikeshare/model.yaml")
    query = ws.query(["rides", "revenue"], by=["stations.name"], where=["calendar.year = 2025"])
    result = ws.run(query)                 # the reference evaluator
    result.columns, result.rows
    print(ws.compile(query, "duckdb").sql)  # the same question as SQL

Engines are looked up by name in a registry. An engine adapter registers itself with
:func:`register_engine` when the package ``measureport.engines`` is imported (the workspace imports
it before the first look-up), so a new engine needs no change here or in the command line::

    register_engine("duckdb", lambda workspace: DuckDBEngine(workspace.model))

A factory receives the :class:`Workspace` and returns an object with ``run(query) -> ResultTable``
(and, optionally, ``close()``); the workspace builds each engine once and reuses it.
"""

from __future__ import annotations

import difflib
import importlib
from collections.abc import Callable, Sequence
from pathlib import Path
from types import TracebackType
from typing import TYPE_CHECKING, Protocol

from measureport.errors import MeasureportError
from measureport.query import Query, ResultTable

if TYPE_CHECKING:
    from measureport.compile import CompiledQuery
    from measureport.model.schema import Model
    from measureport.model.tabledata import Dataset
    from measureport.semantics.bound import BoundModel


class Engine(Protocol):
    """Something that answers a query with a result table."""

    def run(self, query: Query) -> ResultTable:
        """The rows of ``query``, shaped and ordered as LANGUAGE.md section 3 says."""
        ...


EngineFactory = Callable[["Workspace"], Engine]

DEFAULT_ENGINE = "duckdb"

UrlEngineFactory = Callable[["Workspace", str], Engine]

_ENGINES: dict[str, EngineFactory] = {}
_URL_ENGINES: dict[str, UrlEngineFactory] = {}
_plugins_loaded = False


def register_engine(name: str, factory: EngineFactory) -> None:
    """Make ``factory`` available as engine ``name`` (a later registration of a name replaces it)."""
    _ENGINES[name] = factory


def engine_names() -> tuple[str, ...]:
    """The names of every registered engine, sorted."""
    _load_engine_plugins()
    return tuple(sorted(_ENGINES))


def register_url_engine(scheme: str, factory: UrlEngineFactory) -> None:
    """Make ``factory`` answer engine names that are URLs of ``scheme`` (``postgresql://...``,
    ``sc://...``): it receives the workspace and the whole URL."""
    _URL_ENGINES[scheme] = factory


def engine_factory(name: str) -> EngineFactory:
    """The factory registered as ``name`` (or for the scheme of a URL such as
    ``postgresql://host/db``); an unknown name is a :class:`MeasureportError`."""
    _load_engine_plugins()
    if "://" in name:
        scheme = name.split("://", 1)[0]
        url_factory = _URL_ENGINES.get(scheme)
        if url_factory is None:
            schemes = ", ".join(f"{s}://" for s in sorted(_URL_ENGINES))
            raise MeasureportError(f"no engine connects to {scheme}:// URLs; the URL engines are {schemes}")
        return lambda workspace: url_factory(workspace, name)
    factory = _ENGINES.get(name)
    if factory is None:
        known = sorted(_ENGINES)
        close = difflib.get_close_matches(name, known, n=1)
        raise MeasureportError(
            f"there is no engine named '{name}'; the engines are {', '.join(known)}",
            hint=f"did you mean {close[0]}?" if close else None,
        )
    return factory


def _load_engine_plugins() -> None:
    global _plugins_loaded
    if not _plugins_loaded:
        _plugins_loaded = True
        importlib.import_module("measureport.engines")


def _as_names(names: str | Sequence[str]) -> tuple[str, ...]:
    # A lone string is one name, not a sequence of one-letter names.
    return (names,) if isinstance(names, str) else tuple(names)


class Workspace:
    """A loaded model with its measures bound; the dataset is read on first use."""

    def __init__(self, model: Model, bound: BoundModel, dataset: Dataset | None = None) -> None:
        """A workspace over an already bound model; ``dataset`` (when given) replaces reading the
        model's data files. Most callers want :meth:`open`."""
        self.model = model
        self.bound = bound
        self._dataset = dataset
        self._engines: dict[str, Engine] = {}

    @classmethod
    def open(cls, model_path: str | Path) -> Workspace:
        """Load the model file, parse and bind its measures. Bad input raises :class:`MeasureportError`."""
        # Stage imports are deferred so that `measureport --help` starts without loading DuckDB.
        from measureport.model.loader import load_model
        from measureport.semantics.binder import bind_model

        model = load_model(model_path)
        return cls(model, bind_model(model))

    @property
    def dataset(self) -> Dataset:
        """The data of every table, read from the model's files the first time it is asked for."""
        if self._dataset is None:
            from measureport.model.data import load_dataset

            self._dataset = load_dataset(self.model)
        return self._dataset

    @property
    def measure_names(self) -> tuple[str, ...]:
        """Every measure of the model, in dependency order."""
        return tuple(self.bound.measures)

    def query(
        self,
        measures: str | Sequence[str],
        by: str | Sequence[str] = (),
        where: str | Sequence[str] = (),
        totals: bool = False,
    ) -> Query:
        """A query for ``measures`` grouped by ``by`` (``"table.column"`` texts) under the report
        filters ``where`` (conditions in the measure language, all of which hold)."""
        from measureport.semantics.binder import build_query

        return build_query(self.bound, _as_names(measures), _as_names(by), _as_names(where), totals)

    def view_query(self, view: str) -> Query:
        """The query that the model's view ``view`` stands for."""
        from measureport.semantics.binder import view_query

        return view_query(self.bound, view)

    def compile(self, query: Query, dialect: str = "duckdb") -> CompiledQuery:
        """The SQL of ``query`` in ``dialect``: ``.sql`` is the statement, ``.explain()`` tells how
        each measure became SQL."""
        from measureport.compile import compile_query

        return compile_query(self.bound, query, dialect)

    def engine(self, name: str = DEFAULT_ENGINE) -> Engine:
        """The engine ``name`` for this workspace, built on first use."""
        if name not in self._engines:
            self._engines[name] = engine_factory(name)(self)
        return self._engines[name]

    def run(self, query: Query, engine: str = DEFAULT_ENGINE) -> ResultTable:
        """The result of ``query`` computed by ``engine``."""
        return self.engine(engine).run(query)

    def close(self) -> None:
        """Close every engine that has something to close (connections, servers)."""
        engines, self._engines = self._engines, {}
        for built in engines.values():
            close = getattr(built, "close", None)
            if callable(close):
                close()

    def __enter__(self) -> Workspace:
        return self

    def __exit__(
        self,
        exc_type: type[BaseException] | None,
        exc: BaseException | None,
        tb: TracebackType | None,
    ) -> None:
        self.close()


class ReferenceEngine:
    """The reference evaluator as an engine: slow, obviously correct, the oracle for the others.
    One evaluator serves every query of the workspace, so its caches carry over between queries."""

    def __init__(self, workspace: Workspace) -> None:
        from measureport.reference.evaluator import Evaluator

        self._evaluator = Evaluator(workspace.bound, workspace.dataset)

    def run(self, query: Query) -> ResultTable:
        from measureport.reference.evaluator import evaluate_with

        return evaluate_with(self._evaluator, query)


register_engine("reference", ReferenceEngine)
