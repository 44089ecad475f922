"""Running the verify matrix: every check on every target, compared with the baseline.

The baseline of a check is the reference evaluator when the model's data are small enough
(:data:`DEFAULT_REFERENCE_LIMIT` rows in all tables together), else DuckDB. Each other target
compiles the check for its dialect — a construct the dialect cannot express makes the cell
``unsupported`` (naming the measures concerned, while the other measures are still compared) —
runs it, and is compared with the baseline cell by cell.
"""

from __future__ import annotations

import dataclasses
import time
from collections import Counter
from dataclasses import dataclass, field
from typing import Any, Protocol

from sqlglot import exp

from measureport.compile import CompiledQuery
from measureport.errors import MeasureportError
from measureport.query import Query, ResultTable
from measureport.verify.cells import Cell, CellStatus, compared_cell
from measureport.verify.checks import Check
from measureport.verify.targets import BASELINE_ENGINE, REFERENCE, Target, TargetChoice, Unavailable
from measureport.workspace import Workspace

#: Above this many rows (all tables together) the reference evaluator is skipped: it evaluates
#: every cell one at a time, in plain Python, and is meant for test-sized data.
DEFAULT_REFERENCE_LIMIT = 250_000


class Progress(Protocol):
    """Told how much work there is and when each piece starts and ends."""

    def start(self, total: int) -> None: ...

    def working(self, text: str) -> None: ...

    def advance(self) -> None: ...


class _Silent:
    def start(self, total: int) -> None:
        pass

    def working(self, text: str) -> None:
        pass

    def advance(self) -> None:
        pass


@dataclass
class VerifyResult:
    """The matrix: ``cells[(i, name)]`` is check ``i`` on target ``name``."""

    checks: tuple[Check, ...]
    targets: tuple[Target, ...]
    baseline: str
    tolerance: float
    cells: dict[tuple[int, str], Cell] = field(default_factory=dict)
    unavailable: tuple[Unavailable, ...] = ()
    notes: tuple[str, ...] = ()
    seconds: dict[str, float] = field(default_factory=dict)

    def cell(self, check: int, target: str) -> Cell:
        """The cell of check number ``check`` on the target named ``target``."""
        return self.cells[(check, target)]

    @property
    def failed(self) -> bool:
        """True when any cell is a mismatch or an engine error."""
        return any(cell.failed for cell in self.cells.values())

    def counts(self) -> Counter[CellStatus]:
        """How many cells have each status."""
        return Counter(cell.status for cell in self.cells.values())


def error_text(exc: BaseException) -> str:
    """One sentence for an error: the message of a :class:`MeasureportError`, else the type and text."""
    if isinstance(exc, MeasureportError):
        return exc.message
    if isinstance(exc, ImportError) and exc.name:
        return f"{exc.name} is not installed"
    said = str(exc).strip().splitlines()
    return f"{type(exc).__name__}: {said[0]}" if said else type(exc).__name__


def data_rows(workspace: Workspace) -> int:
    """How many rows the model's tables hold together, counted by the DuckDB engine."""
    duck: Any = workspace.engine(BASELINE_ENGINE)
    total = 0
    for name in workspace.model.tables:
        table = exp.Table(this=exp.to_identifier(name, quoted=True))
        count = exp.select(exp.Count(this=exp.Star())).from_(table)
        total += int(duck.connection.execute(count.sql(dialect="duckdb")).fetchone()[0])
    return total


def _statement(engine: Any, compiled: CompiledQuery | None) -> str | None:
    """The SQL an engine runs for ``compiled``, as its ``statement`` method tells, else formatted."""
    if compiled is None:
        return None
    statement = getattr(engine, "statement", None)
    if callable(statement):
        try:
            return str(statement(compiled))
        except Exception:  # the cell reports the engine's failure; the text is a courtesy
            pass
    try:
        return compiled.run_sql(pretty=True)
    except MeasureportError:
        return None


class _Engines:
    """The engine object behind each target, built once."""

    def __init__(self, workspace: Workspace) -> None:
        self.workspace = workspace
        self.built: dict[str, Any] = {}

    def build(self, target: Target) -> Any:
        if target.name not in self.built:
            if target.kind == "roundtrip":
                from measureport.engines.roundtrip import RoundTripEngine

                assert target.profile is not None
                self.built[target.name] = RoundTripEngine.for_workspace(self.workspace, target.profile)
            else:
                self.built[target.name] = self.workspace.engine(target.source or target.name)
        return self.built[target.name]


