"""`measureport run` on the canal-hire model of conftest.py (invented data; every expected value
is worked out by hand from the table in conftest.py's docstring). Tests taking the ``engine``
fixture run once per registered engine: every engine must print the same thing."""

from __future__ import annotations

import json
from collections.abc import Callable
from pathlib import Path

import pytest
from click.testing import CliRunner

from measureport.cli.main import main
from measureport.workspace import engine_names

ModelWriter = Callable[..., Path]


def run(*args: str, engine: str | None = None) -> tuple[int, str, str]:
    engine_option = ["--engine", engine] if engine else []
    result = CliRunner().invoke(main, ["run", *args, *engine_option])
    return result.exit_code, result.stdout, result.stderr


# The command line's own behaviour is checked on the in-process engines; every other engine is
# compared with the reference in tests/realengines and by `verify`.
COMMAND_LINE_ENGINES = tuple(name for name in engine_names() if name in ("reference", "duckdb"))


@pytest.fixture(params=COMMAND_LINE_ENGINES)
def engine(request: pytest.FixtureRequest) -> str:
    name: str = request.param
    return name


def test_csv_by_a_dimension_column(canal_model: Path, engine: str) -> None:
    code, out, err = run(str(canal_model), "-m", "hires,hours", "--by", "boats.name", "--format", "csv",
                         engine=engine)
    assert (code, err) == (0, "")
    # Heron: hires 1, 2 (2 + 3 hours); Kingfisher: hires 3, 5 (1 hour, hire 5 has none);
    # the orphan hire 4 (4 hours) under the empty member, last (nulls last), as an empty field.
    assert out == "boats.name,hires,hours\nHeron,2,5\nKingfisher,2,1\n,1,4\n"


def test_csv_floats_and_a_ratio_measure(canal_model: Path, engine: str) -> None:
    code, out, _ = run(str(canal_model), "-m", "fee", "-m", "fee_per_hour", "--by", "boats.name",
                       "--format", "csv", engine=engine)
    assert code == 0
    # fee: Heron 30.5 + 45.0 = 75.5, Kingfisher 12.25, empty member 60.0;
    # fee_per_hour = fee / hours: 75.5 / 5 = 15.1, 12.25 / 1 = 12.25, 60.0 / 4 = 15.0.
    assert out == "boats.name,fee,fee_per_hour\nHeron,75.5,15.1\nKingfisher,12.25,12.25\n,60.0,15.0\n"


def test_header_keeps_the_by_columns_as_written(canal_model: Path, engine: str) -> None:
    code, out, _ = run(str(canal_model), "-m", "hires", "--by", " boats.kind ", "--format", "csv",
                       engine=engine)
    assert code == 0
    # dayboat = Kingfisher (2 hires), narrowboat = Heron (2), then the orphan.
    assert out == "boats.kind,hires\ndayboat,2\nnarrowboat,2\n,1\n"


def test_where_conditions_all_hold(canal_model: Path, engine: str) -> None:
    code, out, _ = run(str(canal_model), "-m", "hires,fee", "--where", 'boats.kind = "narrowboat"',
                       "--where", "hires.hours > 2", "--format", "csv", engine=engine)
    assert code == 0
    # Heron's hires are 1 (2 hours) and 2 (3 hours); only hire 2 has more than 2 hours: fee 45.0.
    assert out == "hires,fee\n1,45.0\n"


def test_csv_totals_are_marked(canal_model: Path, engine: str) -> None:
    code, out, _ = run(str(canal_model), "-m", "hires", "--by", "boats.kind,hires.day", "--totals",
                       "--format", "csv", engine=engine)
    assert code == 0
    # Detail cells: dayboat 05-01 hire 3, 05-02 hire 5; narrowboat 05-01 hire 1, 05-02 hire 2;
    # empty member 05-02 hire 4 (empty member on 05-01 has no hire: dropped). Subtotals per kind
    # follow their detail rows, the grand total (5 hires) last (docs/semantics-choices.md).
    assert out == (
        "boats.kind,hires.day,hires,totals\n"
        "dayboat,2025-05-01,1,\n"
        "dayboat,2025-05-02,1,\n"
        "dayboat,,2,subtotal\n"
        "narrowboat,2025-05-01,1,\n"
        "narrowboat,2025-05-02,1,\n"
        "narrowboat,,2,subtotal\n"
        ",2025-05-02,1,\n"
        ",,1,subtotal\n"
        ",,5,total\n"
    )


