"""Engine values typed by column kind: what each engine hands back, as a ResultTable holds it.

The inputs are the values the drivers were seen to return (sqlite3, psycopg, pyspark, chdb,
datafusion); the expected outputs follow the rules in typed_rows' docstring.
"""

from __future__ import annotations

import datetime as dt
import decimal

import numpy as np
import pytest

from measureport.engines.typed_rows import result_kinds, table_kinds, typed_rows, typed_value
from measureport.query import Query
from realengines.samples import library, readings


@pytest.mark.parametrize(
    ("value", "kind", "expected"),
    [
        ("2024-02-29", "date", dt.date(2024, 2, 29)),  # SQLite stores dates as ISO text
        (dt.datetime(2025, 3, 1, 0, 0), "date", dt.date(2025, 3, 1)),  # month truncation's timestamp
        (dt.date(1969, 12, 31), "date", dt.date(1969, 12, 31)),
        (1, "boolean", True),  # SQLite stores booleans as 0/1
        (0, "boolean", False),
        (True, "boolean", True),
        (decimal.Decimal("15"), "number", 15),  # PostgreSQL's sum of integers is numeric
        (decimal.Decimal("12.50"), "number", 12.5),  # a decimal column's value
        (decimal.Decimal("12.00"), "number", 12.0),  # keeps its scale: a float, not the int 12
        (np.int64(7), "number", 7),
        (np.float64(0.5), "number", 0.5),
        ("drill", "text", "drill"),
        (None, "date", None),
        (None, "number", None),
    ],
)
def test_typed_value(value: object, kind: str, expected: object) -> None:
    got = typed_value(value, kind)  # type: ignore[arg-type]
    assert got == expected
    assert type(got) is type(expected)


def test_a_value_that_does_not_fit_its_kind_is_handed_on() -> None:
    # Left for the comparison to report, not forced into a date or a boolean.
    assert typed_value("not a day", "date") == "not a day"
    assert typed_value(2, "boolean") == 2


def test_unknown_kind_still_normalises_decimals_and_timestamps() -> None:
    rows = typed_rows([(decimal.Decimal("2.5"), dt.datetime(2025, 1, 2, 3, 4))], None)
    assert rows == [(2.5, dt.date(2025, 1, 2))]


def test_table_kinds_follow_model_order() -> None:
    bound, _ = readings()
    kinds = table_kinds(bound.model, "readings")
    assert kinds == ("number", "number", "number", "number", "text", "date", "boolean")


def test_result_kinds_are_grouping_columns_then_measures_then_the_level() -> None:
    from measureport.semantics.binder import build_query

    bound, _ = library()
    query: Query = build_query(bound, ["loans", "deposits"], ["tools.electric", "loans.day"], [], False)
    assert result_kinds(bound, query) == ("boolean", "date", "number", "number", "number")
    assert result_kinds(bound, query, level_column=False) == ("boolean", "date", "number", "number")
