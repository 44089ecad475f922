"""``sql``, ``diff`` and ``views`` (section 4), checked against values worked out by hand from
``contract/harbour.py`` (invented data). The SQL is run on DuckDB over tables named as in the
model; the rules are common practice, no source.
"""

from __future__ import annotations

from decimal import Decimal

import pytest

from contract.bench import Bench, Outcome, sql_args
from contract.duck import database
from contract.harbour import model_yaml, topic_files
from contract.tables import Grid, same_value

TOPIC = "ported"
MEASURES = """\
measure share = passengers / (passengers given clear route.name)
measure seats_left = sum(route.capacity - sailings.passengers for each sailings)
measure ytd_trips = trips given to_date(calendar.day, year)
"""
VIEWS = """\
views:
  riders_by_route_year:
    measures: [passengers, trips]
    by: [route.name, calendar.year]
    where: ['calendar.year >= 2025']
"""
MATCHING_EXPORT = """\
Route name,Riders,trips
East Cross,160,3
North Loop,450,5
South Shuttle,50,3
,25,1
"""
WRONG_EXPORT = """\
route.name,passengers,trips
East Cross,160,3
North Loop,451,5
South Shuttle,50,3
,25,1
"""
FILES = {
    **topic_files(TOPIC, MEASURES),
    "viewed.yaml": model_yaml(["base.measures"], views=VIEWS),
    "exports/matching.csv": MATCHING_EXPORT,
    "exports/wrong.csv": WRONG_EXPORT,
}
PORTED = ["passengers", "trips", "share", "seats_left", "ytd_trips"]
COMMANDS = {
    "sql": sql_args(f"{TOPIC}.yaml", PORTED, ["route.name"]),
    "diff_matching": [
        "diff", "viewed.yaml", "-m", "passengers,trips", "--by", "route.name",
        "--expected", "exports/matching.csv", "--map", "Route name=route.name", "--map", "Riders=passengers",
    ],
    "diff_wrong": [
        "diff", "viewed.yaml", "-m", "passengers,trips", "--by", "route.name",
        "--expected", "exports/wrong.csv",
    ],
    "views": ["views", "viewed.yaml", "--dialect", "duckdb", "--out", "generated"],
}
SHARED = {"by_route": PORTED}


def _close(a: object, b: object) -> bool:
    if isinstance(a, int | float | Decimal) and isinstance(b, int | float):
        return bool(float(a) == pytest.approx(float(b), rel=1e-9))
    return a == b


# Rows by route.name (Night Owl is all null and dropped). The calendar is not narrowed by a
# route, so the last visible day is 2025-12-31 and ytd_trips counts 2025's sailings per route.
PORTED_ROWS = [
    ("East Cross", 160, 3, 160 / 685, 80, 2),
    ("North Loop", 450, 5, 450 / 685, 300, 3),
    ("South Shuttle", 50, 3, 50 / 685, 50, 2),
    (None, 25, 1, 25 / 685, None, 1),  # the empty member: no capacity
]


def test_sql_gives_the_rows_that_run_prints(outcomes: dict[str, Outcome], bench: Bench) -> None:
    done = outcomes["sql"]
    assert done.returncode == 0, done.describe()
    con = database(bench.root)
    result = con.execute(done.stdout)
    assert [d[0] for d in result.description] == ["route.name", *PORTED]
    rows = result.fetchall()
    assert len(rows) == len(PORTED_ROWS), rows
    for got, expected in zip(rows, PORTED_ROWS, strict=True):
        assert all(_close(a, b) for a, b in zip(got, expected, strict=True)), (got, expected)


def test_run_prints_the_same_values(grid: Grid) -> None:
    # The shared run by route.name holds more measures, so Night Owl has a row there too.
    table = grid("by_route")
    rows = {row[0]: row for row in table.rows}
    for name, *values in PORTED_ROWS:
        printed = rows[name or ""]
        for measure, value in zip(PORTED, values, strict=True):
            assert same_value(printed[table.header.index(measure)], value), (name, measure, printed)


def test_diff_of_a_matching_export_exits_0(outcomes: dict[str, Outcome]) -> None:
    done = outcomes["diff_matching"]
    assert done.returncode == 0, done.describe()


def test_diff_of_a_differing_export_exits_1(outcomes: dict[str, Outcome]) -> None:
    done = outcomes["diff_wrong"]
    assert done.returncode == 1, done.describe()
    assert "Traceback" not in done.stderr
    assert "North Loop" in done.stdout + done.stderr, done.describe()


def test_views_writes_one_create_statement_per_view(outcomes: dict[str, Outcome], bench: Bench) -> None:
    done = outcomes["views"]
    assert done.returncode == 0, done.describe()
    text = (bench.root / "generated" / "riders_by_route_year.sql").read_text(encoding="utf-8")
    assert "CREATE" in text.upper()
    con = database(bench.root)
    con.execute(text)
    result = con.execute("SELECT * FROM riders_by_route_year")
    names = [d[0] for d in result.description]
    rows = [dict(zip(names, row, strict=True)) for row in result.fetchall()]
    assert {"passengers", "trips"} <= set(names), names
    # 2025 only: East Cross sailings 7, 10; North Loop 5, 6, 9; South Shuttle 8, 12; empty 11.
    got = sorted(((r["passengers"], r["trips"]) for r in rows), key=lambda pair: pair[0])
    assert got == [(25, 1), (30, 2), (120, 2), (260, 3)]
