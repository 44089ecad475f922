"""The demo's measures and views: they parse, bind without warnings, are all described, and
together use every construct of the measure language (LANGUAGE.md section 2)."""

from __future__ import annotations

from collections.abc import Iterator
from pathlib import Path

import pytest

from demo.constructs import REQUIRED, features, nodes
from measureport.demo.writer import demo_source
from measureport.language import ast
from measureport.language.parser import parse_measures
from measureport.workspace import Workspace

EXAMPLE_MODEL = Path(__file__).resolve().parents[2] / "examples" / "bikeshare" / "model.yaml"
FILE_HEADER = "The measures of the bike-share demo network"


@pytest.fixture(scope="module")
def measure_file() -> ast.MeasureFile:
    return parse_measures(demo_source("bikeshare.measures"), "bikeshare.measures")


@pytest.fixture(scope="module")
def workspace() -> Iterator[Workspace]:
    with Workspace.open(EXAMPLE_MODEL) as opened:
        yield opened


def test_the_measures_together_use_every_construct(measure_file: ast.MeasureFile) -> None:
    used: set[str] = set()
    for definition in measure_file.measures:
        used |= features(definition.expr)
    assert REQUIRED - used == set()


def test_the_feature_finder_sees_a_construct_only_where_it_is() -> None:
    # The finder above decides this test module's verdict, so check it on two tiny measures.
    text = "measure a = sum(rides.fare)\nmeasure b = a / (a given clear stations)\n"
    first, second = parse_measures(text, "<test>").measures
    assert features(first.expr) == {"sum(column)"}
    assert features(second.expr) == {"clear t", "share of total"}


def test_there_are_about_twenty_measures_each_described(measure_file: ast.MeasureFile) -> None:
    assert 20 <= len(measure_file.measures) <= 32
    for definition in measure_file.measures:
        assert definition.description, f"measure {definition.name} has no comment above it"
        assert FILE_HEADER not in definition.description


def test_a_measure_spans_two_fact_tables(measure_file: ast.MeasureFile) -> None:
    by_name = {d.name: d.expr for d in measure_file.measures}

    def tables(name: str, seen: frozenset[str] = frozenset()) -> set[str]:
        found: set[str] = set()
        for node in nodes(by_name[name]):
            if isinstance(node, ast.ColumnRef | ast.TableRef):
                found.add(node.table)
            elif isinstance(node, ast.Name) and node.name in by_name and node.name not in seen:
                found |= tables(node.name, seen | {name})
        return found

    assert any({"rides", "maintenance"} <= tables(name) for name in by_name)


def test_every_measure_binds_without_warnings(workspace: Workspace, measure_file: ast.MeasureFile) -> None:
    assert set(workspace.measure_names) == {d.name for d in measure_file.measures}
    assert [w.render() for w in workspace.bound.warnings] == []


def test_the_model_has_three_or_four_views_with_filters(workspace: Workspace) -> None:
    views = workspace.model.views
    assert 3 <= len(views) <= 4
    assert any(view.where for view in views.values())
    for name in views:
        query = workspace.view_query(name)
        assert query.measures == views[name].measures


def test_the_shipped_files_are_the_example_files() -> None:
    folder = EXAMPLE_MODEL.parent
    for name in ("model.yaml", "bikeshare.measures"):
        assert (folder / name).read_text(encoding="utf-8") == demo_source(name)