class VerifyRunner:
    """Runs checks on targets for one workspace (see :func:`run_verify`)."""

    def __init__(
        self,
        workspace: Workspace,
        choice: TargetChoice,
        tolerance: float = 1e-9,
        reference_limit: int = DEFAULT_REFERENCE_LIMIT,
        progress: Progress | None = None,
    ) -> None:
        self.workspace = workspace
        self.tolerance = tolerance
        self.progress: Progress = progress or _Silent()
        self.engines = _Engines(workspace)
        self.notes: list[str] = []
        self.start_seconds: dict[str, float] = {}
        self.unavailable = list(choice.unavailable)
        self.targets = self._with_baseline(list(choice.targets), reference_limit)
        self.targets = self._built(self.targets, choice.named)
        self._expected: dict[tuple[int, tuple[str, ...]], ResultTable] = {}
        self._baseline_of: dict[int, str] = {}

    # --- set-up -------------------------------------------------------------------------------

    def _with_baseline(self, targets: list[Target], reference_limit: int) -> list[Target]:
        """The targets with the reference first when the data are small enough, and DuckDB always
        present as the fallback baseline."""
        rows = data_rows(self.workspace)
        self.use_reference = rows <= reference_limit
        if not self.use_reference:
            self.notes.append(
                f"the reference evaluator was skipped: the model's tables hold {rows:,} rows, more than "
                f"the limit of {reference_limit:,} (--reference-limit); results are compared with DuckDB"
            )
        names = [t.name for t in targets]
        if BASELINE_ENGINE not in names:
            targets.insert(0, Target(BASELINE_ENGINE, "engine"))
        if REFERENCE not in names and self.use_reference:
            targets.insert(0, Target(REFERENCE, "reference"))
        return targets

    def _built(self, targets: list[Target], named: bool) -> list[Target]:
        """The targets whose engine could be built; the others are unavailable (or, when named on
        the command line, an error)."""
        kept: list[Target] = []
        for target in targets:
            if target.kind == "reference" and not self.use_reference:
                kept.append(target)
                continue
            self.progress.working(f"starting {target.name}")
            started = time.perf_counter()
            try:
                self.engines.build(target)
            except Exception as exc:
                reason = error_text(exc)
                if named or target.name in (BASELINE_ENGINE, REFERENCE):
                    raise MeasureportError(f"the engine {target.name} could not start: {reason}") from None
                self.unavailable.append(Unavailable(target.name, reason))
                continue
            self.start_seconds[target.name] = time.perf_counter() - started
            kept.append(target)
        return kept

    @property
    def baseline(self) -> str:
        """The target whose results the others are compared with."""
        return REFERENCE if self.use_reference else BASELINE_ENGINE

    # --- running --------------------------------------------------------------------------------

    def run(self, checks: list[Check]) -> VerifyResult:
        """Every check on every target."""
        result = VerifyResult(
            tuple(checks), tuple(self.targets), self.baseline, self.tolerance,
            unavailable=tuple(self.unavailable), notes=tuple(self.notes), seconds=dict(self.start_seconds),
        )
        self.progress.start(len(checks) * len(self.targets))
        for index, check in enumerate(checks):
            self._run_check(index, check, result)
        return result

    def _run_check(self, index: int, check: Check, result: VerifyResult) -> None:
        expected = self._baseline_cells(index, check, result)
        for target in self.targets:
            if (index, target.name) in result.cells:
                continue
            self.progress.working(f"{check.name} on {target.name}")
            started = time.perf_counter()
            if expected is None:
                cell = Cell("skipped", "no baseline: the reference and DuckDB both failed on this check")
            else:
                cell = self._target_cell(index, check, target, expected)
            self._add_time(result, target.name, started)
            result.cells[(index, target.name)] = cell
            self.progress.advance()

    def _baseline_cells(self, index: int, check: Check, result: VerifyResult) -> ResultTable | None:
        """Run the baseline candidates (the reference, then DuckDB) until one succeeds; fill their
        cells; return the baseline result, or None when both failed."""
        candidates = [REFERENCE, BASELINE_ENGINE] if self.use_reference else [BASELINE_ENGINE]
        if not self.use_reference and any(t.name == REFERENCE for t in self.targets):
            too_large = "the data are too large for the reference evaluator"
            result.cells[(index, REFERENCE)] = Cell("skipped", too_large)
            self.progress.advance()
        for name in candidates:
            target = next(t for t in self.targets if t.name == name)
            self.progress.working(f"{check.name} on {name}")
            engine = self.engines.build(target)
            compiled = None
            started = time.perf_counter()
            try:
                compiled = self._compile(engine, check.query)
                expected = self._execute(engine, check.query, compiled)
            except Exception as exc:
                result.cells[(index, name)] = Cell("error", error_text(exc), sql=_statement(engine, compiled))
                self.progress.advance()
                continue
            self._add_time(result, name, started)
            self._expected[(index, check.query.measures)] = expected
            self._baseline_of[index] = name
            result.cells[(index, name)] = Cell("baseline", sql=_statement(engine, compiled))
            self.progress.advance()
            return expected
        return None

    @staticmethod
    def _add_time(result: VerifyResult, name: str, started: float) -> None:
        result.seconds[name] = result.seconds.get(name, 0.0) + time.perf_counter() - started

    @staticmethod
    def _compile(engine: Any, query: Query) -> CompiledQuery | None:
        compile_ = getattr(engine, "compile", None)
        if callable(compile_) and callable(getattr(engine, "run_compiled", None)):
            compiled: CompiledQuery = compile_(query)
            return compiled
        return None

    @staticmethod
    def _execute(engine: Any, query: Query, compiled: CompiledQuery | None) -> ResultTable:
        result: ResultTable = engine.run_compiled(compiled) if compiled is not None else engine.run(query)
        return result

    def _expected_for(self, index: int, query: Query) -> ResultTable:
        """The baseline result of ``query`` (a check's query, or the same with fewer measures)."""
        key = (index, query.measures)
        if key not in self._expected:
            engine = self.engines.built[self._baseline_of[index]]
            self._expected[key] = self._execute(engine, query, self._compile(engine, query))
        return self._expected[key]

    def _target_cell(self, index: int, check: Check, target: Target, expected: ResultTable) -> Cell:
        engine = self.engines.build(target)
        try:
            compiled = self._compile(engine, check.query)
        except MeasureportError as exc:
            return self._partly_unsupported(index, check.query, engine, exc)
        except Exception as exc:
            return Cell("error", error_text(exc))
        return self._run_and_compare(engine, check.query, compiled, expected)

    def _run_and_compare(
        self, engine: Any, query: Query, compiled: CompiledQuery | None, expected: ResultTable
    ) -> Cell:
        sql = _statement(engine, compiled)
        try:
            actual = self._execute(engine, query, compiled)
            return compared_cell(expected, actual, self.tolerance, sql)
        except Exception as exc:
            return Cell("error", error_text(exc), sql=sql)

    def _partly_unsupported(self, index: int, query: Query, engine: Any, whole: MeasureportError) -> Cell:
        """The query does not compile for the target: find the measures that do not, and compare
        the others."""
        if len(query.measures) < 2:
            return Cell("unsupported", whole.message)
        refused: list[tuple[str, str]] = []
        for measure in query.measures:
            try:
                self._compile(engine, dataclasses.replace(query, measures=(measure,)))
            except MeasureportError as exc:
                refused.append((measure, exc.message))
        rest = tuple(m for m in query.measures if m not in {name for name, _ in refused})
        if not refused or not rest:
            return Cell("unsupported", whole.message, unsupported_measures=tuple(refused))
        smaller = dataclasses.replace(query, measures=rest)
        try:
            compiled = self._compile(engine, smaller)
            expected = self._expected_for(index, smaller)
        except Exception as exc:
            return Cell("unsupported", error_text(exc), unsupported_measures=tuple(refused))
        compared = self._run_and_compare(engine, smaller, compiled, expected)
        status: CellStatus = compared.status if compared.failed else "unsupported"
        reason = compared.reason or f"{len(refused)} of {len(query.measures)} measures cannot be written"
        return dataclasses.replace(
            compared, status=status, reason=reason, unsupported_measures=tuple(refused)
        )


def run_verify(
    workspace: Workspace,
    checks: list[Check],
    choice: TargetChoice,
    tolerance: float = 1e-9,
    reference_limit: int = DEFAULT_REFERENCE_LIMIT,
    progress: Progress | None = None,
) -> VerifyResult:
    """Run every check on every target of ``choice`` and compare each with the baseline."""
    runner = VerifyRunner(workspace, choice, tolerance, reference_limit, progress)
    return runner.run(checks)

