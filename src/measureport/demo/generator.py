"""The invented data of the bike-share demo: one file per table, the same for the same seed."""

from __future__ import annotations

from pathlib import Path

import pyarrow as pa

from measureport.demo import dimensions, facts
from measureport.demo import sampling as draw
from measureport.demo.output import DataFormat, data_file_name, data_format, write_table
from measureport.errors import MeasureportError

TABLES: tuple[str, ...] = ("rides", "maintenance", "stations", "districts", "bikes", "plans", "calendar")
DATA_DIR = "data"
JOBS_PER_RIDE = 0.04
MIN_JOBS = 30


def data_files(out_dir: Path, fmt: DataFormat = "csv") -> list[Path]:
    """The files :func:`generate_data` writes under ``out_dir``, in the order of :data:`TABLES`."""
    return [out_dir / DATA_DIR / data_file_name(t, fmt) for t in TABLES]


def build_tables(rides: int = 20_000, seed: int = 7) -> dict[str, pa.Table]:
    """Every table of the demo network, in memory, keyed by table name."""
    if rides < 1:
        raise MeasureportError(f"the demo needs at least one ride, not {rides}")
    rng = draw.new_generator(seed)
    days = dimensions.calendar_days()
    fleet = dimensions.build_fleet()
    pull = facts.station_pull(rng)
    ride_table, rides_per_bike = facts.draw_rides(rng, rides, days, fleet, pull)
    jobs = max(MIN_JOBS, round(rides * JOBS_PER_RIDE))
    tables = {
        "rides": ride_table,
        "maintenance": facts.draw_maintenance(rng, jobs, days, fleet, rides_per_bike, pull),
        "stations": dimensions.stations_table(),
        "districts": dimensions.districts_table(),
        "bikes": dimensions.bikes_table(fleet),
        "plans": dimensions.plans_table(),
        "calendar": dimensions.calendar_table(days),
    }
    return {name: tables[name] for name in TABLES}


def generate_data(out_dir: Path, rides: int = 20_000, seed: int = 7, fmt: str = "csv") -> dict[str, int]:
    """Write one file per table into ``out_dir/data`` (CSV or Parquet) and return the row count
    of each table. The same ``rides`` and ``seed`` give the same files."""
    file_format = data_format(fmt)
    tables = build_tables(rides, seed)
    (out_dir / DATA_DIR).mkdir(parents=True, exist_ok=True)
    for name, table in tables.items():
        write_table(table, out_dir / DATA_DIR / data_file_name(name, file_format), file_format)
    return {name: table.num_rows for name, table in tables.items()}
