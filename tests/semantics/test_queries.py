"""Queries from command-line options and from views, and report filters (invented bike-share model)."""

from __future__ import annotations

import pytest

from measureport.errors import MeasureportError, Span, remember_source
from measureport.language import ast
from measureport.model.schema import View, ViewCondition
from measureport.query import Query
from measureport.semantics.binder import bind_condition, bind_model, build_query, view_query
from semantics.bikes import BIKES, bind, parse, with_views

MEASURES = "measure trips = count(rides)\nmeasure fares = sum(rides.fare)\n"
BOUND = bind(MEASURES)


def query_error(measures: list[str], by: list[str] = [], where_: list[str] = []) -> MeasureportError:  # noqa: B006
    with pytest.raises(MeasureportError) as raised:
        build_query(BOUND, measures, by, where_)
    return raised.value


def test_a_query_from_options() -> None:
    query = build_query(
        BOUND, ["trips", "fares"], ["stations.name", "calendar.month"], ["bikes.electric"], True
    )
    assert query == Query(
        ("trips", "fares"),
        (ast.ColumnRef("stations", "name"), ast.ColumnRef("calendar", "month")),
        (ast.ColumnRef("bikes", "electric"),),
        totals=True,
    )
    assert query.by[1].span == Span("<--by>", 1, 15, 1, 28)  # after the 14 characters "stations.name,"


def test_an_unknown_measure_in_the_options() -> None:
    error = query_error(["trips", "fars"])
    assert error.message == "unknown measure fars; did you mean fares?"
    assert (error.span.file, error.span.line, error.span.column) == ("<-m>", 1, 7)  # after "trips,"
    assert "  trips,fars\n        ^^^^" in error.render()


def test_a_measure_asked_for_twice() -> None:
    assert query_error(["trips", "trips"]).message == "measure trips is asked for twice"


def test_no_measure_at_all() -> None:
    assert query_error([]).message == "name at least one measure to compute"


def test_an_unknown_grouping_column() -> None:
    error = query_error(["trips"], ["stations.name", "bikes.modle"])
    assert error.message == "table bikes has no column modle; did you mean model?"
    assert (error.span.file, error.span.line, error.span.column) == (
        "<--by>",
        1,
        21,
    )  # "stations.name,bikes."


def test_grouping_by_something_other_than_a_column() -> None:
    error = query_error(["trips"], ["trips"])
    assert error.message == "--by takes columns written table.column; trips is not one"


def test_grouping_by_a_column_twice() -> None:
    error = query_error(["trips"], ["stations.name", "stations.name"])
    assert error.message == "stations.name is in --by twice"
    assert error.span.column == 15


def test_report_filters_are_bound_and_each_has_its_own_line() -> None:
    error = query_error(["trips"], [], ["calendar.year = 2025", 'stations.name = "Quay" or bikes.electric'])
    assert error.message == (
        "a report filter tests the columns of one table, but this one names columns of stations and bikes"
    )
    assert (error.span.file, error.span.line, error.span.column) == ("<--where>", 2, 1)


def test_a_report_filter_cannot_use_a_measure_or_an_aggregate() -> None:
    error = query_error(["trips"], [], ["trips > 3 and calendar.year = 2025"])
    assert (
        error.message
        == "a report filter tests the columns of one table row by row; it cannot use the measure trips"
    )
    error = query_error(["trips"], [], ["calendar.day = max(calendar.day)"])
    assert error.message == (
        "a report filter tests the columns of one table row by row; it cannot use max(calendar.day)"
    )
    assert error.span.column == 16


def test_a_report_filter_is_a_boolean() -> None:
    error = query_error(["trips"], [], ["calendar.year + 1"])
    assert error.message == "a report filter must be true or false; this is a number"


def test_a_syntax_error_in_a_report_filter_is_reported_in_its_place() -> None:
    error = query_error(["trips"], [], ["calendar.year = 2025", "calendar.year = = 2"])
    assert (error.span.file, error.span.line) == ("<--where>", 2)


