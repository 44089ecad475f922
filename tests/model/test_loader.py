"""Loading valid model files: tables, inferred and declared types, relationships, views (invented data)."""

from __future__ import annotations

from pathlib import Path

import duckdb

from measureport.model.loader import load_model
from measureport.model.schema import BIGINT, BOOLEAN, DATE, DOUBLE, INTEGER, TEXT, decimal

from .conftest import SNOWFLAKE_MODEL


def test_columns_come_from_the_file_in_file_order_with_inferred_types(bikes):
    model = bikes.load(SNOWFLAKE_MODEL)
    rides = model.tables["rides"]
    # The header of RIDES_CSV, in order.
    assert list(rides.columns) == ["ride_id", "start_station", "day", "minutes", "fare", "rider", "electric"]
    # DuckDB reads whole numbers in a CSV as BIGINT, 3.50 as DOUBLE, true/false as BOOLEAN.
    types = {name: column.type for name, column in rides.columns.items()}
    assert types == {
        "ride_id": BIGINT,
        "start_station": BIGINT,
        "day": DATE,
        "minutes": BIGINT,
        "fare": DOUBLE,
        "rider": TEXT,
        "electric": BOOLEAN,
    }


def test_declared_types_override_inferred_ones_and_keep_file_order(bikes):
    model = bikes.load(
        """\
        name: bike share
        tables:
          rides:
            from: data/rides.csv
            columns:
              fare: decimal(8,2)
              minutes: integer
              rider: text
        """
    )
    rides = model.tables["rides"]
    assert list(rides.columns) == ["ride_id", "start_station", "day", "minutes", "fare", "rider", "electric"]
    assert rides.columns["fare"].type == decimal(8, 2)
    assert rides.columns["minutes"].type == INTEGER
    assert rides.columns["ride_id"].type == BIGINT  # not declared: inferred
    # A declared column's span is its name under `columns:` (line 6, column 7 of the file).
    assert (rides.columns["fare"].span.line, rides.columns["fare"].span.column) == (6, 7)


def test_table_source_key_and_spans(bikes):
    model = bikes.load(SNOWFLAKE_MODEL)
    stations = model.tables["stations"]
    assert stations.source == "data/stations.csv"
    assert stations.path == bikes.root / "data" / "stations.csv"
    assert stations.key == "station_id"
    # "    key: station_id" is line 7; the value starts at column 10.
    assert (stations.key_span.line, stations.key_span.column) == (7, 10)
    # "    from: data/stations.csv" is line 6; the value starts at column 11.
    assert (stations.source_span.line, stations.source_span.column) == (6, 11)
    # "  stations:" is line 5: the table's name at column 3.
    assert (stations.span.line, stations.span.column) == (5, 3)
    assert model.tables["rides"].key is None
    assert model.name == "bike share"
    assert model.path == bikes.model_path


def test_relationships_in_order_with_spans(bikes):
    model = bikes.load(SNOWFLAKE_MODEL)
    assert [str(r) for r in model.relationships] == [
        "rides.start_station -> stations.station_id",
        "stations.district_id -> districts.district_id",
    ]
    first = model.relationships[0]
    assert (first.many_table, first.many_column, first.one_table, first.one_column) == (
        "rides",
        "start_station",
        "stations",
        "station_id",
    )
    # "  - rides.start_station -> stations.station_id" is line 12; the text starts at column 5.
    assert (first.span.line, first.span.column) == (12, 5)


def test_a_table_may_point_at_a_dimension_of_another_type_of_number(bikes):
    # integer on the many side, bigint on the one side: both are numbers, so they may be joined.
    model = bikes.load(
        SNOWFLAKE_MODEL.replace(
            "    from: data/rides.csv\n",
            "    from: data/rides.csv\n    columns:\n      start_station: integer\n",
        )
    )
    assert model.tables["rides"].columns["start_station"].type == INTEGER
    assert len(model.relationships) == 2


def test_engine_table_keeps_its_name_and_declared_columns(project):
    model = project.load(
        """\
        name: warehouse
        tables:
          rides:
            from: analytics.rides
            columns:
              ride_id: bigint
              day: date
        """
    )
    rides = model.tables["rides"]
    assert rides.path is None
    assert rides.source == "analytics.rides"
    assert {n: c.type for n, c in rides.columns.items()} == {"ride_id": BIGINT, "day": DATE}


