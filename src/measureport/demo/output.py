"""Writing a demo table to CSV or Parquet, byte for byte the same for the same table."""

from __future__ import annotations

from pathlib import Path
from typing import Literal

import pyarrow as pa
import pyarrow.csv as pacsv
import pyarrow.parquet as pq

from measureport.errors import MeasureportError

DataFormat = Literal["csv", "parquet"]
FORMATS: tuple[DataFormat, ...] = ("csv", "parquet")


def data_format(fmt: str) -> DataFormat:
    """``fmt`` checked to be ``csv`` or ``parquet``."""
    if fmt == "csv":
        return "csv"
    if fmt == "parquet":
        return "parquet"
    raise MeasureportError(f"the demo data can be written as csv or parquet, not '{fmt}'")


def data_file_name(table: str, fmt: DataFormat) -> str:
    """The file name a table is written to: ``rides.csv``, ``rides.parquet``."""
    return f"{table}.{fmt}"


def write_table(table: pa.Table, path: Path, fmt: DataFormat) -> None:
    """Write ``table`` to ``path``: CSV with a header line, nulls as empty fields, or Parquet."""
    if fmt == "parquet":
        pq.write_table(table, path, compression="zstd")
        return
    with path.open("wb") as sink:
        # The demo's texts hold no commas, quotes or line breaks, so nothing needs quoting.
        sink.write((",".join(table.column_names) + "\n").encode("utf-8"))
        options = pacsv.WriteOptions(include_header=False, quoting_style="none")
        pacsv.write_csv(table, sink, options)
