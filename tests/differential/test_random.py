"""Property: for random models, data and measures, the SQL on DuckDB gives exactly what the
reference evaluator gives (tests/differential/generators.py draws them; all invented).

The fast profile runs in the default test run; the deep one (thousands of examples, a fixed
seed) in the slow suite. Every failure found becomes a named regression test in
test_regressions.py.
"""

from __future__ import annotations

import pytest
from hypothesis import HealthCheck, assume, given, settings

from differential.generators import Case, cases
from differential.harness import differences
from measureport.engines.duckdb import DuckDBEngine
from measureport.errors import MeasureportError
from measureport.language.parser import parse_measures
from measureport.model.schema import Model
from measureport.model.tabledata import Dataset
from measureport.reference.evaluator import evaluate
from measureport.semantics.binder import bind_model, build_query

FAST = settings(
    max_examples=100,
    deadline=None,
    suppress_health_check=[HealthCheck.too_slow, HealthCheck.filter_too_much, HealthCheck.data_too_large],
)
DEEP = settings(
    max_examples=3000,
    deadline=None,
    derandomize=True,
    suppress_health_check=[HealthCheck.too_slow, HealthCheck.filter_too_much, HealthCheck.data_too_large],
)


def agree(case: Case) -> None:
    model, data, text, names, by, where, totals = case
    try:
        bound = bind_model(model, [parse_measures(text, "random.measures")])
        query = build_query(bound, names, by, where, totals)
    except MeasureportError:
        assume(False)
        return
    expected = evaluate(bound, data, query)
    engine = DuckDBEngine(bound, data)
    try:
        actual = engine.run(query)
    finally:
        engine.close()
    problems = differences(expected, actual)
    assert not problems, "\n".join([text, f"by {by} where {where} totals {totals}", *problems])


@FAST
@given(cases())
def test_random_measures_agree(
    case: tuple[Model, Dataset, str, list[str], list[str], list[str], bool],
) -> None:
    agree(case)


@pytest.mark.slow
@DEEP
@given(cases())
def test_random_measures_agree_deep(
    case: tuple[Model, Dataset, str, list[str], list[str], list[str], bool],
) -> None:
    agree(case)
