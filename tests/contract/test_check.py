"""``measureport check``: orphan keys are counted (section 1) and a bare aggregate inside
``for each`` is warned about (rule 1); orphan rows group under the empty member. Invented data.
"""

from __future__ import annotations

import re

from contract.bench import Outcome, run_args
from contract.harbour import ROUTES_CSV, topic_files
from contract.tables import assert_column

TOPIC = "check"
MEASURES = """\
measure per_trip = passengers / trips
measure flat_max = sum(max(sailings.passengers) for each sailings)
measure bound_max = sum(max(sailings.passengers) given row for each sailings)
"""
# Routes without South Shuttle (route 3): sailings 4, 8 and 12 lose their route, as 11 did.
ROUTES_WITHOUT_SOUTH = "".join(line + "\n" for line in ROUTES_CSV.splitlines() if not line.startswith("3,"))
FILES = {
    **topic_files(TOPIC, MEASURES),
    "data/routes_without_south.csv": ROUTES_WITHOUT_SOUTH,
    **topic_files("more_orphans", "", sources={"route": "data/routes_without_south.csv"}),
}
COMMANDS = {
    "check": ["check", f"{TOPIC}.yaml"],
    "more_orphans": ["check", "more_orphans.yaml"],
    "more_orphans_run": run_args("more_orphans.yaml", ["passengers", "trips"], ["route.name"]),
}


def _line_about(text: str, relationship: str) -> str:
    lines = [line for line in text.splitlines() if relationship in line]
    assert lines, text
    return lines[0]


def test_check_counts_one_orphan_row(outcomes: dict[str, Outcome]) -> None:
    done = outcomes["check"]
    assert done.returncode == 0, done.describe()
    report = done.stdout + done.stderr
    # One sailing (11) points at route 9, which does not exist.
    line = _line_about(report, "sailings.route_id")
    assert re.search(r"\b1\b", line), line


def test_check_counts_four_orphan_rows(outcomes: dict[str, Outcome]) -> None:
    done = outcomes["more_orphans"]
    assert done.returncode == 0, done.describe()
    # Sailings 4, 8, 12 (route 3, removed) and 11 (route 9).
    line = _line_about(done.stdout + done.stderr, "sailings.route_id")
    assert re.search(r"\b4\b", line), line


def test_orphans_group_under_the_empty_member(outcomes: dict[str, Outcome]) -> None:
    # Empty member: sailings 4 (20), 8 (30), 11 (25), 12 (null).
    table = outcomes["more_orphans_run"].table()
    assert table.column("route.name") == ["East Cross", "North Loop", ""]
    assert_column(table, "passengers", [160, 450, 20 + 30 + 25])
    assert_column(table, "trips", [3, 5, 4])


def test_check_warns_about_a_bare_aggregate_inside_for_each(outcomes: dict[str, Outcome]) -> None:
    done = outcomes["check"]
    report = done.stdout + done.stderr
    # flat_max is on line 2 of check.measures; per_trip (line 1) and bound_max (line 3, the row
    # made explicit) are fine.
    lines = report.splitlines()
    warnings = [line for line in lines if "warning" in line.lower() and "check.measures:" in line]
    assert warnings, report
    assert all("check.measures:2:" in line for line in warnings), report
