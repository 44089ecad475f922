"""One cell of the verify matrix: how one engine did on one check."""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Literal

from measureport.compare import Comparison, compare_results
from measureport.query import ResultTable

CellStatus = Literal["pass", "fail", "unsupported", "error", "skipped", "baseline"]

#: Statuses that make `verify` exit with status 1.
FAILING: frozenset[CellStatus] = frozenset({"fail", "error"})


@dataclass(frozen=True)
class Cell:
    """The outcome of one check on one engine.

    ``pass``/``fail``: the results were compared (``comparison``); ``largest_relative`` is the
    largest relative difference of any two numbers compared (0.0 when all are equal, ``inf`` when
    a number differs from an expected 0). ``unsupported``: the engine's dialect cannot express
    the query (``reason``); when only some measures are unsupported, ``unsupported_measures``
    names them with their reasons and ``comparison`` holds the comparison of the others.
    ``error``: the engine failed to run the statement. ``skipped``: not run (``reason``).
    ``baseline``: the engine whose results the others are compared with. ``sql`` is the
    statement the engine ran, when it ran one."""

    status: CellStatus
    reason: str = ""
    comparison: Comparison | None = None
    largest_relative: float | None = None
    unsupported_measures: tuple[tuple[str, str], ...] = ()
    sql: str | None = None

    @property
    def failed(self) -> bool:
        """True for a mismatch or an engine error."""
        return self.status in FAILING

    def text(self) -> str:
        """The cell as the matrix prints it: ``pass``, ``pass 2e-16``, ``FAIL 3e-01``, ``FAIL rows``,
        ``unsupported``, ``ERROR``, ``skipped``, ``baseline``."""
        if self.status == "pass":
            return "pass" + _difference_text(self.largest_relative)
        if self.status == "fail":
            rows = self.comparison is not None and bool(self.comparison.missing or self.comparison.extra)
            return "FAIL" + (" rows" if rows else _difference_text(self.largest_relative) or " values")
        if self.status == "error":
            return "ERROR"
        if self.status == "unsupported" and self.unsupported_measures:
            return f"unsupported {len(self.unsupported_measures)}"
        return self.status


def _difference_text(largest: float | None) -> str:
    if largest is None or largest == 0:
        return ""
    if math.isinf(largest):
        return " inf"
    return f" {largest:.0e}"


def largest_relative_difference(expected: ResultTable, actual: ResultTable) -> float:
    """The largest relative difference between two numbers in matching cells of the two results:
    0.0 when every pair of numbers is equal, ``inf`` when a number differs from an expected 0."""
    exact = compare_results(expected, actual, 0.0)
    errors = [d.error for d in exact.differences if d.error is not None]
    return max((e.relative if e.relative is not None else math.inf for e in errors), default=0.0)


def compared_cell(
    expected: ResultTable, actual: ResultTable, tolerance: float, sql: str | None = None
) -> Cell:
    """``pass`` or ``fail`` for ``actual`` against ``expected`` within the relative ``tolerance``."""
    comparison = compare_results(expected, actual, tolerance)
    largest = largest_relative_difference(expected, actual)
    status: CellStatus = "pass" if comparison.equal else "fail"
    return Cell(status, comparison=comparison, largest_relative=largest, sql=sql)
