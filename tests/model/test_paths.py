"""Cycles and two paths between the same two tables are errors that name the paths (invented data)."""

from __future__ import annotations

import pytest

from measureport.errors import MeasureportError
from measureport.model.paths import check_paths, describe_path
from measureport.model.schema import Relationship

MODEL_HEAD = """\
name: m
tables:
  rides:
    from: data/rides.csv
  stations:
    from: data/stations.csv
    key: station_id
  districts:
    from: data/districts.csv
    key: district_id
relationships:
"""  # 11 lines: the first relationship is line 12, its text at column 5


def write_data(project):
    project.write("data/rides.csv", "ride_id,start_station,end_station,district_id\n1,10,11,1\n")
    project.write("data/stations.csv", "station_id,district_id\n10,1\n11,2\n")
    project.write("data/districts.csv", "district_id,hub_station\n1,10\n2,11\n")


def model_with(*relationships: str) -> str:
    return MODEL_HEAD + "".join(f"  - {r}\n" for r in relationships)


def test_two_paths_through_a_snowflake_name_both_paths(project):
    write_data(project)
    error = project.error(
        model_with(
            "rides.start_station -> stations.station_id",
            "stations.district_id -> districts.district_id",
            "rides.district_id -> districts.district_id",
        )
    )
    assert error.message == (
        "rides reaches districts two ways: rides.start_station -> stations.station_id then "
        "stations.district_id -> districts.district_id, and rides.district_id -> districts.district_id"
    )
    # Reported at the relationship that makes the second path: line 14.
    assert project.where(error) == (14, 5)


def test_two_relationships_to_the_same_dimension(project):
    write_data(project)
    error = project.error(
        model_with("rides.start_station -> stations.station_id", "rides.end_station -> stations.station_id")
    )
    assert error.message == (
        "rides reaches stations two ways: rides.start_station -> stations.station_id, and "
        "rides.end_station -> stations.station_id"
    )
    assert project.where(error) == (13, 5)


def test_cycle_is_an_error_that_prints_it(project):
    write_data(project)
    error = project.error(
        model_with(
            "stations.district_id -> districts.district_id",
            "districts.hub_station -> stations.station_id",
        )
    )
    assert error.message == (
        "these relationships form a cycle: stations.district_id -> districts.district_id then "
        "districts.hub_station -> stations.station_id"
    )
    assert project.where(error) == (13, 5)


def test_a_diamond_seen_from_below_is_fine():
    # rides -> stations and repairs -> stations: two facts sharing a dimension are one path each.
    rels = (
        Relationship("rides", "station_id", "stations", "station_id"),
        Relationship("repairs", "station_id", "stations", "station_id"),
        Relationship("stations", "district_id", "districts", "district_id"),
    )
    check_paths(rels)  # raises nothing


def test_longer_cycle_lists_only_the_relationships_on_it():
    rels = (
        Relationship("rides", "station_id", "stations", "station_id"),
        Relationship("stations", "district_id", "districts", "district_id"),
        Relationship("districts", "region_id", "regions", "region_id"),
        Relationship("regions", "hub_station", "stations", "station_id"),
    )
    with pytest.raises(MeasureportError) as caught:
        check_paths(rels)
    # The cycle is stations -> districts -> regions -> stations; rides only leads into it.
    assert caught.value.message == "these relationships form a cycle: " + describe_path(rels[1:])
