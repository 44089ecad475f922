"""In-memory columnar data of a model's tables, as the reference evaluator reads them."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
import numpy.typing as npt


@dataclass(frozen=True)
class ColumnData:
    """One column: ``values`` (numbers as float64 or int64, text as object arrays of str,
    dates as ``datetime64[D]``, booleans as bool) and ``null``, True where the value is null.
    Where ``null`` is True the entry in ``values`` is a placeholder and must not be read."""

    values: npt.NDArray[np.generic]
    null: npt.NDArray[np.bool_]


@dataclass(frozen=True)
class TableData:
    name: str
    n_rows: int
    columns: dict[str, ColumnData]


@dataclass(frozen=True)
class Dataset:
    """The data of every table of a model, by table name."""

    tables: dict[str, TableData]
