"""The verify matrix as plain text: one row per check, one column per engine, then what went wrong."""

from __future__ import annotations

from measureport.compare.display import count_text, key_text, value_text
from measureport.verify.cells import Cell, CellStatus
from measureport.verify.runner import VerifyResult

_GAP = "  "
#: How long a reason may be in the terminal text (the HTML report has it whole).
REASON_WIDTH = 200
#: How many differing cells of a failed check the text names (the HTML report has them all).
SHOWN_DIFFERENCES = 3


def matrix_table(result: VerifyResult) -> tuple[tuple[str, ...], list[tuple[str, ...]]]:
    """The header (``check`` and each target's name) and one row of cell texts per check."""
    header = ("check", *(t.name for t in result.targets))
    rows = [
        (check.name, *(result.cell(i, t.name).text() for t in result.targets))
        for i, check in enumerate(result.checks)
    ]
    return header, rows


def aligned_lines(header: tuple[str, ...], rows: list[tuple[str, ...]]) -> list[str]:
    """The table padded to common column widths, a rule under the header."""
    widths = [max(len(cell) for cell in column) for column in zip(header, *rows, strict=True)]

    def line(cells: tuple[str, ...]) -> str:
        return _GAP.join(cell.ljust(width) for cell, width in zip(cells, widths, strict=True)).rstrip()

    return [line(header), _GAP.join("-" * w for w in widths), *(line(r) for r in rows)]


def shortened(text: str, width: int = REASON_WIDTH) -> str:
    """``text`` cut to ``width`` characters, with an ellipsis when it was longer."""
    return text if len(text) <= width else text[: width - 1].rstrip() + "…"


def timing_text(result: VerifyResult) -> str:
    """``time: reference 1.2 s, duckdb 0.3 s, ...`` (starting the engine included)."""
    said = [f"{t.name} {result.seconds[t.name]:.1f} s" for t in result.targets if t.name in result.seconds]
    return "time: " + ", ".join(said)


def cell_detail(cell: Cell) -> list[str]:
    """What a cell that is not a plain pass has to say, one line each."""
    lines: list[str] = []
    if cell.status in ("unsupported", "error", "skipped") and cell.reason:
        lines.append(shortened(f"{cell.status}: {cell.reason}"))
    for name, why in cell.unsupported_measures:
        lines.append(shortened(f"measure {name} cannot be written: {why}"))
    comparison = cell.comparison
    if cell.status == "fail" and comparison is not None:
        lines.append(
            f"{len(comparison.missing)} missing rows, {len(comparison.extra)} extra rows, "
            f"{len(comparison.differences)} differing cells"
        )
        for d in comparison.differences[:SHOWN_DIFFERENCES]:
            lines.append(
                f"{key_text(comparison.by, d.key, d.level)}: {d.measure} is {value_text(d.actual)}, "
                f"expected {value_text(d.expected)}"
            )
        for row in comparison.missing[:SHOWN_DIFFERENCES]:
            lines.append(f"missing row {key_text(comparison.by, row.key, row.level)}")
        for row in comparison.extra[:SHOWN_DIFFERENCES]:
            lines.append(f"extra row {key_text(comparison.by, row.key, row.level)}")
    return lines


def summary_text(result: VerifyResult) -> str:
    """``12 pass, 1 fail, 2 unsupported`` over every compared cell."""
    counts = result.counts()
    order: tuple[CellStatus, ...] = ("pass", "fail", "error", "unsupported", "skipped")
    said = [f"{counts[s]} {'errors' if s == 'error' and counts[s] != 1 else s}" for s in order if counts[s]]
    return ", ".join(said) or "nothing compared"


def verify_text(result: VerifyResult, model: str) -> str:
    """The whole verify output: the matrix, notes on the cells that did not pass, the engines
    that did not run, and the verdict."""
    header, rows = matrix_table(result)
    lines = [
        f"verify {model}: {count_text(len(result.checks), 'check')} on "
        f"{count_text(len(result.targets), 'engine')}, "
        f"compared with {result.baseline} (relative tolerance {result.tolerance:g})",
        "",
        *aligned_lines(header, rows),
    ]
    details: list[str] = []
    for i, check in enumerate(result.checks):
        for target in result.targets:
            said = cell_detail(result.cell(i, target.name))
            if said:
                details.append(f"{check.name} on {target.name}:")
                details += [f"  {line}" for line in said]
    if details:
        lines += ["", *details]
    roundtrips = [t.name for t in result.targets if t.kind == "roundtrip"]
    notes = list(result.notes)
    if roundtrips:
        notes.append(
            "round-trip (written in the dialect, parsed back with sqlglot, run on DuckDB): "
            + ", ".join(roundtrips)
        )
    notes += [f"not run: {u.name} ({u.reason})" for u in result.unavailable]
    if result.seconds:
        notes.append(timing_text(result))
    if notes:
        lines += ["", *notes]
    verdict = "FAILED" if result.failed else "all compared cells agree"
    lines += ["", f"result: {verdict} ({summary_text(result)})"]
    return "\n".join(lines) + "\n"
