"""The engine registry and the workspace's dispatch to engines, on hand-made models (invented data)."""

from __future__ import annotations

from pathlib import Path

import pytest

from measureport.errors import MeasureportError
from measureport.language import ast
from measureport.model.schema import Model
from measureport.query import Query, ResultTable
from measureport.semantics.bound import BoundMeasure, BoundModel
from measureport.workspace import Workspace, engine_factory, engine_names, register_engine
from support.modelbuild import make


class CountingEngine:
    """An invented engine: answers every query with one row holding how many queries it has run."""

    built = 0

    def __init__(self, workspace: Workspace) -> None:
        CountingEngine.built += 1
        self.runs = 0
        self.closed = False

    def run(self, query: Query) -> ResultTable:
        self.runs += 1
        return ResultTable(by=(), measures=query.measures, rows=[(self.runs,)], levels=[0])

    def close(self) -> None:
        self.closed = True


def empty_workspace() -> Workspace:
    model = Model(name="empty", path=Path("model.yaml"), tables={}, relationships=(),
                  measure_files=(), views={})
    return Workspace(model, BoundModel(model=model, measures={}))


def test_reference_engine_is_registered() -> None:
    assert "reference" in engine_names()


def test_unknown_engine_names_the_known_ones_and_a_close_match() -> None:
    with pytest.raises(MeasureportError) as caught:
        engine_factory("refrence")
    assert "there is no engine named 'refrence'" in caught.value.message
    assert "reference" in caught.value.message
    assert caught.value.hint == "did you mean reference?"


def test_workspace_builds_each_engine_once_and_closes_it() -> None:
    register_engine("counting-test", CountingEngine)
    CountingEngine.built = 0
    workspace = empty_workspace()
    query = Query(measures=("rides",))
    # Two runs on one engine: one engine built, and its second answer counts two runs.
    workspace.run(query, "counting-test")
    second = workspace.run(query, "counting-test")
    assert CountingEngine.built == 1
    assert second.rows == [(2,)]
    engine = workspace.engine("counting-test")
    assert isinstance(engine, CountingEngine)
    workspace.close()
    assert engine.closed


def test_workspace_as_context_manager_closes_engines() -> None:
    register_engine("counting-test", CountingEngine)
    with empty_workspace() as workspace:
        engine = workspace.engine("counting-test")
    assert isinstance(engine, CountingEngine) and engine.closed


def test_reference_engine_answers_through_the_workspace() -> None:
    # Invented data: four rides, one of them from station 9, which does not exist (an orphan).
    model, dataset = make(
        {
            "rides": {"ride_id": [1, 2, 3, 4], "station_id": [1, 1, 2, 9]},
            "stations": {"station_id": [1, 2], "name": ["Quay", "Mill"]},
        },
        keys={"stations": "station_id"},
        relationships=["rides.station_id -> stations.station_id"],
    )
    rides = BoundMeasure("rides", ast.Aggregate("count", ast.TableRef("rides")), "number", ())
    workspace = Workspace(model, BoundModel(model, {"rides": rides}), dataset)
    result = workspace.run(Query(("rides",), by=(ast.ColumnRef("stations", "name"),)))
    # By hand: Mill has ride 3, Quay rides 1 and 2, the orphan groups under the empty member, last.
    assert result.rows == [("Mill", 1), ("Quay", 2), (None, 1)]


def test_url_engine_names_reach_the_factory_of_their_scheme() -> None:
    # An engine name that is a URL goes to the factory registered for its scheme, whole URL given.
    from measureport.workspace import register_url_engine

    seen: list[str] = []

    def factory(workspace: object, url: str) -> object:
        seen.append(url)
        return "an engine"

    register_url_engine("testscheme", factory)  # type: ignore[arg-type]
    made = engine_factory("testscheme://host:1/db")(None)  # type: ignore[arg-type]
    assert made == "an engine"
    assert seen == ["testscheme://host:1/db"]


def test_unknown_url_scheme_is_bad_input() -> None:
    with pytest.raises(MeasureportError, match=r"no engine connects to nosuch:// URLs"):
        engine_factory("nosuch://host/db")
