"""Results for people: a rich table on a terminal, plain aligned text anywhere else."""

from __future__ import annotations

from rich.table import Table
from rich.text import Text

from measureport.cli.layout import ROLLED_UP, rolled_up, row_level
from measureport.cli.values import display_text, is_number
from measureport.query import ResultTable

_GAP = "  "


def _display_cells(result: ResultTable) -> list[list[str]]:
    return [
        [ROLLED_UP if rolled_up(result, i, j) else display_text(value) for j, value in enumerate(row)]
        for i, row in enumerate(result.rows)
    ]


def _numeric_columns(result: ResultTable) -> list[bool]:
    """A column is numeric (right-aligned) when it holds a number and nothing but numbers and nulls."""
    numeric = []
    for j in range(len(result.columns)):
        values = [row[j] for row in result.rows if row[j] is not None]
        numeric.append(bool(values) and all(is_number(v) for v in values))
    return numeric


def to_plain_table(result: ResultTable) -> str:
    """Columns padded to a common width, numbers right-aligned, a rule under the header; nulls blank,
    rolled-up cells ``(all)``."""
    header = list(result.columns)
    body = _display_cells(result)
    numeric = _numeric_columns(result)
    widths = [max(len(text) for text in column) for column in zip(header, *body, strict=True)]

    def line(cells: list[str]) -> str:
        padded = [
            text.rjust(width) if right else text.ljust(width)
            for text, width, right in zip(cells, widths, numeric, strict=True)
        ]
        return _GAP.join(padded).rstrip()

    lines = [line(header), _GAP.join("-" * width for width in widths)]
    lines.extend(line(cells) for cells in body)
    return "\n".join(lines) + "\n"


def to_rich_table(result: ResultTable, title: str | None = None) -> Table:
    """The result as a rich table: subtotal rows in bold, rolled-up cells as a dim ``(all)``."""
    table = Table(title=title, title_justify="left", header_style="bold")
    for name, right in zip(result.columns, _numeric_columns(result), strict=True):
        table.add_column(name, justify="right" if right else "left")
    for i, cells in enumerate(_display_cells(result)):
        rendered = [
            Text(text, style="dim italic") if rolled_up(result, i, j) else Text(text)
            for j, text in enumerate(cells)
        ]
        detail = row_level(result, i) >= len(result.by)
        table.add_row(*rendered, style=None if detail else "bold")
    return table
