"""`measureport check` and the errors in model and measure files (invented canal-hire model)."""

from __future__ import annotations

import re
from collections.abc import Callable
from pathlib import Path

from click.testing import CliRunner

from measureport.cli.main import main

ModelWriter = Callable[..., Path]


def check(model: Path) -> tuple[int, str, str]:
    result = CliRunner().invoke(main, ["check", str(model)])
    return result.exit_code, result.stdout, result.stderr


def test_check_reports_model_and_data(canal_model: Path) -> None:
    code, out, err = check(canal_model)
    assert code == 0
    assert err == ""
    lines = out.splitlines()
    assert lines[0] == f"model canal-hires ({canal_model}): 2 tables, 1 relationship, 4 measures, 0 views"
    # Five hires, two boats; hire 4's boat 3 is not found (one orphan).
    assert "  hires: 5 rows" in lines
    assert "  boats: 2 rows" in lines
    orphan_line = next(line for line in lines if "hires.boat_id -> boats.boat_id" in line)
    assert "1 of 5" in orphan_line
    assert lines[-1] == "no errors, 0 warnings, 1 relationship with orphan rows"


def test_lint_warnings_do_not_fail_the_check(model_writer: ModelWriter, canal_measures: str) -> None:
    # LANGUAGE.md rule 1: a bare aggregate inside `for each` gives the same value on every row.
    lint_line = "measure flat = sum(count(hires) for each boats)"
    model = model_writer(measures=canal_measures + lint_line + "\n")
    code, out, err = check(model)
    assert code == 0
    measures_file = model.parent / "hires.measures"
    line_number = canal_measures.count("\n") + 1
    # The warning is located in the measure file, at the bare aggregate `count(hires)`.
    assert err.startswith(f"{measures_file}:{line_number}:{lint_line.index('count') + 1}: warning: ")
    assert lint_line in err
    assert out.splitlines()[-1] == "no errors, 1 warning, 1 relationship with orphan rows"


def test_bad_yaml_is_exit_2_with_its_place(model_writer: ModelWriter, canal_yaml: str) -> None:
    # An unclosed flow sequence on line 4 ("    from: [data/hires.csv").
    broken = canal_yaml.replace("from: data/hires.csv", "from: [data/hires.csv")
    model = model_writer(model_yaml=broken)
    code, out, err = check(model)
    assert code == 2
    assert out == ""
    assert re.match(rf"{re.escape(str(model))}:\d+:\d+: error: ", err)
    assert "Traceback" not in err


def test_bad_measure_syntax_shows_the_line_and_a_caret(
    model_writer: ModelWriter, canal_measures: str
) -> None:
    bad_line = "measure fee = sum(hires.fee) * * 2"
    model = model_writer(measures=canal_measures.replace("measure fee = sum(hires.fee)", bad_line))
    code, out, err = check(model)
    assert code == 2
    assert out == ""
    lines = err.splitlines()
    measures_file = model.parent / "hires.measures"
    # `measure fee` is line 5 of the file; the second `*` (column 32) cannot start an operand.
    second_star = bad_line.index("* *") + 3
    assert lines[0].startswith(f"{measures_file}:5:{second_star}: error: ")
    assert lines[1] == f"  {bad_line}"
    assert lines[2] == "  " + " " * (second_star - 1) + "^"
    assert "Traceback" not in err


def test_measure_cycle_is_an_error(model_writer: ModelWriter) -> None:
    model = model_writer(measures="measure a = b + 1\nmeasure b = a * 2\n")
    code, _, err = check(model)
    assert code == 2
    assert "cycle" in err
    assert "a -> b -> a" in err
