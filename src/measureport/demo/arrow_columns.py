"""Typed Arrow columns from numpy arrays and null masks, as the demo tables are written."""

from __future__ import annotations

from collections.abc import Sequence

import numpy as np
import numpy.typing as npt
import pyarrow as pa
import pyarrow.compute as pc

Mask = npt.NDArray[np.bool_] | None


def _validity(null: Mask, n: int) -> pa.Buffer | None:
    if null is None or not null.any():
        return None
    return pa.py_buffer(np.packbits(~null, bitorder="little").tobytes())


def integers(values: npt.ArrayLike, null: Mask = None) -> pa.Array:
    """An int32 column (ids, counts, minutes)."""
    return pa.array(np.asarray(values, dtype=np.int32), mask=null)


def decimals(cents: npt.ArrayLike, precision: int, null: Mask = None) -> pa.Array:
    """A ``decimal(precision, 2)`` column from whole hundredths (cents, or tens of metres)."""
    low = np.asarray(cents, dtype=np.int64)
    # decimal128 stores each value as a 16-byte little-endian two's-complement integer.
    words = np.stack([low, np.where(low < 0, -1, 0)], axis=1).astype("<i8")
    buffers = [_validity(null, low.size), pa.py_buffer(words.tobytes())]
    return pa.Array.from_buffers(pa.decimal128(precision, 2), low.size, buffers)


def labels(codes: npt.ArrayLike, names: Sequence[str], null: Mask = None) -> pa.Array:
    """A text column: ``names[code]`` for each code."""
    indices = pa.array(np.asarray(codes, dtype=np.int32), mask=null)
    return pc.take(pa.array(list(names), pa.string()), indices)


def texts(values: Sequence[str | None]) -> pa.Array:
    """A text column from Python strings (None is null)."""
    return pa.array(list(values), pa.string())


def dates(days: npt.ArrayLike, null: Mask = None) -> pa.Array:
    """A date column from ``datetime64[D]`` values."""
    return pa.array(np.asarray(days, dtype="datetime64[D]"), pa.date32(), mask=null)


def flags(values: npt.ArrayLike, null: Mask = None) -> pa.Array:
    """A boolean column."""
    return pa.array(np.asarray(values, dtype=np.bool_), pa.bool_(), mask=null)
