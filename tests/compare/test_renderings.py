"""The text and HTML renderings of a comparison, and the self-contained report writer
(invented values; the expected texts are written out by hand)."""

from __future__ import annotations

import re
from pathlib import Path

import pytest

from measureport.compare import compare_results, comparison_sections, comparison_text
from measureport.query import ResultTable
from measureport.report import DataTable, Facts, Paragraph, Section, render_report, write_report

BY = ("tools.name",)
MEASURES = ("loans", "fees")


def differing_pair() -> tuple[ResultTable, ResultTable]:
    expected = ResultTable(BY, MEASURES, [("Drill", 4, 15.75), ("Sander", 1, 12.5), (None, 1, 1.75)])
    actual = ResultTable(BY, MEASURES, [("Drill", 4, 16.0), ("Ladder", 2, None), (None, 1, 1.75)])
    return expected, actual


def test_text_lists_missing_extra_differing_then_summary() -> None:
    text = comparison_text(compare_results(*differing_pair()), "export", "translated")
    assert text == (
        "missing rows (in the export result, not the translated one): 1\n"
        "  tools.name  loans  fees\n"
        "  Sander      1      12.5\n"
        "extra rows (in the translated result, not the export one): 1\n"
        "  tools.name  loans  fees\n"
        "  Ladder      2      null\n"
        "differing cells: 1\n"
        "  tools.name  measure  export  translated  absolute error  relative error\n"
        # |16.0 - 15.75| = 0.25, and 0.25 / 15.75 = 0.015873... (three digits: 0.0159).
        "  Drill       fees     15.75   16.0        0.25            0.0159\n"
        "summary: 3 export rows, 3 translated rows, 2 matched; 1 missing, 1 extra, 1 differing cell in "
        "1 row; relative tolerance 1e-09\n"
        "result: different\n"
    )


def test_text_of_equal_results() -> None:
    expected, _ = differing_pair()
    text = comparison_text(compare_results(expected, expected))
    assert text.splitlines()[-1] == "result: equal"
    assert "differing cells: 0" in text


def test_text_marks_the_empty_member_and_rolled_up_cells() -> None:
    expected = ResultTable(BY, ("loans",), [(None, 1), (None, 8)], [1, 0])
    actual = ResultTable(BY, ("loans",), [], [])
    text = comparison_text(compare_results(expected, actual))
    assert "  (empty)     1\n" in text
    assert "  (all)       8\n" in text


def test_sections_name_each_kind_of_difference() -> None:
    sections = comparison_sections(compare_results(*differing_pair()), "export", "translated",
                                   (("model", "library.yaml"),))
    headings = [s.heading for s in sections]
    assert headings == [
        "Missing rows (in the export result, not the translated one): 1",
        "Extra rows (in the translated result, not the export one): 1",
        "Differing cells: 1",
        "Summary",
    ]
    differing = sections[2].blocks[0]
    assert isinstance(differing, DataTable)
    assert differing.rows == (("Drill", "fees", "15.75", "16.0", "0.25", "0.0159"),)
    summary_facts = sections[3].blocks[1]
    assert isinstance(summary_facts, Facts)
    assert summary_facts.items[0] == ("model", "library.yaml")
    assert sections[3].tone == "bad"


def test_report_is_self_contained_and_escaped(tmp_path: Path) -> None:
    hostile = '<script>alert("x")</script> & co'
    sections = [
        Section("Rows & cells", (Paragraph(hostile), Facts(((hostile, "v"),)),
                                 DataTable(("name", "n"), ((hostile, "1"),), (False, True))), "bad"),
    ]
    path = write_report(tmp_path / "report.html", "Diff <of> loans", sections)
    page = path.read_text(encoding="utf-8")
    assert page.startswith("<!DOCTYPE html>")
    assert "<script" not in page
    assert "&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; co" in page
    assert "<title>Diff &lt;of&gt; loans</title>" in page
    assert "<h2>Rows &amp; cells</h2>" in page
    assert '<td class="number">1</td>' in page
    # Nothing is fetched from elsewhere: no links, no sources, no URLs.
    assert not re.search(r"<link|\bsrc=|\bhref=|https?:|url\(|@import", page)
    assert "<style>" in page


def test_report_of_a_comparison_names_every_part() -> None:
    comparison = compare_results(*differing_pair())
    page = render_report("diff", comparison_sections(comparison, "export", "translated"))
    for text in ("Missing rows", "Sander", "Extra rows", "Ladder", "Differing cells", "Drill", "0.0159",
                 "Summary", "Result: different"):
        assert text in page
    # The order of the sections: missing, extra, differing, summary.
    positions = [page.index(t) for t in ("Missing rows", "Extra rows", "Differing cells", "Summary")]
    assert positions == sorted(positions)


def test_a_table_row_must_fit_its_columns() -> None:
    with pytest.raises(ValueError):
        DataTable(("a", "b"), (("1",),))
