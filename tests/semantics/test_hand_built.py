"""Binding syntax trees built by hand (no parser involved), on the invented bike-share model."""

from __future__ import annotations

import pytest

from measureport.errors import MeasureportError, Span
from measureport.language import ast
from measureport.semantics.binder import bind_model
from semantics.bikes import BIKES

F = "hand.measures"


def at(line: int, column: int, end: int | None = None) -> Span:
    return Span(F, line, column, line, end if end is not None else column)


def measure(name: str, expr: ast.Expr, line: int) -> ast.MeasureDef:
    return ast.MeasureDef(name, expr, span=at(line, 1), name_span=at(line, 9, 8 + len(name)))


def file_of(*defs: ast.MeasureDef) -> ast.MeasureFile:
    return ast.MeasureFile(F, defs)


FARES = ast.Aggregate("sum", ast.ColumnRef("rides", "fare", span=at(1, 17, 26)), span=at(1, 13, 27))
RIDES = ast.Aggregate("count", ast.TableRef("rides", span=at(2, 19, 23)), span=at(2, 13, 24))


def test_names_become_measure_and_let_references() -> None:
    # measure fares = sum(rides.fare)
    # measure rides_n = count(rides)
    # measure per_ride = let n = rides_n  fares / n
    body = ast.Binary("/", ast.Name("fares", span=at(3, 30)), ast.Name("n", span=at(3, 38)))
    let = ast.Let("n", ast.Name("rides_n", span=at(3, 22)), body, span=at(3, 16), name_span=at(3, 20))
    bound = bind_model(
        BIKES,
        [file_of(measure("fares", FARES, 1), measure("rides_n", RIDES, 2), measure("per_ride", let, 3))],
    )
    per_ride = bound.measures["per_ride"]
    assert per_ride.expr == ast.Let(
        "n", ast.MeasureRef("rides_n"), ast.Binary("/", ast.MeasureRef("fares"), ast.LocalRef("n"))
    )
    assert per_ride.depends_on == ("rides_n", "fares")  # in the order first mentioned
    assert per_ride.type == "number"


def test_dependency_order_puts_references_first() -> None:
    # `ratio` is written first but references the two measures written after it.
    ratio = ast.Binary("/", ast.Name("fares"), ast.Name("rides_n"))
    bound = bind_model(
        BIKES, [file_of(measure("ratio", ratio, 1), measure("fares", FARES, 2), measure("rides_n", RIDES, 3))]
    )
    # ratio's references in the order written (fares, rides_n), then ratio itself.
    assert list(bound.measures) == ["fares", "rides_n", "ratio"]


def test_two_measure_cycle_is_reported_at_the_first_definition() -> None:
    a = ast.Binary("+", ast.Name("b"), ast.Number(1))
    b = ast.Binary("*", ast.Name("a"), ast.Number(2))
    with pytest.raises(MeasureportError) as raised:
        bind_model(BIKES, [file_of(measure("a", a, 1), measure("b", b, 2))])
    assert raised.value.message == "measures form a cycle: a -> b -> a"
    assert raised.value.span == at(1, 9)  # the name of a, defined on line 1
    assert raised.value.more == []


def test_a_bare_column_needs_an_aggregate() -> None:
    ref = ast.ColumnRef("rides", "fare", span=at(1, 13, 22))
    with pytest.raises(MeasureportError) as raised:
        bind_model(BIKES, [file_of(measure("fare", ref, 1))])
    assert raised.value.message == "rides.fare needs an aggregate here, e.g. sum(rides.fare)"
    assert raised.value.span == at(1, 13, 22)


def test_unknown_column_points_at_the_column_name() -> None:
    # measure fares = sum(rides.fair)  -- `fair` starts at column 23
    ref = ast.ColumnRef("rides", "fair", span=at(1, 17, 26))
    with pytest.raises(MeasureportError) as raised:
        bind_model(BIKES, [file_of(measure("fares", ast.Aggregate("sum", ref), 1))])
    assert raised.value.message == "table rides has no column fair; did you mean fare?"
    assert (raised.value.span.line, raised.value.span.column) == (1, 23)
