"""Every mistake in a model file is a plain sentence at file:line:col (invented data).

Positions are worked out by hand from the YAML texts: lines and columns are 1-based.
"""

from __future__ import annotations

import pytest

from measureport.errors import MeasureportError
from measureport.model.loader import load_model

from .conftest import SNOWFLAKE_MODEL

RIDES_ONLY = "name: m\ntables:\n  rides:\n    from: data/rides.csv\n"


def test_missing_model_file_is_a_plain_error(tmp_path):
    with pytest.raises(MeasureportError) as caught:
        load_model(tmp_path / "nowhere.yaml")
    assert "does not exist" in caught.value.message


def test_empty_file(project):
    error = project.error("")
    assert error.message == "the model file is empty"
    assert project.where(error) == (1, 1)


def test_not_a_mapping(project):
    error = project.error("- rides\n- stations\n")
    assert error.message == "the model file must be a mapping"
    assert project.where(error) == (1, 1)


def test_yaml_syntax_error_is_a_plain_sentence(project):
    # Line 3 is indented by one space, less than the mapping it follows.
    error = project.error("name: m\ntables:\n rides:\n    from: x.csv\n  stations: {}\n")
    assert error.message == "this line is not indented like the lines around it"
    assert "<" not in error.message  # no parser token names
    assert project.where(error) == (5, 3)


def test_unknown_setting_names_the_allowed_ones(bikes):
    error = bikes.error("name: m\ntable:\n  rides:\n    from: data/rides.csv\n")
    assert error.message == (
        "'table' is not a setting of the model file; the settings are name, tables, relationships, "
        "measures and views"
    )
    assert error.hint == "did you mean 'tables'?"
    assert bikes.where(error) == (2, 1)


def test_missing_required_setting(project):
    error = project.error("tables:\n  rides:\n    from: data/rides.csv\n")
    assert error.message == "the model file has no 'name'"
    assert project.where(error) == (1, 1)


def test_duplicate_root_setting(bikes):
    error = bikes.error("name: a\nname: b\ntables:\n  rides:\n    from: data/rides.csv\n")
    assert error.message == "setting 'name' appears twice in the model file; the first is at line 1"
    assert bikes.where(error) == (2, 1)


def test_duplicate_table_name(bikes):
    # PyYAML would keep only the second `rides`; the loader reads the node tree and sees both.
    error = bikes.error(RIDES_ONLY + "  rides:\n    from: data/stations.csv\n")
    assert error.message == "table 'rides' appears twice in 'tables'; the first is at line 3"
    assert bikes.where(error) == (5, 3)


def test_table_name_must_be_a_lower_case_identifier(bikes):
    error = bikes.error("name: m\ntables:\n  Rides:\n    from: data/rides.csv\n")
    assert error.message.startswith("a table name must be a lower-case identifier")
    assert error.message.endswith("not 'Rides'")
    assert error.hint == "write it 'rides'"
    assert bikes.where(error) == (3, 3)


def test_table_name_cannot_be_a_word_of_the_language(bikes):
    error = bikes.error("name: m\ntables:\n  count:\n    from: data/rides.csv\n")
    assert error.message == "'count' is a word of the measure language and cannot name a table"
    assert bikes.where(error) == (3, 3)


def test_unknown_table_setting(bikes):
    error = bikes.error("name: m\ntables:\n  rides:\n    form: data/rides.csv\n")
    assert error.message == "'form' is not a setting of table rides; the settings are from, columns and key"
    assert error.hint == "did you mean 'from'?"
    assert bikes.where(error) == (4, 5)


def test_table_without_from(bikes):
    error = bikes.error("name: m\ntables:\n  rides:\n    key: ride_id\n")
    assert error.message == "table rides has no 'from'"
    assert bikes.where(error) == (3, 3)


def test_data_file_that_does_not_exist(bikes):
    error = bikes.error("name: m\ntables:\n  rides:\n    from: data/ride.csv\n")
    assert error.message.startswith("the data file data/ride.csv of table rides does not exist")
    assert error.hint == "did you mean 'rides.csv'?"
    # "    from: data/ride.csv": the value starts at column 11.
    assert bikes.where(error) == (4, 11)


def test_from_that_is_neither_a_file_nor_a_table_name(bikes):
    error = bikes.error("name: m\ntables:\n  rides:\n    from: data/rides.txt\n")
    assert error.message == (
        "'data/rides.txt' is neither a .csv or .parquet file nor a table name such as schema.table"
    )
    assert bikes.where(error) == (4, 11)


def test_engine_table_must_declare_its_columns(project):
    error = project.error("name: m\ntables:\n  rides:\n    from: analytics.rides\n")
    assert error.message == (
        "table rides reads the table 'analytics.rides' of a connected engine, so its columns must be declared"
    )
    assert project.where(error) == (3, 3)


def test_duplicate_column(bikes):
    error = bikes.error(RIDES_ONLY + "    columns:\n      fare: double\n      fare: decimal(8,2)\n")
    assert error.message == "column 'fare' appears twice in 'columns' of table rides; the first is at line 6"
    assert bikes.where(error) == (7, 7)


