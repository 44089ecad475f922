"""The two fact tables of the demo network, rides and maintenance jobs, drawn from a seed.

The patterns are chosen so that the showcase has a story: summer is busier than winter, 2025
busier than 2024, weekdays peak at commuting hours, central districts draw more riders, electric
bikes ride longer and farther, and a fleet of new electric bikes arrives in March 2025.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass

import numpy as np
import numpy.typing as npt
import pyarrow as pa

from measureport.demo import arrow_columns as col
from measureport.demo import sampling as draw
from measureport.demo.catalog import (
    BIKE_BATCHES,
    DISTRICTS,
    ELECTRIC_CENTS_PER_MINUTE,
    FIRST_DAY,
    MAINTENANCE_KINDS,
    MEMBER_PLAN_MIX,
    PAY_AS_YOU_GO,
    PLANS,
    STATIONS,
    UNLOCK_FEE_CENTS,
    UNREGISTERED_BIKE_IDS,
    UNREGISTERED_STATION_ID,
)
from measureport.demo.dimensions import Fleet, weekday_numbers

Ints = npt.NDArray[np.int64]
Floats = npt.NDArray[np.float64]
Flags = npt.NDArray[np.bool_]
Days = npt.NDArray[np.datetime64]

CLOSED_DAYS = (dt.date(2024, 12, 25), dt.date(2025, 12, 25))  # the network shuts on Christmas Day
FESTIVAL = (dt.date(2025, 7, 10), dt.date(2025, 7, 20))  # the pop-up station's days
FESTIVAL_SHARE = 0.08  # of the rides on festival days that start at the pop-up station
LOAN_BIKE_SHARE = 0.0015
LOAN_BIKE_SPEED_KMH = 12.0
GROWTH_2025 = 1.18
WEEKEND_DEMAND = 0.85

PAYMENTS: tuple[str, ...] = ("card", "app", "pass")
# Rides per hour of the day, relative; weekdays peak at commuting times.
WEEKDAY_HOURS = np.array([1, 0.5, 0.3, 0.2, 0.3, 1.5, 4, 10, 13, 7, 4, 4,
                          5, 5, 4, 5, 8, 12, 10, 6, 4, 3, 2, 1.5])
WEEKEND_HOURS = np.array([2, 1.5, 1, 0.5, 0.3, 0.5, 1, 2, 4, 6, 8, 9,
                          10, 10, 9, 8, 7, 6, 5, 4, 3, 3, 2.5, 2])
COMMUTE_HOURS = (7, 8, 9, 16, 17, 18)


def day_demand(rng: np.random.Generator, days: Days) -> Floats:
    """How many rides each day draws, relative: season, weekday, growth and the weather."""
    day_of_year = (days - days.astype("datetime64[Y]")).astype(np.int64)
    season = 1.0 + 0.45 * np.cos(2 * np.pi * (day_of_year - 196) / 365.25)
    weekend = weekday_numbers(days) >= 6
    year = days.astype("datetime64[Y]").astype(np.int64) + 1970
    demand = season * np.where(weekend, WEEKEND_DEMAND, 1.0) * np.where(year >= 2025, GROWTH_2025, 1.0)
    demand = demand * draw.lognormal(rng, 1.0, 0.25, days.size)
    return np.where(np.isin(days, np.array(CLOSED_DAYS, dtype="datetime64[D]")), 0.0, demand)


def station_pull(rng: np.random.Generator) -> Floats:
    """How strongly each station of the register draws riders."""
    district_pull = {d.district_id: d.pull for d in DISTRICTS}
    base = np.array([district_pull.get(s.district_id, 0.7) * (s.capacity or 20) / 25 for s in STATIONS])
    return base * draw.lognormal(rng, 1.0, 0.45, len(STATIONS))


def _respecting_start(rng: np.random.Generator, picks: Ints, weights: Floats, starts: Days,
                      on_day: Days) -> Ints:
    """Re-draw the picks whose item had not started yet on the ride's day, among items that
    existed from the first day."""
    early = starts <= np.datetime64(FIRST_DAY, "D")
    late = starts[picks] > on_day
    redrawn = np.flatnonzero(early)[draw.weighted_choice(rng, weights[early], int(late.sum()))]
    picks = picks.copy()
    picks[late] = redrawn
    return picks


def _hours(rng: np.random.Generator, weekend: Flags) -> Ints:
    weekday_pick = draw.weighted_choice(rng, WEEKDAY_HOURS, weekend.size)
    weekend_pick = draw.weighted_choice(rng, WEEKEND_HOURS, weekend.size)
    return np.where(weekend, weekend_pick, weekday_pick)


def _plans(rng: np.random.Generator, weekend: Flags, hour: Ints) -> Ints:
    commuting = ~weekend & np.isin(hour, COMMUTE_HOURS)
    member_chance = np.where(commuting, 0.72, np.where(weekend, 0.30, 0.45))
    member = draw.chance(rng, member_chance, hour.size)
    member_plan = np.array([p.plan_id for p in PLANS if p.plan_id != PAY_AS_YOU_GO])
    picked = member_plan[draw.weighted_choice(rng, MEMBER_PLAN_MIX, hour.size)]
    return np.where(member, picked, PAY_AS_YOU_GO)


def _fares(plan_id: Ints, minutes: Ints, electric: Flags) -> Ints:
    """Fare of each ride in cents, from its plan's price list."""
    by_id = {p.plan_id: p for p in PLANS}
    ids = np.array(sorted(by_id))
    included = np.array([by_id[i].included_minutes for i in ids])[np.searchsorted(ids, plan_id)]
    per_minute = np.array([by_id[i].cents_per_minute for i in ids])[np.searchsorted(ids, plan_id)]
    unlock = np.where(plan_id == PAY_AS_YOU_GO, UNLOCK_FEE_CENTS, 0)
    surcharge = np.where(electric, ELECTRIC_CENTS_PER_MINUTE * minutes, 0)
    fare: Ints = (unlock + per_minute * np.maximum(minutes - included, 0) + surcharge).astype(np.int64)
    return fare


