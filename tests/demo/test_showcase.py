"""The showcase queries of `measureport demo` name measures and columns the demo model has."""

from __future__ import annotations

from collections.abc import Iterator
from pathlib import Path

import pytest

from measureport.demo.showcase import SHOWCASE, ShowcaseQuery
from measureport.workspace import Workspace

EXAMPLE_MODEL = Path(__file__).resolve().parents[2] / "examples" / "bikeshare" / "model.yaml"


@pytest.fixture(scope="module")
def workspace() -> Iterator[Workspace]:
    with Workspace.open(EXAMPLE_MODEL) as opened:
        yield opened


def test_five_to_seven_queries_with_distinct_titles_and_an_explanation() -> None:
    assert 5 <= len(SHOWCASE) <= 7
    assert len({item.title for item in SHOWCASE}) == len(SHOWCASE)
    for item in SHOWCASE:
        assert item.measures and item.by
        assert item.explanation.strip()
        assert "\n" not in item.explanation


def test_some_queries_filter_and_some_add_totals() -> None:
    assert any(item.where for item in SHOWCASE)
    assert any(item.totals for item in SHOWCASE)


@pytest.mark.parametrize("item", SHOWCASE, ids=lambda item: item.title)
def test_each_query_binds(workspace: Workspace, item: ShowcaseQuery) -> None:
    query = workspace.query(item.measures, item.by, item.where, item.totals)
    assert query.measures == item.measures
    assert [str(c) for c in query.by] == list(item.by)
    assert len(query.where) == len(item.where)


def test_run_arguments_say_the_same_query() -> None:
    item = ShowcaseQuery("t", ("trips", "revenue"), ("calendar.year",), ("calendar.year = 2025",), True, "x")
    assert item.run_arguments() == [
        "-m", "trips,revenue", "--by", "calendar.year", "--where", "calendar.year = 2025", "--totals",
    ]


@pytest.mark.slow
@pytest.mark.parametrize("item", SHOWCASE, ids=lambda item: item.title)
def test_each_query_runs_on_the_reference_engine(workspace: Workspace, item: ShowcaseQuery) -> None:
    result = workspace.run(workspace.query(item.measures, item.by, item.where, item.totals))
    assert result.columns == item.by + item.measures
    assert result.rows
