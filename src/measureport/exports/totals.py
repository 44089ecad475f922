"""Telling totals rows of an export from detail rows.

Exports often carry subtotal and grand total rows. A row is a totals row when, reading its grouping
cells from the left, it reaches a cell that is *rolled up* — and then every cell after it is empty
or a totals label as well. A cell is rolled up when it is

- a totals label (``Total``, ``Totals``, ``Grand total``, ``Subtotal``, ``Sub-total``, ``Sub total``;
  any letter case) that is not a member of that column after the cells to its left, or
- empty (or ``(blank)``) where the translated result has no empty member after the cells to its
  left — an empty grouping cell is how exports write the empty member too, so the translated
  rows decide which one it is.

The row's level is the number of grouping cells before the first rolled-up one (0 for a grand
total), matching the levels of ``run --totals``. Only trailing cells can roll up: a label or an
empty cell followed by a real value is a member.
"""

from __future__ import annotations

from collections.abc import Callable, Sequence

from measureport.compare.values import Canonical, canonical
from measureport.exports.cells import CellError, is_blank
from measureport.query import ResultTable

TOTALS_LABELS = frozenset({"total", "totals", "grand total", "subtotal", "sub-total", "sub total"})


def is_totals_label(cell: object) -> bool:
    """True for a cell that says Total, Grand total, Subtotal and the like."""
    return isinstance(cell, str) and " ".join(cell.split()).casefold() in TOTALS_LABELS


class KnownMembers:
    """The combinations of leading grouping values that a result's detail rows hold."""

    def __init__(self, result: ResultTable) -> None:
        width = len(result.by)
        self._prefixes: set[tuple[Canonical, ...]] = set()
        for index, row in enumerate(result.rows):
            if result.levels and result.levels[index] != width:
                continue
            key = tuple(canonical(value) for value in row[:width])
            self._prefixes.update(key[:k] for k in range(width + 1))

    def has(self, values: Sequence[object]) -> bool:
        """True when some detail row starts with ``values``."""
        return tuple(canonical(value) for value in values) in self._prefixes


def _may_roll_up(cell: object) -> bool:
    return is_blank(cell) or is_totals_label(cell)


def trailing_start(cells: Sequence[object]) -> int:
    """Where the trailing run of empty and totals-label cells begins (``len(cells)`` when the last
    cell is neither): the cells before it are members, whatever the row turns out to be."""
    start = len(cells)
    while start > 0 and _may_roll_up(cells[start - 1]):
        start -= 1
    return start


def totals_level(
    cells: Sequence[object],
    members_before: Sequence[object],
    read: Callable[[int], object],
    members: KnownMembers,
) -> int:
    """The level of an export row (``len(cells)`` for a detail row) from its raw grouping ``cells``
    and the values of the cells before :func:`trailing_start`. ``read(j)`` reads cell ``j`` as its
    column's value, raising :class:`CellError` when it cannot."""
    kept = list(members_before)
    for k in range(len(kept), len(cells)):
        if is_blank(cells[k]):
            value = None
        else:
            try:
                value = read(k)
            except CellError:
                return k
        if not members.has((*kept, value)):
            return k
        kept.append(value)
    return len(cells)
