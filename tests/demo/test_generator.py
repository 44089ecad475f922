"""The demo data generator: deterministic, the promised sizes, keys, orphans, nulls and patterns.

All data here is the demo's invented bike-share network.
"""

from __future__ import annotations

import time
from pathlib import Path

import duckdb
import pyarrow.csv as pacsv
import pyarrow.parquet as pq
import pytest

from measureport.demo import catalog
from measureport.demo.generator import TABLES, generate_data
from measureport.errors import MeasureportError

SMALL_RIDES = 20_000  # what the demo_data fixture asks for


def scalar(con: duckdb.DuckDBPyConnection, sql: str) -> object:
    """The single value a query returns."""
    row = con.execute(sql).fetchone()
    assert row is not None
    return row[0]


def _file_bytes(folder: Path) -> dict[str, bytes]:
    return {p.name: p.read_bytes() for p in sorted((folder / "data").iterdir())}


def test_same_seed_gives_the_same_files(tmp_path: Path) -> None:
    generate_data(tmp_path / "a", rides=3_000, seed=11)
    generate_data(tmp_path / "b", rides=3_000, seed=11)
    assert _file_bytes(tmp_path / "a") == _file_bytes(tmp_path / "b")


def test_another_seed_gives_other_rides(tmp_path: Path) -> None:
    generate_data(tmp_path / "a", rides=3_000, seed=11)
    generate_data(tmp_path / "b", rides=3_000, seed=12)
    a, b = _file_bytes(tmp_path / "a"), _file_bytes(tmp_path / "b")
    assert a["rides.csv"] != b["rides.csv"]
    # The registers are fixed, not drawn: they do not depend on the seed.
    assert a["stations.csv"] == b["stations.csv"]


def test_returned_sizes_are_the_rows_written(demo_data: tuple[Path, dict[str, int]],
                                             demo_db: duckdb.DuckDBPyConnection) -> None:
    out, sizes = demo_data
    assert tuple(sizes) == TABLES
    assert sizes["rides"] == SMALL_RIDES
    for table, rows in sizes.items():
        assert scalar(demo_db, f"SELECT count(*) FROM {table}") == rows
        # one header line, then one line per row
        lines = (out / "data" / f"{table}.csv").read_bytes().count(b"\n")
        assert lines == rows + 1


def test_calendar_covers_2024_and_2025_day_by_day(demo_db: duckdb.DuckDBPyConnection) -> None:
    # 2024 is a leap year: 366 + 365 = 731 days.
    assert scalar(demo_db, "SELECT count(DISTINCT day) FROM calendar") == 731
    assert str(scalar(demo_db, "SELECT min(day) FROM calendar")) == "2024-01-01"
    assert str(scalar(demo_db, "SELECT max(day) FROM calendar")) == "2025-12-31"
    # 2024-03-01 was a Friday (ISO weekday 5), in the first quarter.
    row = demo_db.execute(
        "SELECT year, quarter, month, month_number, weekday, weekday_number, is_weekend "
        "FROM calendar WHERE day = DATE '2024-03-01'").fetchone()
    assert row == (2024, "2024-Q1", "2024-03", 3, "Fri", 5, False)
    # 2025-03-02 was a Sunday.
    assert scalar(demo_db, "SELECT is_weekend FROM calendar WHERE day = DATE '2025-03-02'") is True


@pytest.mark.parametrize(("table", "key"), [
    ("stations", "station_id"), ("districts", "district_id"), ("bikes", "bike_id"),
    ("plans", "plan_id"), ("calendar", "day"), ("rides", "ride_id"), ("maintenance", "job_id"),
])
def test_keys_are_unique_and_not_null(demo_db: duckdb.DuckDBPyConnection, table: str, key: str) -> None:
    rows = scalar(demo_db, f"SELECT count(*) FROM {table}")
    assert scalar(demo_db, f"SELECT count(DISTINCT {key}) FROM {table}") == rows


