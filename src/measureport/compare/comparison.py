"""Matching two result tables row by row on their grouping key, and listing what differs."""

from __future__ import annotations

from collections.abc import Iterator
from dataclasses import dataclass
from typing import Any

from measureport.compare.cells import NumericError, Tolerance, cells_agree, numeric_error
from measureport.compare.values import Canonical, canonical
from measureport.query import ResultTable

RowKey = tuple[int, tuple[Canonical, ...]]


@dataclass(frozen=True)
class UnmatchedRow:
    """A row found on one side only: its grouping values (``level`` of them kept, the rest rolled up)
    and its measure values, in the order of the comparison's ``measures``."""

    key: tuple[Any, ...]
    level: int
    values: tuple[Any, ...]


@dataclass(frozen=True)
class CellDifference:
    """One measure that differs in a row present on both sides."""

    key: tuple[Any, ...]
    level: int
    measure: str
    expected: Any
    actual: Any
    error: NumericError | None


@dataclass(frozen=True)
class Comparison:
    """What :func:`compare_results` found. ``missing`` rows are expected but not in the actual
    result, ``extra`` rows are in the actual result only."""

    by: tuple[str, ...]
    measures: tuple[str, ...]
    tolerance: Tolerance
    expected_rows: int
    actual_rows: int
    missing: tuple[UnmatchedRow, ...]
    extra: tuple[UnmatchedRow, ...]
    differences: tuple[CellDifference, ...]

    @property
    def equal(self) -> bool:
        """True when every row matches and every cell agrees."""
        return not (self.missing or self.extra or self.differences)

    @property
    def matched_rows(self) -> int:
        """How many expected rows found their actual row."""
        return self.expected_rows - len(self.missing)

    @property
    def differing_rows(self) -> int:
        """How many matched rows have at least one differing cell."""
        return len({(d.level, tuple(canonical(v) for v in d.key[: d.level])) for d in self.differences})


@dataclass(frozen=True)
class _Row:
    key: tuple[Any, ...]
    level: int
    values: tuple[Any, ...]


def _rows(table: ResultTable, measures: tuple[str, ...]) -> Iterator[_Row]:
    """The rows of ``table`` with measure values reordered as ``measures``."""
    width = len(table.by)
    positions = [width + table.measures.index(name) for name in measures]
    for index, row in enumerate(table.rows):
        level = table.levels[index] if table.levels else width
        key = tuple(row[:level]) + (None,) * (width - level)
        yield _Row(key, level, tuple(row[p] for p in positions))


def row_key(key: tuple[Any, ...], level: int) -> RowKey:
    """The matching key of a row: its level and the canonical form of the grouping values it keeps."""
    return (level, tuple(canonical(value) for value in key[:level]))


def _check_shapes(expected: ResultTable, actual: ResultTable) -> None:
    if len(expected.by) != len(actual.by):
        raise ValueError(
            f"the results have {len(expected.by)} and {len(actual.by)} grouping columns; "
            "only results of the same query can be compared"
        )
    if sorted(expected.measures) != sorted(actual.measures) or len(set(expected.measures)) != len(
        expected.measures
    ):
        raise ValueError(
            f"the results have the measures {', '.join(expected.measures)} and "
            f"{', '.join(actual.measures)}; only results of the same query can be compared"
        )


def compare_results(
    expected: ResultTable,
    actual: ResultTable,
    tolerance: float = 1e-9,
    *,
    absolute_tolerance: float = 0.0,
) -> Comparison:
    """Match the rows of ``actual`` to those of ``expected`` by grouping key (and totals level) and
    compare their measures by name: numbers within the relative ``tolerance`` (with an optional
    ``absolute_tolerance`` floor near zero), null only equal to null, dates equal however typed.

    Results of different queries (other grouping columns count or measures) raise ``ValueError``.
    A key repeated on one side matches as many rows of the other side as it has; the rest are
    missing or extra."""
    _check_shapes(expected, actual)
    limits = Tolerance(tolerance, absolute_tolerance)
    measures = expected.measures
    waiting: dict[RowKey, list[_Row]] = {}
    actual_rows = list(_rows(actual, measures))
    for row in actual_rows:
        waiting.setdefault(row_key(row.key, row.level), []).append(row)
    matched_ids: set[int] = set()
    missing: list[UnmatchedRow] = []
    differences: list[CellDifference] = []
    for row in _rows(expected, measures):
        candidates = waiting.get(row_key(row.key, row.level))
        if not candidates:
            missing.append(UnmatchedRow(row.key, row.level, row.values))
            continue
        partner = candidates.pop(0)
        matched_ids.add(id(partner))
        for name, want, got in zip(measures, row.values, partner.values, strict=True):
            if not cells_agree(want, got, limits):
                error = numeric_error(want, got)
                differences.append(CellDifference(row.key, row.level, name, want, got, error))
    extra = [UnmatchedRow(r.key, r.level, r.values) for r in actual_rows if id(r) not in matched_ids]
    return Comparison(
        by=expected.by,
        measures=measures,
        tolerance=limits,
        expected_rows=len(expected.rows),
        actual_rows=len(actual.rows),
        missing=tuple(missing),
        extra=tuple(extra),
        differences=tuple(differences),
    )


def restrict_levels(result: ResultTable, levels: set[int]) -> ResultTable:
    """The rows of ``result`` whose totals level is in ``levels`` (detail rows are at ``len(by)``)."""
    width = len(result.by)
    kept = [
        (row, level)
        for index, row in enumerate(result.rows)
        if (level := result.levels[index] if result.levels else width) in levels
    ]
    return ResultTable(result.by, result.measures, [row for row, _ in kept], [level for _, level in kept])
