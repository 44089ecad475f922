"""The relationship graph helpers on a snowflake and on a model with two facts (invented models)."""

from __future__ import annotations

from pathlib import Path

import pytest

from measureport.model import graph
from measureport.model.schema import INTEGER, Column, Model, Relationship, Table


def table(name: str, *columns: str, key: str | None = None) -> Table:
    return Table(name, f"data/{name}.csv", {c: Column(c, INTEGER) for c in columns}, key=key)


def make_model(tables: list[Table], relationships: list[Relationship]) -> Model:
    return Model("m", Path("model.yaml"), {t.name: t for t in tables}, tuple(relationships), (), {})


RIDES_STATIONS = Relationship("rides", "station_id", "stations", "station_id")
STATIONS_DISTRICTS = Relationship("stations", "district_id", "districts", "district_id")
RIDES_DAYS = Relationship("rides", "day", "calendar", "day")
REPAIRS_STATIONS = Relationship("repairs", "station_id", "stations", "station_id")
REPAIRS_DAYS = Relationship("repairs", "day", "calendar", "day")


@pytest.fixture
def snowflake() -> Model:
    """rides -> stations -> districts."""
    return make_model(
        [
            table("rides", "ride_id", "station_id"),
            table("stations", "station_id", "district_id", key="station_id"),
            table("districts", "district_id", key="district_id"),
        ],
        [RIDES_STATIONS, STATIONS_DISTRICTS],
    )


@pytest.fixture
def two_facts() -> Model:
    """rides and repairs both point at stations and at calendar; stations -> districts."""
    return make_model(
        [
            table("rides", "ride_id", "station_id", "day"),
            table("repairs", "repair_id", "station_id", "day"),
            table("stations", "station_id", "district_id", key="station_id"),
            table("districts", "district_id", key="district_id"),
            table("calendar", "day", key="day"),
        ],
        [RIDES_STATIONS, RIDES_DAYS, REPAIRS_STATIONS, REPAIRS_DAYS, STATIONS_DISTRICTS],
    )


def test_reachable_gives_each_table_with_its_path(snowflake):
    assert graph.reachable(snowflake, "rides") == {
        "rides": [],
        "stations": [RIDES_STATIONS],
        "districts": [RIDES_STATIONS, STATIONS_DISTRICTS],
    }
    assert graph.reachable(snowflake, "districts") == {"districts": []}


def test_path(snowflake):
    assert graph.path(snowflake, "rides", "districts") == [RIDES_STATIONS, STATIONS_DISTRICTS]
    assert graph.path(snowflake, "stations", "stations") == []
    # Relationships only lead from the many side to the one side.
    assert graph.path(snowflake, "districts", "rides") is None


def test_unknown_table_is_a_programming_error(snowflake):
    with pytest.raises(KeyError):
        graph.reachable(snowflake, "bikes")


def test_tables_reaching(snowflake, two_facts):
    assert graph.tables_reaching(snowflake, "districts") == {"districts", "stations", "rides"}
    assert graph.tables_reaching(snowflake, "rides") == {"rides"}
    assert graph.tables_reaching(two_facts, "calendar") == {"calendar", "rides", "repairs"}


def test_dimensions_are_the_one_sides(snowflake, two_facts):
    assert graph.dimensions(snowflake) == {"stations", "districts"}
    assert graph.dimensions(two_facts) == {"stations", "districts", "calendar"}


def test_closest_common_source_of_columns_of_one_table_is_that_table(two_facts):
    assert graph.closest_common_source(two_facts, {"stations"}) == "stations"


def test_closest_common_source_along_a_snowflake(two_facts):
    # stations reaches districts and itself; rides and repairs reach both too, and reach stations.
    assert graph.common_sources(two_facts, {"stations", "districts"}) == {"stations", "rides", "repairs"}
    assert graph.closest_common_source(two_facts, {"stations", "districts"}) == "stations"


def test_closest_common_source_of_a_fact_and_its_dimension(two_facts):
    assert graph.closest_common_source(two_facts, {"rides", "calendar"}) == "rides"


def test_no_single_closest_source_gives_the_candidates(two_facts):
    # Both facts reach stations and calendar and neither reaches the other.
    assert graph.closest_common_source(two_facts, {"stations", "calendar"}) is None
    assert graph.nearest_common_sources(two_facts, {"stations", "calendar"}) == ["repairs", "rides"]


def test_no_table_reaches_both_facts(two_facts):
    assert graph.closest_common_source(two_facts, {"rides", "repairs"}) is None
    assert graph.nearest_common_sources(two_facts, {"rides", "repairs"}) == []
    assert graph.nearest_common_sources(two_facts, set()) == []
