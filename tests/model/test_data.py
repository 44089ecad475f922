"""Reading table data into arrays, null masks, key checks and read errors (invented data)."""

from __future__ import annotations

import datetime as dt

import duckdb
import numpy as np
import pytest

from measureport.errors import MeasureportError
from measureport.model.data import load_dataset

from .conftest import SNOWFLAKE_MODEL

DECLARED_RIDES = """\
name: bike share
tables:
  rides:
    from: data/rides.csv
    columns:
      minutes: integer
      fare: decimal(8,2)
"""


def test_values_and_null_masks_of_every_kind(bikes):
    dataset = load_dataset(bikes.load(DECLARED_RIDES))
    rides = dataset.tables["rides"]
    assert rides.n_rows == 4
    cols = rides.columns
    # Expected values read off RIDES_CSV in conftest.py.
    assert cols["ride_id"].values.dtype == np.int64
    assert cols["ride_id"].values.tolist() == [1, 2, 3, 4]
    assert cols["start_station"].null.tolist() == [False, False, False, True]
    assert cols["start_station"].values[:3].tolist() == [10, 11, 99]
    assert cols["minutes"].values.dtype == np.int64  # declared integer
    assert cols["fare"].values.dtype == np.float64  # declared decimal(8,2)
    assert cols["fare"].values.tolist() == [3.5, 7.25, 1.0, 2.0]
    assert cols["day"].values.dtype == np.dtype("datetime64[D]")
    assert cols["day"].values.tolist() == [
        dt.date(2025, 3, 1),
        dt.date(2025, 3, 1),
        dt.date(2025, 3, 2),
        dt.date(2025, 3, 3),
    ]
    rider = cols["rider"]
    assert rider.values.dtype == object
    # A doubled quote inside a quoted field is one quote; a quoted comma stays in the text.
    assert rider.values[0] == 'Ana "Speedy" Ruiz'
    assert rider.values[3] == "Cy, the third"
    assert rider.null.tolist() == [False, True, False, False]
    assert all(isinstance(v, str) for v in rider.values)
    electric = cols["electric"]
    assert electric.values.dtype == np.bool_
    assert electric.null.tolist() == [False, False, False, True]
    assert electric.values[:3].tolist() == [True, False, True]


def test_null_date_is_masked(bikes):
    stations = load_dataset(bikes.load(SNOWFLAKE_MODEL)).tables["stations"]
    # Quay Steps (third row) has no opening date.
    assert stations.columns["opened"].null.tolist() == [False, False, True]
    assert stations.columns["opened"].values[1] == np.datetime64("2024-06-15")


def test_every_table_is_read(bikes):
    dataset = load_dataset(bikes.load(SNOWFLAKE_MODEL))
    assert {name: t.n_rows for name, t in dataset.tables.items()} == {
        "rides": 4,
        "stations": 3,
        "districts": 2,
    }


def test_timestamp_declared_as_date_keeps_the_day(project):
    project.write("data/trips.csv", "trip_id,started\n1,2025-03-01 23:59:00\n2,2025-03-02 00:00:01\n")
    model = project.load(
        "name: m\ntables:\n  trips:\n    from: data/trips.csv\n    columns:\n      started: date\n"
    )
    started = load_dataset(model).tables["trips"].columns["started"]
    assert started.values.tolist() == [dt.date(2025, 3, 1), dt.date(2025, 3, 2)]


def test_parquet_values_with_nulls(project):
    (project.root / "data").mkdir()
    target = project.root / "data" / "repairs.parquet"
    with duckdb.connect() as con:
        con.execute(
            "COPY (SELECT * FROM (VALUES (1, 12.50::DECIMAL(9,2), 'chain'), (2, NULL, NULL)) "
            "t(repair_id, cost, part)) TO ? (FORMAT parquet)",
            [str(target)],
        )
    model = project.load("name: m\ntables:\n  repairs:\n    from: data/repairs.parquet\n")
    repairs = load_dataset(model).tables["repairs"]
    assert repairs.columns["cost"].values.dtype == np.float64
    assert repairs.columns["cost"].values[0] == 12.5
    assert repairs.columns["cost"].null.tolist() == [False, True]
    assert repairs.columns["part"].null.tolist() == [False, True]
    assert repairs.columns["part"].values[0] == "chain"