def _ratings(rng: np.random.Generator, electric: Flags, minutes: Ints) -> tuple[Ints, Flags]:
    """A 1–5 rating on about three rides in ten; the others are null."""
    mood = 4.0 + 0.3 * electric - 0.6 * (minutes > 60) + 0.9 * draw.standard_normal(rng, minutes.size)
    rated = draw.chance(rng, 0.3, minutes.size)
    return np.clip(np.rint(mood), 1, 5).astype(np.int64), ~rated


@dataclass(frozen=True)
class BikePicks:
    """The bike of each ride, and what the ride inherits from it."""

    bike_id: Ints
    electric: Flags
    cargo: Flags
    speed_kmh: Floats
    rides_per_bike: Ints  # rides taken by each registered bike, in fleet order


def _start_stations(rng: np.random.Generator, day: Days, pull: Floats) -> Ints:
    """The start station of each ride: open on the ride's day; the pop-up during the festival."""
    station_ids = np.array([s.station_id for s in STATIONS])
    opened = np.array([s.opened for s in STATIONS], dtype="datetime64[D]")
    station = _respecting_start(rng, draw.weighted_choice(rng, pull, day.size), pull, opened, day)
    festival = (day >= np.datetime64(FESTIVAL[0])) & (day <= np.datetime64(FESTIVAL[1]))
    pop_up = festival & draw.chance(rng, FESTIVAL_SHARE, day.size)
    return np.where(pop_up, UNREGISTERED_STATION_ID, station_ids[station])


def _bikes(rng: np.random.Generator, day: Days, fleet: Fleet) -> BikePicks:
    """The bike of each ride: in service on the ride's day, or now and then a loan bike."""
    n = day.size
    bike_pull = np.array([BIKE_BATCHES[b].pull for b in fleet.batch])
    bike = _respecting_start(rng, draw.weighted_choice(rng, bike_pull, n), bike_pull, fleet.commissioned, day)
    loan = draw.chance(rng, LOAN_BIKE_SHARE, n)
    loan_bikes = np.array(UNREGISTERED_BIKE_IDS)
    loan_ids = loan_bikes[draw.weighted_choice(rng, np.ones(loan_bikes.size), n)]
    batch = fleet.batch[bike]
    return BikePicks(
        bike_id=np.where(loan, loan_ids, fleet.bike_id[bike]),
        electric=np.array([b.is_electric for b in BIKE_BATCHES])[batch] & ~loan,
        cargo=np.array(["Cargo" in b.model for b in BIKE_BATCHES])[batch] & ~loan,
        speed_kmh=np.where(loan, LOAN_BIKE_SPEED_KMH, np.array([b.speed_kmh for b in BIKE_BATCHES])[batch]),
        rides_per_bike=np.bincount(bike[~loan], minlength=fleet.bike_id.size).astype(np.int64),
    )