def test_column_name_must_be_a_lower_case_identifier(bikes):
    error = bikes.error(RIDES_ONLY + "    columns:\n      Fare: double\n")
    assert error.message.startswith("a column name must be a lower-case identifier")
    assert bikes.where(error) == (6, 7)


@pytest.mark.parametrize(
    ("spelling", "message", "hint"),
    [
        (
            "int",
            "'int' is not a column type; the types are integer, bigint, double, text, date, boolean, "
            "decimal(p,s)",
            "write 'integer'",
        ),
        (
            "varchar(20)",
            "'varchar(20)' is not a column type; the types are integer, bigint, double, "
            "text, date, boolean, decimal(p,s)",
            None,
        ),
        (
            "Date",
            "'Date' is not a column type; the types are integer, bigint, double, text, date, "
            "boolean, decimal(p,s)",
            "write 'date'",
        ),
        ("decimal(40,2)", "a decimal's precision must be between 1 and 38, not 40", None),
        ("decimal(4,6)", "a decimal's scale (6) cannot exceed its precision (4)", None),
    ],
)
def test_unknown_type_spelling(bikes, spelling, message, hint):
    error = bikes.error(RIDES_ONLY + f"    columns:\n      fare: {spelling}\n")
    assert error.message == message
    assert error.hint == hint
    # "      fare: TYPE": the type starts at column 13.
    assert bikes.where(error) == (6, 13)


def test_declared_column_not_in_the_file(bikes):
    error = bikes.error(RIDES_ONLY + "    columns:\n      fares: double\n")
    assert error.message == "column fares is declared but data/rides.csv has no such column"
    assert error.hint == "did you mean 'fare'?"
    assert bikes.where(error) == (6, 7)


def test_file_column_that_is_not_an_identifier(project):
    project.write("data/rides.csv", "Ride ID,day\n1,2025-01-01\n")
    error = project.error(RIDES_ONLY)
    assert error.message.startswith(
        "data/rides.csv has a column 'Ride ID', which is not a lower-case identifier"
    )
    assert project.where(error) == (4, 11)


def test_timestamp_column_must_be_declared(project):
    project.write("data/rides.csv", "ride_id,started\n1,2025-03-01 08:15:00\n")
    error = project.error(RIDES_ONLY)
    assert (
        error.message == "column started of data/rides.csv holds timestamps, and measureport works with days"
    )
    assert error.hint is not None and "'date'" in error.hint
    assert project.where(error) == (4, 11)


def test_key_that_is_not_a_column(bikes):
    error = bikes.error("name: m\ntables:\n  stations:\n    from: data/stations.csv\n    key: station\n")
    assert error.message == "the key station is not a column of table stations"
    assert error.hint == "did you mean 'station_id'?"
    assert bikes.where(error) == (5, 10)


# --- relationships -----------------------------------------------------------------------------
# SNOWFLAKE_MODEL's relationships are lines 12 and 13; each text starts at column 5.


def relationships(*lines: str) -> str:
    head = SNOWFLAKE_MODEL[: SNOWFLAKE_MODEL.index("relationships:")]
    return head + "relationships:\n" + "".join(f"  - {line}\n" for line in lines)


def test_unknown_table_in_a_relationship(bikes):
    error = bikes.error(relationships("rides.start_station -> station.station_id"))
    assert error.message == "there is no table station"
    assert error.hint == "did you mean 'stations'?"
    # "rides.start_station -> " is 23 characters, so `station` starts at column 5 + 23 = 28.
    assert bikes.where(error) == (12, 28)
    assert (error.span.end_line, error.span.end_column) == (12, 34)  # 7 letters: 28 to 34


def test_unknown_column_in_a_relationship(bikes):
    error = bikes.error(relationships("rides.start_stat -> stations.station_id"))
    assert error.message == "table rides has no column start_stat"
    assert error.hint == "did you mean 'start_station'?"
    # `start_stat` follows "rides." (6 characters): column 11.
    assert bikes.where(error) == (12, 11)


def test_one_side_must_be_the_key(bikes):
    error = bikes.error(relationships("rides.start_station -> stations.name"))
    assert error.message == (
        "a relationship must point at the key of its one side; the key of stations is station_id, not name"
    )
    assert bikes.where(error) == (12, 28)


def test_one_side_without_a_key(bikes):
    error = bikes.error(relationships("stations.station_id -> rides.ride_id"))
    assert error.message == "table rides has no key, so nothing can point at it"
    assert error.hint == "add 'key: ride_id' to table rides if ride_id is unique and never null"
    # "stations.station_id -> " is 23 characters: `rides` at column 28.
    assert bikes.where(error) == (12, 28)


def test_relationship_written_with_the_wrong_arrow(bikes):
    error = bikes.error(relationships("rides.start_station => stations.station_id"))
    assert error.message == "a relationship points from the many side to the one side with '->', not '=>'"
    assert error.hint == "write it 'many_table.column -> one_table.column'"
    # "rides.start_station " is 20 characters: `=>` at column 25.
    assert bikes.where(error) == (12, 25)


