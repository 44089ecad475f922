"""A bike-share model (schema only, invented) and helpers to bind measure text against it.

rides ──start_station──▶ stations ──district_id──▶ districts
  │ └──bike_id──▶ bikes ◀──bike_id── repairs ──station_id──▶ stations
  └──day──▶ calendar                 weather (no relationships)
"""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

import pytest

from measureport.errors import Diagnostic, MeasureportError
from measureport.language import ast
from measureport.language.parser import parse_measures
from measureport.model.schema import (
    BOOLEAN,
    DATE,
    DOUBLE,
    INTEGER,
    TEXT,
    Column,
    DataType,
    Model,
    Relationship,
    Table,
    View,
    decimal,
)
from measureport.semantics.binder import bind_model
from measureport.semantics.bound import BoundModel

FILE = "bikes.measures"


def _table(name: str, key: str | None, /, **columns: DataType) -> Table:
    return Table(name, f"data/{name}.csv", {c: Column(c, t) for c, t in columns.items()}, key)


TABLES = {
    t.name: t
    for t in [
        _table(
            "rides",
            None,
            ride_id=INTEGER,
            bike_id=INTEGER,
            start_station=INTEGER,
            day=DATE,
            minutes=INTEGER,
            fare=decimal(8, 2),
            rider_type=TEXT,
            is_member=BOOLEAN,
        ),
        _table(
            "stations",
            "station_id",
            station_id=INTEGER,
            name=TEXT,
            district_id=INTEGER,
            capacity=INTEGER,
            opened=DATE,
        ),
        _table("districts", "district_id", district_id=INTEGER, district_name=TEXT, zone=TEXT),
        _table("bikes", "bike_id", bike_id=INTEGER, model=TEXT, electric=BOOLEAN),
        _table("calendar", "day", day=DATE, month=INTEGER, year=INTEGER, weekday=TEXT),
        _table("repairs", None, repair_id=INTEGER, bike_id=INTEGER, station_id=INTEGER, cost=DOUBLE),
        _table("weather", None, day=DATE, rain_mm=DOUBLE),
    ]
}

RELATIONSHIPS = (
    Relationship("rides", "start_station", "stations", "station_id"),
    Relationship("rides", "bike_id", "bikes", "bike_id"),
    Relationship("rides", "day", "calendar", "day"),
    Relationship("stations", "district_id", "districts", "district_id"),
    Relationship("repairs", "bike_id", "bikes", "bike_id"),
    Relationship("repairs", "station_id", "stations", "station_id"),
)

BIKES = Model("bike-share", Path("bikes.yaml"), TABLES, RELATIONSHIPS, (), {})


def with_views(*views: View) -> Model:
    """The bike-share model with ``views``."""
    return replace(BIKES, views={view.name: view for view in views})


def parse(text: str, file: str = FILE) -> ast.MeasureFile:
    """Parse ``text`` as the measure file ``file``."""
    return parse_measures(text, file)


def bind(text: str, model: Model = BIKES) -> BoundModel:
    """Parse and bind ``text`` as the one measure file of ``model``."""
    return bind_model(model, [parse(text)])


def problems(text: str, model: Model = BIKES) -> list[Diagnostic]:
    """The diagnostics binding ``text`` raises (the test fails if it binds)."""
    with pytest.raises(MeasureportError) as raised:
        bind(text, model)
    return raised.value.diagnostics


def only_problem(text: str, model: Model = BIKES) -> Diagnostic:
    """The one diagnostic binding ``text`` raises."""
    found = problems(text, model)
    assert len(found) == 1, [d.render() for d in found]
    return found[0]


def where(diagnostic: Diagnostic) -> tuple[int, int]:
    """Line and column of a diagnostic."""
    return diagnostic.span.line, diagnostic.span.column


def warnings(text: str, model: Model = BIKES) -> list[Diagnostic]:
    """The warnings of binding ``text``."""
    return list(bind(text, model).warnings)
