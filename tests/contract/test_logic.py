"""Comparisons and logic with their SQL meaning (three-valued: a null never passes), counted with
``count(1 for each sailings where COND)``, on invented data.

Passengers per sailing 1..12: 90, 100, 40, 20, 120, 80, 50, 30, 60, 70, 25, null.
Route per sailing: 1, 1, 2, 3, 1, 1, 2, 3, 1, 2, 9, 3 (route 9 does not exist: no name).
Expected counts are worked out by hand; the rules are common practice, no source. A count over
no iterated row is null (rule 5).
"""

from __future__ import annotations

import pytest

from contract.harbour import topic_files
from contract.tables import Grid, assert_column

CASES = {
    # name: (condition, expected count, how)
    "cmp_eq": ("sailings.passengers = 80", 1, "sailing 6"),
    "cmp_ne": ("sailings.route_id != 1", 7, "sailings 3, 4, 7, 8, 10, 11, 12"),
    "cmp_lt": ("sailings.passengers < 50", 4, "40, 20, 30, 25"),
    "cmp_le": ("sailings.passengers <= 50", 5, "40, 20, 50, 30, 25"),
    "cmp_gt": ("sailings.passengers > 100", 1, "120"),
    "cmp_ge": ("sailings.passengers >= 100", 2, "100, 120"),
    "cmp_and": ("sailings.passengers > 30 and sailings.passengers < 90", 5, "40, 80, 50, 60, 70"),
    "cmp_or": ("sailings.passengers < 25 or sailings.passengers > 100", 2, "20, 120"),
    "cmp_not": ("not (sailings.passengers > 50)", 5, "40, 20, 50, 30, 25; not null is null"),
    "cmp_in": ("sailings.route_id in (2, 3)", 6, "sailings 3, 4, 7, 8, 10, 12"),
    "cmp_not_in": ("sailings.route_id not in (1, 2)", 4, "sailings 4, 8, 11, 12"),
    "cmp_between": ("sailings.passengers between 50 and 80", 4, "80, 50, 60, 70 (ends included)"),
    "cmp_is_null": ("sailings.passengers is null", 1, "sailing 12"),
    "cmp_is_not_null": ("sailings.passengers is not null", 11, "all but sailing 12"),
    "cmp_like": ('route.name like "N%"', 5, "North Loop's five; Night Owl never sails"),
    "cmp_like_one": ('route.name like "_ast%"', 3, "East Cross: _ is one character"),
    "cmp_precedence": (
        "sailings.passengers < 30 or sailings.passengers > 90 and sailings.route_id = 1",
        4,
        "and binds tighter: 20, 25, and 100, 120 on route 1",
    ),
    "cmp_date": ('sailings.day < date "2025-01-01"', 4, "sailings 1-4, in 2024"),
    "cmp_in_null": ("sailings.passengers in (20, null)", 1, "sailing 4; = null is never true"),
    "cmp_not_in_null": ("sailings.passengers not in (20, null)", None, "never true: no row, so null"),
    "cmp_between_reversed": ("sailings.passengers between 80 and 50", None, "no value is >= 80 and <= 50"),
    "cmp_empty_name": ("route.name is null", 1, "sailing 11 points at the empty member"),
    "cmp_quoted": ('route.name = "North ""Loop"""', None, 'no route is named North "Loop"'),
    "cmp_text_lt": ('route.name < "O"', 8, "East Cross 3 and North Loop 5; no name fails"),
}
TOPIC = "logic"
MEASURES = "".join(
    f"measure {name} = count(1 for each sailings where {condition})\n"
    for name, (condition, _, _) in CASES.items()
)
FILES = topic_files(TOPIC, MEASURES)
SHARED = {"overall": list(CASES)}
COMMANDS: dict[str, list[str]] = {}


@pytest.mark.parametrize("measure", list(CASES))
def test_condition(grid: Grid, measure: str) -> None:
    _, expected, _ = CASES[measure]
    assert_column(grid("overall"), measure, [expected])
