"""A comparison as plain text: missing rows, extra rows, differing cells, then a summary."""

from __future__ import annotations

from collections.abc import Sequence

from measureport.compare.comparison import Comparison, UnmatchedRow
from measureport.compare.display import count_text, error_texts, key_cells, value_text

_GAP = "  "
_INDENT = "  "


def aligned(header: Sequence[str], rows: Sequence[Sequence[str]]) -> list[str]:
    """``header`` and ``rows`` padded to common column widths, indented, trailing spaces removed."""
    widths = [max(len(cell) for cell in column) for column in zip(header, *rows, strict=True)]
    return [
        (_INDENT + _GAP.join(cell.ljust(width) for cell, width in zip(line, widths, strict=True))).rstrip()
        for line in (header, *rows)
    ]


def _unmatched_lines(comparison: Comparison, rows: tuple[UnmatchedRow, ...]) -> list[str]:
    header = [*comparison.by, *comparison.measures]
    body = [[*key_cells(r.key, r.level), *(value_text(v) for v in r.values)] for r in rows]
    return aligned(header, body) if rows else []


def summary_text(comparison: Comparison, expected_name: str = "expected", actual_name: str = "actual") -> str:
    """One line: row counts on each side, what matched, what differs, and the tolerance."""
    c = comparison
    tolerance = f"relative tolerance {c.tolerance.relative:g}"
    if c.tolerance.absolute:
        tolerance += f", absolute {c.tolerance.absolute:g}"
    return (
        f"{count_text(c.expected_rows, expected_name + ' row')}, "
        f"{count_text(c.actual_rows, actual_name + ' row')}, {c.matched_rows} matched; "
        f"{len(c.missing)} missing, {len(c.extra)} extra, "
        f"{count_text(len(c.differences), 'differing cell')} in {count_text(c.differing_rows, 'row')}; "
        f"{tolerance}"
    )


def verdict_text(comparison: Comparison) -> str:
    """``equal`` or ``different``."""
    return "equal" if comparison.equal else "different"


def comparison_text(
    comparison: Comparison, expected_name: str = "expected", actual_name: str = "actual"
) -> str:
    """The whole comparison for a terminal or a log; ``expected_name`` and ``actual_name`` name the
    two sides (``export`` and ``translated`` for a diff, for example)."""
    c = comparison
    lines = [f"missing rows (in the {expected_name} result, not the {actual_name} one): {len(c.missing)}"]
    lines += _unmatched_lines(c, c.missing)
    lines.append(f"extra rows (in the {actual_name} result, not the {expected_name} one): {len(c.extra)}")
    lines += _unmatched_lines(c, c.extra)
    lines.append(f"differing cells: {len(c.differences)}")
    if c.differences:
        header = [*c.by, "measure", expected_name, actual_name, "absolute error", "relative error"]
        body = [
            [*key_cells(d.key, d.level), d.measure, value_text(d.expected), value_text(d.actual),
             *error_texts(d.error)]
            for d in c.differences
        ]
        lines += aligned(header, body)
    lines.append(f"summary: {summary_text(c, expected_name, actual_name)}")
    lines.append(f"result: {verdict_text(c)}")
    return "\n".join(lines) + "\n"
