"""What a report holds: titled sections of paragraphs, label-value facts and tables of text cells.

Callers format every value into text first, so the HTML writer has only text to escape and lay out.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Literal

Tone = Literal["plain", "good", "bad"]


@dataclass(frozen=True)
class Paragraph:
    """A sentence or two of text."""

    text: str


@dataclass(frozen=True)
class Facts:
    """Label and value pairs, shown as a two-column list."""

    items: tuple[tuple[str, str], ...]


@dataclass(frozen=True)
class DataTable:
    """A table of text cells under a header; ``numeric[i]`` right-aligns column ``i``."""

    columns: tuple[str, ...]
    rows: tuple[tuple[str, ...], ...]
    numeric: tuple[bool, ...] = ()

    def __post_init__(self) -> None:
        for row in self.rows:
            if len(row) != len(self.columns):
                raise ValueError(f"a row of {len(row)} cells in a table of {len(self.columns)} columns")
        if self.numeric and len(self.numeric) != len(self.columns):
            raise ValueError("numeric needs one flag per column")


Block = Paragraph | Facts | DataTable


@dataclass(frozen=True)
class Section:
    """A heading and its blocks; ``tone`` colours the heading (``good`` for agreement, ``bad`` for a
    problem)."""

    heading: str
    blocks: tuple[Block, ...] = ()
    tone: Tone = "plain"