def test_empty_table_has_typed_empty_columns(project):
    project.write("data/rides.csv", "ride_id,day\n")
    model = project.load(
        "name: m\ntables:\n  rides:\n    from: data/rides.csv\n"
        "    columns:\n      ride_id: integer\n      day: date\n"
    )
    rides = load_dataset(model).tables["rides"]
    assert rides.n_rows == 0
    assert rides.columns["ride_id"].values.dtype == np.int64
    assert rides.columns["day"].values.dtype == np.dtype("datetime64[D]")


STATIONS_MODEL = "name: m\ntables:\n  stations:\n    from: data/stations.csv\n    key: station_id\n"


def test_key_with_nulls(project):
    project.write("data/stations.csv", "station_id,name\n10,Harbour Gate\n,Old Mill\n,Quay Steps\n")
    with pytest.raises(MeasureportError) as caught:
        load_dataset(project.load(STATIONS_MODEL))
    assert caught.value.message == "stations.station_id has 2 null values; a key must be unique and not null"
    # "    key: station_id" is line 5; the value starts at column 10.
    assert project.where(caught.value) == (5, 10)


def test_key_with_duplicates_names_the_first_repeated_value(project):
    project.write("data/stations.csv", "station_id,name\n11,a\n10,b\n11,c\n10,d\n11,e\n12,f\n")
    with pytest.raises(MeasureportError) as caught:
        load_dataset(project.load(STATIONS_MODEL))
    # 11 is the first value, in file order, that repeats: three times; 10 repeats too.
    assert caught.value.message == (
        "stations.station_id has duplicate values: 11 appears 3 times (1 other value also repeats); "
        "a key must be unique and not null"
    )
    assert project.where(caught.value) == (5, 10)


def test_text_key_with_duplicates(project):
    project.write("data/calendar.csv", "month,days\n2025-01,31\n2025-02,28\n2025-02,29\n")
    model = project.load("name: m\ntables:\n  calendar:\n    from: data/calendar.csv\n    key: month\n")
    with pytest.raises(MeasureportError) as caught:
        load_dataset(model)
    assert caught.value.message == (
        'calendar.month has duplicate values: "2025-02" appears 2 times; a key must be unique and not null'
    )


def test_bad_value_for_a_declared_type_names_file_line_and_declaration(bikes):
    bikes.write("data/rides.csv", "ride_id,day\n1,2025-03-01\n2,2025-03-02\n3,someday\n")
    model = bikes.load(
        "name: m\ntables:\n  rides:\n    from: data/rides.csv\n    columns:\n      day: date\n"
    )
    with pytest.raises(MeasureportError) as caught:
        load_dataset(model)
    error = caught.value
    # "3,someday" is line 4 of the file (the header is line 1).
    assert error.message == (
        'cannot read data/rides.csv, line 4: the value "someday" in column day cannot be read as date'
    )
    assert bikes.where(error) == (4, 11)  # the table's `from:` value
    assert error.hint == f"column day is declared date at {bikes.model_path}:6:7"
    note = error.more[0]
    assert (note.span.file, note.span.line) == (str(bikes.root / "data" / "rides.csv"), 4)
    assert "Traceback" not in error.render() and "Conversion Error" not in error.render()


@pytest.mark.parametrize(
    ("value", "problem"),
    [
        # DuckDB itself would round 3.50 to 4; measureport refuses it.
        ("3.50", '"3.50" in column minutes (data row 2) is not a whole number'),
        ("abc", '"abc" in column minutes (data row 2) is not a whole number'),
        # 2**31 = 2147483648 is one past the largest 32-bit integer.
        ("2147483648", "2147483648 in column minutes (data row 2) is outside the range of integer"),
    ],
)
def test_declared_integer_column_is_read_strictly(bikes, value, problem):
    bikes.write("data/rides.csv", f"ride_id,minutes\n1,12\n2,{value}\n")
    model = bikes.load(
        "name: m\ntables:\n  rides:\n    from: data/rides.csv\n    columns:\n      minutes: integer\n"
    )
    with pytest.raises(MeasureportError) as caught:
        load_dataset(model)
    assert caught.value.message == f"cannot read data/rides.csv: the value {problem}"
    assert caught.value.hint == f"column minutes is declared integer at {bikes.model_path}:6:7"