def test_parquet_types_are_mapped(project):
    folder = project.root / "data"
    folder.mkdir()
    target = folder / "repairs.parquet"
    with duckdb.connect() as con:
        con.execute(
            "COPY (SELECT 1::SMALLINT AS a, 2::INTEGER AS b, 3::BIGINT AS c, 4.5::FLOAT AS d, "
            "12.25::DECIMAL(9,2) AS e, 'x' AS f, DATE '2025-01-02' AS g, true AS h) TO ? (FORMAT parquet)",
            [str(target)],
        )
    model = project.load("name: m\ntables:\n  repairs:\n    from: data/repairs.parquet\n")
    types = {n: c.type for n, c in model.tables["repairs"].columns.items()}
    # SMALLINT/INTEGER -> integer, BIGINT -> bigint, FLOAT -> double, DECIMAL(9,2) kept.
    assert types == {
        "a": INTEGER,
        "b": INTEGER,
        "c": BIGINT,
        "d": DOUBLE,
        "e": decimal(9, 2),
        "f": TEXT,
        "g": DATE,
        "h": BOOLEAN,
    }


def test_timestamp_declared_as_date_is_accepted(project):
    project.write("data/trips.csv", "trip_id,started\n1,2025-03-01 08:15:00\n")
    model = project.load(
        "name: m\ntables:\n  trips:\n    from: data/trips.csv\n    columns:\n      started: date\n"
    )
    assert model.tables["trips"].columns["started"].type == DATE


def test_measure_files_resolve_beside_the_model(bikes):
    bikes.write("measures/bikes.measures", "measure rides = count(rides)\n")
    model = bikes.load(SNOWFLAKE_MODEL + "measures:\n  - measures/bikes.measures\n")
    assert model.measure_files == (bikes.root / "measures" / "bikes.measures",)
    # "  - measures/bikes.measures" is line 15, the text at column 5.
    span = model.measure_file_spans[0]
    assert (span.line, span.column) == (15, 5)


def test_optional_sections_may_be_left_empty(bikes):
    model = bikes.load(
        "name: m\ntables:\n  rides:\n    from: data/rides.csv\n    columns:\n"
        "relationships:\nmeasures:\nviews:\n"
    )
    assert model.relationships == ()
    assert model.measure_files == ()
    assert model.views == {}
    assert len(model.tables["rides"].columns) == 7


def test_views_keep_names_columns_conditions_and_spans(bikes):
    model = bikes.load(
        SNOWFLAKE_MODEL
        + """\
views:
  rides_by_district:
    measures: [ride_count, mean_minutes]
    by: [districts.district, stations.name]
    where: ['stations.name != "Old Mill"', rides.minutes > 5]
  all_rides:
    measures:
      - ride_count
    by: []
    where:
      - |
        rides.minutes
          >= 10
"""
    )
    view = model.views["rides_by_district"]
    assert view.measures == ("ride_count", "mean_minutes")
    assert view.by == (("districts", "district"), ("stations", "name"))
    assert [c.text for c in view.where] == ['stations.name != "Old Mill"', "rides.minutes > 5"]
    # SNOWFLAKE_MODEL has 13 lines, so `views:` is line 14 and the view's name line 15.
    # Line 18 is `    where: ['stations.name != "Old Mill"', rides.minutes > 5]`: the quote is at
    # column 13, so the text starts at column 14; the quoted text is 27 characters (14-40), then
    # the quote, a comma and a space: the plain scalar starts at column 44.
    assert [(c.span.line, c.span.column) for c in view.where] == [(18, 14), (18, 44)]
    # Line 16 `    measures: [ride_count, mean_minutes]`: '[' at 15, names at columns 16 and 28.
    assert [(s.line, s.column) for s in view.measure_spans] == [(16, 16), (16, 28)]
    # Line 17 `    by: [districts.district, stations.name]`: '[' at 9, then columns 10 and 30.
    assert [(s.line, s.column) for s in view.by_spans] == [(17, 10), (17, 30)]
    assert (view.span.line, view.span.column) == (15, 3)
    other = model.views["all_rides"]
    assert other.by == ()
    # `- |` is line 24; the block's text starts on line 25 at column 9 (its indentation is 8).
    assert other.where[0].text == "rides.minutes\n  >= 10\n"
    assert (other.where[0].span.line, other.where[0].span.column) == (25, 9)


def test_model_path_may_be_a_string_relative_to_the_working_folder(bikes, monkeypatch):
    bikes.write("model.yaml", SNOWFLAKE_MODEL)
    monkeypatch.chdir(bikes.root)
    model = load_model("model.yaml")
    assert model.path == Path("model.yaml")
    assert model.tables["rides"].path == Path("data/rides.csv")