def test_relationship_side_that_is_not_table_column(bikes):
    error = bikes.error(relationships("rides -> stations.station_id"))
    assert error.message == "the many side of a relationship must be table.column, not 'rides'"
    assert bikes.where(error) == (12, 5)


def test_relationship_with_a_missing_side(bikes):
    error = bikes.error(relationships("rides.start_station ->"))
    assert error.message == "the one side of this relationship is missing"
    assert bikes.where(error) == (12, 5)


def test_relationship_from_a_table_to_itself(bikes):
    bikes.write("data/staff.csv", "person_id,manager_id\n1,\n2,1\n")
    error = bikes.error(
        "name: m\ntables:\n  staff:\n    from: data/staff.csv\n    key: person_id\n"
        "relationships:\n  - staff.manager_id -> staff.person_id\n"
    )
    assert error.message == "a relationship cannot point table staff at itself"
    assert bikes.where(error) == (7, 5)


def test_relationship_between_columns_of_different_kinds(bikes):
    text = relationships("rides.start_station -> stations.station_id").replace(
        "    from: data/rides.csv\n", "    from: data/rides.csv\n    columns:\n      start_station: text\n"
    )
    error = bikes.error(text)
    assert error.message == (
        "rides.start_station is text but stations.station_id is bigint; a relationship joins columns of the "
        "same kind"
    )
    assert bikes.where(error) == (14, 5)  # two lines of `columns:` moved it from line 12


def test_relationship_written_twice(bikes):
    error = bikes.error(
        relationships(
            "rides.start_station -> stations.station_id", "rides.start_station -> stations.station_id"
        )
    )
    assert error.message == (
        "the relationship rides.start_station -> stations.station_id is written twice; "
        "the first is at line 12"
    )
    assert bikes.where(error) == (13, 5)


def test_relationships_must_be_a_list(bikes):
    head = SNOWFLAKE_MODEL[: SNOWFLAKE_MODEL.index("relationships:")]
    error = bikes.error(head + "relationships: rides.start_station -> stations.station_id\n")
    assert error.message == "'relationships' must be a list"
    # "relationships: " is 15 characters: the value at column 16 of line 11.
    assert bikes.where(error) == (11, 16)


# --- measures and views ------------------------------------------------------------------------


def test_measure_file_that_does_not_exist(bikes):
    bikes.write("bikes.measures", "measure rides = count(rides)\n")
    error = bikes.error(SNOWFLAKE_MODEL + "measures:\n  - bike.measures\n")
    assert error.message.startswith("the measure file bike.measures does not exist")
    assert error.hint == "did you mean 'bikes.measures'?"
    assert bikes.where(error) == (15, 5)


def test_measure_file_listed_twice(bikes):
    bikes.write("bikes.measures", "measure rides = count(rides)\n")
    error = bikes.error(SNOWFLAKE_MODEL + "measures:\n  - bikes.measures\n  - bikes.measures\n")
    assert error.message == "the measure file bikes.measures is listed twice"
    assert bikes.where(error) == (16, 5)


def view(*lines: str) -> str:
    """SNOWFLAKE_MODEL with one view `v` (its name on line 15, its settings from line 16)."""
    return SNOWFLAKE_MODEL + "views:\n  v:\n" + "".join(f"    {line}\n" for line in lines)


def test_duplicate_view_names(bikes):
    error = bikes.error(view("measures: [a]", "by: []") + "  v:\n    measures: [b]\n    by: []\n")
    assert error.message == "view 'v' appears twice in 'views'; the first is at line 15"
    assert bikes.where(error) == (18, 3)


def test_view_grouping_column_that_does_not_exist(bikes):
    error = bikes.error(view("measures: [a]", "by: [stations.nam]"))
    assert error.message == "table stations has no column nam"
    assert error.hint == "did you mean 'name'?"
    # "    by: [" is 9 characters; `stations.` 9 more: `nam` at column 19 of line 17.
    assert bikes.where(error) == (17, 19)


def test_view_grouping_table_that_does_not_exist(bikes):
    error = bikes.error(view("measures: [a]", "by: [station.name]"))
    assert error.message == "there is no table station"
    assert bikes.where(error) == (17, 10)


def test_view_grouping_entry_that_is_not_table_column(bikes):
    error = bikes.error(view("measures: [a]", "by: [name]"))
    assert error.message == "a grouping column is written table.column, not 'name'"
    assert bikes.where(error) == (17, 10)


def test_view_without_by(bikes):
    error = bikes.error(view("measures: [a]"))
    assert error.message == "view v has no 'by'"
    assert bikes.where(error) == (15, 3)


def test_view_with_no_measures(bikes):
    error = bikes.error(view("measures: []", "by: []"))
    assert error.message == "view v lists no measures"
    assert bikes.where(error) == (16, 15)


def test_view_measure_list_written_as_one_text(bikes):
    error = bikes.error(view("measures: [a b]", "by: []"))
    assert error.message == "'a b' is not a measure name"
    assert bikes.where(error) == (16, 16)


def test_view_where_must_be_a_list(bikes):
    error = bikes.error(view("measures: [a]", "by: []", "where: rides.minutes > 5"))
    assert error.message == "'where' of view v must be a list"
    assert bikes.where(error) == (18, 12)
