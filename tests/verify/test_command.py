"""`measureport verify` and `measureport dialects` through the command line, on the bakery model
(bakery.py, invented data) and the test doubles of doubles.py."""

from __future__ import annotations

import html
import io
import sys
from pathlib import Path

import pytest

from measureport.dialects import profile_names
from measureport.verify import DEFAULT_REFERENCE_LIMIT
from verify.conftest import invoke
from verify.doubles import DROPS_FILTER


def test_all_agree_exits_0_with_the_matrix(bakery: Path) -> None:
    code, out, err = invoke("verify", bakery, "--engines", "reference,duckdb,sqlite,tsql")
    assert code == 0, out + err
    lines = out.splitlines()
    assert lines[0] == (
        f"verify {bakery}: 5 checks on 4 engines, compared with reference (relative tolerance 1e-09)"
    )
    assert lines[2].split() == ["check", "reference", "duckdb", "sqlite", "tsql"]
    assert lines[4].split() == ["view", "town_2026", "baseline", "pass", "pass", "pass"]
    assert "round-trip (written in the dialect, parsed back with sqlglot, run on DuckDB): tsql" in lines
    assert lines[-1] == "result: all compared cells agree (15 pass)"
    assert err == ""  # no progress bar when stderr is not a terminal


def test_a_mismatch_exits_1_and_the_report_names_the_cell(bakery: Path, tmp_path: Path) -> None:
    report = tmp_path / "verify.html"
    code, out, _ = invoke("verify", bakery, "--engines", f"duckdb,{DROPS_FILTER}", "--report", report)
    assert code == 1
    assert "view town_2026 on double-drops-year-filter:" in out
    assert "shops.town = Northfield: loaves is 90, expected 50" in out
    # 5 checks on duckdb and the double (the reference is the baseline): one cell fails.
    assert out.splitlines()[-2] == "result: FAILED (9 pass, 1 fail)"
    assert out.splitlines()[-1] == f"report written to {report}"
    page = html.unescape(report.read_text(encoding="utf-8"))
    assert "FAIL: view town_2026 on double-drops-year-filter" in page
    assert "view town_2026 on double-drops-year-filter: Differing cells: 3" in page
    # The differing row: Northfield's loaves, 50 by the reference, 90 without the year filter.
    row = page.split("view town_2026 on double-drops-year-filter: Differing cells")[1]
    assert "<td>Northfield</td><td>loaves</td>" in row
    assert '<td class="number">50</td><td class="number">90</td>' in row
    assert "SQL" in page and "LEFT JOIN" in page


def test_one_question_is_one_check(bakery: Path) -> None:
    code, out, _ = invoke("verify", bakery, "-m", "loaves", "--by", "shops.town", "--engines", "duckdb")
    assert code == 0
    assert "1 check on 2 engines" in out.splitlines()[0]
    assert out.splitlines()[4].split() == ["loaves", "by", "shops.town", "baseline", "pass"]


def test_the_reference_limit_is_said(bakery: Path) -> None:
    code, out, _ = invoke("verify", bakery, "--engines", "duckdb,sqlite", "--reference-limit", "3")
    assert code == 0
    assert "compared with duckdb" in out.splitlines()[0]
    assert (
        "the reference evaluator was skipped: the model's tables hold 12 rows, more than the limit of 3 "
        "(--reference-limit); results are compared with DuckDB"
    ) in out


def test_bad_input_exits_2(bakery: Path, tmp_path: Path) -> None:
    code, _, err = invoke("verify", bakery, "--engines", "duckdb,sqlit")
    assert code == 2 and "there is no engine or dialect named 'sqlit'" in err
    assert "did you mean 'sqlite'?" in err
    code, _, err = invoke("verify", bakery, "--tolerance", "-1")
    assert code == 2 and "--tolerance must be a relative tolerance of zero or more" in err
    code, _, err = invoke("verify", bakery, "--report", tmp_path / "no" / "such" / "r.html")
    assert code == 2 and "the folder for --report" in err
    code, _, err = invoke("verify", bakery, "-m", "crumbs", "--engines", "duckdb")
    assert code == 2 and "crumbs" in err and "Traceback" not in err


def test_the_command_line_default_limit_is_the_runners() -> None:
    from measureport.cli.verify import _REFERENCE_LIMIT

    assert _REFERENCE_LIMIT == DEFAULT_REFERENCE_LIMIT


def test_dialects_lists_every_profile_with_its_status() -> None:
    code, out, _ = invoke("dialects")
    assert code == 0
    lines = out.splitlines()
    assert lines[0].split() == ["dialect", "sqlglot", "engine", "status"]
    assert [line.split()[0] for line in lines[2:]] == list(profile_names())
    tsql = next(line for line in lines if line.startswith("tsql "))
    assert tsql.split()[1:4] == ["tsql", "roundtrip", "round-trip:"]
    duckdb = next(line for line in lines if line.startswith("duckdb "))
    assert duckdb.split()[1:] == ["duckdb", "duckdb", "runs", "here"]


def test_dialects_shows_the_quirks_of_one() -> None:
    code, out, _ = invoke("dialects", "sqlite")
    assert code == 0
    first = out.splitlines()[0]
    assert first == "SQLite (sqlite): rendered in sqlglot's sqlite dialect, run on the sqlite engine"
    assert any(line.split()[:3] == ["month_end_clamping", "rolls_over", "here"] for line in out.splitlines())
    code, out, _ = invoke("dialects", "tsql")
    null_ordering = next(line for line in out.splitlines() if line.startswith("null_ordering "))
    assert null_ordering.split()[1] == "emulated" and "not checked here" in null_ordering


def test_an_unknown_dialect_exits_2() -> None:
    code, _, err = invoke("dialects", "tsq")
    assert code == 2 and "there is no dialect named 'tsq'" in err and "did you mean 'tsql'?" in err


class _Terminal(io.StringIO):
    def isatty(self) -> bool:
        return True


def test_a_progress_bar_counts_the_cells_on_a_terminal(monkeypatch: pytest.MonkeyPatch) -> None:
    from measureport.cli.verify import _Bar, _progress

    monkeypatch.setattr(sys, "stderr", _Terminal())
    with _progress() as progress:
        assert isinstance(progress, _Bar)
        progress.start(3)
        progress.working("view town_2026 on tsql")
        progress.advance()
        progress.advance()
        task = progress.progress.tasks[0]
        assert (task.total, task.completed, task.description) == (3, 2, "view town_2026 on tsql")


def test_no_progress_bar_off_a_terminal(monkeypatch: pytest.MonkeyPatch) -> None:
    from measureport.cli.verify import _Bar, _progress

    monkeypatch.setattr(sys, "stderr", io.StringIO())
    with _progress() as progress:
        assert not isinstance(progress, _Bar)
