"""Columns as row values, for each, row and conditions over one table (invented bike-share model).

Relationships: rides -> stations -> districts, rides -> bikes, rides -> calendar,
repairs -> bikes, repairs -> stations; weather stands alone.
"""

from __future__ import annotations

from measureport.language import ast
from semantics.bikes import bind, only_problem, warnings, where


def one(expression_lines: str) -> tuple[str, tuple[int, int]]:
    """Bind ``measure m =`` followed by the given lines; the one error and where it is."""
    found = only_problem("measure trips = count(rides)\nmeasure m =\n" + expression_lines)
    return found.message, where(found)


def binds(expression: str) -> None:
    """``measure m = expression`` binds without error or warning."""
    assert warnings(f"measure trips = count(rides)\nmeasure m = {expression}\n") == []


def test_a_bare_number_column_needs_an_aggregate() -> None:
    assert one("  rides.fare\n") == ("rides.fare needs an aggregate here, e.g. sum(rides.fare)", (3, 3))


def test_a_bare_text_column_needs_an_aggregate() -> None:
    assert one("  stations.name\n") == (
        "stations.name needs an aggregate here, e.g. max(stations.name)",
        (3, 3),
    )


def test_sum_of_an_expression_without_for_each_says_how_to_write_it() -> None:
    assert one("  sum(rides.fare * 2)\n") == (
        "sum without for each takes one column; to aggregate an expression row by row, "
        "write sum(rides.fare * 2 for each rides)",
        (3, 3),
    )


def test_the_suggested_table_is_the_one_that_reaches_every_column() -> None:
    # rides reaches stations, so rides is the table to iterate.
    message, _ = one("  mean(stations.capacity - rides.minutes)\n")
    assert message.endswith("write mean(stations.capacity - rides.minutes for each rides)")


def test_mean_of_a_measure_without_for_each_says_how_to_write_it() -> None:
    assert one("  mean(trips)\n") == (
        "mean without for each takes one column; to aggregate trips over the members of a column, "
        "write mean(trips for each table.column)",
        (3, 3),
    )


def test_sum_of_a_table() -> None:
    assert one("  sum(rides)\n") == (
        "sum(rides) needs a column of rides, written rides.column; count(rides) counts its rows",
        (3, 3),
    )


def test_inside_a_table_iteration_columns_of_reached_tables_have_row_values() -> None:
    # rides reaches stations (one hop), districts (two hops) and calendar.
    binds('sum(rides.fare * stations.capacity for each rides where districts.zone = "harbour")')
    binds('count(rides.ride_id for each rides where calendar.weekday = "Sat")')


def test_inside_a_table_iteration_a_column_the_table_does_not_reach() -> None:
    assert one("  sum(stations.capacity * rides.minutes for each stations)\n") == (
        "rides.minutes has no value on the current row: the iterated table stations does not reach rides",
        (3, 27),  # "  sum(stations.capacity * " is 26 characters
    )


def test_inside_a_column_iteration_only_iterated_columns_have_values() -> None:
    binds("max(stations.district_id for each stations.district_id)")
    assert one("  sum(stations.capacity for each stations.district_id)\n") == (
        "stations.capacity has no value here: inside for each stations.district_id only the iterated "
        "columns have a current value",
        (3, 7),
    )


def test_the_where_of_a_column_iteration_sees_only_the_iterated_columns() -> None:
    message, position = one("  sum(trips for each stations.name where stations.capacity > 10)\n")
    assert message.startswith("stations.capacity has no value here")
    assert position == (3, 42)  # "  sum(trips for each stations.name where " is 41 characters


def test_an_outer_iteration_gives_values_inside_an_inner_one() -> None:
    # rides.minutes is not reached from stations, but the outer rides row gives it a value.
    binds("sum((sum(stations.capacity + rides.minutes for each stations) given row) for each rides)")


def test_iterated_columns_must_come_from_one_closest_table() -> None:
    # Both rides and repairs reach stations and bikes, and neither reaches the other.
    assert one("  count(stations.name for each stations.name, bikes.model)\n") == (
        "for each needs columns that one closest table reaches; repairs and rides both reach "
        "stations.name and bikes.model, so iterate the rows of one table instead, e.g. for each repairs",
        (3, 23),  # the iteration starts at "for", after the 22 characters "  count(stations.name "
    )


