"""A mistake in a profile is a plain sentence at file:line:col of the value it is about.

The profiles here are written for the test (an imaginary dialect 'pondsql' rendered as postgres).
"""

from __future__ import annotations

from pathlib import Path

import pytest

from measureport.dialects import read_profile
from measureport.dialects.loader import load_profile
from measureport.errors import MeasureportError

VALID = """\
name: pondsql
sqlglot: postgres
engine: roundtrip
float_type: DOUBLE PRECISION
quirks:
  division_by_zero: error
  integer_division: truncates
  make_date: MAKE_DATE
  last_day: none
  date_trunc: DATE_TRUNC
  date_trunc_returns: timestamp
  day_arithmetic: "d + INTERVAL 'n DAY'"
  month_end_clamping: clamps
  boolean_literals: true_false
  null_ordering: explicit
  filter_clause: supported
  window_functions: supported
  view_ddl: create_or_replace
  count_distinct_columns: single
  null_safe_equality: IS NOT DISTINCT FROM
  greatest_least_nulls: ignored
  rounding: away_from_zero
"""


def write(folder: Path, text: str, name: str = "pondsql") -> Path:
    path = folder / f"{name}.yaml"
    path.write_text(text, encoding="utf-8")
    return path


def error_of(path: Path) -> MeasureportError:
    with pytest.raises(MeasureportError) as caught:
        read_profile(path)
    return caught.value


def test_the_valid_profile_loads(tmp_path: Path) -> None:
    profile = read_profile(write(tmp_path, VALID))
    assert (profile.name, profile.sqlglot, profile.engine, profile.title) == (
        "pondsql", "postgres", "roundtrip", "pondsql"
    )
    assert profile.quirks.last_day == "none"
    assert profile.not_checked_here == frozenset() and profile.readback_repairs == ()


def test_a_quirk_value_outside_its_choices_points_at_the_value(tmp_path: Path) -> None:
    path = write(tmp_path, VALID.replace("division_by_zero: error", "division_by_zero: erorr"))
    error = error_of(path)
    # Line 6 of the file; the value starts after "  division_by_zero: " (20 characters).
    assert (error.span.line, error.span.column) == (6, 21)
    assert error.message == "division_by_zero cannot be 'erorr'; it is one of error, null_result and infinity"
    assert error.hint == "did you mean 'error'?"


def test_a_missing_quirk_is_named(tmp_path: Path) -> None:
    path = write(tmp_path, VALID.replace("  window_functions: supported\n", ""))
    error = error_of(path)
    assert error.message == "quirks has no 'window_functions'"
    assert error.span.line == 6  # the quirks mapping starts on line 6


def test_an_unknown_quirk_is_refused_with_the_closest_name(tmp_path: Path) -> None:
    path = write(tmp_path, VALID + "  nulls_ordering: explicit\n")
    error = error_of(path)
    assert error.message.startswith("'nulls_ordering' is not a setting of quirks")
    assert error.hint == "did you mean 'null_ordering'?"
    assert error.span.line == 23  # the line after VALID's 22 lines


def test_an_unknown_sqlglot_dialect_suggests_the_closest(tmp_path: Path) -> None:
    error = error_of(write(tmp_path, VALID.replace("sqlglot: postgres", "sqlglot: postgress")))
    assert error.message == "sqlglot has no dialect named 'postgress'"
    assert error.hint == "did you mean 'postgres'?"
    assert (error.span.line, error.span.column) == (2, 10)


def test_the_name_must_be_the_file_name(tmp_path: Path) -> None:
    error = error_of(write(tmp_path, VALID, name="marshsql"))
    assert error.message == "the profile in marshsql.yaml must be named 'marshsql'"
    assert (error.span.line, error.span.column) == (1, 7)


def test_float_type_must_be_a_float(tmp_path: Path) -> None:
    error = error_of(write(tmp_path, VALID.replace("float_type: DOUBLE PRECISION", "float_type: BIGINT")))
    assert error.message == "float_type must name a floating-point type, and 'BIGINT' does not"
    assert error.span.line == 4


def test_readback_repairs_need_a_roundtrip_dialect(tmp_path: Path) -> None:
    text = VALID.replace("engine: roundtrip", "engine: postgres") + "readback_repairs: [float_is_double]\n"
    error = error_of(write(tmp_path, text))
    assert error.message == "readback_repairs apply only to a dialect whose engine is roundtrip"
    assert error.span.line == 23  # the line after VALID's 22 lines


def test_an_unknown_repair_is_refused(tmp_path: Path) -> None:
    error = error_of(write(tmp_path, VALID + "readback_repairs: [float_is_dubble]\n"))
    assert error.message.startswith("an item of readback_repairs cannot be 'float_is_dubble'")
    assert error.hint == "did you mean 'float_is_double'?"


def test_not_checked_here_takes_quirk_names_or_all(tmp_path: Path) -> None:
    every = read_profile(write(tmp_path, VALID + "not_checked_here: all\n"))
    assert not every.checked_here("null_ordering") and not every.checked_here("float_type")
    some = read_profile(write(tmp_path, VALID + "not_checked_here: [view_ddl]\n"))
    assert not some.checked_here("view_ddl") and some.checked_here("null_ordering")
    error = error_of(write(tmp_path, VALID + "not_checked_here: [view_dll]\n"))
    assert error.hint == "did you mean 'view_ddl'?"


def test_a_function_quirk_must_be_a_name(tmp_path: Path) -> None:
    error = error_of(write(tmp_path, VALID.replace("make_date: MAKE_DATE", "make_date: MAKE DATE")))
    assert error.message == "make_date must be a function name or none, not 'MAKE DATE'"
    assert error.span.line == 8


def test_broken_yaml_is_located(tmp_path: Path) -> None:
    error = error_of(write(tmp_path, VALID.replace("quirks:\n", "quirks: [\n", 1)))
    assert error.message == "the dialect profile is not valid YAML here"
    assert error.span.file.endswith("pondsql.yaml") and error.span.line > 0


def test_load_profile_reads_a_folder(tmp_path: Path) -> None:
    write(tmp_path, VALID)
    assert load_profile("pondsql", tmp_path).sqlglot == "postgres"
    with pytest.raises(MeasureportError) as caught:
        load_profile("duckdb", tmp_path)
    assert caught.value.message == "there is no dialect named 'duckdb'; the dialects are pondsql"