def test_json_with_totals(canal_model: Path, engine: str) -> None:
    code, out, _ = run(str(canal_model), "-m", "hires,hours", "--by", "boats.kind", "--totals",
                       "--format", "json", engine=engine)
    assert code == 0
    # hours: dayboat 1 (hire 3; hire 5 has none), narrowboat 2 + 3 = 5, orphan 4; total 10.
    assert json.loads(out) == [
        {"boats.kind": "dayboat", "hires": 2, "hours": 1, "totals": None},
        {"boats.kind": "narrowboat", "hires": 2, "hours": 5, "totals": None},
        {"boats.kind": None, "hires": 1, "hours": 4, "totals": None},
        {"boats.kind": None, "hires": 5, "hours": 10, "totals": "total"},
    ]


def test_json_dates_are_iso(canal_model: Path, engine: str) -> None:
    code, out, _ = run(str(canal_model), "-m", "hires", "--by", "hires.day", "--format", "json",
                       engine=engine)
    assert code == 0
    # 05-01: hires 1 and 3; 05-02: hires 2, 4, 5.
    assert json.loads(out) == [
        {"hires.day": "2025-05-01", "hires": 2},
        {"hires.day": "2025-05-02", "hires": 3},
    ]


def test_table_format_off_a_terminal_is_plain_text(canal_model: Path, engine: str) -> None:
    code, out, _ = run(str(canal_model), "-m", "hires,fee", "--by", "boats.name", engine=engine)
    assert code == 0
    # Same values as the csv tests; numbers right-aligned, the empty member's name blank; a
    # float is shown with at most four decimals, so 60.0 reads 60.
    assert out == (
        "boats.name  hires    fee\n"
        "----------  -----  -----\n"
        "Heron           2   75.5\n"
        "Kingfisher      2  12.25\n"
        "                1     60\n"
    )


def test_table_format_marks_rolled_up_cells(canal_model: Path, engine: str) -> None:
    code, out, _ = run(str(canal_model), "-m", "hires", "--by", "boats.kind", "--totals", engine=engine)
    assert code == 0
    assert out.splitlines()[-2:] == ["                1", "(all)           5"]


def test_unknown_measure_suggests_the_close_name(canal_model: Path) -> None:
    code, out, err = run(str(canal_model), "-m", "hires,hirse")
    assert code == 2
    assert out == ""
    assert "hirse" in err and "hires" in err
    assert "did you mean" in err
    assert "Traceback" not in err


def test_bad_where_is_located_in_the_option(canal_model: Path) -> None:
    code, _, err = run(str(canal_model), "-m", "hires", "--where", "boats.knd = 1")
    assert code == 2
    lines = err.splitlines()
    # The error names the --where text, quotes it and puts a caret under the unknown column.
    assert lines[0].startswith("<--where>:1:")
    assert "knd" in lines[0]
    assert lines[1] == "  boats.knd = 1"
    assert set(lines[2].strip()) == {"^"}
    assert "kind" in err
    assert "Traceback" not in err


def test_where_that_does_not_parse(canal_model: Path) -> None:
    code, _, err = run(str(canal_model), "-m", "hires", "--where", "boats.kind = = 1")
    assert code == 2
    assert err.startswith("<--where>:1:")
    assert "Traceback" not in err


def test_unknown_engine(canal_model: Path) -> None:
    code, _, err = run(str(canal_model), "-m", "hires", "--engine", "referenc")
    assert code == 2
    assert err == (
        f"error: there is no engine named 'referenc'; the engines are {_engine_list()}\n"
        "  hint: did you mean reference?\n"
    )


def _engine_list() -> str:
    from measureport.workspace import engine_names

    return ", ".join(engine_names())


def test_debug_shows_the_traceback_of_bad_input(canal_model: Path) -> None:
    result = CliRunner().invoke(main, ["--debug", "run", str(canal_model), "-m", "hirse"])
    assert result.exit_code == 2
    assert "Traceback (most recent call last)" in result.stderr
    assert "MeasureportError" in result.stderr


def test_a_measure_named_totals_cannot_sit_beside_the_totals_column(model_writer: ModelWriter) -> None:
    model = model_writer(measures="measure totals = count(hires)\n")
    code, out, err = run(str(model), "-m", "totals", "--totals", "--format", "csv")
    assert (code, out) == (2, "")
    assert err.startswith("error: with --totals the csv output has a column named totals")
    # Without --totals it is an ordinary measure: five hires.
    assert run(str(model), "-m", "totals", "--format", "csv")[:2] == (0, "totals\n5\n")
