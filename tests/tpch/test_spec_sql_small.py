"""At scale factor 0.01: each view of the TPC-H example, run on DuckDB from the measures, gives the
rows of the specification's SQL text run on DuckDB directly, and the reference evaluator agrees."""

from __future__ import annotations

import duckdb
import pytest

from measureport.workspace import Workspace
from tpch.rows import differences, keyed_result, keyed_sql
from tpch.spec_queries import Q17_BY_BRAND_AND_CONTAINER, SPEC_QUERIES, SpecQuery


def _ids(query: SpecQuery) -> str:
    return f"q{query.number}-{query.view}"


@pytest.mark.parametrize("spec", SPEC_QUERIES, ids=_ids)
def test_measures_on_duckdb_give_the_rows_of_the_specification_sql(
    spec: SpecQuery, small_workspace: Workspace, small_sql: duckdb.DuckDBPyConnection
) -> None:
    expected = keyed_sql(small_sql, spec.sql, spec.keys, spec.values)
    actual = keyed_result(small_workspace.run(small_workspace.view_query(spec.view), engine="duckdb"))
    assert expected, "the specification's query returned no row"
    assert differences(expected, actual) == []


# Q10 groups by columns of two tables (customer and nation), so its grid is every customer with
# every nation; the reference evaluator takes about half a minute on it, too long for the quick run.
REFERENCE_CASES = [pytest.param(q, marks=pytest.mark.slow) if q.number == 10 else q for q in SPEC_QUERIES]


@pytest.mark.parametrize("spec", REFERENCE_CASES, ids=_ids)
def test_reference_evaluator_agrees_with_duckdb(spec: SpecQuery, small_workspace: Workspace) -> None:
    query = small_workspace.view_query(spec.view)
    on_duckdb = keyed_result(small_workspace.run(query, engine="duckdb"))
    by_reference = keyed_result(small_workspace.run(query, engine="reference"))
    assert differences(on_duckdb, by_reference) == []


def test_small_quantity_loss_by_brand_and_container_matches_sql(
    small_workspace: Workspace, small_sql: duckdb.DuckDBPyConnection
) -> None:
    # At this scale Brand#23 in a MED BOX may have no small order at all (then both sides are
    # null), so Q17 is also checked for every brand and container at once.
    expected = keyed_sql(small_sql, Q17_BY_BRAND_AND_CONTAINER, ("p_brand", "p_container"), ("avg_yearly",))
    query = small_workspace.query(["small_order_yearly_loss"], by=["part.p_brand", "part.p_container"])
    actual = keyed_result(small_workspace.run(query, engine="duckdb"))
    assert len(expected) > 100
    assert differences(expected, actual) == []
