"""Strict conversion of fetched values to the model's integer types: no rounding, no overflow.

DuckDB rounds when it casts text or fractions to an integer ('3.50' becomes 4); measureport
refuses such values instead, so a wrongly declared column is an error rather than changed data.
"""

from __future__ import annotations

from typing import Any

import numpy as np
import numpy.typing as npt

from measureport.model.schema import DataType

# The smallest value and one past the largest value of each integer type.
_BOUNDS: dict[str, tuple[int, int]] = {
    "integer": (-(2**31), 2**31),
    "bigint": (-(2**63), 2**63),
}


class IntegerValueError(ValueError):
    """A value that is not a whole number in the range of its column's type; ``row`` is 1-based."""

    def __init__(self, value: object, row: int, reason: str) -> None:
        super().__init__(reason)
        self.value = value
        self.row = row
        self.reason = reason


def to_int64(
    data: npt.NDArray[Any], null: npt.NDArray[np.bool_], data_type: DataType
) -> npt.NDArray[np.int64]:
    """``data`` (integers, doubles or text) as int64, nulls as 0. Raises :class:`IntegerValueError`
    for a fraction, a text that is not a whole number, or a value outside ``data_type``'s range."""
    low, past_high = _BOUNDS[data_type.sql]
    values: npt.NDArray[Any]
    if data.dtype.kind in "iu":
        values = np.where(null, 0, data)
    elif data.dtype.kind == "f":
        values = np.where(null, 0.0, data)
        fraction = ~np.isfinite(values) | (values != np.floor(values))
        _raise_at(fraction, values, "is not a whole number")
        _raise_at(
            (values < low) | (values >= float(past_high)), values, f"is outside the range of {data_type.sql}"
        )
        return values.astype(np.int64)
    else:
        values = _parse_texts(np.where(null, "0", data))
    _raise_at((values < low) | (values >= past_high), values, f"is outside the range of {data_type.sql}")
    return values.astype(np.int64)


def _parse_texts(texts: npt.NDArray[Any]) -> npt.NDArray[Any]:
    """Texts as integers, as Python's ``int()`` reads them (surrounding spaces allowed); an object
    array of Python integers when some do not fit in 64 bits, so the range check can name them."""
    try:
        return texts.astype(object).astype(np.int64)
    except (ValueError, OverflowError):
        pass
    parsed: list[int] = []
    for row, text in enumerate(texts.tolist()):
        try:
            parsed.append(int(text))
        except ValueError:
            raise IntegerValueError(text, row + 1, "is not a whole number") from None
    return np.array(parsed, dtype=object)


def _raise_at(bad: npt.NDArray[np.bool_], values: npt.NDArray[Any], reason: str) -> None:
    if bad.any():
        row = int(np.argmax(bad))
        value = values[row]
        raise IntegerValueError(value.item() if isinstance(value, np.generic) else value, row + 1, reason)
