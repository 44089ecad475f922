"""How a comparison's values read in its text and HTML renderings."""

from __future__ import annotations

import datetime as dt
from typing import Any

from measureport.compare.cells import NumericError
from measureport.compare.values import plain

ROLLED_UP = "(all)"
EMPTY_MEMBER = "(empty)"
NULL = "null"


def value_text(value: object) -> str:
    """A measure value: null as ``null``, floats in their shortest exact form, dates in ISO form."""
    value = plain(value)
    if value is None:
        return NULL
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, float):
        return repr(value)
    if isinstance(value, dt.date):
        return value.isoformat()
    return str(value)


def key_cells(key: tuple[Any, ...], level: int) -> list[str]:
    """The grouping values of a row: the empty member as ``(empty)``, rolled-up columns ``(all)``."""
    return [
        ROLLED_UP if index >= level else (EMPTY_MEMBER if value is None else value_text(value))
        for index, value in enumerate(key)
    ]


def key_text(by: tuple[str, ...], key: tuple[Any, ...], level: int) -> str:
    """``col = value, col = value`` for a row, or ``the single row`` when there is no grouping."""
    if not by:
        return "the single row"
    return ", ".join(f"{name} = {cell}" for name, cell in zip(by, key_cells(key, level), strict=True))


def amount_text(amount: float | None) -> str:
    """An error amount to three significant digits; ``undefined`` where it has no value."""
    return "undefined" if amount is None else f"{amount:.3g}"


def error_texts(error: NumericError | None) -> tuple[str, str]:
    """The absolute and relative error of a cell, or two dashes when the cell is not two numbers."""
    if error is None:
        return ("-", "-")
    return (amount_text(error.absolute), amount_text(error.relative))


def count_text(count: int, noun: str) -> str:
    """``1 row``, ``2 rows``."""
    return f"{count} {noun}" if count == 1 else f"{count} {noun}s"