def test_declared_integer_column_accepts_whole_numbers_and_nulls(bikes):
    bikes.write("data/rides.csv", "ride_id,minutes\n1, 12\n2,\n3,2147483647\n")
    model = bikes.load(
        "name: m\ntables:\n  rides:\n    from: data/rides.csv\n    columns:\n      minutes: integer\n"
    )
    minutes = load_dataset(model).tables["rides"].columns["minutes"]
    assert minutes.values.dtype == np.int64
    assert minutes.null.tolist() == [False, True, False]
    assert minutes.values[[0, 2]].tolist() == [12, 2**31 - 1]


def test_parquet_value_that_does_not_fit_the_declared_type(project):
    (project.root / "data").mkdir()
    with duckdb.connect() as con:
        con.execute(
            "COPY (SELECT 'x' AS part, 2.5::DOUBLE AS weight, 7.0::DOUBLE AS size) TO ? (FORMAT parquet)",
            [str(project.root / "data" / "p.parquet")],
        )
    head = "name: m\ntables:\n  parts:\n    from: data/p.parquet\n    columns:\n"
    for declared, problem in [
        ("part: date", 'the value "x" in column part cannot be read as date'),
        ("part: integer", 'the value "x" in column part (data row 1) is not a whole number'),
        ("weight: integer", "the value 2.5 in column weight (data row 1) is not a whole number"),
    ]:
        model = project.load(head + f"      {declared}\n")
        with pytest.raises(MeasureportError) as caught:
            load_dataset(model)
        assert caught.value.message == f"cannot read data/p.parquet: {problem}"
    # A whole double declared integer is fine.
    model = project.load(head + "      size: integer\n")
    assert load_dataset(model).tables["parts"].columns["size"].values.tolist() == [7]


ENGINE_MODEL = """\
name: warehouse
tables:
  rides:
    from: analytics.rides
    columns:
      ride_id: integer
      day: date
"""


def test_engine_table_is_read_from_the_connection(project):
    with duckdb.connect() as con:
        con.execute("CREATE SCHEMA analytics")
        con.execute(
            "CREATE TABLE analytics.rides AS "
            "SELECT * FROM (VALUES (7, DATE '2025-05-01', 'x')) t(ride_id, day, extra)"
        )
        rides = load_dataset(project.load(ENGINE_MODEL), con).tables["rides"]
    # Only the declared columns are read.
    assert list(rides.columns) == ["ride_id", "day"]
    assert rides.columns["ride_id"].values.tolist() == [7]
    assert rides.columns["day"].values.tolist() == [dt.date(2025, 5, 1)]


def test_engine_table_without_a_connection(project):
    with pytest.raises(MeasureportError) as caught:
        load_dataset(project.load(ENGINE_MODEL))
    assert caught.value.message == (
        "table rides is read from the engine table 'analytics.rides', and no engine connection was given"
    )
    assert project.where(caught.value) == (4, 11)


def test_engine_table_missing_a_declared_column(project):
    with duckdb.connect() as con:
        con.execute("CREATE SCHEMA analytics")
        con.execute("CREATE TABLE analytics.rides AS SELECT 1 AS ride_id")
        with pytest.raises(MeasureportError) as caught:
            load_dataset(project.load(ENGINE_MODEL), con)
    assert caught.value.message == "cannot read the engine table 'analytics.rides': there is no column day"


def test_value_past_the_type_sample_points_at_declaring_the_type(project):
    # DuckDB judges a CSV column's type from a sample of its first rows; a text far below them
    # does not fit the type judged.
    rows = "".join(f"{i},{i % 7}\n" for i in range(1, 60001))
    project.write("data/rides.csv", "ride_id,minutes\n" + rows + "60001,unknown\n")
    model = project.load("name: m\ntables:\n  rides:\n    from: data/rides.csv\n")
    assert model.tables["rides"].columns["minutes"].type.sql == "bigint"
    with pytest.raises(MeasureportError) as caught:
        load_dataset(model)
    assert caught.value.message == (
        'cannot read data/rides.csv: the value "unknown" in column minutes (data row 60001) '
        "is not a whole number"
    )
    assert caught.value.hint == "declare the type of column minutes under 'columns:' (it was read as bigint)"
