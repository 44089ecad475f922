"""The data-quality report: row counts and orphan keys per relationship (invented data)."""

from __future__ import annotations

import datetime as dt

from measureport.model.data import load_dataset
from measureport.model.quality import QualityFinding, data_quality
from measureport.model.schema import Relationship

from .conftest import SNOWFLAKE_MODEL


def test_row_counts_and_orphans_counted_by_hand(bikes):
    model = bikes.load(SNOWFLAKE_MODEL)
    findings = data_quality(model, load_dataset(model))
    rows = [(f.table, f.rows) for f in findings if f.kind == "rows"]
    # RIDES_CSV has 4 rides, STATIONS_CSV 3 stations, DISTRICTS_CSV 2 districts.
    assert rows == [("rides", 4), ("stations", 3), ("districts", 2)]
    orphans = [f for f in findings if f.kind == "orphans"]
    rides_stations, stations_districts = orphans
    # Ride start stations are 10, 11, 99 and empty; the stations are 10, 11 and 12:
    # ride 4 has a null key and ride 3's key 99 has no match.
    assert (rides_stations.null_keys, rides_stations.unmatched, rides_stations.example) == (1, 1, 99)
    assert rides_stations.orphans == 2
    assert rides_stations.severity == "warning"
    assert rides_stations.render() == (
        "rides.start_station -> stations.station_id: 2 of 4 rides rows have no match in stations "
        "(1 null key; 1 key not found, e.g. 99); they group under the empty member of stations"
    )
    # The stations' districts 1, 2 and 1 all exist.
    assert stations_districts.orphans == 0
    assert stations_districts.severity == "info"
    assert (
        stations_districts.render()
        == "stations.district_id -> districts.district_id: every stations row has a match"
    )
    assert findings[0].render() == "rides: 4 rows"


def test_text_and_date_keys(project):
    project.write(
        "data/rides.csv",
        "ride_id,plan,day\n1,gold,2025-03-01\n2,basic,2025-03-09\n3,gold,2025-03-09\n4,,2025-03-01\n",
    )
    project.write("data/plans.csv", "plan,fee\nbasic,5\nsilver,9\n")
    project.write("data/calendar.csv", "day\n2025-03-01\n2025-03-02\n")
    model = project.load(
        "name: m\ntables:\n  rides:\n    from: data/rides.csv\n"
        "  plans:\n    from: data/plans.csv\n    key: plan\n"
        "  calendar:\n    from: data/calendar.csv\n    key: day\n"
        "relationships:\n  - rides.plan -> plans.plan\n  - rides.day -> calendar.day\n"
    )
    plans, days = (f for f in data_quality(model, load_dataset(model)) if f.kind == "orphans")
    # Plans: gold (rides 1, 3) is not a plan; ride 4 has none.
    assert (plans.null_keys, plans.unmatched, plans.example) == (1, 2, "gold")
    assert plans.render() == (
        "rides.plan -> plans.plan: 3 of 4 rides rows have no match in plans (1 null key; 2 keys not found, "
        'e.g. "gold"); they group under the empty member of plans'
    )
    # Days: 2025-03-09 (rides 2, 3) is not in the calendar.
    assert (days.null_keys, days.unmatched, days.example) == (0, 2, dt.date(2025, 3, 9))
    assert "e.g. 2025-03-09" in days.render()


def test_only_null_keys_name_no_example():
    relationship = Relationship("rides", "station_id", "stations", "station_id")
    finding = QualityFinding("orphans", "rides", 10, relationship, null_keys=3)
    assert finding.render() == (
        "rides.station_id -> stations.station_id: 3 of 10 rides rows have no match in stations "
        "(3 null keys); they group under the empty member of stations"
    )


def test_one_orphan_reads_in_the_singular():
    relationship = Relationship("rides", "station_id", "stations", "station_id")
    finding = QualityFinding("orphans", "rides", 1, relationship, unmatched=1, example=7)
    assert finding.render() == (
        "rides.station_id -> stations.station_id: 1 of 1 rides row has no match in stations "
        "(1 key not found, e.g. 7); they group under the empty member of stations"
    )
