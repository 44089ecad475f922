"""External check: plain aggregates of the reference evaluator against pandas groupby.

pandas is the independent reference here (its own CSV reader, joins and groupby on the demo's
committed data, examples/bikeshare). Orphan keys are kept by left joins and grouped under a null
key (groupby with dropna=False), the empty member of LANGUAGE.md section 1.
"""

from __future__ import annotations

import datetime as dt
import math
from dataclasses import replace
from pathlib import Path
from typing import Any

import pandas as pd
import pytest

from measureport.language.parser import parse_measures
from measureport.model.data import load_dataset
from measureport.model.loader import load_model
from measureport.reference.evaluator import Evaluator, evaluate_with
from measureport.semantics.binder import bind_model, build_query

DEMO = Path(__file__).resolve().parents[2] / "examples" / "bikeshare"

MEASURES = """
measure total_minutes = sum(rides.duration_min)
measure mean_distance = mean(rides.distance_km)
measure rated = count(rides.rating)
measure ride_count = count(rides)
measure bikes_used = distinct(rides.bike_id)
measure cheapest = min(rides.fare)
measure last_day = max(rides.day)
"""
NAMES = ["total_minutes", "mean_distance", "rated", "ride_count", "bikes_used", "cheapest", "last_day"]


@pytest.fixture(scope="module")
def evaluator() -> Evaluator:
    # The demo's own views name the demo's measures; this check brings measures of its own.
    model = replace(load_model(DEMO / "model.yaml"), views={})
    bound = bind_model(model, [parse_measures(MEASURES, "pandas-check.measures")])
    return Evaluator(bound, load_dataset(model))


@pytest.fixture(scope="module")
def joined() -> pd.DataFrame:
    data = DEMO / "data"
    rides = pd.read_csv(data / "rides.csv", parse_dates=["day"])
    stations = pd.read_csv(data / "stations.csv")[["station_id", "district_id"]]
    districts = pd.read_csv(data / "districts.csv").rename(columns={"name": "district"})
    bikes = pd.read_csv(data / "bikes.csv")[["bike_id", "model"]]
    frame = rides.merge(stations, on="station_id", how="left")
    frame = frame.merge(districts[["district_id", "district"]], on="district_id", how="left")
    return frame.merge(bikes, on="bike_id", how="left")


def _pandas_cells(frame: pd.DataFrame, keys: list[str]) -> dict[tuple[Any, ...], tuple[Any, ...]]:
    grouped = frame.groupby(keys, dropna=False)
    table = pd.DataFrame(
        {
            "total_minutes": grouped["duration_min"].sum(),
            "mean_distance": grouped["distance_km"].mean(),
            "rated": grouped["rating"].count(),
            "ride_count": grouped.size(),
            "bikes_used": grouped["bike_id"].nunique(),
            "cheapest": grouped["fare"].min(),
            "last_day": grouped["day"].max(),
        }
    )
    cells = {}
    for key, row in table.iterrows():
        key_tuple = key if isinstance(key, tuple) else (key,)
        cells[tuple(None if pd.isna(k) else k for k in key_tuple)] = tuple(_plain(v) for v in row)
    return cells


def _plain(value: Any) -> Any:
    if isinstance(value, pd.Timestamp):
        return value.date()
    if value is None or (isinstance(value, float) and math.isnan(value)):
        return None
    return value


def _same(a: Any, b: Any) -> bool:
    if a is None or b is None:
        return a is None and b is None
    if isinstance(a, dt.date) or isinstance(b, dt.date):
        return bool(a == b)
    return math.isclose(float(a), float(b), rel_tol=1e-9, abs_tol=1e-12)


def _compare(evaluator: Evaluator, joined: pd.DataFrame, by: list[str], keys: list[str]) -> int:
    query = build_query(evaluator.bound, NAMES, by, [], False)
    ours = {row[: len(by)]: row[len(by) :] for row in evaluate_with(evaluator, query).rows}
    theirs = _pandas_cells(joined, keys)
    assert set(ours) == set(theirs)
    for key, values in theirs.items():
        for name, mine, other in zip(NAMES, ours[key], values, strict=True):
            assert _same(mine, other), f"{key} {name}: measureport {mine!r}, pandas {other!r}"
    return len(theirs)


def test_plain_aggregates_by_one_column_match_pandas(evaluator: Evaluator, joined: pd.DataFrame) -> None:
    # Through the snowflake rides -> stations -> districts, with the empty member for orphans.
    cells = _compare(evaluator, joined, ["districts.name"], ["district"])
    assert cells >= 5


def test_plain_aggregates_by_two_columns_match_pandas(evaluator: Evaluator, joined: pd.DataFrame) -> None:
    # Across two tables: a dimension column and a fact column (with nulls in both).
    cells = _compare(evaluator, joined, ["bikes.model", "rides.payment"], ["model", "payment"])
    assert cells >= 10
