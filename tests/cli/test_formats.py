"""CSV, JSON and table output of hand-made result tables (invented data, no engine involved)."""

from __future__ import annotations

import datetime as dt
import io
import json
from decimal import Decimal

import numpy as np
from rich.console import Console

from measureport.cli.formats import csv_field, to_csv, to_json
from measureport.cli.tables import to_plain_table, to_rich_table
from measureport.cli.values import cell_text, display_text, json_value
from measureport.query import ResultTable

# Invented: rides and revenue by district and month, with a null district (the empty member).
DETAIL = ResultTable(
    by=("districts.name", "calendar.month"),
    measures=("rides", "revenue"),
    rows=[
        ("Docklands", "2025-03", 12, 30.5),
        ("Docklands", "2025-04", 3, None),
        (None, "2025-03", 1, 2.25),
    ],
    levels=[2, 2, 2],
)

# Invented: the same query with --totals; levels 2 = detail, 1 = subtotal per district, 0 = grand total.
WITH_TOTALS = ResultTable(
    by=("districts.name", "calendar.month"),
    measures=("rides",),
    rows=[
        ("Docklands", "2025-03", 12),
        ("Docklands", None, 12),
        (None, None, 12),
    ],
    levels=[2, 1, 0],
)


def test_cell_text_follows_the_number_rules() -> None:
    # LANGUAGE.md section 4 and the brief: integers without a point, floats in shortest repr.
    assert cell_text(7) == "7"
    assert cell_text(7.0) == "7.0"
    assert cell_text(0.1 + 0.2) == "0.30000000000000004"
    assert cell_text(None) == ""
    assert cell_text(True) == "true"
    assert cell_text(dt.date(2025, 3, 1)) == "2025-03-01"


def test_display_text_rounds_floats_for_people() -> None:
    # Tables show at most four decimals, trailing zeros dropped; tiny values keep three
    # significant digits so they do not read as zero. Integers and text are unchanged.
    assert display_text(0.3967035025285634) == "0.3967"
    assert display_text(3920.7599999999998) == "3920.76"
    assert display_text(60.0) == "60"
    assert display_text(-0.00004) == "-4e-05"
    assert display_text(0.0) == "0"
    assert display_text(123456789) == "123456789"
    assert display_text("0.39670350") == "0.39670350"


def test_engine_values_are_normalised() -> None:
    # numpy scalars and decimals that an engine might hand back print as the Python values would.
    assert cell_text(np.int64(5)) == "5"
    assert cell_text(np.float64(2.5)) == "2.5"
    assert cell_text(np.bool_(False)) == "false"
    assert cell_text(Decimal("12.50")) == "12.5"
    assert cell_text(Decimal("12")) == "12"


def test_csv_quotes_only_where_needed() -> None:
    assert csv_field("Old Town") == "Old Town"
    assert csv_field('Pier "7", north') == '"Pier ""7"", north"'
    # An empty text is not null: it is written as two quotes, null as nothing.
    assert csv_field("") == '""'
    assert csv_field(None) == ""


def test_csv_header_rows_and_nulls() -> None:
    assert to_csv(DETAIL) == (
        "districts.name,calendar.month,rides,revenue\n"
        "Docklands,2025-03,12,30.5\n"
        "Docklands,2025-04,3,\n"
        ",2025-03,1,2.25\n"
    )


def test_csv_totals_column_marks_rolled_up_rows() -> None:
    # docs/semantics-choices.md: rolled-up columns empty, last column `totals` says subtotal/total.
    assert to_csv(WITH_TOTALS, totals=True) == (
        "districts.name,calendar.month,rides,totals\n"
        "Docklands,2025-03,12,\n"
        "Docklands,,12,subtotal\n"
        ",,12,total\n"
    )


def test_csv_without_grouping_is_one_row() -> None:
    grand = ResultTable(by=(), measures=("rides",), rows=[(16,)], levels=[0])
    # With no --by the only level is 0 = len(by): a detail row, so no marker even with totals.
    assert to_csv(grand, totals=True) == "rides,totals\n16,\n"


def test_json_objects_in_column_order() -> None:
    text = to_json(DETAIL)
    records = json.loads(text)
    assert [list(r) for r in records] == [["districts.name", "calendar.month", "rides", "revenue"]] * 3
    assert records[1] == {"districts.name": "Docklands", "calendar.month": "2025-04", "rides": 3,
                          "revenue": None}
    assert records[2]["districts.name"] is None
    # Integers stay integers, floats stay floats.
    assert '"rides": 12,' in text and '"revenue": 30.5' in text


def test_json_dates_and_totals() -> None:
    result = ResultTable(
        by=("calendar.day",), measures=("rides",),
        rows=[(dt.date(2025, 3, 1), 4), (None, 4)], levels=[1, 0],
    )
    assert json.loads(to_json(result, totals=True)) == [
        {"calendar.day": "2025-03-01", "rides": 4, "totals": None},
        {"calendar.day": None, "rides": 4, "totals": "total"},
    ]


def test_json_value_of_a_non_finite_float_is_null() -> None:
    assert json_value(float("inf")) is None
    assert json_value(float("nan")) is None


def test_plain_table_aligns_and_marks_rolled_up_cells() -> None:
    # Text columns left-aligned, numbers right-aligned; null blank; rolled-up cells `(all)`.
    assert to_plain_table(WITH_TOTALS) == (
        "districts.name  calendar.month  rides\n"
        "--------------  --------------  -----\n"
        "Docklands       2025-03            12\n"
        "Docklands       (all)              12\n"
        "(all)           (all)              12\n"
    )


def test_plain_table_leaves_nulls_blank() -> None:
    lines = to_plain_table(DETAIL).splitlines()
    assert lines[0] == "districts.name  calendar.month  rides  revenue"
    assert lines[3] == "Docklands       2025-04             3"
    assert lines[4] == "                2025-03             1     2.25"


def test_rich_table_shows_rolled_up_cells() -> None:
    console = Console(file=io.StringIO(), width=80, color_system=None)
    console.print(to_rich_table(WITH_TOTALS, title="Rides by district"))
    text = console.file.getvalue()  # type: ignore[attr-defined]
    assert "Rides by district" in text
    assert text.count("(all)") == 3
    assert "Docklands" in text