def test_bind_condition_resolves_nothing_but_checks_columns() -> None:
    expr = ast.Binary("=", ast.ColumnRef("stations", "name"), ast.String("Quay"))
    assert bind_condition(BOUND, expr) == expr
    with pytest.raises(MeasureportError) as raised:
        bind_condition(BOUND, ast.Binary("=", ast.ColumnRef("stations", "nam"), ast.String("Quay")))
    assert raised.value.message == "table stations has no column nam; did you mean name?"


# --- views -----------------------------------------------------------------------------------------

YAML = "bikes.yaml"
YAML_TEXT = """views:
  trips_by_station:
    measures: [trips, fares]
    by: [stations.name]
    where: ['calendar.year >= 2025', 'bikes.electric']
"""
remember_source(YAML, YAML_TEXT)


def station_view(*where_: ViewCondition, measures: tuple[str, ...] = ("trips", "fares")) -> View:
    return View(
        "trips_by_station",
        measures,
        (("stations", "name"),),
        where_,
        span=Span(YAML, 2, 3),
        measure_spans=tuple(Span(YAML, 3, 16 + 7 * i, 3, 20 + 7 * i) for i in range(len(measures))),
        by_spans=(Span(YAML, 4, 10, 4, 22),),
    )


def test_view_query() -> None:
    view = station_view(
        ViewCondition("calendar.year >= 2025", Span(YAML, 5, 14)),
        ViewCondition("bikes.electric", Span(YAML, 5, 39)),
    )
    bound = bind_model(with_views(view), [parse(MEASURES)])
    query = view_query(bound, "trips_by_station")
    assert query.measures == ("trips", "fares")
    assert query.by == (ast.ColumnRef("stations", "name"),)
    assert query.where == (
        ast.Binary(">=", ast.ColumnRef("calendar", "year"), ast.Number(2025)),
        ast.ColumnRef("bikes", "electric"),
    )
    # Inside the quotes of the second list item: "    where: ['calendar.year >= 2025', '" is 38 characters.
    assert (query.where[1].span.line, query.where[1].span.column) == (5, 39)


def test_an_unknown_view() -> None:
    view = station_view()
    bound = bind_model(with_views(view), [parse(MEASURES)])
    with pytest.raises(MeasureportError) as raised:
        view_query(bound, "trips_by_stations")
    assert raised.value.message == "the model has no view trips_by_stations; did you mean trips_by_station?"


def test_a_view_asking_for_an_unknown_measure() -> None:
    view = station_view(measures=("trips", "fare"))
    with pytest.raises(MeasureportError) as raised:
        bind_model(with_views(view), [parse(MEASURES)])
    assert raised.value.message == "view trips_by_station asks for unknown measure fare; did you mean fares?"
    assert raised.value.span == Span(YAML, 3, 23, 3, 27)  # the second item of the measures list


def test_a_view_condition_is_bound_where_the_loader_found_it() -> None:
    view = station_view(
        ViewCondition("calendar.year >= 2025", Span(YAML, 5, 14)),
        ViewCondition("bikes.electric and stations.capacity > 5", Span(YAML, 5, 39)),
    )
    with pytest.raises(MeasureportError) as raised:
        bind_model(with_views(view), [parse(MEASURES)])
    assert raised.value.message == (
        "a where condition of a view tests the columns of one table, but this one names columns of bikes "
        "and stations"
    )
    assert (raised.value.span.file, raised.value.span.line, raised.value.span.column) == (YAML, 5, 39)
    assert raised.value.render().splitlines()[2] == " " * 40 + "^" * 40  # under the condition's 40 characters


def test_views_do_not_change_the_bound_measures() -> None:
    view = station_view()
    plain = bind_model(BIKES, [parse(MEASURES)])
    with_view = bind_model(with_views(view), [parse(MEASURES)])
    assert list(plain.measures) == list(with_view.measures) == ["trips", "fares"]