def test_iterated_columns_that_no_table_reaches() -> None:
    assert one("  count(weather.rain_mm for each weather.rain_mm, stations.name)\n") == (
        "for each needs columns that one table reaches, and no table reaches all of weather.rain_mm "
        "and stations.name",
        (3, 25),  # "for" follows the 24 characters "  count(weather.rain_mm "
    )


def test_iterated_columns_with_a_closest_table() -> None:
    # Only rides reaches calendar and stations; stations is the closest table reaching districts.
    binds("sum(trips for each calendar.month, stations.name)")
    binds("sum(trips for each districts.zone, stations.name)")


def test_for_each_of_an_unknown_table() -> None:
    assert one("  sum(trips for each ride)\n") == ("unknown table ride; did you mean rides?", (3, 22))


def test_for_each_of_a_measure() -> None:
    assert one("  sum(trips for each trips)\n") == (
        "trips is a measure, not a table: for each takes a table or columns written table.column",
        (3, 22),
    )


def test_row_outside_for_each() -> None:
    assert one("  trips given\n  row\n") == (
        "row binds the current row of for each, and there is none here",
        (4, 3),
    )


def test_row_inside_for_each() -> None:
    binds("sum((count(rides) given row) for each stations)")


# --- conditions over one table ------------------------------------------------------------------


def test_a_condition_over_two_tables() -> None:
    assert one('  trips given\n  stations.name = "Quay" and bikes.electric\n') == (
        "a condition after given tests the columns of one table, but this one names columns of "
        "stations and bikes",
        (4, 3),
    )


def test_row_values_of_an_enclosing_iteration_are_constants_of_a_condition() -> None:
    # stations.station_id is the current station; the condition filters rides.
    bound = bind(
        "measure trips = count(rides)\n"
        "measure m = sum(trips given rides.start_station = stations.station_id for each stations)\n"
    )
    assert bound.warnings == ()
    assert bound.measures["m"].depends_on == ("trips",)


def test_a_narrow_condition_over_two_tables() -> None:
    message, _ = one("  trips given narrow stations.capacity > rides.minutes\n")
    assert message == (
        "a condition after narrow tests the columns of one table, but this one names columns of "
        "stations and rides"
    )


def test_values_inside_a_condition_are_not_tested_columns() -> None:
    # max(calendar.day) is computed outside the given (rule 4); only calendar.day is tested.
    binds("trips given calendar.day = max(calendar.day)")
    binds("trips given stations.capacity > (max(rides.minutes) given clear rides)")


def test_a_condition_must_test_a_column() -> None:
    assert one('  trips given max(rides.day) > date "2025-01-01"\n') == (
        "a condition after given must test a column, written table.column",
        (3, 15),
    )


def test_the_bound_tree_keeps_iterations_and_conditions() -> None:
    bound = bind(
        "measure trips = count(rides)\nmeasure m = sum(trips given stations.capacity > 5 for each stations)\n"
    )
    assert bound.measures["m"].expr == ast.Aggregate(
        "sum",
        ast.Given(
            ast.MeasureRef("trips"),
            (ast.Condition(ast.Binary(">", ast.ColumnRef("stations", "capacity"), ast.Number(5))),),
        ),
        ast.Iteration(table=ast.TableRef("stations")),
    )


def test_a_condition_whose_columns_all_have_row_values_is_ambiguous() -> None:
    # Inside for each rides both stations.station_id and rides.start_station have row values,
    # so neither table is clearly the one filtered.
    assert one("  sum(trips given stations.station_id = rides.start_station for each rides)\n") == (
        "a condition after given tests the columns of one table, but this one names columns of stations "
        "and rides; to compare with a value of the current row, put that value in a let first",
        (3, 19),
    )


def test_a_let_turns_a_row_value_into_a_constant_of_the_condition() -> None:
    binds("sum(let s = rides.start_station (trips given stations.station_id = s) for each rides)")


def test_rank_over_an_unknown_column() -> None:
    assert one("  rank(trips over stations.nam)\n") == (
        "table stations has no column nam; did you mean name?",
        (3, 28),  # after the 27 characters "  rank(trips over stations."
    )


def test_single_and_restricted_of_unknown_columns() -> None:
    assert one("  single(bike.model)\n") == ("unknown table bike; did you mean bikes?", (3, 10))
    assert one("  restricted(bikes.colour)\n") == ("table bikes has no column colour", (3, 20))
