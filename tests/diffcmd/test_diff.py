"""`measureport diff` end to end on the tool-library model of conftest.py (invented data and
invented exports; every expected value is worked out by hand from the tables in conftest.py's
docstring). Tests taking ``engine`` run on the reference evaluator and on DuckDB."""

from __future__ import annotations

import datetime as dt
import json
from collections.abc import Callable
from decimal import Decimal
from pathlib import Path

import pyarrow as pa
import pyarrow.parquet as pq
import pytest
from click.testing import CliRunner

from measureport.cli.main import main

ExportWriter = Callable[[str, str], Path]

RIGHT_CSV = """\
tools.name,loans,fees
Drill,4,15.75
Sander,1,12.5
Scaffold tower,2,"1,230.25"
,1,1.75
"""


def diff(model: Path, export: Path, *options: str, measures: str = "loans,fees",
         by: str = "tools.name") -> tuple[int, str, str]:
    args = ["diff", str(model), "-m", measures, "--expected", str(export), *options]
    if by:
        args += ["--by", by]
    result = CliRunner().invoke(main, args)
    return result.exit_code, result.stdout, result.stderr


@pytest.fixture(params=["reference", "duckdb"])
def engine(request: pytest.FixtureRequest) -> str:
    name: str = request.param
    return name


def test_a_right_csv_export(library_model: Path, export_file: ExportWriter, engine: str) -> None:
    code, out, err = diff(library_model, export_file("right.csv", RIGHT_CSV), "--engine", engine)
    assert (code, err) == (0, "")
    assert out.splitlines()[-1] == "result: equal"
    assert "summary: 4 export rows, 4 translated rows, 4 matched; 0 missing, 0 extra" in out


def test_a_right_parquet_export(library_model: Path, tmp_path: Path, engine: str) -> None:
    path = tmp_path / "right.parquet"
    pq.write_table(pa.table({
        "tools.name": pa.array(["Drill", "Sander", "Scaffold tower", None]),
        "loans": pa.array([4, 1, 2, 1], pa.int32()),
        "fees": pa.array([Decimal("15.75"), Decimal("12.50"), Decimal("1230.25"), Decimal("1.75")],
                         pa.decimal128(8, 2)),
    }), path)
    code, out, _ = diff(library_model, path, "--engine", engine)
    assert code == 0, out


def test_a_right_json_export_with_mapped_headers(library_model: Path, export_file: ExportWriter) -> None:
    records = [
        {"Tool": "Drill", "Loans": 4, "Fees": 15.75},
        {"Tool": "Sander", "Loans": 1, "Fees": 12.5},
        {"Tool": "Scaffold tower", "Loans": 2, "Fees": "1,230.25"},
        {"Tool": None, "Loans": 1, "Fees": 1.75},
    ]
    path = export_file("right.json", json.dumps(records))
    code, out, _ = diff(library_model, path, "--map", "Tool=tools.name", "--map", "Loans=loans",
                        "--map", "Fees=fees")
    assert code == 0, out


def test_a_wrong_cell(library_model: Path, export_file: ExportWriter, engine: str) -> None:
    export = export_file("wrong.csv", RIGHT_CSV.replace("Drill,4,15.75", "Drill,4,15.00"))
    code, out, _ = diff(library_model, export, "--engine", engine)
    assert code == 1
    # Translated Drill fees 15.75 against 15.00: absolute error 0.75, relative 0.75 / 15 = 0.05.
    assert "  Drill       fees     15.0    15.75       0.75            0.05\n" in out
    assert "1 differing cell in 1 row" in out
    assert out.splitlines()[-1] == "result: different"


def test_a_row_the_translation_lacks(library_model: Path, export_file: ExportWriter) -> None:
    export = export_file("missing.csv", RIGHT_CSV + "Hammer,3,9.0\n")
    code, out, _ = diff(library_model, export)
    assert code == 1
    assert "missing rows (in the export result, not the translated one): 1\n" in out
    assert "  Hammer      3      9.0\n" in out


def test_a_row_the_export_lacks(library_model: Path, export_file: ExportWriter) -> None:
    export = export_file("extra.csv", RIGHT_CSV.replace("Sander,1,12.5\n", ""))
    code, out, _ = diff(library_model, export)
    assert code == 1
    assert "extra rows (in the translated result, not the export one): 1\n" in out
    assert "  Sander      1      12.5\n" in out


def test_a_key_of_the_wrong_type(library_model: Path, export_file: ExportWriter) -> None:
    # tools.tool_id holds numbers; this export writes tool names in its column.
    export = export_file("key.csv", "tools.tool_id,loans\n1,4\nSander,1\n")
    code, out, err = diff(library_model, export, measures="loans", by="tools.tool_id")
    assert (code, out) == (2, "")
    assert f"{export}:3:1: error: the grouping column tools.tool_id holds numbers, but row 2 of the " \
           "export has 'Sander' in column 'tools.tool_id', which is not a number" in err
    # The line and a caret under the value.
    assert "  Sander,1\n  ^^^^^^\n" in err
    assert "Traceback" not in err


