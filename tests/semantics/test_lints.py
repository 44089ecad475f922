"""Warnings of check: aggregates that do not see the current row (LANGUAGE.md rule 1), conditions
that undo the row binding (rule 3), measures no view uses (invented bike-share model)."""

from __future__ import annotations

from measureport.model.schema import View
from semantics.bikes import warnings, where, with_views

TRIPS = "measure trips = count(rides)\n"


def lint(expression_lines: str) -> list[tuple[str, tuple[int, int]]]:
    """The warnings of ``measure m =`` followed by the given lines, and where they are."""
    return [(d.message, where(d)) for d in warnings(TRIPS + "measure m =\n" + expression_lines)]


def test_a_bare_aggregate_inside_for_each_returns_one_value_for_every_row() -> None:
    assert lint("  sum(\n  count(rides) for each stations)\n") == [
        (
            "count(rides) inside for each stations does not see the current row: it returns the same "
            "value on every row; write (count(rides) given row) or use a measure to evaluate it per row",
            (4, 3),
        )
    ]


def test_the_warning_has_the_warning_severity() -> None:
    (found,) = warnings(TRIPS + "measure m = sum(count(rides) for each stations)\n")
    assert found.severity == "warning"


def test_an_aggregate_under_given_sees_the_row() -> None:
    assert lint("  sum((count(rides) given row) for each stations)\n") == []
    assert lint("  sum((count(rides) given clear calendar) for each stations)\n") == []


def test_a_measure_reference_sees_the_row() -> None:
    assert lint("  sum(trips for each stations)\n") == []


def test_single_rank_and_restricted_inside_for_each_are_linted_too() -> None:
    found = lint(
        '  sum(if single(bikes.model) = "city" then 1 else 0 for each stations)\n'
        "  + max(rank(trips over stations.name) for each calendar.month)\n"
    )
    assert [position for _, position in found] == [(3, 10), (4, 9)]
    assert found[0][0].startswith("single(bikes.model) inside for each stations does not see the current row")
    assert found[1][0].startswith(
        "rank(trips over stations.name) inside for each calendar.month does not see the current row"
    )


def test_restricted_inside_for_each_is_linted() -> None:
    (found,) = lint("  count(rides.ride_id for each rides where restricted(stations.name))\n")
    assert found[0].startswith("restricted(stations.name) inside for each rides does not see the current row")


def test_a_nested_bare_iteration_is_linted_but_not_its_own_rows() -> None:
    found = lint("  sum(\n  sum(rides.fare for each rides) for each stations)\n")
    # Only the inner sum is reported; rides.fare inside it is the inner iteration's row value.
    assert len(found) == 1
    assert found[0][1] == (4, 3)
    assert found[0][0].startswith("sum(rides.fare for each rides) inside for each stations")


def test_a_long_aggregate_is_quoted_short() -> None:
    (found,) = lint(
        "  sum(sum(rides.fare * stations.capacity + rides.minutes for each rides) for each bikes)\n"
    )
    assert found[0].startswith("sum(...) inside for each bikes")
    assert "write (sum(...) given row)" in found[0]


def test_a_value_inside_a_condition_is_computed_outside_the_given() -> None:
    # Rule 4: max(calendar.day) is computed before the row binding, so it is the same everywhere.
    found = lint("  sum(trips given calendar.day =\n  max(calendar.day) for each stations)\n")
    assert [position for _, position in found] == [(4, 3)]


def test_outside_for_each_nothing_is_linted() -> None:
    assert lint("  sum(rides.fare) / count(rides)\n") == []


def test_a_condition_that_replaces_the_binding_of_an_iterated_column() -> None:
    assert lint("  sum(trips given\n  stations.district_id = 3 for each stations.district_id)\n") == [
        (
            "the binding of stations.district_id to the current row is lost here; use narrow to keep it",
            (4, 3),
        )
    ]


def test_a_condition_on_any_column_of_the_iterated_table() -> None:
    (found,) = lint(
        '  sum(trips given stations.capacity > 10 and stations.name != "Quay" for each stations)\n'
    )
    assert found == (
        "the binding of stations.capacity and stations.name to the current row is lost here; "
        "use narrow to keep it",
        (3, 19),  # the condition follows the 18 characters "  sum(trips given "
    )


def test_narrow_keeps_the_binding() -> None:
    assert lint("  sum(trips given narrow stations.capacity > 10 for each stations)\n") == []


def test_a_condition_on_another_table_keeps_the_binding() -> None:
    assert lint("  sum(trips given calendar.year = 2025 for each stations)\n") == []


def test_a_condition_outside_for_each_is_not_linted() -> None:
    assert lint("  trips given stations.capacity > 10\n") == []


# --- measures no view uses ---------------------------------------------------------------------------

MEASURES = """measure trips = count(rides)
measure fares = sum(rides.fare)
measure per_trip = fares / trips
measure spare = max(rides.minutes)
"""


def test_measures_no_view_uses_are_reported() -> None:
    model = with_views(View("fares_by_station", ("per_trip",), (("stations", "name"),)))
    found = warnings(MEASURES, model)
    # per_trip uses fares and trips; only spare is left.
    assert [(d.message, where(d)) for d in found] == [("measure spare is not used by any view", (4, 9))]


def test_without_views_no_measure_is_unused() -> None:
    assert warnings(MEASURES) == []


def test_a_warning_renders_with_its_line_and_a_caret() -> None:
    (found,) = warnings(TRIPS + "measure m = sum(count(rides) for each stations)\n")
    # "measure m = sum(" is 16 characters; count(rides) is 12 characters long.
    assert found.render().splitlines()[:3] == [
        "bikes.measures:2:17: warning: " + found.message,
        "  measure m = sum(count(rides) for each stations)",
        "  " + " " * 16 + "^" * 12,
    ]
