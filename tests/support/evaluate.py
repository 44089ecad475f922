"""Run measures written as text on an in-memory model with the reference evaluator (tests only)."""

from __future__ import annotations

from collections.abc import Sequence
from typing import Any

from measureport.language.parser import parse_measures
from measureport.model.schema import Model
from measureport.model.tabledata import Dataset
from measureport.query import ResultTable
from measureport.reference.evaluator import evaluate
from measureport.semantics.binder import bind_model, build_query
from measureport.semantics.bound import BoundModel


def bind_text(model: Model, measures: str) -> BoundModel:
    """Parse and bind measure text against ``model``."""
    return bind_model(model, [parse_measures(measures, "test.measures")])


def run(
    model: Model,
    dataset: Dataset,
    measures: str,
    names: Sequence[str],
    by: Sequence[str] = (),
    where: Sequence[str] = (),
    totals: bool = False,
) -> ResultTable:
    """Evaluate measures ``names`` of ``measures`` by ``by`` under ``where``."""
    bound = bind_text(model, measures)
    return evaluate(bound, dataset, build_query(bound, names, by, where, totals))


def as_dict(result: ResultTable) -> dict[tuple[Any, ...], tuple[Any, ...]]:
    """Detail rows keyed by their grouping values."""
    n = len(result.by)
    return {
        row[:n]: row[n:]
        for row, level in zip(result.rows, result.levels, strict=True)
        if level == n
    }