def test_an_unknown_header(library_model: Path, export_file: ExportWriter) -> None:
    export = export_file("header.csv", RIGHT_CSV.replace("tools.name,loans,fees", "tools.name,loans,fee"))
    code, _, err = diff(library_model, export)
    assert code == 2
    assert "the export column 'fee' is neither a grouping column of --by nor a measure of -m" in err
    assert "hint: did you mean fees?" in err


def test_an_unparseable_number(library_model: Path, export_file: ExportWriter) -> None:
    export = export_file("number.csv", RIGHT_CSV.replace("Sander,1,12.5", "Sander,1,12.5.0"))
    code, _, err = diff(library_model, export)
    assert code == 2
    assert f"{export}:3:10: error: row 2 of the export has '12.5.0' in column 'fees' (measure fees), " \
           "which is not a number" in err


def test_duplicate_keys(library_model: Path, export_file: ExportWriter) -> None:
    export = export_file("twice.csv", RIGHT_CSV + "Drill,4,15.75\n")
    code, _, err = diff(library_model, export)
    assert code == 2
    assert "rows 1 and 5 of the export have the same grouping values (tools.name = Drill)" in err


def test_decimal_commas_and_semicolons(library_model: Path, export_file: ExportWriter) -> None:
    text = 'tools.name;loans;fees\nDrill;4;15,75\nSander;1;12,50\nScaffold tower;2;"1.230,25"\n;1;1,75\n'
    export = export_file("comma.csv", text)
    assert diff(library_model, export, "--decimal-comma")[0] == 0
    # Without the option the comma values do not read as numbers; the hint says why.
    code, _, err = diff(library_model, export)
    assert code == 2
    assert "add --decimal-comma" in err


def test_percentages(library_model: Path, export_file: ExportWriter) -> None:
    # loan_share: Drill 4 / 8 = 50%, Sander 1 / 8 = 12.5%, Scaffold tower 2 / 8 = 25%, empty 12.5%.
    right = "tools.name,loan_share\nDrill,50%\nSander,12.5%\nScaffold tower,25.00%\n(blank),12.5%\n"
    assert diff(library_model, export_file("share.csv", right), measures="loan_share")[0] == 0
    wrong = right.replace("25.00%", "20%")
    code, out, _ = diff(library_model, export_file("share_wrong.csv", wrong), measures="loan_share")
    assert code == 1
    # 0.25 against 0.2: absolute error 0.05, relative 0.05 / 0.2 = 0.25.
    assert "Scaffold tower  loan_share  0.2     0.25        0.05            0.25" in out


def test_dates_iso_and_in_a_format(library_model: Path, export_file: ExportWriter, engine: str) -> None:
    # By loans.day: 03-01 3 loans, 03-02 3 loans, 03-03 2 loans.
    iso = "loans.day,loans\n2025-03-01,3\n2025-03-02,3\n2025-03-03,2\n"
    assert diff(library_model, export_file("iso.csv", iso), "--engine", engine, measures="loans",
                by="loans.day")[0] == 0
    written = "loans.day,loans\n01/03/2025,3\n02/03/2025,3\n03/03/2025,2\n"
    export = export_file("written.csv", written)
    assert diff(library_model, export, "--date-format", "%d/%m/%Y", "--engine", engine, measures="loans",
                by="loans.day")[0] == 0
    code, _, err = diff(library_model, export, measures="loans", by="loans.day")
    assert code == 2
    assert "is not a date in ISO form (YYYY-MM-DD)" in err


def test_parquet_dates_as_timestamps(library_model: Path, tmp_path: Path) -> None:
    path = tmp_path / "days.parquet"
    days = [dt.datetime(2025, 3, d) for d in (1, 2, 3)]
    pq.write_table(pa.table({"loans.day": pa.array(days, pa.timestamp("us")), "loans": [3, 3, 2]}), path)
    assert diff(library_model, path, measures="loans", by="loans.day")[0] == 0


def test_null_equals_only_null(library_model: Path, export_file: ExportWriter) -> None:
    # Only loan 6 (Scaffold tower, no fee): loans 1, fees null.
    where = ("--where", "loans.loan_id = 6")
    blank = export_file("blank.csv", "tools.name,loans,fees\nScaffold tower,1,(blank)\n")
    assert diff(library_model, blank, *where)[0] == 0
    zero = export_file("zero.csv", "tools.name,loans,fees\nScaffold tower,1,0\n")
    code, out, _ = diff(library_model, zero, *where)
    assert code == 1
    assert "Scaffold tower  fees     0       null        -               -" in out


