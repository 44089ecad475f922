"""Types of measures and the type rules of each form (invented bike-share model).

Column types: rides.fare decimal, rides.day date, stations.name text, bikes.electric boolean.
"""

from __future__ import annotations

import pytest

from semantics.bikes import bind, only_problem, where


@pytest.mark.parametrize(
    ("expression", "expected"),
    [
        ("sum(rides.fare)", "number"),
        ("count(rides)", "number"),
        ("distinct(stations.name)", "number"),
        ("max(stations.name)", "text"),
        ("min(rides.day)", "date"),
        ("single(bikes.electric)", "boolean"),
        ("single(rides.day)", "date"),
        ("restricted(stations.name)", "boolean"),
        ("rank(sum(rides.fare) over stations.name)", "number"),
        ("sum(rides.fare) > 10", "boolean"),
        ('max(rides.day) between date "2025-01-01" and date "2025-12-31"', "boolean"),
        ("if restricted(stations.name) then null else max(stations.name)", "text"),
        ("coalesce(null, min(rides.day))", "date"),
        ("null", None),
        ('sum(rides.fare) given stations.name = "Quay"', "number"),
        ("let d = max(rides.day) d", "date"),
        ("round(mean(rides.minutes), -1)", "number"),
    ],
)
def test_measure_types(expression: str, expected: str | None) -> None:
    assert bind(f"measure m = {expression}\n").measures["m"].type == expected


def test_a_measure_reference_has_the_type_of_the_measure() -> None:
    bound = bind("measure last_name = max(stations.name)\nmeasure copy = last_name\n")
    assert bound.measures["copy"].type == "text"


def test_a_measure_type_travels_into_the_measures_that_use_it() -> None:
    found = only_problem("measure last_name = max(stations.name)\nmeasure bad =\n  last_name * 2\n")
    assert found.message == "* needs numbers on both sides; the left side is text"
    assert where(found) == (3, 3)


def one(expression_lines: str) -> tuple[str, tuple[int, int]]:
    """Bind ``measure m =`` followed by the given lines; the one error and where it is."""
    found = only_problem("measure m =\n" + expression_lines)
    return found.message, where(found)


def test_sum_needs_numbers() -> None:
    assert one("  sum(stations.name)\n") == ("sum needs numbers; stations.name is text", (2, 7))


def test_mean_needs_numbers() -> None:
    assert one("  mean(rides.day)\n") == ("mean needs numbers; rides.day is a date", (2, 8))


def test_min_and_max_need_ordered_values() -> None:
    assert one("  min(bikes.electric)\n") == (
        "min needs numbers, dates or text; bikes.electric is true or false",
        (2, 7),
    )


def test_sum_of_a_row_expression_needs_numbers() -> None:
    assert one("  sum(stations.name for each stations)\n") == (
        "sum needs numbers; stations.name is text",
        (2, 7),
    )


def test_arithmetic_needs_numbers() -> None:
    assert one("  sum(rides.fare) -\n  max(rides.day)\n") == (
        "- needs numbers on both sides; the right side is a date",
        (3, 3),
    )


def test_unary_minus_needs_a_number() -> None:
    assert one("  -max(stations.name)\n") == ("- needs a number; this is text", (2, 4))


def test_comparison_needs_one_type() -> None:
    assert one("  max(rides.day) > 3\n") == ("cannot compare a date with a number", (2, 3))


def test_like_needs_text() -> None:
    assert one('  max(rides.minutes) like "1%"\n') == (
        "like needs text on its left; this is a number",
        (2, 3),
    )


def test_the_pattern_of_like_is_text() -> None:
    assert one("  max(stations.name) like\n  5\n") == (
        "the pattern of like must be text; this is a number",
        (3, 3),
    )


def test_logic_needs_booleans() -> None:
    assert one("  restricted(stations.name) and\n  count(rides)\n") == (
        "and needs true or false on both sides; the right side is a number",
        (3, 3),
    )


def test_not_needs_a_boolean() -> None:
    assert one("  not count(rides)\n") == ("not needs true or false; this is a number", (2, 7))


def test_the_condition_of_if_is_a_boolean() -> None:
    assert one("  if count(rides) then 1 else 2\n") == (
        "the condition of if must be true or false; this is a number",
        (2, 6),
    )


def test_the_branches_of_if_share_a_type() -> None:
    assert one("  if restricted(stations.name) then count(rides)\n  else max(stations.name)\n") == (
        "the branches of if give a number and text",
        (3, 8),
    )


def test_coalesce_values_share_a_type() -> None:
    assert one("  coalesce(sum(rides.fare),\n  max(stations.name))\n") == (
        "coalesce mixes a number and text",
        (3, 3),
    )


def test_least_needs_ordered_values() -> None:
    assert one("  least(single(bikes.electric), true)\n") == (
        "least needs numbers, dates or text, not true or false",
        (2, 3),
    )


def test_in_list_items_share_the_type_of_the_value() -> None:
    assert one('  max(stations.name) in ("Quay",\n  3)\n') == ("cannot compare text with a number", (3, 3))


def test_between_bounds_share_the_type_of_the_value() -> None:
    assert one('  max(rides.day) between date "2025-01-01" and\n  10\n') == (
        "cannot compare a date with a number",
        (3, 3),
    )


def test_abs_needs_a_number() -> None:
    assert one("  abs(max(stations.name))\n") == ("abs needs a number; this is text", (2, 7))


def test_round_places_must_be_an_integer_literal() -> None:
    assert one("  round(sum(rides.fare),\n  count(rides))\n") == (
        "the decimal places of round must be a whole number written out, e.g. 2",
        (3, 3),
    )
    assert one("  round(sum(rides.fare), 1.5)\n") == (
        "the decimal places of round must be a whole number written out, e.g. 2",
        (2, 26),  # "  round(sum(rides.fare), " is 25 characters
    )


def test_rank_orders_numbers() -> None:
    assert one("  rank(max(stations.name) over stations.name)\n") == (
        "rank orders numbers; max(stations.name) is text",
        (2, 8),
    )


def test_the_where_of_for_each_is_a_boolean() -> None:
    assert one("  count(rides.ride_id for each rides where rides.minutes)\n") == (
        "the condition after where must be true or false; this is a number",
        (2, 44),  # "  count(rides.ride_id for each rides where " is 43 characters
    )


def test_a_given_condition_is_a_boolean() -> None:
    assert one("  count(rides) given stations.capacity + 1\n") == (
        "a condition after given must be true or false; this is a number",
        (2, 22),  # "  count(rides) given " is 21 characters
    )


def test_a_boolean_column_is_a_condition() -> None:
    assert bind("measure m = count(rides) given bikes.electric\n").measures["m"].type == "number"
