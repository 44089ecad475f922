"""Engine values to the Python values of a ResultTable: int, float, str, date, bool or None."""

from __future__ import annotations

import datetime as dt
import decimal
from typing import Any


def python_value(value: Any) -> Any:
    """``value`` as a plain Python value (decimals become floats, timestamps dates)."""
    if value is None or isinstance(value, bool | int | float | str):
        return value
    if isinstance(value, decimal.Decimal):
        return float(value)
    if isinstance(value, dt.datetime):
        return value.date()
    if isinstance(value, dt.date):
        return value
    item = getattr(value, "item", None)
    if callable(item):
        return python_value(item())
    return value