def test_a_totals_row_is_compared_with_the_translated_total(
    library_model: Path, export_file: ExportWriter, engine: str
) -> None:
    # The grand total: 8 loans, fees 1260.25.
    export = export_file("total.csv", RIGHT_CSV + "Total,8,\"1,260.25\"\n")
    code, out, _ = diff(library_model, export, "--engine", engine)
    assert code == 0, out
    assert "totals rows of the export, compared with the translated totals: rows 5" in out
    wrong = export_file("total_wrong.csv", RIGHT_CSV + "Grand total,8,1260.00\n")
    code, out, _ = diff(library_model, wrong, "--engine", engine)
    assert code == 1
    assert "  (all)       fees     1260.0  1260.25     0.25" in out
    code, out, _ = diff(library_model, wrong, "--skip-totals", "--engine", engine)
    assert code == 0
    assert "totals rows of the export dropped (--skip-totals): rows 5" in out


def test_subtotals_at_one_level(library_model: Path, export_file: ExportWriter, engine: str) -> None:
    # By kind and name: access/Scaffold tower 2, power/Drill 4, power/Sander 1, empty/empty 1;
    # subtotals access 2, power 4 + 1 = 5, empty 1. The export has no grand total, so none is
    # compared.
    text = (
        "tools.kind,tools.name,loans\n"
        "access,Scaffold tower,2\naccess,Total,2\n"
        "power,Drill,4\npower,Sander,1\npower,Total,5\n"
        ",,1\n,Total,1\n"
    )
    export = export_file("kinds.csv", text)
    code, out, _ = diff(library_model, export, "--engine", engine, measures="loans",
                        by="tools.kind,tools.name")
    assert code == 0, out
    assert "rows 2, 5, 7" in out
    # Without the empty kind's subtotal, the translated one is an extra row.
    code, out, _ = diff(library_model, export_file("kinds_short.csv", text.replace(",Total,1\n", "")),
                        "--engine", engine, measures="loans", by="tools.kind,tools.name")
    assert code == 1
    assert "  (empty)     (all)       1\n" in out


def test_the_report_names_each_difference(library_model: Path, export_file: ExportWriter,
                                          tmp_path: Path) -> None:
    text = (
        "tools.name,loans,fees\n"
        "Drill,4,15.00\n"             # a wrong cell: 15.75 translated
        "Scaffold tower,2,1230.25\n"  # Sander left out: an extra translated row
        ",1,1.75\n"
        "Hammer,3,9.0\n"              # not in the translation: a missing row
    )
    report = tmp_path / "diff.html"
    code, out, _ = diff(library_model, export_file("mixed.csv", text), "--report", str(report))
    assert code == 1
    assert f"report written to {report}" in out
    page = report.read_text(encoding="utf-8")
    missing, extra, differing, summary = (
        page.index(heading) for heading in ("Missing rows", "Extra rows", "Differing cells", "Summary")
    )
    assert missing < page.index("Hammer") < extra < page.index("Sander") < differing < page.index("0.05")
    assert differing < summary
    assert "Result: different" in page
    assert "<script" not in page and "http" not in page


def test_bad_tolerance(library_model: Path, export_file: ExportWriter) -> None:
    code, _, err = diff(library_model, export_file("right.csv", RIGHT_CSV), "--tolerance", "-1")
    assert code == 2
    assert "--tolerance must be a relative tolerance of zero or more" in err


def test_a_wider_tolerance(library_model: Path, export_file: ExportWriter) -> None:
    # 15.7501 against 15.75 is a relative 0.0001 / 15.75 = 6.3e-6 off.
    export = export_file("close.csv", RIGHT_CSV.replace("15.75", "15.7501"))
    assert diff(library_model, export)[0] == 1
    assert diff(library_model, export, "--tolerance", "1e-5")[0] == 0


def test_no_grouping_columns(library_model: Path, export_file: ExportWriter) -> None:
    # Every loan: 8 loans, fees 1260.25.
    code, out, _ = diff(library_model, export_file("all.csv", 'loans,fees\n8,"1,260.25"\n'), by="")
    assert code == 0
    assert out.startswith("diff of loans, fees: ")
    code, _, err = diff(library_model, export_file("all_twice.csv", "loans,fees\n8,1260.25\n8,1260.25\n"),
                        by="")
    assert code == 2
    assert "rows 1 and 2 of the export are both the one row of a result without grouping columns" in err


def test_a_report_in_a_missing_folder_is_refused_first(library_model: Path, export_file: ExportWriter,
                                                       tmp_path: Path) -> None:
    code, out, err = diff(library_model, export_file("right.csv", RIGHT_CSV), "--report",
                          str(tmp_path / "nowhere" / "diff.html"))
    assert (code, out) == (2, "")
    assert "does not exist" in err
