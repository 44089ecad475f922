"""A small invented tram network for the differential tests.

lines     1 Red (tram), 2 Blue (bus)
stops     1 Harbour (line 1, zone A, 2 platforms), 2 Market (line 1, zone B, 4),
          3 Depot (line 2, zone A, platforms unknown), 4 Quarry (line 5 — no such line: an orphan
          key, so Quarry belongs to the empty member of lines)
days      every day of 2024-01-01 .. 2025-03-31, with year and month ("2025-02")
boardings stop day riders fare            inspections stop day faults
          1 2025-01-03 10 2.5                         1 2025-01-05 1
          1 2025-01-20  5 2.5                         2 2025-02-10 3
          2 2025-02-02  8 3.0                         3 2025-03-15 0
          3 2025-02-14  4 null                        7 2025-03-20 2   <- orphan stop
          9 2025-03-01  6 1.0   <- orphan stop
       null 2025-03-05  2 1.0   <- null key
          2 2024-02-02  7 3.0   <- these two rows are identical
          2 2024-02-02  7 3.0
          1 2024-03-31  3 2.0
"""

from __future__ import annotations

import datetime as dt
from collections.abc import Iterator

from differential.harness import Differential
from measureport.model.schema import Model
from measureport.model.tabledata import Dataset
from support.modelbuild import make

_FIRST = dt.date(2024, 1, 1)
DAYS = [_FIRST + dt.timedelta(days=i) for i in range((dt.date(2025, 3, 31) - _FIRST).days + 1)]
D = dt.date


def tram_network() -> tuple[Model, Dataset]:
    """The model and data described in the module text."""
    return make(
        {
            "lines": {"line_id": [1, 2], "name": ["Red", "Blue"], "kind": ["tram", "bus"]},
            "stops": {
                "stop_id": [1, 2, 3, 4],
                "name": ["Harbour", "Market", "Depot", "Quarry"],
                "line_id": [1, 1, 2, 5],
                "zone": ["A", "B", "A", "C"],
                "platforms": [2, 4, None, 1],
            },
            "days": {
                "day": DAYS,
                "year": [d.year for d in DAYS],
                "month": [f"{d.year}-{d.month:02d}" for d in DAYS],
            },
            "boardings": {
                "stop_id": [1, 1, 2, 3, 9, None, 2, 2, 1],
                "day": [
                    D(2025, 1, 3),
                    D(2025, 1, 20),
                    D(2025, 2, 2),
                    D(2025, 2, 14),
                    D(2025, 3, 1),
                    D(2025, 3, 5),
                    D(2024, 2, 2),
                    D(2024, 2, 2),
                    D(2024, 3, 31),
                ],
                "riders": [10, 5, 8, 4, 6, 2, 7, 7, 3],
                "fare": [2.5, 2.5, 3.0, None, 1.0, 1.0, 3.0, 3.0, 2.0],
            },
            "inspections": {
                "stop_id": [1, 2, 3, 7],
                "day": [D(2025, 1, 5), D(2025, 2, 10), D(2025, 3, 15), D(2025, 3, 20)],
                "faults": [1, 3, 0, 2],
            },
        },
        keys={"lines": "line_id", "stops": "stop_id", "days": "day"},
        relationships=[
            "stops.line_id -> lines.line_id",
            "boardings.stop_id -> stops.stop_id",
            "boardings.day -> days.day",
            "inspections.stop_id -> stops.stop_id",
            "inspections.day -> days.day",
        ],
    )


def tram_differential(measures: str) -> Iterator[Differential]:
    """The tram network's data with ``measures`` on the reference and DuckDB, for a fixture to
    ``yield from``; the engine is closed when the fixture ends."""
    model, data = tram_network()
    diff = Differential(model, data, measures)
    try:
        yield diff
    finally:
        diff.close()
