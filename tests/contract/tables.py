"""Results as the command line prints them in CSV, and assertions on their columns."""

from __future__ import annotations

from collections.abc import Callable, Sequence
from dataclasses import dataclass

import pytest


@dataclass(frozen=True)
class CsvTable:
    """A parsed ``--format csv`` result: the header and the rows, all fields as text."""

    header: list[str]
    rows: list[list[str]]

    def keys(self, width: int) -> list[tuple[str, ...]]:
        """The first ``width`` fields (the grouping columns) of every row, in order."""
        return [tuple(row[:width]) for row in self.rows]

    def column(self, name: str) -> list[str]:
        assert name in self.header, f"no column {name!r} in {self.header}"
        index = self.header.index(name)
        return [row[index] for row in self.rows]


def same_value(actual: str, expected: object) -> bool:
    """Whether a CSV field shows ``expected``: None is an empty field, numbers compare numerically."""
    if expected is None:
        return actual == ""
    if isinstance(expected, bool | str):
        return actual == str(expected)
    if isinstance(expected, int | float):
        try:
            number = float(actual)
        except ValueError:
            return False
        return number == pytest.approx(float(expected), rel=1e-9, abs=1e-12)
    raise TypeError(f"unexpected expectation {expected!r}")


def assert_column(table: CsvTable, measure: str, expected: Sequence[object]) -> None:
    """Assert the column ``measure`` shows ``expected``, one value per row, in row order."""
    actual = table.column(measure)
    assert len(actual) == len(expected), f"{measure}: {actual} != {list(expected)}"
    wrong = [(i, a, e) for i, (a, e) in enumerate(zip(actual, expected, strict=True)) if not same_value(a, e)]
    assert not wrong, f"{measure}: got {actual}, expected {list(expected)}; (row, got, expected): {wrong}"


# Reads a shared grid by name (the ``grid`` fixture).
Grid = Callable[[str], CsvTable]
