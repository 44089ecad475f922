"""The model's tables as Arrow tables: one Arrow type per model type, nulls kept (invented data)."""

from __future__ import annotations

import datetime as dt
import decimal
from pathlib import Path

import pyarrow as pa
import pytest

from measureport.engines.loading import arrow_type, loadable_tables, table_to_arrow
from measureport.errors import MeasureportError
from measureport.model.loader import load_model
from measureport.model.schema import BIGINT, BOOLEAN, DATE, DOUBLE, INTEGER, TEXT
from measureport.model.schema import decimal as decimal_type
from realengines.samples import readings


@pytest.mark.parametrize(
    ("data_type", "expected"),
    [
        (INTEGER, pa.int64()),  # widened, as DuckDB reads integer
        (BIGINT, pa.int64()),
        (decimal_type(12, 2), pa.decimal128(12, 2)),
        (DOUBLE, pa.float64()),
        (TEXT, pa.string()),
        (DATE, pa.date32()),
        (BOOLEAN, pa.bool_()),
    ],
)
def test_arrow_type_per_model_type(data_type: object, expected: pa.DataType) -> None:
    assert arrow_type(data_type) == expected  # type: ignore[arg-type]


def test_dataset_table_converts_with_nulls_and_exact_decimals() -> None:
    bound, dataset = readings()
    table = table_to_arrow(bound.model.tables["readings"], dataset.tables["readings"])
    assert table.column("fee").to_pylist() == [decimal.Decimal("12.50"), None, decimal.Decimal("-0.01")]
    assert table.column("dock_id").to_pylist() == [9007199254740993, None, -5]
    assert table.column("day").to_pylist() == [dt.date(1969, 12, 31), None, dt.date(2024, 2, 29)]
    assert table.column("is_faulty").to_pylist() == [True, None, False]
    # The empty text of row 3 stays text; only row 2 is null.
    assert table.column("note").to_pylist() == ['say "hi", ok\nx', None, ""]
    assert table.column("note").null_count == 1


def test_tables_from_files_are_read_strictly(tmp_path: Path) -> None:
    (tmp_path / "data").mkdir()
    (tmp_path / "data" / "huts.csv").write_text("hut_id,rent,opened\n1,12.30,2025-06-01\n2,,\n")
    (tmp_path / "model.yaml").write_text(
        "name: lakeside\ntables:\n  huts:\n    from: data/huts.csv\n    key: hut_id\n"
        "    columns:\n      hut_id: integer\n      rent: decimal(6,2)\n      opened: date\n"
    )
    model = load_model(tmp_path / "model.yaml")
    tables = loadable_tables(model)
    assert tables["huts"].schema.types == [pa.int64(), pa.decimal128(6, 2), pa.date32()]
    assert tables["huts"].to_pylist() == [
        {"hut_id": 1, "rent": decimal.Decimal("12.30"), "opened": dt.date(2025, 6, 1)},
        {"hut_id": 2, "rent": None, "opened": None},
    ]


def test_a_duplicate_key_in_a_file_is_the_usual_error(tmp_path: Path) -> None:
    (tmp_path / "data").mkdir()
    (tmp_path / "data" / "huts.csv").write_text("hut_id,rent\n1,1.00\n1,2.00\n")
    (tmp_path / "model.yaml").write_text(
        "name: lakeside\ntables:\n  huts:\n    from: data/huts.csv\n    key: hut_id\n"
    )
    with pytest.raises(MeasureportError, match="duplicate values"):
        loadable_tables(load_model(tmp_path / "model.yaml"))


def test_only_tables_in_the_dataset_are_loaded() -> None:
    bound, dataset = readings()
    assert set(loadable_tables(bound.model, dataset)) == {"readings"}
