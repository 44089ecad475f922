"""Dependency order and cycles between measures (invented bike-share model)."""

from __future__ import annotations

from semantics.bikes import bind, only_problem, problems, where


def test_measures_come_after_the_measures_they_reference() -> None:
    bound = bind(
        """measure margin = revenue - cost
measure revenue = sum(rides.fare)
measure cost = sum(repairs.cost)
measure per_ride = margin / trips
measure trips = count(rides)
"""
    )
    # margin needs revenue and cost first; per_ride needs margin (placed) and trips.
    assert list(bound.measures) == ["revenue", "cost", "margin", "trips", "per_ride"]
    assert bound.measures["per_ride"].depends_on == ("margin", "trips")
    assert bound.measures["revenue"].depends_on == ()


def test_a_measure_referenced_twice_is_one_dependency() -> None:
    bound = bind("measure trips = count(rides)\nmeasure x = trips * trips + trips\n")
    assert bound.measures["x"].depends_on == ("trips",)


def test_a_measure_that_references_itself() -> None:
    found = only_problem("measure trips = count(rides)\nmeasure loop = loop + 1\n")
    assert found.message == "measures form a cycle: loop -> loop"
    assert where(found) == (2, 9)


def test_a_cycle_of_two_measures() -> None:
    found = only_problem("measure a = b + 1\nmeasure b = a * 2\n")
    assert found.message == "measures form a cycle: a -> b -> a"
    assert where(found) == (1, 9)


def test_a_cycle_of_three_measures() -> None:
    found = only_problem("measure total = part + 1\nmeasure part = share * 2\nmeasure share = total / 3\n")
    assert found.message == "measures form a cycle: total -> part -> share -> total"
    assert where(found) == (1, 9)


def test_a_cycle_starts_at_its_first_definition() -> None:
    # The cycle is b -> c -> a -> b; b is defined first (line 2), x only leads into it.
    found = only_problem("measure x = b\nmeasure b = c\nmeasure c = a\nmeasure a = b\n")
    assert found.message == "measures form a cycle: b -> c -> a -> b"
    assert where(found) == (2, 9)


def test_two_separate_cycles_are_both_reported() -> None:
    found = problems("measure a = b\nmeasure b = a\nmeasure c = d\nmeasure d = c\n")
    assert [(d.message, where(d)) for d in found] == [
        ("measures form a cycle: a -> b -> a", (1, 9)),
        ("measures form a cycle: c -> d -> c", (3, 9)),
    ]


def test_a_let_value_is_not_a_dependency() -> None:
    bound = bind("measure trips = count(rides)\nmeasure x = let y = trips y + 1\n")
    assert bound.measures["x"].depends_on == ("trips",)
