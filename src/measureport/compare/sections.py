"""A comparison as report sections: missing rows, extra rows, differing cells, then a summary."""

from __future__ import annotations

from measureport.compare.comparison import Comparison, UnmatchedRow
from measureport.compare.display import count_text, error_texts, key_cells, value_text
from measureport.compare.text import summary_text, verdict_text
from measureport.compare.values import canonical, number_of
from measureport.report.document import Block, DataTable, Facts, Paragraph, Section, Tone


def _is_number(value: object) -> bool:
    return number_of(canonical(value)) is not None


def _unmatched(heading: str, comparison: Comparison, rows: tuple[UnmatchedRow, ...]) -> Section:
    if not rows:
        return Section(f"{heading}: none", (Paragraph("None."),), "good")
    width = len(comparison.by)
    numeric = (False,) * width + tuple(
        all(_is_number(r.values[i]) or r.values[i] is None for r in rows)
        for i in range(len(comparison.measures))
    )
    table = DataTable(
        (*comparison.by, *comparison.measures),
        tuple((*key_cells(r.key, r.level), *(value_text(v) for v in r.values)) for r in rows),
        numeric,
    )
    return Section(f"{heading}: {len(rows)}", (table,), "bad")


def _differences(comparison: Comparison, expected_name: str, actual_name: str) -> Section:
    c = comparison
    if not c.differences:
        return Section("Differing cells: none", (Paragraph("None."),), "good")
    table = DataTable(
        (*c.by, "measure", expected_name, actual_name, "absolute error", "relative error"),
        tuple(
            (*key_cells(d.key, d.level), d.measure, value_text(d.expected), value_text(d.actual),
             *error_texts(d.error))
            for d in c.differences
        ),
        (False,) * (len(c.by) + 1) + (True,) * 4,
    )
    return Section(f"Differing cells: {len(c.differences)}", (table,), "bad")


def comparison_sections(
    comparison: Comparison,
    expected_name: str = "expected",
    actual_name: str = "actual",
    about: tuple[tuple[str, str], ...] = (),
) -> list[Section]:
    """The sections of a comparison report, named for the two sides; ``about`` (label and value
    pairs, such as the model and the files compared) opens the summary."""
    c = comparison
    tone: Tone = "good" if c.equal else "bad"
    summary: list[Block] = [
        Paragraph(f"Result: {verdict_text(c)}. {summary_text(c, expected_name, actual_name)}."),
        Facts(
            (
                *about,
                (f"{expected_name} rows", str(c.expected_rows)),
                (f"{actual_name} rows", str(c.actual_rows)),
                ("matched rows", str(c.matched_rows)),
                ("missing rows", str(len(c.missing))),
                ("extra rows", str(len(c.extra))),
                ("differing cells", f"{len(c.differences)} in {count_text(c.differing_rows, 'row')}"),
                ("relative tolerance", f"{c.tolerance.relative:g}"),
            )
        ),
    ]
    return [
        _unmatched(f"Missing rows (in the {expected_name} result, not the {actual_name} one)", c, c.missing),
        _unmatched(f"Extra rows (in the {actual_name} result, not the {expected_name} one)", c, c.extra),
        _differences(c, expected_name, actual_name),
        Section("Summary", tuple(summary), tone),
    ]
