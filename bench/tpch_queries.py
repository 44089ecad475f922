"""The TPC-H pairs: each view of examples/tpch and the specification's SQL text of its query.

The SQL text is read from tests/tpch/spec_queries.py, which names its source: the TPC-H Standard
Specification (Transaction Processing Performance Council), clause 2.4, with the substitution
parameters of each query's validation run written in. It is read from that file (not copied) so
that the answer checks and the benchmark time the same text.
"""

from __future__ import annotations

import importlib.util
import sys
from dataclasses import dataclass
from pathlib import Path

from sqlglot import exp, parse_one

from measureport.errors import MeasureportError

SPEC_FILE = Path(__file__).resolve().parents[1] / "tests" / "tpch" / "spec_queries.py"

#: The lowering strategy each view exercises, in our words.
STRATEGIES: dict[str, str] = {
    "pricing_summary": "eight aggregates fused under a report filter on the fact",
    "shipping_priority": "grid on a large dimension; report filters on the fact and two dimensions",
    "order_priority_checking": "narrow on the fact with a distinct count",
    "local_supplier_volume": "for each rows where a condition across two dimensions (snowflake)",
    "forecasting_revenue_change": "grand total under range filters on the fact",
    "returned_item_reporting": "grid across two tables, cut to the rows with a value",
    "important_stock": "clear a grid column on the second fact: compared with the total",
    "shipping_modes": "two narrowed counts on a dimension, with coalesce",
    "promotion_effect": "share of a filtered subset (narrow on a dimension)",
    "parts_supplier_relationship": "distinct count on the second fact under filters on its dimensions",
    "small_quantity_orders": "for each rows against a mean at a coarser grain (clear but)",
    "discounted_revenue": "for each rows where an or of conditions across fact and dimension",
}

#: Views whose measures all aggregate under the report's own context: one scan of the fact suffices.
ONE_CONTEXT = (
    "pricing_summary", "shipping_priority", "local_supplier_volume", "forecasting_revenue_change",
    "returned_item_reporting", "discounted_revenue",
)


@dataclass(frozen=True)
class SpecPair:
    """A specification query and its view. ``keys`` and ``values`` are the SQL result columns of
    the view's grouping columns and measures, in order; ``timed_sql`` is ``sql`` without a LIMIT
    (``limited`` tells whether it had one)."""

    number: int
    view: str
    sql: str
    keys: tuple[str, ...]
    values: tuple[str, ...]
    timed_sql: str
    limited: bool

    @property
    def name(self) -> str:
        return f"q{self.number}_{self.view}"

    @property
    def strategy(self) -> str:
        return STRATEGIES.get(self.view, "(no label)")


def spec_pairs(spec_file: Path = SPEC_FILE) -> tuple[SpecPair, ...]:
    """Every specification query of ``spec_file`` (its ``SPEC_QUERIES``) as a pair."""
    found = importlib.util.spec_from_file_location("bench_spec_queries", spec_file)
    if found is None or found.loader is None or not spec_file.is_file():
        raise MeasureportError(f"the TPC-H query texts were not found at {spec_file}")
    module = sys.modules.get(found.name)
    if module is None:
        module = importlib.util.module_from_spec(found)
        sys.modules[found.name] = module  # dataclasses look their module up while it loads
        found.loader.exec_module(module)
    pairs = []
    for query in module.SPEC_QUERIES:
        sql = str(query.sql)
        timed, limited = without_limit(sql)
        keys = tuple(str(k) for k in query.keys)
        values = tuple(str(v) for v in query.values)
        pairs.append(SpecPair(int(query.number), str(query.view), sql, keys, values, timed, limited))
    return tuple(pairs)


def without_limit(sql: str) -> tuple[str, bool]:
    """``sql`` without the LIMIT of its outermost SELECT, and whether it had one. The text is
    returned unchanged when there is no LIMIT."""
    tree = parse_one(sql, read="duckdb")
    if not isinstance(tree, exp.Select) or tree.args.get("limit") is None:
        return sql, False
    tree.set("limit", None)
    return tree.sql(dialect="duckdb"), True
