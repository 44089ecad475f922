"""Invented data for the real-engine tests.

``readings``: one table with a column of every model type and a row of nulls, for round trips.

    reading_id  dock_id             fee      temperature  note                    day         is_faulty
    1           9007199254740993    12.50    -3.25        say "hi", ok<newline>x  1969-12-31  true
    2           (null)              (null)   (null)       (null)                  (null)      (null)
    3           -5                  -0.01    1e300        (empty text)            2024-02-29  false

dock_id 9007199254740993 is 2**53 + 1, the first integer a double cannot hold: it survives only if
no engine passes it through a float. 1969-12-31 is the day before the Unix epoch, where a
timestamp-based conversion in a local time zone would slip a day.

``hires``: a tool-lending library (loans of tools, tools on shelves), for queries compiled from
measures; see :data:`LIBRARY_MEASURES`.
"""

from __future__ import annotations

import datetime as dt
from pathlib import Path
from typing import Any

import numpy as np

from measureport.language.parser import parse_measures
from measureport.model.schema import (
    BIGINT,
    BOOLEAN,
    DATE,
    DOUBLE,
    INTEGER,
    TEXT,
    Column,
    DataType,
    Model,
    Relationship,
    Table,
    decimal,
)
from measureport.model.tabledata import ColumnData, Dataset, TableData
from measureport.semantics.binder import bind_model
from measureport.semantics.bound import BoundModel

READING_TYPES: dict[str, DataType] = {
    "reading_id": INTEGER,
    "dock_id": BIGINT,
    "fee": decimal(12, 2),
    "temperature": DOUBLE,
    "note": TEXT,
    "day": DATE,
    "is_faulty": BOOLEAN,
}

READING_ROWS: list[tuple[Any, ...]] = [
    (1, 2**53 + 1, 12.5, -3.25, 'say "hi", ok\nx', dt.date(1969, 12, 31), True),
    (2, None, None, None, None, None, None),
    (3, -5, -0.01, 1e300, "", dt.date(2024, 2, 29), False),
]


def column_data(values: list[Any], data_type: DataType) -> ColumnData:
    """A column of the in-memory dataset, nulls masked, placeholders where null."""
    null = np.array([v is None for v in values], dtype=np.bool_)
    arr: np.ndarray[Any, Any]
    if data_type.kind == "date":
        arr = np.array([v or dt.date(1970, 1, 1) for v in values], dtype="datetime64[D]")
    elif data_type.sql in ("integer", "bigint"):
        arr = np.array([0 if v is None else v for v in values], dtype=np.int64)
    elif data_type.kind == "number":
        arr = np.array([0.0 if v is None else v for v in values], dtype=np.float64)
    elif data_type.kind == "boolean":
        arr = np.array([bool(v) for v in values], dtype=np.bool_)
    else:
        arr = np.array(["" if v is None else v for v in values], dtype=object)
    return ColumnData(arr, null)


def table_of(
    name: str, types: dict[str, DataType], rows: list[tuple[Any, ...]], key: str | None = None
) -> tuple[Table, TableData]:
    """A model table and its data from typed columns and rows of Python values."""
    table = Table(name, f"data/{name}.csv", {c: Column(c, t) for c, t in types.items()}, key)
    columns = {c: column_data([row[i] for row in rows], t) for i, (c, t) in enumerate(types.items())}
    return table, TableData(name, len(rows), columns)


def model_of(
    tables: list[tuple[Table, TableData]], relationships: tuple[Relationship, ...] = ()
) -> tuple[Model, Dataset]:
    model = Model("test", Path("model.yaml"), {t.name: t for t, _ in tables}, relationships, (), {})
    return model, Dataset({t.name: d for t, d in tables})


def readings() -> tuple[BoundModel, Dataset]:
    """The ``readings`` model (no measures) and its data."""
    model, dataset = model_of([table_of("readings", READING_TYPES, READING_ROWS)])
    return BoundModel(model, {}), dataset


# --- the tool library -------------------------------------------------------------------------
#
# loans (fact)                                     tools (dimension, key tool_id)
#   loan_id tool_id day         days  deposit        tool_id name         kind     electric
#   1       1       2025-03-01  2     10.00          1       drill        power    true
#   2       1       2025-03-02  1     10.00          2       ladder       access   false
#   3       2       2025-03-02  3     25.50          3       saw          power    true
#   4       3       2025-04-01  (nul) 7.25           4       Sander       power    true
#   5       9       2025-04-02  5     (null)       (tool 9 is not in tools: the empty member)
#   6       (null)  2025-04-02  1     4.00

LOAN_TYPES: dict[str, DataType] = {
    "loan_id": INTEGER,
    "tool_id": INTEGER,
    "day": DATE,
    "days": INTEGER,
    "deposit": decimal(8, 2),
}
LOAN_ROWS: list[tuple[Any, ...]] = [
    (1, 1, dt.date(2025, 3, 1), 2, 10.00),
    (2, 1, dt.date(2025, 3, 2), 1, 10.00),
    (3, 2, dt.date(2025, 3, 2), 3, 25.50),
    (4, 3, dt.date(2025, 4, 1), None, 7.25),
    (5, 9, dt.date(2025, 4, 2), 5, None),
    (6, None, dt.date(2025, 4, 2), 1, 4.00),
]
TOOL_TYPES: dict[str, DataType] = {"tool_id": INTEGER, "name": TEXT, "kind": TEXT, "electric": BOOLEAN}
TOOL_ROWS: list[tuple[Any, ...]] = [
    (1, "drill", "power", True),
    (2, "ladder", "access", False),
    (3, "saw", "power", True),
    (4, "Sander", "power", True),
]

LIBRARY_MEASURES = """\
measure loans = count(loans)
measure loan_days = sum(loans.days)
measure deposits = sum(loans.deposit)
measure mean_days = mean(loans.days)
measure days_per_loan = loan_days / loans
measure power_loans = loans given tools.kind = "power"
measure share_of_loans = loans / (loans given clear tools)
measure tools_lent = distinct(loans.tool_id)
measure s_tools = count(tools.name for each tools where tools.name like "s%")
"""


def library() -> tuple[BoundModel, Dataset]:
    """The tool-library model with :data:`LIBRARY_MEASURES` bound, and its data."""
    model, dataset = model_of(
        [table_of("loans", LOAN_TYPES, LOAN_ROWS), table_of("tools", TOOL_TYPES, TOOL_ROWS, key="tool_id")],
        (Relationship("loans", "tool_id", "tools", "tool_id"),),
    )
    return bind_model(model, [parse_measures(LIBRARY_MEASURES, "library.measures")]), dataset
