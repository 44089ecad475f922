"""The ferry model of LANGUAGE.md section 1, with small data of our own (invented data).

The model keeps the tables and columns the contract shows and adds a few: ``route.name``,
``route.capacity`` and ``route.harbour_id`` (a snowflake: route points to harbour), and
``calendar.month`` / ``calendar.year``. The calendar holds every day of 2023, 2024 and 2025.

sailings (fact, invented)                         route (invented)
  id route day         passengers fare            route_id name           harbour capacity
  1  1     2024-02-29  90         225.00          1        North Loop     10      150
  2  1     2024-03-10  100        250.00          2        East Cross     10      80
  3  2     2024-03-20  40         80.00           3        South Shuttle  20      50
  4  3     2024-11-30  20         60.00           4        Night Owl      20      40   (never sails)
  5  1     2025-01-05  120        300.00
  6  1     2025-01-20  80         200.00        harbour (invented)
  7  2     2025-01-20  50         100.00          harbour_id town
  8  3     2025-02-10  30         90.00           10         Quayside
  9  1     2025-02-28  60         150.00          20         Pier Town
  10 2     2025-03-01  70         140.00          30         Gull Rock   (no routes)
  11 9     2025-03-15  25         50.00     <- route 9 does not exist: an orphan (empty member)
  12 3     2025-03-31  (null)     0.00      <- no passenger count recorded

Sums worked out by hand, used by many tests:
  all sailings: passengers 685 (11 counted), trips 12, fares 1645.00
  by route:  North Loop 450 / 5 trips, East Cross 160 / 3, South Shuttle 50 / 3 (one null),
             empty member 25 / 1, Night Owl nothing
  by month:  2024-02 90/1, 2024-03 140/2, 2024-11 20/1, 2025-01 250/3, 2025-02 90/2, 2025-03 95/3
"""

from __future__ import annotations

import datetime as dt
from pathlib import Path

SAILINGS_CSV = """\
sailing_id,route_id,day,passengers,fare_total
1,1,2024-02-29,90,225.00
2,1,2024-03-10,100,250.00
3,2,2024-03-20,40,80.00
4,3,2024-11-30,20,60.00
5,1,2025-01-05,120,300.00
6,1,2025-01-20,80,200.00
7,2,2025-01-20,50,100.00
8,3,2025-02-10,30,90.00
9,1,2025-02-28,60,150.00
10,2,2025-03-01,70,140.00
11,9,2025-03-15,25,50.00
12,3,2025-03-31,,0.00
"""

ROUTES_CSV = """\
route_id,name,harbour_id,capacity
1,North Loop,10,150
2,East Cross,10,80
3,South Shuttle,20,50
4,Night Owl,20,40
"""

HARBOURS_CSV = """\
harbour_id,town
10,Quayside
20,Pier Town
30,Gull Rock
"""

FIRST_DAY = dt.date(2023, 1, 1)
LAST_DAY = dt.date(2025, 12, 31)


def calendar_csv() -> str:
    """One row per day from FIRST_DAY to LAST_DAY: day, month (1-12), year."""
    lines = ["day,month,year"]
    day = FIRST_DAY
    while day <= LAST_DAY:
        lines.append(f"{day.isoformat()},{day.month},{day.year}")
        day += dt.timedelta(days=1)
    return "\n".join(lines) + "\n"


BASE_MEASURES = """\
# Passengers carried.
measure passengers = sum(sailings.passengers)
# Number of sailings.
measure trips = count(sailings)
"""


def model_yaml(measure_files: list[str], *, sources: dict[str, str] | None = None, views: str = "") -> str:
    """The model file of LANGUAGE.md section 1, extended with harbour, listing ``measure_files``.

    ``sources`` replaces the ``from:`` of the named tables; ``views`` is a ``views:`` block
    appended at the end. The ``from:`` of sailings is on line 4, its value at column 11
    (bad-input tests point at it).
    """
    paths = {
        "sailings": "data/sailings.csv",
        "route": "data/routes.csv",
        "harbour": "data/harbours.csv",
        "calendar": "data/calendar.csv",
        **(sources or {}),
    }
    files = "\n".join(f"  - {name}" for name in measure_files)
    return f"""\
name: harbour-ferries
tables:
  sailings:
    from: {paths["sailings"]}
    columns:
      sailing_id: integer
      route_id: integer
      day: date
      passengers: integer
      fare_total: decimal(12,2)
  route:
    from: {paths["route"]}
    key: route_id
  harbour:
    from: {paths["harbour"]}
    key: harbour_id
  calendar:
    from: {paths["calendar"]}
    key: day
relationships:
  - sailings.route_id -> route.route_id
  - sailings.day -> calendar.day
  - route.harbour_id -> harbour.harbour_id
measures:
{files}
{views}"""


def topic_files(topic: str, measures: str, *, sources: dict[str, str] | None = None) -> dict[str, str]:
    """``TOPIC.measures`` and a model ``TOPIC.yaml`` that reads ``base.measures`` and it."""
    return {
        f"{topic}.measures": measures,
        f"{topic}.yaml": model_yaml(["base.measures", f"{topic}.measures"], sources=sources),
    }


def write_shared_files(folder: Path) -> None:
    """Write the invented CSV files into ``folder/data`` and ``base.measures`` into ``folder``."""
    data = folder / "data"
    data.mkdir(parents=True, exist_ok=True)
    (data / "sailings.csv").write_text(SAILINGS_CSV, encoding="utf-8")
    (data / "routes.csv").write_text(ROUTES_CSV, encoding="utf-8")
    (data / "harbours.csv").write_text(HARBOURS_CSV, encoding="utf-8")
    (data / "calendar.csv").write_text(calendar_csv(), encoding="utf-8")
    (folder / "base.measures").write_text(BASE_MEASURES, encoding="utf-8")