def draw_rides(rng: np.random.Generator, n: int, days: Days, fleet: Fleet,
               pull: Floats) -> tuple[pa.Table, Ints]:
    """``n`` rides in time order, and how many rides each registered bike took."""
    day = days[draw.weighted_choice(rng, day_demand(rng, days), n)]
    weekend = weekday_numbers(day) >= 6
    hour = _hours(rng, weekend)
    station_id = _start_stations(rng, day, pull)
    bikes = _bikes(rng, day, fleet)
    electric, cargo, speed = bikes.electric, bikes.cargo, bikes.speed_kmh

    plan_id = _plans(rng, weekend, hour)
    month = day.astype("datetime64[M]").astype(np.int64) % 12 + 1
    median = 13.0 * np.where(weekend, 1.3, 1.0) * np.where(electric, 1.2, 1.0) \
        * np.where(cargo, 1.25, 1.0) * np.where(np.isin(month, (6, 7, 8)), 1.1, 1.0)
    minutes = np.clip(np.rint(draw.lognormal(rng, median, 0.55, n)), 2, 240).astype(np.int64)
    distance = np.rint(100 * minutes / 60 * speed * draw.lognormal(rng, 1.0, 0.18, n)).astype(np.int64)
    no_distance = draw.chance(rng, 0.015, n)  # the GPS unit dropped out
    fare = _fares(plan_id, minutes, electric)
    card, app, pass_ = (PAYMENTS.index(p) for p in ("card", "app", "pass"))
    payment = np.where(plan_id != PAY_AS_YOU_GO, pass_, np.where(draw.chance(rng, 0.55, n), card, app))
    no_payment = draw.chance(rng, 0.004, n)  # the payment record is missing
    rating, unrated = _ratings(rng, electric, minutes)

    order = np.lexsort((draw.uniform(rng, n), hour, day))
    table = pa.table({
        "ride_id": col.integers(np.arange(1, n + 1)),
        "station_id": col.integers(station_id[order]),
        "bike_id": col.integers(bikes.bike_id[order]),
        "plan_id": col.integers(plan_id[order]),
        "day": col.dates(day[order]),
        "start_hour": col.integers(hour[order]),
        "duration_min": col.integers(minutes[order]),
        "distance_km": col.decimals(distance[order], 7, null=no_distance[order]),
        "fare": col.decimals(fare[order], 8),
        "payment": col.labels(payment[order], PAYMENTS, null=no_payment[order]),
        "rating": col.integers(rating[order], null=unrated[order]),
    })
    return table, bikes.rides_per_bike


# Per kind: chance on a classic bike, on an electric one, median minutes, median parts cost (cents).
KIND_PROFILE = {
    "inspection": (0.45, 0.35, 30.0, 0.0),
    "repair": (0.35, 0.30, 55.0, 2500.0),
    "tyre": (0.20, 0.15, 25.0, 1800.0),
    "battery": (0.0, 0.20, 40.0, 18000.0),
}
LABOUR_CENTS_PER_MINUTE = 75
DEPOT_SHARE = 0.1


def draw_maintenance(rng: np.random.Generator, n: int, days: Days, fleet: Fleet, rides_per_bike: Ints,
                     pull: Floats) -> pa.Table:
    """``n`` workshop jobs in time order: busier bikes come in more often; weekdays only."""
    workdays = days[weekday_numbers(days) <= 5]
    day = workdays[draw.weighted_choice(rng, np.ones(workdays.size), n)]
    usage = rides_per_bike.astype(np.float64) + 1.0
    bike = _respecting_start(rng, draw.weighted_choice(rng, usage, n), usage, fleet.commissioned, day)
    electric = np.array([b.is_electric for b in BIKE_BATCHES])[fleet.batch[bike]]
    loan = draw.chance(rng, 0.005, n)
    bike_id = np.where(loan, UNREGISTERED_BIKE_IDS[0], fleet.bike_id[bike])
    electric &= ~loan

    profiles = [KIND_PROFILE[k] for k in MAINTENANCE_KINDS]
    classic_kind = draw.weighted_choice(rng, [p[0] for p in profiles], n)
    electric_kind = draw.weighted_choice(rng, [p[1] for p in profiles], n)
    kind = np.where(electric, electric_kind, classic_kind)
    minutes = np.clip(np.rint(draw.lognormal(rng, np.array([p[2] for p in profiles])[kind], 0.4, n)),
                      10, 480).astype(np.int64)
    parts = draw.lognormal(rng, np.array([p[3] for p in profiles])[kind], 0.5, n)
    # Battery jobs replace the battery about one time in three; otherwise they only test it.
    parts = np.where((kind == MAINTENANCE_KINDS.index("battery")) & draw.chance(rng, 0.67, n), 0.0, parts)
    cost = LABOUR_CENTS_PER_MINUTE * minutes + np.rint(parts).astype(np.int64)
    not_invoiced = draw.chance(rng, 0.03, n)
    station_ids = np.array([s.station_id for s in STATIONS])
    opened = np.array([s.opened for s in STATIONS], dtype="datetime64[D]")
    station = _respecting_start(rng, draw.weighted_choice(rng, pull, n), pull, opened, day)
    at_depot = draw.chance(rng, DEPOT_SHARE, n)  # jobs done at the depot have no station

    order = np.lexsort((draw.uniform(rng, n), day))
    return pa.table({
        "job_id": col.integers(np.arange(1, n + 1)),
        "bike_id": col.integers(bike_id[order]),
        "station_id": col.integers(station_ids[station][order], null=at_depot[order]),
        "day": col.dates(day[order]),
        "kind": col.labels(kind[order], MAINTENANCE_KINDS),
        "minutes": col.integers(minutes[order]),
        "cost": col.decimals(cost[order], 8, null=not_invoiced[order]),
    })
