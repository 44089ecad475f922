"""How one result value is written: in CSV and plain tables, and as a JSON value."""

from __future__ import annotations

import datetime as dt
import math
import sys
from decimal import Decimal

JsonValue = None | bool | int | float | str


def normalize(value: object) -> object:
    """The Python value behind an engine's value (numpy scalars, decimals)."""
    # A numpy scalar can only exist once numpy is loaded; not importing it keeps start-up quick.
    numpy = sys.modules.get("numpy")
    if numpy is not None and isinstance(value, numpy.generic):
        value = value.item()
    if isinstance(value, Decimal):
        exponent = value.as_tuple().exponent
        return int(value) if isinstance(exponent, int) and exponent >= 0 else float(value)
    return value


def cell_text(value: object) -> str:
    """The text of a value: integers without a point, floats in Python's shortest repr, dates in ISO
    form, booleans as ``true``/``false``, null as the empty text."""
    value = normalize(value)
    if value is None:
        return ""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, float):
        return repr(value)
    if isinstance(value, dt.date):
        return value.isoformat()
    return str(value)


def display_text(value: object) -> str:
    """The text of a value for people reading a table: like :func:`cell_text`, but a float is
    shown with at most four decimals (three significant digits when it is smaller than 0.001).
    CSV and JSON keep every digit."""
    value = normalize(value)
    if isinstance(value, float) and math.isfinite(value):
        if value == 0 or abs(value) >= 0.001:
            text = f"{value:.4f}".rstrip("0").rstrip(".")
            return "0" if text in ("-0", "") else text
        return f"{value:.3g}"
    return cell_text(value)


def json_value(value: object) -> JsonValue:
    """A value JSON can hold: dates as ISO text, null for null and for a float that is not finite."""
    value = normalize(value)
    if value is None or isinstance(value, bool | int | str):
        return value
    if isinstance(value, float):
        return value if math.isfinite(value) else None
    if isinstance(value, dt.date):
        return value.isoformat()
    return str(value)


def is_number(value: object) -> bool:
    """True for numbers (booleans are not numbers here)."""
    value = normalize(value)
    return isinstance(value, int | float) and not isinstance(value, bool)
