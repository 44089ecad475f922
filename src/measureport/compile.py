"""Compile a query to SQL: the one entry point that the command line and the Python API share.

from measureport.compile import compile_query

compiled = compile_query(bound, query, dialect="duckdb")
print(compiled.sql)          # one statement, formatted
print(compiled.explain())    # per measure: how each part became SQL, and the plan tree
compiled.scans               # how many times the statement reads each model table
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

from sqlglot import exp

from measureport.collector import collection_paused
from measureport.plan.printing import format_plan
from measureport.plan.query_plan import LEVEL_COLUMN, QueryPlan, plan_query
from measureport.query import Query
from measureport.render.dialect_forms import localise
from measureport.render.dialects import dialect_profile
from measureport.render.statement import RenderedStatement, render_statement
from measureport.semantics.bound import BoundModel


@dataclass
class CompiledQuery:
    """A query as SQL. ``expression`` (sqlglot) and ``sql`` give the columns and rows that
    ``run`` prints; ``run_expression`` adds one last column, ``__level``, that engines use to
    mark subtotal rows. ``plan`` is the plan's root node."""

    query: Query
    dialect: str
    sqlglot_dialect: str
    bound: BoundModel
    query_plan: QueryPlan
    rendered: RenderedStatement
    _sql: str | None = field(default=None, repr=False)
    _expression: exp.Select | None = field(default=None, repr=False)

    @property
    def plan(self) -> object:
        return self.query_plan.root

    @property
    def expression(self) -> exp.Select:
        """The statement as a sqlglot tree (a copy of its own)."""
        if self._expression is None:
            self._expression = self.rendered.public_expression()
        return self._expression

    @property
    def run_expression(self) -> exp.Select:
        """The statement that engines execute, with the ``__level`` column last."""
        return self.rendered.expression

    @property
    def sql(self) -> str:
        """The statement, formatted, in the query's dialect."""
        if self._sql is None:
            self._sql = self.rendered.sql(self.sqlglot_dialect)
        return self._sql

    def run_sql(self, pretty: bool = False) -> str:
        """The statement that engines execute (``sql`` plus the ``__level`` column)."""
        return self.rendered.sql(self.sqlglot_dialect, pretty=pretty, everything=True)

    @property
    def level_column(self) -> str:
        return LEVEL_COLUMN

    @property
    def scans(self) -> dict[str, int]:
        """How many times the statement reads each model table."""
        return dict(self.rendered.scans)

    def explain(self) -> str:
        """Per measure: its text, how each aggregate, iteration and rank it needs was lowered
        (and which other measures share that step), and its plan tree; then the tables the
        statement reads and the plan of the whole query, where the measures are fused."""
        lines: list[str] = []
        for name in self.query.measures:
            measure = self.bound.measures[name]
            lines.append(f"measure {name} = {' '.join(measure.source.split()) or '...'}")
            steps = self.query_plan.strategies_for(name)
            if not steps:
                lines.append("  computed from the values of the grid row alone (no aggregate)")
            for step in steps:
                description = getattr(step.request, "description", "") or "a step"
                lines.append(f"  - {description}: {step.words}")
                others = [m for m in step.shared_with() if m != name]
                if others:
                    lines.append(f"    fused with {', '.join(others)} (one aggregate, one scan)")
            if len(self.query.measures) > 1:
                alone = plan_query(self.bound, replace(self.query, measures=(name,)))
                lines.append("  plan of this measure alone:")
                lines += ["    " + line for line in format_plan(alone.root).splitlines()]
            lines.append("")
        lines += [f"grid: {note}" for note in self.query_plan.notes]
        scans = ", ".join(f"{t} {n}x" for t, n in sorted(self.scans.items())) or "none"
        lines.append(f"tables read by the statement: {scans}")
        lines.append("plan of the query:")
        lines += ["  " + line for line in format_plan(self.query_plan.root).splitlines()]
        return "\n".join(lines)


def compile_query(bound: BoundModel, query: Query, dialect: str = "duckdb") -> CompiledQuery:
    """The SQL of ``query`` over ``bound``'s model in ``dialect``. A construct that cannot be
    lowered exactly raises :class:`measureport.errors.MeasureportError` naming the measure."""
    profile = dialect_profile(dialect)
    with collection_paused():
        planned = plan_query(bound, query)
        neutral = render_statement(planned.executable, hidden_last=True)
        rendered = replace(neutral, expression=localise(neutral.expression, profile, in_place=True))
    return CompiledQuery(query, profile.name, profile.sqlglot, bound, planned, rendered)
