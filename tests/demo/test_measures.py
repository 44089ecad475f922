"""The demo's measures and views: they parse, bind without warnings, are all described, and
together use every construct of the measure language (LANGUAGE.md section 2)."""

from __future__ import annotations

from collections.abc import Iterator
from dataclasses import fields, is_dataclass
from pathlib import Path

import pytest

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


def _nodes(node: object) -> Iterator[object]:
    """``node`` and every node below it, depth first."""
    yield node
    if isinstance(node, tuple):
        for item in node:
            yield from _nodes(item)
    elif is_dataclass(node):
        for f in fields(node):
            if f.name != "span" and not f.name.endswith("_span"):
                yield from _nodes(getattr(node, f.name))


def _features(expr: ast.Expr) -> set[str]:
    """The constructs an expression uses, named as in the task list of the demo."""
    found: set[str] = set()
    for node in _nodes(expr):
        match node:
            case ast.Aggregate(function=function, argument=argument, iteration=None):
                found.add("count(table)" if isinstance(argument, ast.TableRef) else f"{function}(column)")
            case ast.Aggregate(argument=argument, iteration=ast.Iteration() as iteration):
                has_measure = any(isinstance(n, ast.Name) for n in _nodes(argument))
                if iteration.table is not None:
                    inside = "measure inside" if has_measure else "row expression"
                    found.add(f"for each table, {inside}")
                else:
                    found.add("for each columns" if len(iteration.columns) > 1 else "for each column")
                if iteration.where is not None:
                    found.add("for each ... where")
            case ast.Condition():
                found.add("given: replace")
            case ast.Narrow():
                found.add("given: narrow")
            case ast.Clear(column=str()):
                found.add("clear t.c")
            case ast.Clear(keep=()):
                found.add("clear t")
            case ast.Clear():
                found.add("clear t but")
            case ast.RowBinding():
                found.add("row")
            case ast.ToDate(start=None):
                found.add("to_date")
            case ast.ToDate():
                found.add("to_date with a fiscal start")
            case ast.Shift():
                found.add("shift")
            case ast.Trailing():
                found.add("trailing")
            case ast.Rank(ascending=True):
                found.add("rank ascending")
            case ast.Rank():
                found.add("rank descending")
            case ast.Let():
                found.add("let")
            case ast.If(otherwise=None):
                found.add("if without else")
            case ast.If():
                found.add("if/else")
            case ast.Call(function=function):
                found.add(function)
            case ast.Single():
                found.add("single")
            case ast.Restricted():
                found.add("restricted")
            case ast.InList(negated=negated):
                found.add("not in" if negated else "in")
            case ast.Between():
                found.add("between")
            case ast.Like():
                found.add("like")
            case ast.IsNull():
                found.add("is null")
            case ast.DateLiteral():
                found.add("date literal")
            case ast.String():
                found.add("text literal")
            case ast.Binary(op="/", right=right) if any(
                isinstance(n, ast.Given) and any(isinstance(m, ast.Clear) for m in n.modifiers)
                for n in _nodes(right)
            ):
                found.add("share of total")
            case _:
                pass
    return found


REQUIRED = {
    "sum(column)", "mean(column)", "min(column)", "max(column)", "count(column)", "distinct(column)",
    "count(table)", "for each table, row expression", "for each table, measure inside", "for each column",
    "for each columns", "for each ... where", "given: replace", "given: narrow", "clear t.c", "clear t",
    "clear t but", "row", "to_date", "to_date with a fiscal start", "shift", "trailing", "rank ascending",
    "rank descending", "let", "if/else", "if without else", "coalesce", "abs", "round", "least", "greatest",
    "single", "restricted", "in", "not in", "between", "like", "is null", "share of total", "date literal",
    "text literal",
}


def test_the_measures_together_use_every_construct(measure_file: ast.MeasureFile) -> None:
    used: set[str] = set()
    for definition in measure_file.measures:
        used |= _features(definition.expr)
    assert REQUIRED - used == set()


def test_the_feature_finder_sees_a_construct_only_where_it_is() -> None:
    # The finder above decides this test module's verdict, so check it on two tiny measures.
    text = "measure a = sum(rides.fare)\nmeasure b = a / (a given clear stations)\n"
    first, second = parse_measures(text, "<test>").measures
    assert _features(first.expr) == {"sum(column)"}
    assert _features(second.expr) == {"clear t", "share of total"}


def test_there_are_about_twenty_measures_each_described(measure_file: ast.MeasureFile) -> None:
    assert 20 <= len(measure_file.measures) <= 32
    for definition in measure_file.measures:
        assert definition.description, f"measure {definition.name} has no comment above it"
        assert FILE_HEADER not in definition.description


def test_a_measure_spans_two_fact_tables(measure_file: ast.MeasureFile) -> None:
    by_name = {d.name: d.expr for d in measure_file.measures}

    def tables(name: str, seen: frozenset[str] = frozenset()) -> set[str]:
        found: set[str] = set()
        for node in _nodes(by_name[name]):
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
