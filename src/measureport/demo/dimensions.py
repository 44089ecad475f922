"""The dimension tables of the demo network, built from the catalog (no randomness here)."""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass

import numpy as np
import numpy.typing as npt
import pyarrow as pa

from measureport.demo import arrow_columns as col
from measureport.demo.catalog import (
    BIKE_BATCHES,
    BIKES_WITHOUT_DATE,
    DISTRICTS,
    FIRST_DAY,
    LAST_DAY,
    PLANS,
    STATIONS,
)

WEEKDAY_NAMES: tuple[str, ...] = ("Mon", "Tue", "Wed", "Thu", "Fri", "Sat", "Sun")


@dataclass(frozen=True)
class Fleet:
    """One entry per registered bike, in bike_id order (ids start at 1)."""

    bike_id: npt.NDArray[np.int64]
    batch: npt.NDArray[np.int64]  # index into BIKE_BATCHES
    commissioned: npt.NDArray[np.datetime64]


def calendar_days(first: dt.date = FIRST_DAY, last: dt.date = LAST_DAY) -> npt.NDArray[np.datetime64]:
    """Every day from ``first`` to ``last``, both included."""
    return np.arange(np.datetime64(first, "D"), np.datetime64(last, "D") + 1)


def weekday_numbers(days: npt.NDArray[np.datetime64]) -> npt.NDArray[np.int64]:
    """ISO weekday of each day: 1 for Monday … 7 for Sunday."""
    # 1970-01-01 was a Thursday (ISO 4).
    return ((days.astype(np.int64) + 3) % 7 + 1).astype(np.int64)


def calendar_table(days: npt.NDArray[np.datetime64]) -> pa.Table:
    """The calendar: one row per day with its year, quarter, month and weekday."""
    years = days.astype("datetime64[Y]").astype(np.int64) + 1970
    month_numbers = days.astype("datetime64[M]").astype(np.int64) % 12 + 1
    weekdays = weekday_numbers(days)
    quarter_names = [f"{y}-Q{(m - 1) // 3 + 1}" for y, m in zip(years, month_numbers, strict=True)]
    month_names = [f"{y}-{m:02d}" for y, m in zip(years, month_numbers, strict=True)]
    return pa.table({
        "day": col.dates(days),
        "year": col.integers(years),
        "quarter": col.texts(quarter_names),
        "month": col.texts(month_names),
        "month_number": col.integers(month_numbers),
        "weekday": col.labels(weekdays - 1, WEEKDAY_NAMES),
        "weekday_number": col.integers(weekdays),
        "is_weekend": col.flags(weekdays >= 6),
    })


def districts_table() -> pa.Table:
    """The district register."""
    return pa.table({
        "district_id": col.integers([d.district_id for d in DISTRICTS]),
        "name": col.texts([d.name for d in DISTRICTS]),
        "zone": col.texts([d.zone for d in DISTRICTS]),
    })


def stations_table() -> pa.Table:
    """The station register (a snowflake: each station points at its district)."""
    capacity = np.array([s.capacity or 0 for s in STATIONS])
    return pa.table({
        "station_id": col.integers([s.station_id for s in STATIONS]),
        "name": col.texts([s.name for s in STATIONS]),
        "district_id": col.integers([s.district_id for s in STATIONS]),
        "capacity": col.integers(capacity, null=np.array([s.capacity is None for s in STATIONS])),
        "opened": col.dates(np.array([s.opened for s in STATIONS], dtype="datetime64[D]")),
    })


def plans_table() -> pa.Table:
    """The price plans."""
    return pa.table({
        "plan_id": col.integers([p.plan_id for p in PLANS]),
        "name": col.texts([p.name for p in PLANS]),
        "monthly_fee": col.decimals([p.monthly_fee_cents for p in PLANS], 6),
        "included_minutes": col.integers([p.included_minutes for p in PLANS]),
    })


def build_fleet() -> Fleet:
    """Number the bikes of every batch in order, from 1."""
    batch = np.concatenate([np.full(b.count, i, dtype=np.int64) for i, b in enumerate(BIKE_BATCHES)])
    bike_id = np.arange(1, batch.size + 1, dtype=np.int64)
    commissioned = np.array([BIKE_BATCHES[i].commissioned for i in batch], dtype="datetime64[D]")
    return Fleet(bike_id, batch, commissioned)


def bikes_table(fleet: Fleet) -> pa.Table:
    """The bike register; a few bikes have lost their commissioning date."""
    no_date = np.isin(fleet.bike_id, BIKES_WITHOUT_DATE)
    return pa.table({
        "bike_id": col.integers(fleet.bike_id),
        "model": col.labels(fleet.batch, [b.model for b in BIKE_BATCHES]),
        "is_electric": col.flags([BIKE_BATCHES[i].is_electric for i in fleet.batch]),
        "commissioned": col.dates(fleet.commissioned, null=no_date),
    })
