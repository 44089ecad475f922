"""Measure texts of our own, generated over the bike-share demo model, for timing the compiler on
many measures: plain aggregates, row expressions, given with replace, narrow and clear, column and
table iterations, time windows, rank, and let/if arithmetic. The same seed gives the same texts.
"""

from __future__ import annotations

import random
from collections.abc import Callable
from dataclasses import dataclass

RIDE_NUMBERS = ("rides.fare", "rides.duration_min", "rides.distance_km", "rides.rating", "rides.start_hour")
AGGREGATES = ("sum", "mean", "min", "max", "count", "distinct")
# Values present in the demo data (measureport demo).
CONDITIONS = (
    "calendar.year = 2025",
    "calendar.is_weekend = true",
    'bikes.model like "%Cargo%"',
    "bikes.is_electric = true",
    'plans.name in ("Monthly", "Annual")',
    'districts.zone = "central"',
    'rides.payment = "card"',
    "rides.rating between 4 and 5",
)
CLEARS = (
    "plans.name", "stations", "districts", "calendar but calendar.year", "bikes.model", "calendar.month",
)
RANKED = ("stations.name", "districts.name", "plans.name", "bikes.model", "calendar.month")
ITERATED_COLUMNS = ("calendar.day", "stations.name", "calendar.year, calendar.month_number", "bikes.model")
ITERATED_TABLES = ("stations", "bikes", "plans")
BASES = (
    "trips", "revenue", "sum(rides.fare)", "count(rides)", "mean(rides.duration_min)",
    "sum(maintenance.cost)",
)
# Inside an iteration a measure reference is bound to the current row; a bare aggregate is not.
MEASURES = ("trips", "revenue", "revenue_per_trip", "mean_duration", "bikes_in_use")


@dataclass(frozen=True)
class GeneratedMeasure:
    """One generated measure: its name, its family (the construct it exercises) and its text."""

    name: str
    family: str
    text: str

    def definition(self) -> str:
        return f"measure {self.name} = {self.text}"


Family = Callable[[random.Random, int], str]


def _aggregate(rng: random.Random, i: int) -> str:
    return f"{rng.choice(AGGREGATES)}({rng.choice(RIDE_NUMBERS)}) * {1 + i % 7}"


def _row_expression(rng: random.Random, i: int) -> str:
    column = rng.choice(("rides.duration_min", "rides.fare", "rides.start_hour"))
    return (
        f"sum(greatest({column} - {i % 30}, 0) for each rides where rides.start_hour >= {i % 24})"
    )


def _replace(rng: random.Random, i: int) -> str:
    return f"{rng.choice(BASES)} given {rng.choice(CONDITIONS)}, rides.start_hour >= {i % 24}"


def _narrow(rng: random.Random, i: int) -> str:
    return f"coalesce({rng.choice(BASES)} given narrow {rng.choice(CONDITIONS)}, 0) + {i % 5}"


def _clear(rng: random.Random, i: int) -> str:
    base = rng.choice(BASES)
    return f"{base} / ({base} given clear {rng.choice(CLEARS)}) * {1 + i % 3}"


def _column_iteration(rng: random.Random, i: int) -> str:
    aggregate = rng.choice(("mean", "max", "min", "sum"))
    over = rng.choice(ITERATED_COLUMNS)
    return f"{aggregate}(coalesce({rng.choice(MEASURES)}, 0) + {i % 9} for each {over})"


def _table_iteration(rng: random.Random, i: int) -> str:
    aggregate = rng.choice(("mean", "max", "sum"))
    condition = rng.choice(CONDITIONS[:2])
    measure = rng.choice(MEASURES)
    return f"{aggregate}(({measure} given row, {condition}) + {i % 4} for each {rng.choice(ITERATED_TABLES)})"


def _time_window(rng: random.Random, i: int) -> str:
    window = rng.choice((
        f"to_date(calendar.day, {rng.choice(('year', 'quarter', 'month'))})",
        f'to_date(calendar.day, year, start "{1 + i % 12:02d}-01")',
        f"shift(calendar.day, -{1 + i % 3}, {rng.choice(('day', 'month', 'quarter', 'year'))})",
        f"trailing(calendar.day, {1 + i % 60}, {rng.choice(('day', 'month'))})",
    ))
    return f"{rng.choice(BASES[:4])} given {window}"


def _rank(rng: random.Random, i: int) -> str:
    order = " ascending" if i % 2 else ""
    return f"rank({rng.choice(BASES)} + {i % 3} over {rng.choice(RANKED)}{order})"


def _let_if(rng: random.Random, i: int) -> str:
    first, second = rng.sample(BASES, 2)
    return f"let a = {first}\n  let b = {second}\n  if b > {i % 10} then round(a / b, {i % 4}) else null"


FAMILIES: tuple[tuple[str, Family], ...] = (
    ("aggregate", _aggregate),
    ("row expression", _row_expression),
    ("given replace", _replace),
    ("given narrow", _narrow),
    ("given clear", _clear),
    ("for each columns", _column_iteration),
    ("for each table", _table_iteration),
    ("time window", _time_window),
    ("rank", _rank),
    ("let and if", _let_if),
)


def generate_measures(count: int, seed: int = 2026) -> list[GeneratedMeasure]:
    """``count`` measures, the families taken in turn, each text varied by ``seed``."""
    rng = random.Random(seed)
    measures = []
    for i in range(count):
        family, make = FAMILIES[i % len(FAMILIES)]
        measures.append(GeneratedMeasure(f"generated_{i:04d}", family, make(rng, i)))
    return measures


def measure_file_text(measures: list[GeneratedMeasure]) -> str:
    """The measures as the text of one measure file."""
    return "\n".join(m.definition() for m in measures) + "\n"
