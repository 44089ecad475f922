"""The verify matrix as a self-contained HTML report: the matrix, then for each cell that did not
pass its reason, its SQL and, for a mismatch, the differing rows."""

from __future__ import annotations

import dataclasses
from pathlib import Path

from measureport.compare import comparison_sections
from measureport.report import Block, DataTable, Facts, Paragraph, Section, Tone, write_report
from measureport.verify.cells import Cell
from measureport.verify.checks import Check
from measureport.verify.runner import VerifyResult
from measureport.verify.targets import Target
from measureport.verify.text import matrix_table, summary_text


def _sentence(text: str) -> str:
    return text if text.endswith((".", "!", "?")) else text + "."


def _summary(result: VerifyResult, model: str) -> Section:
    verdict = "some cells do not agree" if result.failed else "every compared cell agrees"
    facts = [
        ("model", model),
        ("checks", str(len(result.checks))),
        ("engines", ", ".join(t.name for t in result.targets)),
        ("baseline", result.baseline),
        ("relative tolerance", f"{result.tolerance:g}"),
        ("cells", summary_text(result)),
    ]
    facts += [("not run", f"{u.name}: {u.reason}") for u in result.unavailable]
    blocks: list[Block] = [Paragraph(f"Result: {verdict}."), Facts(tuple(facts))]
    blocks += [Paragraph(_sentence(note[0].upper() + note[1:])) for note in result.notes]
    return Section("Summary", tuple(blocks), "bad" if result.failed else "good")


def _matrix(result: VerifyResult) -> Section:
    header, rows = matrix_table(result)
    legend = DataTable(
        ("engine", "how it computes"), tuple((t.name, t.describe()) for t in result.targets)
    )
    return Section("Matrix", (DataTable(header, tuple(rows)), legend))


def _cell_section(check: Check, target: Target, cell: Cell, baseline: str) -> list[Section]:
    where = f"{check.name} on {target.name}"
    tone: Tone = "bad" if cell.failed else "plain"
    blocks: list[Block] = [Facts((("check", check.name), ("engine", target.name), ("cell", cell.text())))]
    if cell.reason:
        blocks.append(Paragraph(_sentence(f"{cell.status.capitalize()}: {cell.reason}")))
    if cell.unsupported_measures:
        blocks.append(DataTable(("measure", "why it cannot be written"), cell.unsupported_measures))
    if cell.sql:
        blocks.append(DataTable(("SQL",), ((cell.sql,),)))
    sections = [Section(f"{cell.status.upper()}: {where}", tuple(blocks), tone)]
    if cell.status == "fail" and cell.comparison is not None:
        for part in comparison_sections(cell.comparison, baseline, target.name):
            sections.append(dataclasses.replace(part, heading=f"{where}: {part.heading}"))
    return sections


def verify_sections(result: VerifyResult, model: str) -> list[Section]:
    """The report's sections: summary, matrix, then one part per cell that failed, could not run
    or could not be written."""
    sections = [_summary(result, model), _matrix(result)]
    for i, check in enumerate(result.checks):
        for target in result.targets:
            cell = result.cell(i, target.name)
            if cell.status in ("fail", "error", "unsupported"):
                sections += _cell_section(check, target, cell, result.baseline)
    return sections


def write_verify_report(path: str | Path, result: VerifyResult, model: str) -> Path:
    """Write the report of ``result`` to ``path`` and return the path."""
    return write_report(path, f"Verify {model}", verify_sections(result, model))
