"""The fixed registers of the invented bike-share network: districts, stations, plans, bike models.

Everything here is invented for the demo. The random parts (how busy a station is, which bike
takes which ride) live in the generator; these are the facts an operator would type in once.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass

FIRST_DAY = dt.date(2024, 1, 1)
LAST_DAY = dt.date(2025, 12, 31)


@dataclass(frozen=True)
class District:
    district_id: int
    name: str
    zone: str
    pull: float  # how strongly the district draws riders, relative to the others


@dataclass(frozen=True)
class Station:
    station_id: int
    name: str
    district_id: int
    capacity: int | None  # None: the dock count was never recorded
    opened: dt.date


@dataclass(frozen=True)
class Plan:
    plan_id: int
    name: str
    monthly_fee_cents: int
    included_minutes: int  # minutes of each ride covered by the fee
    cents_per_minute: int  # charged past the included minutes


@dataclass(frozen=True)
class BikeBatch:
    """A batch of identical bikes bought on one day."""

    model: str
    is_electric: bool
    count: int
    commissioned: dt.date
    speed_kmh: float
    pull: float  # how often riders pick such a bike, relative to a classic one


DISTRICTS: tuple[District, ...] = (
    District(1, "Harbourside", "central", 1.6),
    District(2, "Old Town", "central", 1.4),
    District(3, "Riverbend", "inner", 1.0),
    District(4, "Millfield", "inner", 0.8),
    District(5, "Northgate", "outer", 0.55),
    District(6, "Kestrel Park", "outer", 0.45),
)

# District 7 ("Airfield", being set up) is missing from the district register on purpose: its
# station points at no district, so reports by district show it under the empty member.
UNREGISTERED_DISTRICT_ID = 7

_OPEN = dt.date(2022, 4, 1)

STATIONS: tuple[Station, ...] = (
    Station(1, "Harbour Quay", 1, 40, _OPEN),
    Station(2, "Ferry Steps", 1, 32, _OPEN),
    Station(3, "Fish Market", 1, 24, _OPEN),
    Station(4, "Lighthouse Walk", 1, 20, _OPEN),
    Station(5, "Dry Dock", 1, 18, dt.date(2023, 6, 1)),
    Station(6, "Customs House", 1, 28, _OPEN),
    Station(7, "Pier Head", 1, 22, dt.date(2024, 5, 20)),
    Station(8, "Sailmakers Yard", 1, 16, _OPEN),
    Station(9, "Cathedral Square", 2, 36, _OPEN),
    Station(10, "Guildhall", 2, 30, _OPEN),
    Station(11, "Weavers Lane", 2, 18, _OPEN),
    Station(12, "Corn Exchange", 2, 26, _OPEN),
    Station(13, "Museum Gardens", 2, 24, _OPEN),
    Station(14, "Bell Tower", 2, 14, _OPEN),
    Station(15, "Printers Row", 2, 20, dt.date(2023, 3, 15)),
    Station(16, "Riverbend Bridge", 3, 30, _OPEN),
    Station(17, "Boathouse", 3, 20, _OPEN),
    Station(18, "Willow Bank", 3, 16, _OPEN),
    Station(19, "Lock Keepers", 3, None, _OPEN),
    Station(20, "Riverbend Library", 3, 18, dt.date(2025, 2, 3)),
    Station(21, "Millfield Station", 4, 34, _OPEN),
    Station(22, "Mill Pond", 4, 16, _OPEN),
    Station(23, "Brewery Corner", 4, 18, _OPEN),
    Station(24, "Millfield Campus", 4, 28, dt.date(2024, 9, 2)),
    Station(25, "Northgate Hospital", 5, 24, _OPEN),
    Station(26, "Northgate Retail Park", 5, 20, _OPEN),
    Station(27, "Orchard Road", 5, 12, _OPEN),
    Station(28, "Kestrel Park Gates", 6, 20, _OPEN),
    Station(29, "Lakeside", 6, 16, _OPEN),
    Station(30, "Airfield Terminal", UNREGISTERED_DISTRICT_ID, 20, dt.date(2025, 6, 16)),
)

# Rides from a pop-up station at a summer festival that was never entered in the register.
UNREGISTERED_STATION_ID = 99
# Loan bikes borrowed from a partner network; they are not in the bike register.
UNREGISTERED_BIKE_IDS: tuple[int, ...] = (9001, 9002, 9003)

PAY_AS_YOU_GO = 1
PLANS: tuple[Plan, ...] = (
    Plan(PAY_AS_YOU_GO, "Pay as you go", 0, 0, 15),
    Plan(2, "Monthly", 1400, 45, 10),
    Plan(3, "Annual", 950, 45, 10),
    Plan(4, "Student", 600, 30, 10),
)
# Member share of each plan among member rides (Monthly, Annual, Student).
MEMBER_PLAN_MIX: tuple[float, ...] = (0.45, 0.35, 0.20)
UNLOCK_FEE_CENTS = 100  # pay-as-you-go riders pay it on every ride
ELECTRIC_CENTS_PER_MINUTE = 8  # every rider pays it on an electric bike, for every minute

BIKE_BATCHES: tuple[BikeBatch, ...] = (
    BikeBatch("Commuter 2", False, 140, dt.date(2021, 9, 1), 12.0, 1.0),
    BikeBatch("Commuter 3", False, 120, dt.date(2023, 2, 1), 12.5, 1.1),
    BikeBatch("Cargo L", False, 16, dt.date(2022, 5, 1), 9.0, 0.5),
    BikeBatch("E-Commuter", True, 50, dt.date(2023, 4, 1), 17.0, 2.4),
    BikeBatch("E-Commuter", True, 60, dt.date(2025, 3, 3), 17.0, 2.4),
    BikeBatch("E-Cargo", True, 10, dt.date(2024, 4, 15), 13.0, 0.9),
)
# Bikes whose commissioning paperwork is lost: their commissioned date is null.
BIKES_WITHOUT_DATE: tuple[int, ...] = (17, 88, 203)

MAINTENANCE_KINDS: tuple[str, ...] = ("inspection", "repair", "tyre", "battery")