@pytest.mark.parametrize(("many", "column", "one", "key"), [
    ("rides", "station_id", "stations", "station_id"),
    ("rides", "bike_id", "bikes", "bike_id"),
    ("maintenance", "bike_id", "bikes", "bike_id"),
    ("stations", "district_id", "districts", "district_id"),
])
def test_orphan_keys_are_present(demo_db: duckdb.DuckDBPyConnection, many: str, column: str,
                                 one: str, key: str) -> None:
    orphans = scalar(demo_db, f"SELECT count(*) FROM {many} WHERE {column} NOT IN (SELECT {key} FROM {one})")
    assert isinstance(orphans, int)
    assert orphans > 0


def test_orphans_are_few(demo_db: duckdb.DuckDBPyConnection) -> None:
    # A handful, not a flood: under 1 % of rides (the festival station and the loan bikes).
    unknown = scalar(demo_db, "SELECT count(*) FROM rides "
                     "WHERE station_id NOT IN (SELECT station_id FROM stations) "
                     "OR bike_id NOT IN (SELECT bike_id FROM bikes)")
    assert isinstance(unknown, int)
    assert 0 < unknown < SMALL_RIDES / 100


def test_every_ride_has_its_plan_and_day(demo_db: duckdb.DuckDBPyConnection) -> None:
    assert scalar(demo_db, "SELECT count(*) FROM rides WHERE plan_id NOT IN (SELECT plan_id FROM plans)") == 0
    assert scalar(demo_db, "SELECT count(*) FROM rides WHERE day NOT IN (SELECT day FROM calendar)") == 0


@pytest.mark.parametrize(("table", "column"), [
    ("rides", "distance_km"), ("rides", "payment"), ("rides", "rating"), ("stations", "capacity"),
    ("bikes", "commissioned"), ("maintenance", "cost"), ("maintenance", "station_id"),
])
def test_some_values_are_null(demo_db: duckdb.DuckDBPyConnection, table: str, column: str) -> None:
    nulls = scalar(demo_db, f"SELECT count(*) FROM {table} WHERE {column} IS NULL")
    assert isinstance(nulls, int)
    assert nulls > 0


@pytest.mark.parametrize(("table", "column"), [
    ("rides", "station_id"), ("rides", "bike_id"), ("rides", "plan_id"), ("rides", "day"),
    ("rides", "fare"), ("rides", "duration_min"), ("maintenance", "day"), ("maintenance", "bike_id"),
])
def test_required_values_are_never_null(demo_db: duckdb.DuckDBPyConnection, table: str, column: str) -> None:
    assert scalar(demo_db, f"SELECT count(*) FROM {table} WHERE {column} IS NULL") == 0


def test_summer_is_busier_than_winter_and_2025_than_2024(demo_db: duckdb.DuckDBPyConnection) -> None:
    by_month = dict(demo_db.execute(
        "SELECT month(day), count(*) FROM rides GROUP BY 1").fetchall())
    assert by_month[7] > 1.5 * by_month[1]
    by_year = dict(demo_db.execute("SELECT year(day), count(*) FROM rides GROUP BY 1").fetchall())
    assert by_year[2025] > by_year[2024]


def test_weekdays_peak_at_commuting_hours(demo_db: duckdb.DuckDBPyConnection) -> None:
    rows = demo_db.execute(
        "SELECT is_weekend, start_hour, count(*) FROM rides JOIN calendar USING (day) GROUP BY 1, 2"
    ).fetchall()
    count = {(weekend, hour): n for weekend, hour, n in rows}
    assert count[(False, 8)] > count[(False, 13)]
    assert count[(True, 13)] > count[(True, 8)]


def test_electric_bikes_ride_longer_and_farther(demo_db: duckdb.DuckDBPyConnection) -> None:
    rows = dict((electric, (minutes, km)) for electric, minutes, km in demo_db.execute(
        "SELECT is_electric, avg(duration_min), avg(distance_km) FROM rides JOIN bikes USING (bike_id) "
        "GROUP BY 1").fetchall())
    assert rows[True][0] > rows[False][0]
    assert rows[True][1] > rows[False][1]


def test_central_districts_draw_more_rides_than_outer_ones(demo_db: duckdb.DuckDBPyConnection) -> None:
    rows = dict(demo_db.execute(
        "SELECT zone, count(*) FROM rides JOIN stations USING (station_id) "
        "JOIN districts USING (district_id) GROUP BY 1").fetchall())
    assert rows["central"] > rows["inner"] > rows["outer"]


