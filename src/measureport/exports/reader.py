"""Reading an export by its file name's extension: ``.csv``, ``.parquet`` or ``.json``."""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path

from measureport.errors import MeasureportError
from measureport.exports.csvfile import read_csv_export
from measureport.exports.jsonfile import read_json_export
from measureport.exports.parquetfile import read_parquet_export
from measureport.exports.table import ExportTable

READERS: dict[str, Callable[[Path], ExportTable]] = {
    ".csv": read_csv_export,
    ".parquet": read_parquet_export,
    ".json": read_json_export,
}


def read_export(path: str | Path) -> ExportTable:
    """The headers and rows of the export at ``path``, read as its extension says."""
    target = Path(path)
    reader = READERS.get(target.suffix.lower())
    if reader is None:
        raise MeasureportError(
            f"cannot tell the format of the export {target}: its name should end in "
            f"{', '.join(READERS)}"
        )
    return reader(target)
