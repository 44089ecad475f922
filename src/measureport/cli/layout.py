"""Where each result row sits: detail, subtotal or grand total, and which of its cells are rolled up."""

from __future__ import annotations

from measureport.query import ResultTable

TOTALS_COLUMN = "totals"
ROLLED_UP = "(all)"


def row_level(result: ResultTable, index: int) -> int:
    """How many leading grouping columns row ``index`` keeps (every one when the engine gave no levels)."""
    return result.levels[index] if result.levels else len(result.by)


def totals_marker(result: ResultTable, index: int) -> str:
    """``total`` for the grand total row, ``subtotal`` for other rolled-up rows, empty for detail rows."""
    level = row_level(result, index)
    if level >= len(result.by):
        return ""
    return "total" if level == 0 else "subtotal"


def rolled_up(result: ResultTable, index: int, column: int) -> bool:
    """True when cell ``column`` of row ``index`` is a grouping column that the row rolls up."""
    return column < len(result.by) and column >= row_level(result, index)
