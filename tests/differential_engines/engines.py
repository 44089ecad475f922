"""Reference == engine, cell by cell, through the shared comparison (dates equal however typed)."""

from __future__ import annotations

from measureport.compare.comparison import compare_results
from measureport.model.tabledata import Dataset
from measureport.query import Query, ResultTable
from measureport.reference.evaluator import evaluate
from measureport.semantics.bound import BoundModel

TOLERANCE = 1e-9


def disagreement(
    bound: BoundModel, dataset: Dataset, engine: object, query: Query, expected: ResultTable | None = None
) -> str:
    """Empty when the engine gives what the reference evaluator gives (``expected``, when it was
    evaluated already); else the differences and SQL."""
    expected = evaluate(bound, dataset, query) if expected is None else expected
    actual = engine.run(query)  # type: ignore[attr-defined]
    comparison = compare_results(expected, actual, TOLERANCE, absolute_tolerance=1e-12)
    if comparison.equal:
        return ""
    sql = engine.compile(query).sql  # type: ignore[attr-defined]
    return "\n".join([str(comparison), "SQL:", sql])