def test_no_ride_before_its_station_opened_or_bike_commissioned(demo_db: duckdb.DuckDBPyConnection) -> None:
    assert scalar(demo_db, "SELECT count(*) FROM rides JOIN stations USING (station_id) "
                  "WHERE day < opened") == 0
    assert scalar(demo_db, "SELECT count(*) FROM rides JOIN bikes USING (bike_id) "
                  "WHERE day < commissioned") == 0
    # The Airfield Terminal opened on 2025-06-16, inside the data, so it has rides from then on.
    first = scalar(demo_db, "SELECT min(day) FROM rides JOIN stations USING (station_id) "
                   "WHERE name = 'Airfield Terminal'")
    assert str(first) >= "2025-06-16"


def test_the_network_is_closed_on_christmas_day(demo_db: duckdb.DuckDBPyConnection) -> None:
    assert scalar(demo_db, "SELECT count(*) FROM rides WHERE month(day) = 12 AND day(day) = 25") == 0


def test_the_pop_up_station_only_has_festival_rides(demo_db: duckdb.DuckDBPyConnection) -> None:
    first, last = demo_db.execute(
        f"SELECT min(day), max(day) FROM rides WHERE station_id = {catalog.UNREGISTERED_STATION_ID}"
    ).fetchone() or (None, None)
    assert str(first) >= "2025-07-10"
    assert str(last) <= "2025-07-20"


def test_maintenance_happens_on_weekdays(demo_db: duckdb.DuckDBPyConnection) -> None:
    assert scalar(demo_db, "SELECT count(*) FROM maintenance JOIN calendar USING (day) WHERE is_weekend") == 0


def test_fares_follow_the_price_list(demo_db: duckdb.DuckDBPyConnection) -> None:
    # Pay as you go on a classic bike: 1.00 to unlock plus 0.15 a minute (catalog's price list).
    wrong = scalar(demo_db, "SELECT count(*) FROM rides JOIN bikes USING (bike_id) "
                   "WHERE plan_id = 1 AND NOT is_electric AND fare <> 1.00 + 0.15 * duration_min")
    assert wrong == 0
    # Annual members on a classic bike ride 45 minutes free, then pay 0.10 a minute.
    wrong = scalar(demo_db, "SELECT count(*) FROM rides JOIN bikes USING (bike_id) "
                   "WHERE plan_id = 3 AND NOT is_electric AND fare <> 0.10 * greatest(duration_min - 45, 0)")
    assert wrong == 0


def test_parquet_holds_the_same_rows_as_csv(tmp_path: Path) -> None:
    generate_data(tmp_path / "csv", rides=2_000, seed=3)
    generate_data(tmp_path / "pq", rides=2_000, seed=3, fmt="parquet")
    for table in TABLES:
        from_parquet = pq.read_table(tmp_path / "pq" / "data" / f"{table}.parquet")
        # Read the CSV with the Parquet file's column types, so decimals and dates compare as such.
        from_csv = pacsv.read_csv(
            tmp_path / "csv" / "data" / f"{table}.csv",
            convert_options=pacsv.ConvertOptions(column_types=from_parquet.schema, strings_can_be_null=True),
        )
        assert from_csv.equals(from_parquet), table
    fare = pq.read_schema(tmp_path / "pq" / "data" / "rides.parquet").field("fare")
    assert str(fare.type) == "decimal128(8, 2)"


def test_unknown_format_is_refused(tmp_path: Path) -> None:
    with pytest.raises(MeasureportError, match="csv or parquet"):
        generate_data(tmp_path, rides=10, fmt="xlsx")


def test_at_least_one_ride_is_needed(tmp_path: Path) -> None:
    with pytest.raises(MeasureportError, match="at least one ride"):
        generate_data(tmp_path, rides=0)


@pytest.mark.slow
def test_five_million_rides_in_reasonable_time(tmp_path: Path) -> None:
    started = time.perf_counter()
    sizes = generate_data(tmp_path, rides=5_000_000, fmt="parquet")
    elapsed = time.perf_counter() - started
    assert sizes["rides"] == 5_000_000
    assert pq.read_metadata(tmp_path / "data" / "rides.parquet").num_rows == 5_000_000
    # About 20 s on a 2-core machine; allow slack for slower ones.
    assert elapsed < 120
