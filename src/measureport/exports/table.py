"""An export as read from its file: headers and rows of raw cells, each with the place it came from."""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path

from measureport.errors import Span


@dataclass(frozen=True)
class ExportRow:
    """One data row: ``number`` counts data rows from 1 (the header is not a row); ``cells`` holds
    text for CSV and typed values (numbers, text, dates, booleans, None) for Parquet and JSON;
    ``spans[i]`` is where cell ``i`` sits in the file."""

    number: int
    cells: tuple[object, ...]
    spans: tuple[Span, ...]


@dataclass(frozen=True)
class ExportTable:
    """A whole export: ``fmt`` is ``csv``, ``parquet`` or ``json``."""

    path: Path
    fmt: str
    headers: tuple[str, ...]
    header_spans: tuple[Span, ...]
    rows: tuple[ExportRow, ...]

    @property
    def source(self) -> str:
        """The file name used in error locations."""
        return str(self.path)
